/**
 * Dynamical decoupling as a circuit transform: every idle window of a qubit at least
 * `minIdle` long is filled with a sequence of π pulses and waits that spans it exactly.
 *
 * - `xx`: X, X with the Carr–Purcell spacing f/4, X, f/2, X, f/4 (E. L. Hahn, Phys. Rev. 80,
 *   580 (1950); H. Y. Carr, E. M. Purcell, Phys. Rev. 94, 630 (1954)), f being the window minus
 *   the pulses' durations. It refocuses a static Z term: rz(a/4)·X·rz(a/2)·X·rz(a/4) = I.
 * - `xy4`: X, Y, X, Y with the symmetric spacing f/8, f/4, f/4, f/4, f/8 (common practice); it
 *   refocuses static errors about two axes, to first order.
 *
 * The pulses are the built-in `x` and `y` gates on the idle qubit, so they take their profile
 * entries (duration and noise) like any other gate; the waits are `idle` steps, which relax
 * under `idle: thermal` as the window did. An `idle` step of the user inside a filled window is
 * replaced by the sequence. A sequence whose pulses do not fit in the window is not inserted,
 * nor one that would move any other operation in time (a barrier or an aligned measurement
 * inside the window): the transform says which windows it filled and which it left, and why.
 * The ideal run is unchanged (X·X = I, X·Y·X·Y = −I, a global phase).
 */
import type { Circuit, GateOperation, IdleOperation, Operation } from '../circuit/circuit.js';
import { BUILTIN_GATES } from '../circuit/gates.js';
import { scheduleCircuit } from '../api/simulate.js';
import type { NoiseProfile } from '../noise/profile.js';
import { deviceOperations } from '../schedule/deviceOperations.js';
import type { DecouplingSequence } from './sequences.js';
import type { IdleWindow, Schedule } from '../schedule/schedule.js';

export { DECOUPLING_SEQUENCES, type DecouplingSequence } from './sequences.js';

/** What to insert: the sequence, the shortest window filled (ns), and optionally which qubits (default all). */
export interface DecouplingOptions {
  readonly sequence: DecouplingSequence;
  readonly minIdle: number;
  readonly qubits?: readonly number[];
}

/** A window the transform filled (times in ns of the input's schedule). */
export interface DecouplingInsertion {
  readonly qubit: number;
  readonly start: number;
  readonly end: number;
  readonly pulses: readonly string[];
}

/** A window at least minIdle long that was left as it was, and why. */
export interface DecouplingSkip {
  readonly qubit: number;
  readonly start: number;
  readonly end: number;
  readonly reason: string;
}

/** The transformed circuit and the record of what was inserted where. */
export interface DecouplingResult {
  readonly circuit: Circuit;
  readonly inserted: readonly DecouplingInsertion[];
  readonly skipped: readonly DecouplingSkip[];
}

/** Two times (ns) closer than this are the same instant (sums of a few durations). */
export const SAME_TIME_NS = 1e-9;

const PULSES: Record<DecouplingSequence, readonly ('x' | 'y')[]> = { xx: ['x', 'x'], xy4: ['x', 'y', 'x', 'y'] };

/** Fractions of the free time f before, between and after the pulses (they sum to 1). */
const SPACING: Record<DecouplingSequence, readonly number[]> = { xx: [1 / 4, 1 / 2, 1 / 4], xy4: [1 / 8, 1 / 4, 1 / 4, 1 / 4, 1 / 8] };

/** Fills the idle windows of `circuit` (scheduled under `profile`) with a decoupling sequence (see the module comment). */
export function insertDecoupling(circuit: Circuit, profile: NoiseProfile, options: DecouplingOptions): DecouplingResult {
  if (!(options.minIdle >= 0)) throw new RangeError(`insertDecoupling: minIdle must be ≥ 0 ns, not ${options.minIdle}`);
  const only = options.qubits === undefined ? null : new Set(options.qubits);
  const base = schedule(circuit.operations, circuit, profile);
  const inserted: DecouplingInsertion[] = [];
  const skipped: DecouplingSkip[] = [];
  let ops: readonly Operation[] = circuit.operations;
  for (const w of base.idleWindows) {
    if (only !== null && !only.has(w.qubit)) continue;
    const length = w.end - w.start;
    if (length < options.minIdle || length <= SAME_TIME_NS) continue;
    const names = PULSES[options.sequence];
    const free = length - names.reduce((acc, name) => acc + profile.gateEntry(name, [w.qubit]).duration, 0);
    if (free < -SAME_TIME_NS) {
      skipped.push({ ...w, reason: `the ${names.length} pulses take ${length - free} ns, more than the window` });
      continue;
    }
    const candidate = fill(ops, w, names, SPACING[options.sequence].map((f) => Math.max(free, 0) * f), circuit, profile);
    if (candidate === undefined || !keepsTimes(base, schedule(candidate, circuit, profile), candidate)) {
      skipped.push({ ...w, reason: 'filling it would move other operations (a barrier or an aligned measurement inside the window)' });
      continue;
    }
    ops = candidate;
    inserted.push({ ...w, pulses: names });
  }
  return { circuit: { ...circuit, operations: ops }, inserted, skipped };
}

