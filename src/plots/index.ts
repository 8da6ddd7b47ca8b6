/**
 * The plotting layer: each picture is data plus a vega-lite spec, rendered to SVG by one
 * function (render.ts). Study charts (charts.ts, one function per study result in
 * studyPlots.ts) and the run report's timeline and comparison bars (timeline.ts,
 * comparisonBars.ts); colours from the Okabe–Ito set in theme.ts, the report's roles for
 * them in palette.ts.
 */
export { renderSvg, descriptionsAsTitles } from './render.js';
export { lineChart, heatMap, barChart } from './charts.js';
export type { LinePoint, LineChartOptions, HeatCell, Bar } from './charts.js';
export { plotCompare, plotSweep, plotBudget, plotCheck } from './studyPlots.js';
export { timelineSpec, TIMELINE_WIDTH, LANE_HEIGHT } from './timeline.js';
export type { TimelineData, TimelineBox, TimelineIdle, TimelineLink } from './timeline.js';
export { comparisonBarsSpec } from './comparisonBars.js';
export type { ComparisonBar, ComparisonChart } from './comparisonBars.js';
export { OPERATION_FILL, SERIES_FILL, IDLE_RAMP, INK } from './palette.js';
export type { OperationKind, Series } from './palette.js';
