/**
 * Self-contained HTML reports (inline CSS and SVG, no scripts, nothing fetched): the page
 * shell (page.ts) and the page of one run (runPage.ts) with its schedule timeline.
 */
export { runPage, LISTED_IDLE_WINDOWS } from './runPage.js';
export type { RunPageOptions } from './runPage.js';
export { timelineData, idleWindowCost } from './timelineData.js';
export { page, esc, table, figure, keyValueList } from './page.js';
export type { PageSection } from './page.js';
