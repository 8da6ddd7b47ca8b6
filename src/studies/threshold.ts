import { fmt } from './compare.js';
import { meets, type Condition } from './conditions.js';
import { metricValue } from './metrics.js';
import { NOISE_SCALE_KEY, valueText, type Interval } from './ranges.js';
import { asVaryMessage, runPoint } from './sweep.js';
import { InputError } from '../format/problem.js';
import type { RunResult } from '../api/simulate.js';
import { SourceCache, type StudyTarget, type VariantChoice } from './variant.js';

/**
 * `fray threshold`: the value of one key at which a condition is just met, by bracketing and
 * bisection. The metric is assumed monotone in the key; THRESHOLD_SCAN_POINTS evenly spaced
 * samples over the interval find the bracket (where the condition changes between two
 * neighbours) and check that assumption, and every later sample is checked again.
 */

/** Evenly spaced samples taken first, ends included. */
export const THRESHOLD_SCAN_POINTS = 5;

/** Metric values within this of each other count as equal in the monotonicity check (rounding, not a turn). */
export const MONOTONE_TOLERANCE = 1e-12;

/** Options of a threshold search. */
export interface ThresholdOptions extends StudyTarget {
  readonly target: Condition;
  readonly vary: Interval;
  /** Stop when the bracket is this narrow (base units); default (B − A)·1e-6. */
  readonly tol?: number;
}

/** One evaluated point. */
export interface ThresholdSample {
  readonly value: number;
  readonly metric: number;
  readonly meets: boolean;
}

/** The outcome: where the condition turns, or that it holds everywhere or nowhere on the samples. */
export interface ThresholdResult {
  readonly key: string;
  readonly unit: string | null;
  readonly target: string;
  readonly status: 'crossed' | 'met-everywhere' | 'met-nowhere';
  /** The bracket's end that meets the target (the threshold, to the tolerance), when crossed. */
  readonly threshold?: number;
  /** The final bracket [lo, hi] and the metric at both ends. */
  readonly bracket?: { readonly lo: ThresholdSample; readonly hi: ThresholdSample };
  /** The interval's ends as evaluated. */
  readonly ends: { readonly lo: ThresholdSample; readonly hi: ThresholdSample };
  readonly tolerance: number;
  /** False when the samples taken show the metric turning (the answer may then not be the only crossing). */
  readonly monotone: boolean;
  /** Every sample, in the order of the key's value. */
  readonly samples: readonly ThresholdSample[];
  /** One plain sentence saying what was found. */
  readonly verdict: string;
}

/** Whether the samples' metric values, sorted by value, never go both up and down. */
function isMonotone(samples: readonly ThresholdSample[]): boolean {
  let up = false;
  let down = false;
  for (let i = 1; i < samples.length; i++) {
    const d = samples[i]!.metric - samples[i - 1]!.metric;
    if (d > MONOTONE_TOLERANCE) up = true;
    if (d < -MONOTONE_TOLERANCE) down = true;
  }
  return !(up && down);
}

/** Finds the threshold. Throws InputError on bad input (at any evaluated point). */
export function findThreshold(o: ThresholdOptions): ThresholdResult {
  const cache = new SourceCache();
  const { vary, target } = o;
  const tol = o.tol ?? (vary.hi - vary.lo) * 1e-6;
  const samples: ThresholdSample[] = [];
  const evaluate = (x: number): ThresholdSample => {
    const choice: VariantChoice = {
      set: [...(o.set ?? []), ...(vary.key === NOISE_SCALE_KEY ? [] : [{ key: vary.key, value: valueText(x, vary.unit) }])],
      ...(vary.key === NOISE_SCALE_KEY ? { noiseScale: x } : o.noiseScale !== undefined ? { noiseScale: o.noiseScale } : {}),
      ...(o.layout !== undefined ? { layout: o.layout } : {}),
    };
    const observe = target.metric.kind === 'observable' ? [target.metric.pauli] : [];
    let result: RunResult;
    try {
      result = runPoint(cache, { file: o.file, ...(o.device !== undefined ? { device: o.device } : {}) }, choice, observe);
    } catch (e) {
      // name the --vary and the value a problem came from, as sweeps do
      if (!(e instanceof InputError)) throw e;
      const value = valueText(x, vary.unit);
      throw new InputError(e.problems.map((p) => ({ ...p, message: asVaryMessage(p.message, vary.key, value, vary.text) ?? p.message })));
    }
    const m = metricValue(result, target.metric);
    const s = { value: x, metric: m, meets: meets(result, target) };
    samples.push(s);
    return s;
  };
  const scan: ThresholdSample[] = [];
  for (let i = 0; i < THRESHOLD_SCAN_POINTS; i++) {
    const x = i === THRESHOLD_SCAN_POINTS - 1 ? vary.hi : vary.lo + ((vary.hi - vary.lo) * i) / (THRESHOLD_SCAN_POINTS - 1);
    scan.push(evaluate(x));
  }
  const ends = { lo: scan[0]!, hi: scan[scan.length - 1]! };
  const sorted = () => [...samples].sort((a, b) => a.value - b.value);
  const base = { key: vary.key, unit: vary.unit, target: target.text, ends, tolerance: tol };
  const show = (x: number) => `${Number(x.toPrecision(10))}${vary.unit ?? ''}`;
  const changes = scan.findIndex((s, i) => i > 0 && s.meets !== scan[i - 1]!.meets);
  if (changes < 0) {
    const all = scan[0]!.meets;
    const monotone = isMonotone(sorted());
    return {
      ...base,
      status: all ? 'met-everywhere' : 'met-nowhere',
      monotone,
      samples: sorted(),
      verdict: `${target.text} is met ${all ? 'everywhere' : 'nowhere'} on ${vary.key} from ${show(vary.lo)} to ${show(vary.hi)} (${scan.length} samples; ${target.metric.kind} from ${fmt(ends.lo.metric)} to ${fmt(ends.hi.metric)})${monotone ? '' : '; the metric is not monotone on these samples, so the range may hide a crossing'}.`,
    };
  }
  let lo = scan[changes - 1]!;
  let hi = scan[changes]!;
  while (hi.value - lo.value > tol) {
    const mid = evaluate(lo.value + (hi.value - lo.value) / 2);
    if (mid.value <= lo.value || mid.value >= hi.value) break; // the doubles cannot split the bracket further
    if (mid.meets === lo.meets) lo = mid;
    else hi = mid;
  }
  const monotone = isMonotone(sorted()) && scan.filter((s, i) => i > 0 && s.meets !== scan[i - 1]!.meets).length === 1;
  const good = lo.meets ? lo : hi;
  return {
    ...base,
    status: 'crossed',
    threshold: good.value,
    bracket: { lo, hi },
    monotone,
    samples: sorted(),
    verdict:
      `${target.text} holds ${lo.meets ? 'up to' : 'from'} ${vary.key} = ${show(good.value)}: between ${show(lo.value)} (${target.metric.kind} ${fmt(lo.metric)}) and ${show(hi.value)} (${fmt(hi.metric)}), to ±${show(tol)}` +
      `${monotone ? '' : '; the metric is not monotone on the samples taken, so there may be other crossings'}.`,
  };
}
