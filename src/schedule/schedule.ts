import type { Operation } from '../circuit/circuit.js';

/**
 * Time scheduling. Times are in ns from t = 0 (all qubits start in |0⟩ at t = 0).
 *
 * ASAP: each application starts when all its qubits are free; `barrier` sets its qubits'
 * free time to the latest among them; `idle` occupies its qubits for its duration.
 * ALAP: the mirror image — ASAP on the reversed program, times reflected t → T − t —
 * so every application runs as late as the later steps allow, with the same total T.
 *
 * Classical dependencies (record mode): a step with `if` starts no earlier than the end of
 * the last earlier measurement that wrote one of its bits plus the profile's measurement
 * latency; a measurement writing bit b starts no earlier than the start of every earlier
 * step that reads or writes b. Each is a constraint start_i ≥ start_j + c with j before i
 * in program order; ALAP mirrors them (see mirrorConstraints).
 *
 * Idle windows: the gaps on a qubit between t = 0, its busy operations (gates, resets,
 * standalone noise, mid-circuit measurements) and its terminal measurement's start (or T
 * when it has none). `idle` steps and barriers are not busy: their time is idle time.
 */

/** One application placed in time: [start, end] in ns. */
export interface TimedOperation {
  readonly op: Operation;
  readonly start: number;
  readonly end: number;
  /** Idle windows that end where this operation starts, on its busy qubits. */
  readonly idleBefore: readonly IdleWindow[];
}

/** A window [start, end] (ns) in which `qubit` waits. */
export interface IdleWindow {
  readonly qubit: number;
  readonly start: number;
  readonly end: number;
}

/** Measurement `measure` (index into items) writes a bit that step `to` (index into items) reads: `to` starts ≥ its end + latency. */
export interface Feed {
  readonly measure: number;
  readonly to: number;
  /** The record bit (index into Circuit.bits) that carries the dependency. */
  readonly bit: number;
  /** Classical latency in ns (the profile's measure latency). */
  readonly latency: number;
}

/** A scheduled circuit: applications in program order, idle windows, total duration (ns). */
export interface Schedule {
  readonly policy: 'asap' | 'alap';
  readonly items: readonly TimedOperation[];
  /** Windows after each qubit's last busy operation, up to the circuit's end (unmeasured qubits only). */
  readonly trailingIdle: readonly IdleWindow[];
  /** Every idle window, sorted by qubit then start. */
  readonly idleWindows: readonly IdleWindow[];
  /** Latest end time of any application, measurement included. */
  readonly duration: number;
  /** Terminal measurement start per qubit (null when never measured terminally). */
  readonly measureStart: readonly (number | null)[];
  /** Which measurement feeds which conditioned step (record mode; empty otherwise). */
  readonly feeds: readonly Feed[];
}

/** start_i ≥ start_j + offset (ns) for an operation j that comes before i in the order scheduled. */
interface Constraint {
  readonly after: number;
  readonly offset: number;
}

/** Options of scheduleOperations. */
export interface ScheduleOptions {
  /** Classical latency (ns) from a measurement's end to the earliest start of a step conditioned on its bit (record mode; default 0). */
  readonly latency?: number;
  /**
   * Simultaneous readout: every measure step starts all its qubits' measurements together, as if
   * a barrier over them came first (default false: each qubit is measured as soon as it is free).
   */
  readonly simultaneousMeasure?: boolean;
}

/** Schedules `ops` on n qubits; `durationOf` gives each application's duration in ns. */
export function scheduleOperations(
  ops: readonly Operation[],
  n: number,
  durationOf: (op: Operation) => number,
  policy: 'asap' | 'alap',
  options: ScheduleOptions = {},
): Schedule {
  const timed = options.simultaneousMeasure === true ? withMeasureBarriers(ops) : ops;
  const dur = timed.map((op) => (op.kind === 'barrier' ? 0 : durationOf(op)));
  const { constraints, feeds } = classicalConstraints(timed, dur, options.latency ?? 0);
  const times = policy === 'asap' ? asap(timed, n, dur, constraints) : alap(timed, n, dur, constraints);
  const schedule = { ...withIdleWindows(timed, n, times.start, times.end, times.total, policy), feeds };
  if (timed === ops) return schedule;
  // the barriers placed for simultaneous readout are not steps of the circuit; feeds follow the items they name
  const own = new Set(ops);
  const index = new Map<number, number>();
  const items = schedule.items.filter((it, i) => {
    if (!own.has(it.op)) return false;
    index.set(i, index.size);
    return true;
  });
  return { ...schedule, items, feeds: feeds.map((f) => ({ ...f, measure: index.get(f.measure)!, to: index.get(f.to)! })) };
}

/** `ops` with a barrier over each measure step's qubits right before its first measurement. */
function withMeasureBarriers(ops: readonly Operation[]): Operation[] {
  const out: Operation[] = [];
  ops.forEach((op, i) => {
    if (op.kind === 'measure' && (i === 0 || ops[i - 1]!.kind !== 'measure' || ops[i - 1]!.step !== op.step)) {
      const qubits = ops.filter((o) => o.kind === 'measure' && o.step === op.step).map((o) => o.qubits[0]!);
      out.push({ kind: 'barrier', step: op.step, at: op.at, qubits });
    }
    out.push(op);
  });
  return out;
}

