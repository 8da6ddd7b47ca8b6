/**
 * Durations in input files: a non-negative number with a unit, always in nanoseconds
 * inside fray. Units: ns, us (also µs, μs), ms, s. A bare number is refused, because
 * a profile that says `duration: 35` is ambiguous.
 */
import { NUMBER_SOURCE, PLAIN_NUMBER_RE } from './numberSyntax.js';

/** Nanoseconds per unit. */
export const DURATION_UNITS: Readonly<Record<string, number>> = {
  ns: 1,
  us: 1e3,
  'µs': 1e3,
  'μs': 1e3,
  ms: 1e6,
  s: 1e9,
};

/**
 * Longest duration fray accepts, in ns (10^6 s, about 11.6 days), for one duration and for a
 * whole circuit's schedule. Far beyond any coherence time, and far below where sums of
 * durations lose their nanoseconds (2^53 ns ≈ 104 days) or overflow.
 */
export const MAX_DURATION_NS = 1e15;

/** A duration as written: a number, optional spaces, a unit of DURATION_UNITS (the JSON Schemas use this pattern too). */
export const DURATION_PATTERN = `^\\s*(${NUMBER_SOURCE})\\s*(ns|us|µs|μs|ms|s)\\s*$`;
const DURATION_RE = new RegExp(DURATION_PATTERN);

/** Parses '35ns', '1.2us', '2 ms' into nanoseconds, or returns an error message. */
export function parseDuration(text: string): { ns: number } | { error: string } {
  const m = DURATION_RE.exec(text);
  if (m === null) {
    if (PLAIN_NUMBER_RE.test(text)) {
      return { error: `duration '${text}' has no unit; write it with ns, us (µs), ms or s, e.g. '${text.trim()}ns'` };
    }
    return { error: `'${text}' is not a duration; expected a number with a unit ns, us (µs), ms or s, e.g. 35ns or 1.2us` };
  }
  const value = Number(m[1]) * DURATION_UNITS[m[2]!]!;
  if (value < 0) return { error: `duration '${text}' is negative; expected zero or more` };
  if (!(value <= MAX_DURATION_NS)) return { error: `duration '${text}' is longer than fray accepts (at most ${MAX_DURATION_NS / 1e9} s)` };
  return { ns: value };
}

/** Formats nanoseconds for people: 35 ns, 1.2 µs, 3.5 ms. */
export function formatDuration(ns: number): string {
  if (ns === 0) return '0 ns';
  if (ns < 1e3) return `${trim(ns)} ns`;
  if (ns < 1e6) return `${trim(ns / 1e3)} µs`;
  if (ns < 1e9) return `${trim(ns / 1e6)} ms`;
  return `${trim(ns / 1e9)} s`;
}

function trim(x: number): string {
  return String(Number(x.toPrecision(6)));
}
