/**
 * Self-contained HTML reports (inline CSS and SVG, no scripts, nothing fetched): the page
 * shell (page.ts) and the page of one run (runPage.ts) with its schedule timeline.
 */
export { runPage, LISTED_IDLE_WINDOWS } from './runPage.js';
export type { RunPageOptions } from './runPage.js';
export { timelineData, idleWindowCost } from './timelineData.js';
export { page, esc, table, figure, keyValueList } from './page.js';
export type { PageSection } from './page.js';
export { comparePage, compareTable, studyFooter } from './comparePage.js';
export type { StudyTable } from './comparePage.js';
export { budgetPage, budgetTable, lossName, lossText, SHOWN_ZERO_LOSS } from './budgetPage.js';
export { sweepPage, sweepTable } from './sweepPage.js';
export type { SweepPageInput } from './sweepPage.js';
export { checkPage, checkTable } from './checkPage.js';
export { mitigatePage, mitigationObservableTable, readoutTable, valueText, scaleText, SHOWN_ZERO_VALUE, DRAWN_OUTCOMES } from './mitigatePage.js';
