import type { Operation } from '../circuit/circuit.js';

/**
 * Time scheduling. Times are in ns from t = 0 (all qubits start in |0⟩ at t = 0).
 *
 * ASAP: each application starts when all its qubits are free; `barrier` sets its qubits'
 * free time to the latest among them; `idle` occupies its qubits for its duration.
 * ALAP: the mirror image — ASAP on the reversed program, times reflected t → T − t —
 * so every application runs as late as the later steps allow, with the same total T.
 *
 * Idle windows: the gaps on a qubit between t = 0, its busy operations (gates, resets,
 * standalone noise, which take zero time) and its measurement start (or T when it is
 * never measured). `idle` steps and barriers are not busy: their time is idle time.
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
  /** Measurement start per qubit (null when never measured). */
  readonly measureStart: readonly (number | null)[];
}

/** Options of scheduleOperations. */
export interface ScheduleOptions {
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
  const times = policy === 'asap' ? asap(timed, n, durationOf) : alap(timed, n, durationOf);
  const schedule = withIdleWindows(timed, n, times.start, times.end, times.total, policy);
  if (timed === ops) return schedule;
  // the barriers placed for simultaneous readout are not steps of the circuit
  const own = new Set(ops);
  return { ...schedule, items: schedule.items.filter((it) => own.has(it.op)) };
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

function asap(ops: readonly Operation[], n: number, durationOf: (op: Operation) => number) {
  const free = new Float64Array(n);
  const start = new Float64Array(ops.length);
  const end = new Float64Array(ops.length);
  let total = 0;
  ops.forEach((op, i) => {
    let t = 0;
    for (const q of op.qubits) t = Math.max(t, free[q]!);
    const d = op.kind === 'barrier' ? 0 : durationOf(op);
    start[i] = t;
    end[i] = t + d;
    for (const q of op.qubits) free[q] = t + d;
    if (op.kind !== 'barrier') total = Math.max(total, t + d);
  });
  return { start, end, total };
}

function alap(ops: readonly Operation[], n: number, durationOf: (op: Operation) => number) {
  const reversed = [...ops].reverse();
  const r = asap(reversed, n, durationOf);
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
): Schedule {
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
        if (op.kind === 'measure') measureStart[q] = start[i]!;
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
