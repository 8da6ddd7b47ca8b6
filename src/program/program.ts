import type { Circuit, NoiseOverride, Operation } from '../circuit/circuit.js';
import type { Instruction } from '../engine/instruction.js';
import { misplacedZz, plainKinds, type NoiseKindsSpec } from '../format/noiseKindsSpec.js';
import { ProblemList, type SourcePosition } from '../format/problem.js';
import { CustomChannelError, ErrorSolveError, gateNoise, idleChannel, type QubitDecay } from '../noise/gateNoise.js';
import { detuningAngle, zRotation, zzAngle, zzRotation } from '../noise/coherent.js';
import type { NoiseProfile } from '../noise/profile.js';
import type { IdleWindow, Schedule, TimedOperation } from '../schedule/schedule.js';
import { buildTimeline } from '../schedule/timeline.js';

/** Where a noisy instruction comes from: the step (0-based; −1 for idle windows) and what it is. */
export interface Origin {
  readonly step: number;
  /** e.g. 'cx', 'thermal during cx', 'idle 120 ns', 'drift 40 ns', 'coherent', 'depolarizing', 'reset'. */
  readonly what: string;
}

/**
 * A scheduled circuit with its noise, as instruction lists for the engine: the noisy run
 * (every gate, channel and idle window, in an order consistent with each qubit's
 * timeline), and the ideal run (unitaries and resets only).
 */
export interface Program {
  readonly n: number;
  readonly noisy: readonly Instruction[];
  /** origins[i] explains noisy[i]. */
  readonly origins: readonly Origin[];
  readonly ideal: readonly Instruction[];
}

/** True when the profile has an always-on drift term (a detuning, or a zz strength on a coupled pair). */
export function hasDrift(profile: NoiseProfile): boolean {
  return profile.qubits.some((q) => q.detuning !== 0) || (profile.couplings ?? []).some((c) => c.zz !== 0);
}

/**
 * Builds the instruction lists.
 *
 * With drift, the noisy list walks the event timeline (src/schedule/timeline.ts): per event,
 * the drift of the segment before it (diagonal unitaries), the idle relaxation of that segment,
 * then the operations starting at the event.
 *
 * Without drift the timeline's steps 1 and 2 reduce to each qubit's whole idle windows (relaxation
 * is a semigroup, and channels on disjoint qubits commute), so the list is emitted in program order,
 * each operation preceded by the idle windows that end at its start on its own qubits: the same
 * evolution, and exactly version 1's instruction list (its outputs stay bit-for-bit the same).
 */
