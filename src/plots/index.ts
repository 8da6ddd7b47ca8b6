/**
 * The plotting layer: vega-lite specs (charts.ts, in fray's colour-blind-safe look from
 * theme.ts) rendered to SVG by render.ts, and one function per study result (studyPlots.ts).
 */
export { renderSvg } from './render.js';
export { lineChart, heatMap, barChart } from './charts.js';
export type { LinePoint, LineChartOptions, HeatCell, Bar } from './charts.js';
export { plotCompare, plotSweep, plotBudget } from './studyPlots.js';
