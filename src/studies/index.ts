/**
 * The studies layer: decisions between variants under a noise budget, each a library
 * function over parsed sources returning data (the CLI renders it).
 *
 * - metrics.ts     figures of merit (state, classical, tvd, purity, duration, observable:P)
 * - conditions.ts  the condition language `METRIC OP NUMBER` (--require, --target)
 * - variant.ts     the door to the run path: a parsed source + overrides/scale/layout → a run
 * - compare.ts     rank variants (files × devices × layouts)
 * - ranges.ts      `KEY=RANGE` values with units (A..B:N, A..B:log:N, lists, A..B)
 * - sweep.ts       the grid, its fingerprint, shards, and running points (sweepPool.ts,
 *                  sweepWorker.ts: worker threads through piscina)
 * - sweepFiles.ts  CSV / JSON Lines output, resume, merge
 * - threshold.ts   where a condition is just met: bracketing and bisection on one key
 * - budget.ts      where the loss comes from: each noise source alone, each left out, the remainder
 */
export { parseMetric, metricName, metricTitle, metricValue, metricLoss, higherIsBetter, observablesOf, METRIC_NAMES } from './metrics.js';
export type { Metric } from './metrics.js';
export { parseCondition, meets, failedConditions, compareWith } from './conditions.js';
export type { Condition, ComparisonOp } from './conditions.js';
export { runVariant, SourceCache, countOperations, loadOptionsOf } from './variant.js';
export type { VariantChoice, StudyRunSettings, StudyTarget, OperationCounts } from './variant.js';
export { compareVariants, variantLabel, fmt } from './compare.js';
export type { CompareOptions, CompareResult, ComparedVariant } from './compare.js';
export { parseVary, parseInterval, parseQuantity, spaced, valueText, UNIT_FAMILIES, NOISE_SCALE_KEY } from './ranges.js';
export type { Varied, Interval, UnitFamily } from './ranges.js';
export { planSweep, pointAt, selectedIndices, runSweep, runPoint, checkSweep, describePoint } from './sweep.js';
export type { SweepCheck, SweepSpec, SweepPlan, SweepPoint, SweepRow, SweepSelection, SweepRunOptions } from './sweep.js';
export { formatOf, headerOf, headerText, csvColumns, rowText, readSweepFile, completeBytes, mergeSweepFiles } from './sweepFiles.js';
export type { SweepFormat, SweepHeader, SweepFileContent } from './sweepFiles.js';
export { findThreshold, THRESHOLD_SCAN_POINTS } from './threshold.js';
export type { ThresholdOptions, ThresholdResult, ThresholdSample } from './threshold.js';
export { noiseBudget } from './budget.js';
export type { BudgetOptions, BudgetResult, BudgetSource } from './budget.js';