export function buildProgram(circuit: Circuit, profile: NoiseProfile, schedule: Schedule, problems: ProblemList): Program {
  const n = circuit.register.n;
  const noisy: Instruction[] = [];
  const origins: Origin[] = [];
  const ideal: Instruction[] = [];
  const decay = (q: number): QubitDecay => profile.qubits[q]!;
  const channels = circuit.channels;
  const seen = new Set<string>();
  const warnOnce = (at: SourcePosition, code: string, message: string): void => {
    const key = `${at.line}:${at.col}:${message}`;
    if (!seen.has(key)) {
      seen.add(key);
      problems.warn(at, code, message);
    }
  };
  const emitIdle = (w: IdleWindow): void => {
    if (profile.idle !== 'thermal') return;
    const ch = idleChannel(decay(w.qubit), w.end - w.start);
    if (ch === undefined) return;
    noisy.push({ op: 'channel', qubits: [w.qubit], kraus: ch.kraus });
    origins.push({ step: -1, what: `idle ${Number((w.end - w.start).toPrecision(6))} ns` });
  };
  const emitNoise = (
    op: Operation,
    label: string,
    k: number,
    qubits: readonly number[],
    duration: number,
    thermal: boolean,
    kinds: NoiseKindsSpec,
  ): void => {
    const zzAt = misplacedZz(kinds, k);
    if (zzAt !== undefined) {
      // reachable when a step's noise with zz applies to the parts of a split 2-qubit composite
      problems.error(zzAt, 'zz-arity', `${label}: 'zz' of 'coherent' is a 2-qubit rotation, and this application acts on ${k} qubit${k === 1 ? '' : 's'}`);
      return;
    }
    try {
      const gn = gateNoise({
        k,
        duration,
        thermal,
        decay: qubits.map(decay),
        kinds: plainKinds(kinds),
        channels,
      });
      if (gn.warning !== undefined) warnOnce(kinds.error?.at ?? op.at, 'error-below-coherence-limit', `${label}: ${gn.warning}`);
      for (const c of gn.channels) {
        const on = c.targets.map((t) => qubits[t]!);
        if (c.source === 'coherent') noisy.push({ op: 'unitary', qubits: on, matrix: c.kraus[0]! });
        else noisy.push({ op: 'channel', qubits: on, kraus: c.kraus });
        origins.push({ step: op.step, what: c.source === 'thermal' ? `thermal during ${label}` : c.source });
      }
    } catch (e) {
      if (e instanceof ErrorSolveError) {
        problems.error(kinds.error?.at ?? op.at, 'error-unreachable', `${label}: ${e.message}`);
      } else if (e instanceof CustomChannelError) {
        problems.error(kinds.channel?.at ?? op.at, 'channel-arity', `${label}: ${e.message}`);
      } else throw e;
    }
  };
  const kindsOf = (override: NoiseOverride | undefined, fallback: NoiseKindsSpec): NoiseKindsSpec =>
    override !== undefined ? override.kinds : fallback;

  const emitOperation = (item: TimedOperation): void => {
    const op = item.op;
    const stepName = `step ${op.step + 1}`;
    switch (op.kind) {
      case 'gate': {
        const entry = profile.gateEntry(op.name, op.qubits);
        const label = `${stepName} (${op.name} on ${op.qubits.join(', ')})`;
        noisy.push({ op: 'unitary', qubits: op.qubits, matrix: op.unitary });
        origins.push({ step: op.step, what: op.name });
        ideal.push({ op: 'unitary', qubits: op.qubits, matrix: op.unitary });
        emitNoise(op, label, op.qubits.length, op.qubits, item.end - item.start, entry.thermal, kindsOf(op.noise, entry.kinds));
        break;
      }
      case 'reset': {
        const q = op.qubits[0]!;
        noisy.push({ op: 'reset', qubit: q });
        origins.push({ step: op.step, what: 'reset' });
        ideal.push({ op: 'reset', qubit: q });
        emitNoise(op, `${stepName} (reset ${q})`, 1, op.qubits, 0, false, kindsOf(op.noise, profile.reset.kinds));
        break;
      }
      case 'channel':
        emitNoise(op, `${stepName} (noise on ${op.qubits.join(', ')})`, op.qubits.length, op.qubits, 0, false, op.noise.kinds);
        break;
      case 'measure':
      case 'idle':
      case 'barrier':
        break;
    }
  };

  if (!hasDrift(profile)) {
    for (const item of schedule.items) {
      for (const w of item.idleBefore) emitIdle(w);
      emitOperation(item);
    }
    for (const w of schedule.trailingIdle) emitIdle(w);
    return { n, noisy, origins, ideal };
  }

  // The event timeline. The drift terms of one segment commute with each other, so their order is
  // free; it is chosen for fusion (src/plan/fuseInstructions.ts): first the pairs whose qubits were
  // last touched by the same operation (their rzz merges into its group), last the pairs whose
  // qubits are next touched by the same operation (their rzz opens the group that operation joins),
  // the rest in between (diagonal groups that the plan batches).
  const timeline = buildTimeline(schedule, n);
  const lastOp: (TimedOperation | undefined)[] = new Array<TimedOperation | undefined>(n).fill(undefined);
  const upcoming: TimedOperation[][] = Array.from({ length: n }, () => []);
  for (const ev of timeline.events) for (const i of ev.starts) for (const q of schedule.items[i]!.op.qubits) upcoming[q]!.push(schedule.items[i]!);
  const nextIndex = new Array<number>(n).fill(0);
  const pairs = (profile.couplings ?? []).filter((c) => c.zz !== 0);
  const rank = (c: { a: number; b: number }): number => {
    if (lastOp[c.a] !== undefined && lastOp[c.a] === lastOp[c.b]) return 0;
    const na = upcoming[c.a]![nextIndex[c.a]!];
    return na !== undefined && na === upcoming[c.b]![nextIndex[c.b]!] ? 2 : 1;
  };
  for (const ev of timeline.events) {
    if (ev.segment > 0) {
      const active = new Set(ev.driftQubits);
      const what = `drift ${Number(ev.segment.toPrecision(6))} ns`;
      const live = pairs.filter((c) => active.has(c.a) && active.has(c.b)).map((c) => ({ c, r: rank(c) }));
      for (const r of [0, 1, 2]) {
        for (const { c } of live.filter((x) => x.r === r)) {
          noisy.push({ op: 'unitary', qubits: [c.a, c.b], matrix: zzRotation(zzAngle(c.zz, ev.segment)) });
          origins.push({ step: -1, what });
        }
      }
      for (const q of ev.driftQubits) {
        const delta = profile.qubits[q]!.detuning;
        if (delta === 0) continue;
        noisy.push({ op: 'unitary', qubits: [q], matrix: zRotation(detuningAngle(delta, ev.segment)) });
        origins.push({ step: -1, what });
      }
      for (const q of ev.idleQubits) emitIdle({ qubit: q, start: ev.time - ev.segment, end: ev.time });
    }
    for (const i of ev.starts) {
      const item = schedule.items[i]!;
      emitOperation(item);
      for (const q of item.op.qubits) {
        lastOp[q] = item;
        nextIndex[q]!++;
      }
    }
  }
  return { n, noisy, origins, ideal };
}
