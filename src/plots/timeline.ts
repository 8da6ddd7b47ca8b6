/**
 * The schedule as a timeline: one lane per qubit (qubit 0 on top), one box per operation
 * on each qubit it acts on (a multi-qubit operation's boxes joined by a line), idle
 * windows as thin bands shaded by their cost, barriers as dashed ticks, the circuit's end
 * as a dashed line; in record mode a conditioned step's label ends in '?' and a dotted line
 * runs from each measurement to the steps its bit conditions. Times arrive in display units (ns or µs, named by `axisTitle`).
 */
import type { TopLevelSpec } from 'vega-lite';
import { IDLE_RAMP, INK, OPERATION_FILL, OPERATION_TEXT, RULE, type OperationKind } from './palette.js';

/** One box: an operation on one of its qubits. */
export interface TimelineBox {
  readonly lane: number;
  readonly start: number;
  readonly end: number;
  readonly kind: OperationKind;
  /** Short text inside the box when it fits (gate name, M, R, N). */
  readonly label: string;
  /** Hover text with the exact figures. */
  readonly title: string;
  /** A step that runs only when record bits read given values (its label ends in '?'). */
  readonly conditional?: boolean;
}

/** A classical dependency: a measurement's bit, from its end on one lane to the start of a conditioned step on another. */
export interface TimelineFeed {
  readonly from: number;
  readonly fromLane: number;
  readonly to: number;
  readonly toLane: number;
  readonly title: string;
}

/** One idle window of one qubit and what it costs. */
export interface TimelineIdle {
  readonly lane: number;
  readonly start: number;
  readonly end: number;
  /** Cost of the window (the page says which figure; shading is linear in it from 0). */
  readonly cost: number;
  /** The cost as printed inside a wide enough band. */
  readonly costText: string;
  readonly title: string;
}

/** The line joining the boxes of one multi-qubit operation, at time `at`, from lane `from` to lane `to`. */
export interface TimelineLink {
  readonly at: number;
  readonly from: number;
  readonly to: number;
}

/** Everything the timeline draws. */
export interface TimelineData {
  /** Lane names, lane 0 first (drawn on top). */
  readonly lanes: readonly string[];
  readonly boxes: readonly TimelineBox[];
  readonly idle: readonly TimelineIdle[];
  readonly links: readonly TimelineLink[];
  /** Classical dependencies of record mode (empty otherwise). */
  readonly feeds: readonly TimelineFeed[];
  /** Barriers: a dashed tick on each of their lanes. */
  readonly barriers: readonly { readonly lane: number; readonly at: number }[];
  /** Where the circuit ends, and how that is written. */
  readonly end: number;
  readonly endLabel: string;
  /** Title of the time axis (with its unit). */
  readonly axisTitle: string;
  /** Title of the idle-cost legend. */
  readonly costTitle: string;
}

/** Width of the timeline's plotting area, px. */
export const TIMELINE_WIDTH = 760;

/** Height of one lane, px. */
export const LANE_HEIGHT = 40;

/** Half-heights of a box and of an idle band, in lanes. */
const BOX_HALF = 0.34;
const IDLE_HALF = 0.16;

/** Approximate width of one character of box text at 11 px, px (vega measures no fonts in Node). */
const CHAR_PX = 6.6;

/** A zero-length operation is drawn this wide (as a fraction of the axis) so it can be seen and hovered. */
const MIN_BOX_FRACTION = 0.006;

