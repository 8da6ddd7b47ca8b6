import { pauliStringProblem } from '../circuit/pauliString.js';
import type { RunResult } from '../api/simulate.js';

/**
 * The figures of merit the studies rank, gate and sweep by, read from a run's result:
 * `state` and `classical` fidelity, `purity` (higher is better), `tvd`, `duration` (ns) and
 * `observable:P` = |⟨P⟩noisy − ⟨P⟩ideal| for a Pauli string P, qubit 0 leftmost (lower is better).
 */
export type Metric =
  | { readonly kind: 'state' | 'classical' | 'tvd' | 'purity' | 'duration' }
  | { readonly kind: 'observable'; readonly pauli: string };

/** The plain metric names (observable:P aside). */
export const METRIC_NAMES = ['state', 'classical', 'tvd', 'purity', 'duration'] as const;

/** Parses a metric name; an error message says what is expected. */
export function parseMetric(text: string): Metric | { error: string } {
  const t = text.trim();
  if ((METRIC_NAMES as readonly string[]).includes(t)) return { kind: t as (typeof METRIC_NAMES)[number] };
  if (t.startsWith('observable:')) {
    const pauli = t.slice('observable:'.length).trim();
    if (!/^[IXYZ]+$/.test(pauli)) return { error: `'${t}': expected observable:P with a Pauli string P of I, X, Y, Z, e.g. observable:ZZI` };
    return { kind: 'observable', pauli };
  }
  return { error: `unknown metric '${t}'; expected one of ${METRIC_NAMES.join(', ')}, observable:P` };
}

/** The metric's name as written (`observable:ZZI`). */
export function metricName(m: Metric): string {
  return m.kind === 'observable' ? `observable:${m.pauli}` : m.kind;
}

/** What the metric's number means, for table headers and plot axes. */
export function metricTitle(m: Metric): string {
  switch (m.kind) {
    case 'state':
      return 'state fidelity';
    case 'classical':
      return 'classical fidelity';
    case 'tvd':
      return 'total variation distance';
    case 'purity':
      return 'purity';
    case 'duration':
      return 'duration (ns)';
    case 'observable':
      return `|Δ⟨${m.pauli}⟩|`;
  }
}

/** True when a larger value is better (fidelities and purity). */
export function higherIsBetter(m: Metric): boolean {
  return m.kind === 'state' || m.kind === 'classical' || m.kind === 'purity';
}

/** The Pauli strings the metrics need reported (so runs observe them). */
export function observablesOf(metrics: readonly Metric[]): string[] {
  return [...new Set(metrics.flatMap((m) => (m.kind === 'observable' ? [m.pauli] : [])))];
}

/** Why a metric does not apply to an n-qubit circuit, or undefined. */
export function metricProblem(m: Metric, n: number): string | undefined {
  return m.kind === 'observable' ? pauliStringProblem(m.pauli, n) : undefined;
}

/** The metric's value for one run (the run must have observed the metric's Pauli string). */
export function metricValue(result: RunResult, m: Metric): number {
  switch (m.kind) {
    case 'state':
      return result.fidelity.state;
    case 'classical':
      return result.fidelity.classical;
    case 'tvd':
      return result.tvd;
    case 'purity':
      return result.purity;
    case 'duration':
      return result.duration_ns;
    case 'observable': {
      const o = result.observables?.[m.pauli];
      if (o === undefined) throw new RangeError(`metricValue: the run did not observe ${m.pauli}`);
      return Math.abs(o.noisy - o.ideal);
    }
  }
}

/** The loss of a metric from its ideal value (1 − F for fidelities and purity, the value itself otherwise). */
export function metricLoss(m: Metric, value: number): number {
  return higherIsBetter(m) ? 1 - value : value;
}
