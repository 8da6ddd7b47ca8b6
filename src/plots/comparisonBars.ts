/**
 * Grouped bars comparing series (ideal, noisy, measured) per category: outcome
 * probabilities, Bloch vector lengths, Pauli expectation values. Ideal bars are hollow,
 * noisy ones light, measured ones dark (src/plots/palette.ts), all outlined in ink.
 */
import type { TopLevelSpec } from 'vega-lite';
import { INK, SERIES_FILL, type Series } from './palette.js';

/** One bar: `value` of `series` for `category`; `title` is its hover text. */
export interface ComparisonBar {
  readonly category: string;
  readonly series: Series;
  readonly value: number;
  readonly title: string;
}

/** A comparison chart: bars, categories in drawing order, axis titles and the value range. */
export interface ComparisonChart {
  readonly bars: readonly ComparisonBar[];
  readonly categories: readonly string[];
  readonly categoryTitle: string;
  readonly valueTitle: string;
  /**
   * Value axis range, e.g. [0, 1] for probabilities or [−1, 1] for expectation values: the range
   * the quantity has. A bar outside it (an extrapolated expectation value beyond ±1, say) widens
   * the axis to include it (valueDomain), so it is drawn whole instead of cut at the edge.
   */
  readonly domain: readonly [number, number];
  /** Categories in a monospace font (bit strings, Pauli strings). */
  readonly monospace?: boolean;
}

/** Width of one category group, px. */
const GROUP_WIDTH = 54;

/** The value axis of a chart: its declared domain, widened to every finite bar value outside it. */
export function valueDomain(chart: ComparisonChart): [number, number] {
  let [lo, hi] = chart.domain;
  for (const b of chart.bars) {
    if (!Number.isFinite(b.value)) continue;
    if (b.value < lo) lo = b.value;
    if (b.value > hi) hi = b.value;
  }
  return [lo, hi];
}

/** The vega-lite spec of a comparison chart. */
export function comparisonBarsSpec(chart: ComparisonChart): TopLevelSpec {
  const series = (Object.keys(SERIES_FILL) as Series[]).filter((s) => chart.bars.some((b) => b.series === s));
  return {
    width: Math.max(220, chart.categories.length * GROUP_WIDTH),
    height: 190,
    data: { values: chart.bars.map((b) => ({ ...b })) },
    mark: { type: 'bar', stroke: INK, strokeWidth: 0.9 },
    encoding: {
      x: {
        field: 'category',
        type: 'nominal',
        sort: [...chart.categories],
        axis: { title: chart.categoryTitle, labelAngle: 0, labelFont: chart.monospace ? 'Menlo, Consolas, monospace' : undefined, labelFontSize: 12 },
        scale: { paddingInner: 0.25 },
      },
      xOffset: { field: 'series', type: 'nominal', sort: series, scale: { domain: series, paddingInner: 0.08 } },
      y: { field: 'value', type: 'quantitative', scale: { domain: valueDomain(chart), nice: false }, axis: { title: chart.valueTitle, tickCount: 5 } },
      fill: {
        field: 'series',
        type: 'nominal',
        scale: { domain: series, range: series.map((s) => SERIES_FILL[s]) },
        legend: { title: null, orient: 'top', direction: 'horizontal', symbolType: 'square', symbolStrokeColor: INK, symbolStrokeWidth: 0.9, symbolSize: 140 },
      },
      description: { field: 'title' },
    },
  } as TopLevelSpec;
}