/** The vega-lite spec of a timeline. */
export function timelineSpec(data: TimelineData): TopLevelSpec {
  const n = data.lanes.length;
  const span = data.end > 0 ? data.end : 1;
  const px = (t: number) => (t / span) * TIMELINE_WIDTH;
  const minLen = MIN_BOX_FRACTION * span;
  const boxes = data.boxes.map((b) => {
    const end = Math.max(b.end, b.start + minLen);
    const label = b.conditional === true ? `${b.label}?` : b.label;
    const fits = px(end - b.start) >= label.length * CHAR_PX + 6;
    return { ...b, drawEnd: end, mid: (b.start + end) / 2, y0: b.lane - BOX_HALF, y1: b.lane + BOX_HALF, text: fits ? label : '', ink: OPERATION_TEXT[b.kind] };
  });
  const idle = data.idle.map((w) => ({
    ...w,
    mid: (w.start + w.end) / 2,
    y0: w.lane - IDLE_HALF,
    y1: w.lane + IDLE_HALF,
    text: px(w.end - w.start) >= w.costText.length * 5.4 + 8 ? w.costText : '',
  }));
  const maxCost = Math.max(0, ...data.idle.map((w) => w.cost));
  // text on the darker half of the ramp is white
  const idleInk = (cost: number) => (maxCost > 0 && cost > 0.55 * maxCost ? '#ffffff' : INK);
  const kinds = (Object.keys(OPERATION_FILL) as OperationKind[]).filter((k) => data.boxes.some((b) => b.kind === k));
  const x = { field: 'start', type: 'quantitative' as const, scale: { domain: [0, span], nice: false, zero: true }, axis: { title: data.axisTitle, grid: true, tickCount: 8 } };
  const laneNames = JSON.stringify(data.lanes);
  const y = {
    field: 'y0',
    type: 'quantitative' as const,
    scale: { domain: [n - 0.5, -0.5], nice: false, zero: false },
    axis: { title: 'qubit', values: data.lanes.map((_, i) => i), labelExpr: `${laneNames}[datum.value]`, grid: false, ticks: false, domain: false, labelFontSize: 12, labelPadding: 6 },
  };
  return {
    width: TIMELINE_WIDTH,
    height: n * LANE_HEIGHT,
    resolve: { scale: { fill: 'independent' }, legend: { fill: 'independent' } },
    layer: [
      {
        name: 'lanes',
        data: { values: data.lanes.map((_, i) => ({ y0: i, y1: i })) },
        mark: { type: 'rule', stroke: RULE, strokeWidth: 0.6 },
        encoding: { y: { ...y, field: 'y0' } },
      },
      {
        name: 'idle',
        data: { values: idle },
        mark: { type: 'rect', stroke: '#8c857a', strokeWidth: 0.5 },
        encoding: {
          x,
          x2: { field: 'end' },
          y: { ...y, field: 'y0' },
          y2: { field: 'y1' },
          fill: {
            field: 'cost',
            type: 'quantitative',
            scale: { domain: [0, maxCost > 0 ? maxCost : 1], range: [...IDLE_RAMP] },
            legend: { title: data.costTitle, orient: 'bottom', direction: 'horizontal', gradientLength: 220, format: '.1e', titleLimit: 400 },
          },
          description: { field: 'title' },
        },
      },
      {
        name: 'idle_text',
        data: { values: idle.filter((w) => w.text !== '').map((w) => ({ ...w, ink: idleInk(w.cost) })) },
        mark: { type: 'text', fontSize: 9, baseline: 'middle', align: 'center' },
        encoding: { x: { ...x, field: 'mid' }, y: { ...y, field: 'lane' }, text: { field: 'text' }, color: { field: 'ink', type: 'nominal', scale: null } },
      },
      {
        name: 'barriers',
        data: { values: data.barriers.map((b) => ({ at: b.at, y0: b.lane - 0.46, y1: b.lane + 0.46 })) },
        mark: { type: 'rule', stroke: '#6b655c', strokeDash: [3, 2], strokeWidth: 1.2 },
        encoding: { x: { ...x, field: 'at' }, y: { ...y, field: 'y0' }, y2: { field: 'y1' } },
      },
      {
        name: 'links',
        data: { values: data.links },
        mark: { type: 'rule', stroke: INK, strokeWidth: 1.6 },
        encoding: { x: { ...x, field: 'at' }, y: { ...y, field: 'from' }, y2: { field: 'to' } },
      },
      {
        name: 'feeds',
        data: { values: data.feeds.map((f) => ({ ...f })) },
        mark: { type: 'rule', stroke: INK, strokeWidth: 1.3, strokeDash: [2, 2] },
        encoding: { x: { ...x, field: 'from' }, x2: { field: 'to' }, y: { ...y, field: 'fromLane' }, y2: { field: 'toLane' }, description: { field: 'title' } },
      },
      {
        name: 'boxes',
        data: { values: boxes },
        mark: { type: 'rect', stroke: INK, strokeWidth: 0.8, cornerRadius: 2 },
        encoding: {
          x,
          x2: { field: 'drawEnd' },
          y: { ...y, field: 'y0' },
          y2: { field: 'y1' },
          fill: {
            field: 'kind',
            type: 'nominal',
            scale: { domain: kinds, range: kinds.map((k) => OPERATION_FILL[k]) },
            legend: { title: 'operation', orient: 'bottom', direction: 'horizontal', symbolStrokeColor: INK, symbolStrokeWidth: 0.8, symbolType: 'square' },
          },
          description: { field: 'title' },
        },
      },
      {
        name: 'box_text',
        data: { values: boxes.filter((b) => b.text !== '') },
        mark: { type: 'text', fontSize: 11, baseline: 'middle', align: 'center' },
        encoding: { x: { ...x, field: 'mid' }, y: { ...y, field: 'lane' }, text: { field: 'text' }, color: { field: 'ink', type: 'nominal', scale: null } },
      },
      {
        name: 'end',
        data: { values: [{ at: span, y0: -0.5, y1: n - 0.5, label: data.endLabel }] },
        mark: { type: 'rule', stroke: INK, strokeDash: [6, 3], strokeWidth: 1.4 },
        encoding: { x: { ...x, field: 'at' }, y: { ...y, field: 'y0' }, y2: { field: 'y1' }, description: { field: 'label' } },
      },
      {
        name: 'end_text',
        data: { values: [{ at: span, y0: -0.5, label: data.endLabel }] },
        mark: { type: 'text', fontSize: 11, align: 'right', baseline: 'bottom', dy: -3, fill: INK },
        encoding: { x: { ...x, field: 'at' }, y: { ...y, field: 'y0' }, text: { field: 'label' } },
      },
    ],
  } as TopLevelSpec;
}
