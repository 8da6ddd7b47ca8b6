import { createHash } from 'node:crypto';
import { readInputFile } from '../api/readInput.js';
import type { RunResult } from '../api/simulate.js';
import type { Override } from '../format/overrides.js';
import { instantiate } from '../api/loadCircuit.js';
import { fileStart, InputError, ProblemList, type Problem } from '../format/problem.js';
import { metricName, metricProblem, observablesOf, type Metric } from './metrics.js';
import { NOISE_SCALE_KEY, valueText, type Varied } from './ranges.js';
import { loadOptionsOf, runVariant, SourceCache, type StudyTarget, type VariantChoice } from './variant.js';

/**
 * `fray sweep`: one circuit over the Cartesian product of varied keys (the first key
 * outermost, the last fastest). A point's index i in that grid order is its identity:
 * shards take i ≡ I (mod N), resumed and merged files are checked against it, and rows are
 * handed out in grid order whatever order the workers finish in.
 */

/** What a sweep runs: the circuit, the fixed choices, the varied keys, the reported observables. */
export interface SweepSpec extends StudyTarget {
  /** The keys and their values (a varied `noise-scale` replaces a fixed noise scale). */
  readonly vary: readonly Varied[];
  /** Metrics reported (their Pauli strings are observed at every point). */
  readonly metrics?: readonly Metric[];
}

/** The grid of a sweep and its fingerprint. */
export interface SweepPlan {
  readonly spec: SweepSpec;
  /** Number of points (the product of the keys' value counts). */
  readonly total: number;
  /** Pauli strings observed at every point. */
  readonly observe: readonly string[];
  /** 16 hex digits identifying circuit text, device, fixed choices, keys and values: parts of one sweep share it. */
  readonly fingerprint: string;
}

/** One point of the grid: its index, each key's value (base units), and the choice that runs it. */
export interface SweepPoint {
  readonly index: number;
  readonly values: Readonly<Record<string, number>>;
  readonly choice: VariantChoice;
}

/** One finished point. */
export interface SweepRow {
  readonly index: number;
  readonly values: Readonly<Record<string, number>>;
  readonly result: RunResult;
}

/** Plans a sweep: the grid size, observables and fingerprint (reads the circuit text once for the fingerprint). */
export function planSweep(spec: SweepSpec): SweepPlan {
  const keys = spec.vary.map((v) => v.key);
  const twice = keys.find((k, i) => keys.indexOf(k) !== i);
  if (twice !== undefined) throw new RangeError(`planSweep: '${twice}' is varied twice`);
  const total = spec.vary.reduce((n, v) => n * v.values.length, 1);
  const observe = observablesOf(spec.metrics ?? []);
  // the source first: it refuses an unreadable, special or oversized file with a located error
  const source = new SourceCache().get(spec.file, spec.device);
  const read = new ProblemList();
  const text = readInputFile(spec.file, fileStart(spec.file), 'circuit file', read);
  read.throwIfErrors();
  const circuitHash = createHash('sha256').update(text!, 'utf8').digest('hex');
  const identity = {
    circuit: circuitHash,
    device: source.deviceSpec ?? null,
    set: spec.set ?? [],
    noiseScale: spec.noiseScale ?? null,
    layout: spec.layout ?? null,
    vary: spec.vary.map((v) => ({ key: v.key, unit: v.unit, values: v.values })),
    observe,
  };
  const fingerprint = createHash('sha256').update(JSON.stringify(identity)).digest('hex').slice(0, 16);
  return { spec, total, observe, fingerprint };
}

/** The point at grid index i (mixed radix, last key fastest). */
export function pointAt(plan: SweepPlan, index: number): SweepPoint {
  const values: Record<string, number> = Object.create(null) as Record<string, number>;
  const set: Override[] = [...(plan.spec.set ?? [])];
  let noiseScale = plan.spec.noiseScale;
  let rest = index;
  const coords: number[] = [];
  for (let k = plan.spec.vary.length - 1; k >= 0; k--) {
    const n = plan.spec.vary[k]!.values.length;
    coords[k] = rest % n;
    rest = Math.floor(rest / n);
  }
  plan.spec.vary.forEach((v, k) => {
    const x = v.values[coords[k]!]!;
    values[v.key] = x;
    if (v.key === NOISE_SCALE_KEY) noiseScale = x;
    else set.push({ key: v.key, value: valueText(x, v.unit) });
  });
  return {
    index,
    values: { ...values },
    choice: { set, ...(noiseScale !== undefined ? { noiseScale } : {}), ...(plan.spec.layout !== undefined ? { layout: plan.spec.layout } : {}) },
  };
}

/** Which points to run: a shard I/N (i ≡ I mod N) and the indices already done. */
export interface SweepSelection {
  readonly shard?: { readonly index: number; readonly count: number };
  readonly skip?: ReadonlySet<number>;
}

/** The grid indices a selection runs, ascending. */
export function selectedIndices(plan: SweepPlan, sel: SweepSelection = {}): number[] {
  const out: number[] = [];
  const start = sel.shard?.index ?? 0;
  const step = sel.shard?.count ?? 1;
  for (let i = start; i < plan.total; i += step) if (!sel.skip?.has(i)) out.push(i);
  return out;
}

/** How a sweep runs: worker threads and callbacks. */
export interface SweepRunOptions extends SweepSelection {
  /** Worker threads running whole points (1 = in this thread). */
  readonly jobs?: number;
  /** Called with each finished point in grid order (rows are held back until those before them are done). */
  readonly onRow?: (row: SweepRow) => void;
  /** Called after each finished point with the count done and the count to do. */
  readonly onProgress?: (done: number, total: number) => void;
}