/** The schedule of a list of operations as `fray run` would make it (scheduleCircuit: durations, policy, readout timing, latency). */
function schedule(ops: readonly Operation[], circuit: Circuit, profile: NoiseProfile): Schedule {
  return scheduleCircuit({ ...circuit, operations: ops }, profile);
}

/** A built-in π pulse on `qubit`, reported as part of the step `near` (the operation it follows). */
function pulse(name: 'x' | 'y', qubit: number, near: Operation): GateOperation {
  return { kind: 'gate', name, qubits: [qubit], unitary: BUILTIN_GATES.get(name)!.matrix([]), step: near.step, at: near.at, label: 'decoupling' };
}

/**
 * `ops` with window `w` filled: the sequence goes right after the last operation on the qubit
 * that ends at the window's start (first in the program for a window from t = 0), and the
 * user's `idle` steps on the qubit inside the window are dropped. Undefined when the window's
 * start cannot be tied to an operation.
 */
function fill(ops: readonly Operation[], w: IdleWindow, pulses: readonly ('x' | 'y')[], waits: readonly number[], circuit: Circuit, profile: NoiseProfile): Operation[] | undefined {
  const s = schedule(ops, circuit, profile);
  // device items belong to the circuit operation they expand; walk both lists together
  const owner: number[] = [];
  ops.forEach((op, i) => {
    for (let k = deviceOperations([op], profile).length; k > 0; k--) owner.push(i);
  });
  let after = -1;
  const drop = new Set<number>();
  s.items.forEach((it, j) => {
    if (!it.op.qubits.includes(w.qubit)) return;
    const busy = it.op.kind === 'gate' || it.op.kind === 'reset' || it.op.kind === 'channel';
    if (busy && Math.abs(it.end - w.start) <= SAME_TIME_NS) after = owner[j]!;
    if (it.op.kind === 'idle' && it.start >= w.start - SAME_TIME_NS && it.end <= w.end + SAME_TIME_NS) drop.add(owner[j]!);
  });
  if (after === -1 && w.start > SAME_TIME_NS) return undefined;
  // the inserted steps report the step they follow (or the first step, from t = 0)
  const at = after === -1 ? ops[0] : ops[after];
  if (at === undefined) return undefined;
  const sequence: Operation[] = [];
  waits.forEach((t, k) => {
    if (t > SAME_TIME_NS) sequence.push(wait(w.qubit, t, at));
    if (k < pulses.length) sequence.push(pulse(pulses[k]!, w.qubit, at));
  });
  const out: Operation[] = after === -1 ? [...sequence] : [];
  ops.forEach((op, i) => {
    if (!drop.has(i)) out.push(op);
    if (i === after) out.push(...sequence);
  });
  return out;
}

function wait(qubit: number, duration: number, near: Operation): IdleOperation {
  return { kind: 'idle', qubits: [qubit], duration, step: near.step, at: near.at, label: 'decoupling' };
}

/** True when every operation present in both lists starts at the same time and the circuit's duration is the same. */
function keepsTimes(before: Schedule, after: Schedule, newOps: readonly Operation[]): boolean {
  if (Math.abs(before.duration - after.duration) > SAME_TIME_NS) return false;
  const kept = new Set(newOps);
  const start = new Map<Operation, number>();
  for (const it of after.items) start.set(it.op, it.start);
  for (const it of before.items) {
    if (!kept.has(it.op) || it.op.kind === 'idle' || it.op.kind === 'barrier') continue;
    const t = start.get(it.op);
    // parts of split composites are new objects in each schedule and are not found here; the duration check covers them
    if (t !== undefined && Math.abs(t - it.start) > SAME_TIME_NS) return false;
  }
  return true;
}
