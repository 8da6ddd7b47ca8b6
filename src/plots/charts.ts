import type { TopLevelSpec } from 'vega-lite';
import { HEATMAP_SCHEME, PLOT_CONFIG, SERIES_COLORS, SERIES_DASHES } from './theme.js';

/**
 * Generic chart specs over plain rows of numbers: lines against one axis (several series),
 * a heat map over two axes, horizontal bars. Axis titles carry units; the title names what
 * is plotted. Rendering is ./render.ts's job.
 */

/** One point of a line chart: x, the series it belongs to, y. */
export interface LinePoint {
  readonly x: number;
  readonly series: string;
  readonly y: number;
}

/** Options of a line chart. */
export interface LineChartOptions {
  readonly title: string;
  readonly subtitle?: string;
  readonly xTitle: string;
  readonly yTitle: string;
  readonly logX?: boolean;
  /** A horizontal target line and its label. */
  readonly target?: { readonly y: number; readonly label: string };
}

/** Metrics against one varied key: one line with point marks per series. */
export function lineChart(points: readonly LinePoint[], o: LineChartOptions): TopLevelSpec {
  const series = [...new Set(points.map((p) => p.series))];
  const layers: unknown[] = [
    {
      mark: { type: 'line', point: { filled: true, size: 36 }, strokeWidth: 2 },
      encoding: {
        x: { field: 'x', type: 'quantitative', title: o.xTitle, scale: o.logX ? { type: 'log', nice: false } : { zero: false, nice: false } },
        y: { field: 'y', type: 'quantitative', title: o.yTitle, scale: { zero: false } },
        color: { field: 'series', type: 'nominal', title: null, scale: { domain: series, range: SERIES_COLORS.slice(0, Math.max(1, series.length)) } },
        strokeDash: { field: 'series', type: 'nominal', title: null, scale: { domain: series, range: SERIES_DASHES.slice(0, Math.max(1, series.length)) } },
      },
    },
  ];
  if (o.target !== undefined) {
    layers.push({
      data: { values: [{ y: o.target.y, label: o.target.label }] },
      layer: [
        { mark: { type: 'rule', color: '#444444', strokeDash: [3, 3] }, encoding: { y: { field: 'y', type: 'quantitative' } } },
        { mark: { type: 'text', align: 'left', dx: 4, dy: -6, color: '#444444', x: 0 }, encoding: { y: { field: 'y', type: 'quantitative' }, text: { field: 'label' } } },
      ],
    });
  }
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    title: o.subtitle !== undefined ? { text: o.title, subtitle: o.subtitle } : o.title,
    data: { values: points.map((p) => ({ ...p })) },
    layer: layers,
    config: PLOT_CONFIG,
  } as TopLevelSpec;
}

/** Size of a heat-map cell, px: room for a value printed to 3 decimals. */
const HEAT_CELL_WIDTH = 44;
const HEAT_CELL_HEIGHT = 22;
/** The lower share of a heat map's value range whose cells are dark enough to take white text. */
const HEAT_DARK_SHARE = 0.4;

/** One cell of a heat map. */
export interface HeatCell {
  readonly x: number;
  readonly y: number;
  readonly value: number;
}

/** A metric over two varied keys, as coloured cells with the value printed in each. */
export function heatMap(cells: readonly HeatCell[], o: { title: string; subtitle?: string; xTitle: string; yTitle: string; valueTitle: string }): TopLevelSpec {
  const fmt = (v: number) => String(Number(v.toPrecision(4)));
  // the scheme runs dark to light: white text on the darkest part of the range
  const values = cells.map((c) => c.value);
  const [lo, hi] = [Math.min(...values), Math.max(...values)];
  const darkBelow = lo + HEAT_DARK_SHARE * (hi - lo);
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    title: o.subtitle !== undefined ? { text: o.title, subtitle: o.subtitle } : o.title,
    data: { values: cells.map((c) => ({ x: fmt(c.x), y: fmt(c.y), xn: c.x, yn: c.y, value: c.value })) },
    // cells wide enough for the value printed in them (vega-lite's default step of 20 px is not)
    width: { step: HEAT_CELL_WIDTH },
    height: { step: HEAT_CELL_HEIGHT },
    encoding: {
      x: { field: 'x', type: 'ordinal', title: o.xTitle, sort: { field: 'xn' } },
      y: { field: 'y', type: 'ordinal', title: o.yTitle, sort: { field: 'yn', order: 'descending' } },
    },
    layer: [
      { mark: 'rect', encoding: { color: { field: 'value', type: 'quantitative', title: o.valueTitle, scale: { scheme: HEATMAP_SCHEME } } } },
      { mark: { type: 'text', fontSize: 9 }, encoding: { text: { field: 'value', type: 'quantitative', format: '.3f' }, color: { condition: { test: `datum.value < ${darkBelow}`, value: '#ffffff' }, value: '#222222' } } },
    ],
    config: PLOT_CONFIG,
  } as TopLevelSpec;
}

/** One bar: its label, its value, and the group it is coloured by. */
export interface Bar {
  readonly label: string;
  readonly value: number;
  readonly group: string;
}

/** Horizontal bars in the given order, coloured by group, the value printed at each bar's end. */
export function barChart(bars: readonly Bar[], o: { title: string; subtitle?: string; valueTitle: string }): TopLevelSpec {
  const groups = [...new Set(bars.map((b) => b.group))];
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    title: o.subtitle !== undefined ? { text: o.title, subtitle: o.subtitle } : o.title,
    data: { values: bars.map((b, i) => ({ ...b, order: i })) },
    encoding: {
      y: { field: 'label', type: 'nominal', title: null, sort: { field: 'order', op: 'min' }, axis: { labelLimit: 420 } },
      x: { field: 'value', type: 'quantitative', title: o.valueTitle },
    },
    layer: [
      { mark: 'bar', encoding: { color: { field: 'group', type: 'nominal', title: null, scale: { domain: groups, range: SERIES_COLORS.slice(0, Math.max(1, groups.length)) } } } },
      { mark: { type: 'text', align: 'left', dx: 3, fontSize: 10 }, encoding: { text: { field: 'value', type: 'quantitative', format: '.3~g' } } },
    ],
    config: PLOT_CONFIG,
  } as TopLevelSpec;
}