/** Runs one point in this thread (what each worker does too). Throws InputError on bad input. */
export function runPoint(cache: SourceCache, spec: Pick<SweepSpec, 'file' | 'device'>, choice: VariantChoice, observe: readonly string[]): RunResult {
  return runVariant(cache.get(spec.file, spec.device), choice, { observe, threads: 1 }).result;
}

/** Runs the selected points of a sweep and returns the rows in grid order. */
export async function runSweep(plan: SweepPlan, options: SweepRunOptions = {}): Promise<SweepRow[]> {
  const indices = selectedIndices(plan, options);
  const rows: SweepRow[] = [];
  const ready = new Map<number, SweepRow>();
  let next = 0;
  let done = 0;
  // Rows leave in grid order: a finished point waits until every earlier selected point is out.
  const finish = (row: SweepRow): void => {
    ready.set(row.index, row);
    done++;
    while (next < indices.length && ready.has(indices[next]!)) {
      const r = ready.get(indices[next]!)!;
      ready.delete(r.index);
      rows.push(r);
      options.onRow?.(r);
      next++;
    }
    options.onProgress?.(done, indices.length);
  };
  const points = indices.map((i) => pointAt(plan, i));
  const jobs = Math.max(1, Math.min(options.jobs ?? 1, points.length));
  if (jobs === 1) {
    const cache = new SourceCache();
    for (const p of points) {
      finish({ index: p.index, values: p.values, result: runPoint(cache, plan.spec, p.choice, plan.observe) });
      // let the event loop draw progress and take signals between points
      await new Promise((r) => setImmediate(r));
    }
  } else {
    // the pool (piscina) loads only when a sweep uses worker threads
    const { runPointsInPool } = await import('./sweepPool.js');
    await runPointsInPool(plan, points, jobs, (p, result) => finish({ index: p.index, values: p.values, result }));
  }
  return rows;
}

/**
 * Checks every selected point before any runs (each is typed, none simulated), so a value
 * out of range anywhere in the grid is refused up front with nothing written. Returns the
 * Pauli strings each row reports (the circuit's `observe:` then the metrics', in order) and
 * the circuit's and device's names.
 */
export function checkSweep(plan: SweepPlan, sel: SweepSelection = {}): SweepCheck {
  const cache = new SourceCache();
  const source = cache.get(plan.spec.file, plan.spec.device);
  const seen = new Set<string>();
  const errors: Problem[] = [];
  let observables: string[] | undefined;
  let names: { name: string | null; device: string | null } | undefined;
  const problems = new ProblemList();
  for (const i of selectedIndices(plan, sel)) {
    const p = pointAt(plan, i);
    problems.items.length = 0;
    const loaded = instantiate(source, problems, loadOptionsOf(p.choice));
    for (const e of problems.errors) {
      // One report per place and kind: the first point where it happens stands for the rest.
      const key = `${e.file}:${e.line}:${e.col}:${e.code}`;
      if (seen.has(key)) continue;
      seen.add(key);
      errors.push({ ...e, message: pointMessage(plan, e.message, i, p.values) });
    }
    if (loaded !== undefined) {
      for (const m of plan.spec.metrics ?? []) {
        const bad = metricProblem(m, loaded.circuit.register.n);
        if (bad !== undefined && !seen.has(bad)) {
          seen.add(bad);
          errors.push({ ...loaded.circuit.qubitsAt, severity: 'error', code: 'bad-metric', message: `${metricName(m)}: ${bad}` });
        }
      }
      observables ??= [...new Set([...loaded.circuit.observe.map((o) => o.value), ...plan.observe])];
      names ??= { name: loaded.circuit.name, device: loaded.profile.name };
    }
    if (errors.length >= MAX_REPORTED_POINT_ERRORS) break;
  }
  if (errors.length > 0) throw new InputError(errors);
  return { observables: observables ?? [...plan.observe], name: names?.name ?? null, device: names?.device ?? null };
}

/** What checkSweep found out about the sweep's rows. */
export interface SweepCheck {
  /** The Pauli strings every row reports, in order. */
  readonly observables: readonly string[];
  /** The circuit's `name:` and the device's name (for titles). */
  readonly name: string | null;
  readonly device: string | null;
}

/**
 * A point's problem in the words of the sweep: an override of a varied key is named by its
 * --vary and the value it had (`--vary qubits.all.t1=20us..50us:3 at qubits.all.t1=20000ns: …`);
 * any other problem gets the point appended.
 */
function pointMessage(plan: SweepPlan, message: string, index: number, values: Readonly<Record<string, number>>): string {
  for (const v of plan.spec.vary) {
    const renamed = asVaryMessage(message, v.key, valueText(values[v.key]!, v.unit), v.text);
    if (renamed !== undefined) return renamed;
  }
  return `${message} (at point ${index}: ${describePoint(values)})`;
}

/** `--set KEY=VALUE: …` as `--vary RANGE at KEY=VALUE: …` when the message is about that override, else undefined. */
export function asVaryMessage(message: string, key: string, value: string, varyText: string): string | undefined {
  const prefix = `--set ${key}=${value}: `;
  return message.startsWith(prefix) ? `--vary ${varyText} at ${key}=${value}: ${message.slice(prefix.length)}` : undefined;
}

/** A sweep stops listing point problems after this many. */
export const MAX_REPORTED_POINT_ERRORS = 20;

/** `key=value, key=value` of a point (base units). */
export function describePoint(values: Readonly<Record<string, number>>): string {
  return Object.entries(values)
    .map(([k, v]) => `${k}=${v}`)
    .join(', ');
}
