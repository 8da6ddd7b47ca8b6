/**
 * fray's pictures: each is data plus a vega-lite spec, compiled to SVG by one function
 * (renderSvg). Colours are stated once in palette.ts.
 */
export { renderSvg, descriptionsAsTitles } from './render.js';
export { timelineSpec, TIMELINE_WIDTH, LANE_HEIGHT } from './timeline.js';
export type { TimelineData, TimelineBox, TimelineIdle, TimelineLink } from './timeline.js';
export { comparisonBarsSpec } from './comparisonBars.js';
export type { ComparisonBar, ComparisonChart } from './comparisonBars.js';
export { OPERATION_FILL, SERIES_FILL, IDLE_RAMP, INK } from './palette.js';
export type { OperationKind, Series } from './palette.js';
