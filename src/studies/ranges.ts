import { DURATION_UNITS } from '../format/duration.js';
import { NUMBER_SOURCE } from '../format/numberSyntax.js';

/**
 * The values of one varied key, `--vary KEY=RANGE`:
 *   A..B:N        N points, evenly spaced, both ends included
 *   A..B:log:N    N points evenly spaced in log(value) (A, B > 0)
 *   A..B          (threshold only) the interval itself
 *   v1,v2,v3      a list
 * Values may carry a unit of a family below (`20us..200us:log:10`, `50kHz`); they are
 * converted to the family's base unit (ns, Hz), which is what output files hold and what
 * is passed on as `VALUE BASEUNIT`. A new unit family is one row of UNIT_FAMILIES.
 */

/** A family of units: the base unit (what sweep files hold) and each unit's size in it. */
export interface UnitFamily {
  readonly base: string;
  readonly units: Readonly<Record<string, number>>;
}

/** Units a varied value may carry. */
export const UNIT_FAMILIES: readonly UnitFamily[] = [
  { base: 'ns', units: DURATION_UNITS },
  { base: 'Hz', units: { Hz: 1, kHz: 1e3, MHz: 1e6, GHz: 1e9 } },
];

/** The key of the uniform noise scale (not a profile field: it becomes --noise-scale). */
export const NOISE_SCALE_KEY = 'noise-scale';

/** One varied key with its values in base units. */
export interface Varied {
  readonly key: string;
  /** Values in base units (ns, Hz, or plain numbers), in sweep order. */
  readonly values: readonly number[];
  /** The base unit of the values, or null for plain numbers. */
  readonly unit: string | null;
  /** True for a log range (plots use a log axis). */
  readonly log: boolean;
  /** The range as written. */
  readonly text: string;
}

/** An interval A..B of one key (threshold's search range), in base units. */
export interface Interval {
  readonly key: string;
  readonly lo: number;
  readonly hi: number;
  readonly unit: string | null;
  readonly text: string;
}

const NUMBER_UNIT_RE = new RegExp(`^\\s*(${NUMBER_SOURCE})\\s*([A-Za-zµμ]*)\\s*$`);

/** A number with an optional unit, in base units. */
export function parseQuantity(text: string): { value: number; unit: string | null } | { error: string } {
  const m = NUMBER_UNIT_RE.exec(text);
  if (m === null) return { error: `'${text}' is not a number (with an optional unit such as us or kHz)` };
  const x = Number(m[1]);
  const u = m[2]!;
  if (u === '') return { value: x, unit: null };
  for (const f of UNIT_FAMILIES) {
    const size = f.units[u];
    if (size !== undefined) return { value: x * size, unit: f.base };
  }
  const all = UNIT_FAMILIES.flatMap((f) => Object.keys(f.units));
  return { error: `'${text}': unknown unit '${u}'; expected one of ${all.join(', ')}` };
}

/** Splits `KEY=RANGE` at the last '=' that is not inside the key (keys never contain '='). */
function splitKey(text: string): { key: string; range: string } | { error: string } {
  const eq = text.indexOf('=');
  if (eq <= 0) return { error: `'${text}': expected KEY=RANGE, e.g. gates.cx.error=0.001..0.02:8 or qubits.all.t1=20us..200us:log:10` };
  return { key: text.slice(0, eq).trim(), range: text.slice(eq + 1).trim() };
}

/** One unit for all values: every one plain, or every one of the same family. */
function commonUnit(qs: readonly { unit: string | null }[], text: string): string | null | { error: string } {
  const units = new Set(qs.map((q) => q.unit));
  if (units.size > 1) return { error: `'${text}': the values mix units (${[...units].map((u) => u ?? 'none').join(', ')}); give all of them in one kind of unit` };
  return qs[0]!.unit;
}

/** The two ends of `A..B` in one unit. */
function parseEnds(aText: string, bText: string, text: string): { a: number; b: number; unit: string | null } | { error: string } {
  const a = parseQuantity(aText);
  const b = parseQuantity(bText);
  if ('error' in a) return a;
  if ('error' in b) return b;
  const unit = commonUnit([a, b], text);
  if (typeof unit === 'object' && unit !== null) return unit;
  return { a: a.value, b: b.value, unit };
}

/** Parses `KEY=RANGE` into the key's values. */
export function parseVary(text: string): Varied | { error: string } {
  const kr = splitKey(text);
  if ('error' in kr) return kr;
  const { key, range } = kr;
  const m = /^(.+?)\.\.(.+?)(?::(log))?:(\d+)$/.exec(range);
  if (m !== null) {
    const ends = parseEnds(m[1]!, m[2]!, text);
    if ('error' in ends) return ends;
    const n = Number(m[4]);
    if (!Number.isSafeInteger(n) || n < 1 || n > MAX_POINTS_PER_KEY) return { error: `'${text}': the number of points must be from 1 to ${MAX_POINTS_PER_KEY}` };
    const log = m[3] === 'log';
    if (log && !(ends.a > 0 && ends.b > 0)) return { error: `'${text}': a log range needs both ends above zero` };
    return { key, values: spaced(ends.a, ends.b, n, log), unit: ends.unit, log, text };
  }
  if (range.includes('..')) return { error: `'${text}': a range needs its number of points, e.g. ${key}=${range}:10 (or ${key}=${range}:log:10)` };
  const items = range.split(',').map((s) => parseQuantity(s));
  for (const q of items) if ('error' in q) return q;
  const qs = items as { value: number; unit: string | null }[];
  const unit = commonUnit(qs, text);
  if (typeof unit === 'object' && unit !== null) return unit;
  return { key, values: qs.map((q) => q.value), unit, log: false, text };
}

/** Parses `KEY=A..B` (threshold's interval). */
export function parseInterval(text: string): Interval | { error: string } {
  const kr = splitKey(text);
  if ('error' in kr) return kr;
  const m = /^(.+?)\.\.(.+)$/.exec(kr.range);
  if (m === null) return { error: `'${text}': expected KEY=A..B, e.g. gates.cx.error=0.0001..0.05` };
  const ends = parseEnds(m[1]!, m[2]!, text);
  if ('error' in ends) return ends;
  if (!(ends.a < ends.b)) return { error: `'${text}': the interval must go from a smaller to a larger value` };
  return { key: kr.key, lo: ends.a, hi: ends.b, unit: ends.unit, text };
}

/** Most points of one varied key. */
export const MAX_POINTS_PER_KEY = 100_000;

/** N values from a to b inclusive, evenly spaced in value or in log(value); the ends are exact. */
export function spaced(a: number, b: number, n: number, log: boolean): number[] {
  if (n === 1) return [a];
  const out: number[] = [];
  for (let i = 0; i < n; i++) {
    const t = i / (n - 1);
    out.push(i === 0 ? a : i === n - 1 ? b : log ? Math.exp(Math.log(a) + (Math.log(b) - Math.log(a)) * t) : a + (b - a) * t);
  }
  return out;
}

/** The text a value is passed on as: `VALUE BASEUNIT` (e.g. `20000ns`), or the plain number. */
export function valueText(value: number, unit: string | null): string {
  return unit === null ? String(value) : `${value}${unit}`;
}
