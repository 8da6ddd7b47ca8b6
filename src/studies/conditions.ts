import type { RunResult } from '../api/simulate.js';
import { metricName, metricValue, parseMetric, type Metric } from './metrics.js';
import { NUMBER_SOURCE } from '../format/numberSyntax.js';

/**
 * The condition language of `--require`, `--target` (and of `expect:` in later work):
 * `METRIC OP NUMBER`, e.g. `state>=0.9`, `tvd <= 0.05`, `observable:ZZI<0.02`, with OP one
 * of >=, <=, >, <. Spaces around the parts are allowed. A condition is data: parse once,
 * check against any number of runs.
 */
export interface Condition {
  readonly metric: Metric;
  readonly op: ComparisonOp;
  readonly value: number;
  /** The condition as written, normalised (`state>=0.9`). */
  readonly text: string;
}

/** The comparison operators of a condition. */
export type ComparisonOp = '>=' | '<=' | '>' | '<';

const CONDITION_RE = new RegExp(`^\\s*([A-Za-z][A-Za-z:]*)\\s*(>=|<=|>|<)\\s*(${NUMBER_SOURCE})\\s*$`);

/** Parses `METRIC OP NUMBER`; an error message says what is expected. */
export function parseCondition(text: string): Condition | { error: string } {
  const m = CONDITION_RE.exec(text);
  if (m === null) return { error: `'${text}' is not a condition; expected METRIC OP NUMBER, e.g. state>=0.9 or tvd<=0.05 (OP: >=, <=, >, <)` };
  const metric = parseMetric(m[1]!);
  if ('error' in metric) return { error: `'${text}': ${metric.error}` };
  const value = Number(m[3]);
  return { metric, op: m[2] as ComparisonOp, value, text: `${metricName(metric)}${m[2]}${m[3]}` };
}

/** Whether `x OP value` holds. */
export function compareWith(x: number, op: ComparisonOp, value: number): boolean {
  switch (op) {
    case '>=':
      return x >= value;
    case '<=':
      return x <= value;
    case '>':
      return x > value;
    case '<':
      return x < value;
  }
}

/** Whether a run meets the condition. */
export function meets(result: RunResult, c: Condition): boolean {
  return compareWith(metricValue(result, c.metric), c.op, c.value);
}

/** The conditions a run fails, as written. */
export function failedConditions(result: RunResult, conditions: readonly Condition[]): string[] {
  return conditions.filter((c) => !meets(result, c)).map((c) => c.text);
}