/** The classical dependencies of `ops` as constraints per operation (indices in program order), and the feeds among them. */
function classicalConstraints(ops: readonly Operation[], dur: readonly number[], latency: number): { constraints: Constraint[][]; feeds: Feed[] } {
  const constraints: Constraint[][] = ops.map(() => []);
  const feeds: Feed[] = [];
  const lastWriter = new Map<number, number>();
  // Steps that read or wrote each bit since (and including) its last write: earlier ones
  // start no later than that write, which the next write already follows.
  const accessors = new Map<number, number[]>();
  ops.forEach((op, i) => {
    const reads = op.kind === 'gate' || op.kind === 'reset' || op.kind === 'channel' ? (op.condition?.terms.map((t) => t.bit) ?? []) : [];
    for (const b of reads) {
      const w = lastWriter.get(b);
      if (w === undefined) continue; // the format stage refuses a read before any write
      constraints[i]!.push({ after: w, offset: dur[w]! + latency });
      feeds.push({ measure: w, to: i, bit: b, latency });
    }
    if (op.kind === 'measure' && op.bit !== undefined) {
      for (const j of accessors.get(op.bit) ?? []) constraints[i]!.push({ after: j, offset: 0 });
      lastWriter.set(op.bit, i);
      accessors.set(op.bit, [i]);
    }
    for (const b of reads) accessors.get(b)?.push(i);
  });
  return { constraints, feeds };
}

function asap(ops: readonly Operation[], n: number, dur: readonly number[], constraints: readonly (readonly Constraint[])[]) {
  const free = new Float64Array(n);
  const start = new Float64Array(ops.length);
  const end = new Float64Array(ops.length);
  let total = 0;
  ops.forEach((op, i) => {
    let t = 0;
    for (const q of op.qubits) t = Math.max(t, free[q]!);
    for (const c of constraints[i]!) t = Math.max(t, start[c.after]! + c.offset);
    const d = dur[i]!;
    start[i] = t;
    end[i] = t + d;
    for (const q of op.qubits) free[q] = t + d;
    if (op.kind !== 'barrier') total = Math.max(total, t + d);
  });
  return { start, end, total };
}

/**
 * The constraints of the reversed program whose ASAP schedule, reflected t → T − t, is the
 * mirror image: start_i ≥ start_j + c becomes, with s' = T − start − d (the reflected start),
 * s'_j ≥ s'_i + d_i − d_j + c, and j now comes after i.
 */
function mirrorConstraints(constraints: readonly (readonly Constraint[])[], dur: readonly number[]): Constraint[][] {
  const m = constraints.length;
  const out: Constraint[][] = constraints.map(() => []);
  constraints.forEach((list, i) => {
    for (const c of list) out[m - 1 - c.after]!.push({ after: m - 1 - i, offset: dur[i]! - dur[c.after]! + c.offset });
  });
  return out;
}

function alap(ops: readonly Operation[], n: number, dur: readonly number[], constraints: readonly (readonly Constraint[])[]) {
  const reversed = [...ops].reverse();
  const r = asap(reversed, n, [...dur].reverse(), mirrorConstraints(constraints, dur));
  const m = ops.length;
  const start = new Float64Array(m);
  const end = new Float64Array(m);
  for (let i = 0; i < m; i++) {
    const j = m - 1 - i;
    start[i] = r.total - r.end[j]!;
    end[i] = r.total - r.start[j]!;
  }
  return { start, end, total: r.total };
}

function isBusy(op: Operation): boolean {
  return op.kind === 'gate' || op.kind === 'reset' || op.kind === 'channel' || op.kind === 'measure';
}

function withIdleWindows(
  ops: readonly Operation[],
  n: number,
  start: Float64Array,
  end: Float64Array,
  total: number,
  policy: 'asap' | 'alap',
): Omit<Schedule, 'feeds'> {
  const lastEnd = new Float64Array(n);
  const measureStart: (number | null)[] = Array.from({ length: n }, () => null);
  const all: IdleWindow[] = [];
  const items: TimedOperation[] = ops.map((op, i) => {
    const idleBefore: IdleWindow[] = [];
    if (isBusy(op)) {
      for (const q of op.qubits) {
        if (start[i]! > lastEnd[q]!) {
          const w = { qubit: q, start: lastEnd[q]!, end: start[i]! };
          idleBefore.push(w);
          all.push(w);
        }
        lastEnd[q] = Math.max(lastEnd[q]!, end[i]!);
        if (op.kind === 'measure' && op.bit === undefined) measureStart[q] = start[i]!;
      }
    }
    return { op, start: start[i]!, end: end[i]!, idleBefore };
  });
  const trailingIdle: IdleWindow[] = [];
  for (let q = 0; q < n; q++) {
    if (measureStart[q] !== null) continue;
    if (total > lastEnd[q]!) {
      const w = { qubit: q, start: lastEnd[q]!, end: total };
      trailingIdle.push(w);
      all.push(w);
    }
  }
  all.sort((a, b) => a.qubit - b.qubit || a.start - b.start);
  return { policy, items, trailingIdle, idleWindows: all, duration: total, measureStart };
}
