import type { Circuit, Condition, NoiseOverride, Operation } from '../circuit/circuit.js';
import type { Instruction, Origin } from '../engine/instruction.js';
import type { RecordInstruction, RecordProgram } from '../engine/recordProgram.js';
import { misplacedZz, plainKinds, type NoiseKindsSpec } from '../format/noiseKindsSpec.js';
import { ProblemList } from '../format/problem.js';
import { CustomChannelError, ErrorSolveError, gateNoise, idleChannel, type GateNoise, type GateNoiseInput, type QubitDecay } from '../noise/gateNoise.js';
import { detuningAngle, zRotation, zzAngle, zzRotation } from '../noise/coherent.js';
import type { NoiseProfile } from '../noise/profile.js';
import type { IdleWindow, Schedule, TimedOperation } from '../schedule/schedule.js';
import { buildTimeline } from '../schedule/timeline.js';
import { frameNoise, type PauliFrame } from '../noise/twirl.js';
import { exactNumberText, memoised } from '../linalg/exactKeys.js';

export type { Origin } from '../engine/instruction.js';

/**
 * A scheduled circuit with its noise, as instruction lists for the engine: the noisy run
 * (every gate, channel and idle window, in an order consistent with each qubit's
 * timeline), and the ideal run (unitaries and resets only). In record mode (a circuit with
 * `into`) both runs are in `record` instead, and `noisy`, `origins` and `ideal` are empty.
 */
export interface Program {
  readonly n: number;
  readonly noisy: readonly Instruction[];
  /** origins[i] explains noisy[i]. */
  readonly origins: readonly Origin[];
  readonly ideal: readonly Instruction[];
  /** The record-mode program (null for a version-1 circuit). */
  readonly record: RecordProgram | null;
}

/** True when the profile has an always-on drift term (a detuning, or a zz strength on a coupled pair). */
export function hasDrift(profile: NoiseProfile): boolean {
  return profile.qubits.some((q) => q.detuning !== 0) || (profile.couplings ?? []).some((c) => c.zz !== 0);
}

/** Options of buildProgram. */
export interface ProgramOptions {
  /** Gate applications whose noise is Pauli-framed (src/noise/twirl.ts): exactly twirled, or conjugated by one Pauli string. */
  readonly frames?: ReadonlyMap<Operation, PauliFrame>;
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
 *
 * Record mode: a mid-circuit measurement is an operation of the timeline like any other (an
 * instrument on its own qubit, applied whole at its start, then relaxation for its duration);
 * a conditioned step acts where its condition holds and relaxes where it fails. Program order
 * is consistent with the timeline for the record too: a bit's reads and writes are in program
 * order and start in that order (src/schedule/schedule.ts), and the schedule never depends on outcomes.
 */
export function buildProgram(circuit: Circuit, profile: NoiseProfile, schedule: Schedule, problems: ProblemList, options: ProgramOptions = {}): Program {
  const n = circuit.register.n;
  const noisy: Instruction[] = [];
  const origins: Origin[] = [];
  const ideal: Instruction[] = [];
  const recordMode = circuit.bits !== null;
  const recNoisy: RecordInstruction[] = [];
  const recIdeal: RecordInstruction[] = [];
  // The condition of the operation being emitted (record mode) and which side of it.
  let when: { condition: Condition; holds: boolean } | undefined;
  const selection = () => (when === undefined ? {} : { when: { condition: when.condition.terms, holds: when.holds } });
  const pushNoisy = (instruction: Instruction, origin: Origin): void => {
    if (recordMode) recNoisy.push({ kind: 'apply', instruction, origin, ...selection() });
    else {
      noisy.push(instruction);
      origins.push(origin);
    }
  };
  const pushIdeal = (instruction: Instruction, origin: Origin): void => {
    if (recordMode) recIdeal.push({ kind: 'apply', instruction, origin, ...selection() });
    else ideal.push(instruction);
  };
  const decay = (q: number): QubitDecay => profile.qubits[q]!;
  const channels = circuit.channels;
  // gateNoise once per distinct input: every application of one noise entry (a gate name's
  // profile entry, or the same step noise written again) gets the same channels, shared
  const noiseByInput = new Map<string, GateNoise>();
  const noiseOf = (input: GateNoiseInput): GateNoise =>
    memoised(noiseByInput, JSON.stringify([input.k, input.duration, input.thermal, input.decay, input.kinds], exactNumbers), () => gateNoise(input));
  const emitIdle = (w: IdleWindow): void => {
    if (profile.idle !== 'thermal') return;
    const ch = idleChannel(decay(w.qubit), w.end - w.start);
    if (ch === undefined) return;
    pushNoisy({ op: 'channel', qubits: [w.qubit], kraus: ch.kraus }, { step: -1, what: `idle ${Number((w.end - w.start).toPrecision(6))} ns` });
  };
  /** Thermal relaxation of qubit q for `time` ns during step `step` (a measurement, or a step whose condition fails). */
  const emitThermal = (step: number, q: number, time: number, what: string): void => {
    const ch = idleChannel(decay(q), time);
    if (ch !== undefined) pushNoisy({ op: 'channel', qubits: [q], kraus: ch.kraus }, { step, what });
  };
  const emitNoise = (
    op: Operation,
    label: string,
    k: number,
    qubits: readonly number[],
    duration: number,
    thermal: boolean,
    kinds: NoiseKindsSpec,
    frame?: PauliFrame,
  ): void => {
    const zzAt = misplacedZz(kinds, k);
    if (zzAt !== undefined) {
      // reachable when a step's noise with zz applies to the parts of a split 2-qubit composite
      problems.error(zzAt, 'zz-arity', `${label}: 'zz' of 'coherent' is a 2-qubit rotation, and this application acts on ${k} qubit${k === 1 ? '' : 's'}`);
      return;
    }
    try {
      const gn = noiseOf({
        k,
        duration,
        thermal,
        decay: qubits.map(decay),
        kinds: plainKinds(kinds),
        channels,
      });
      // located at the `error:` that asks for it and worded without the step, so the
      // ProblemList counts the applications of one entry as one warning
      const what = op.kind === 'gate' ? `'${op.name}'` : op.kind;
      if (gn.warning !== undefined) problems.warn(kinds.error?.at ?? op.at, 'error-below-coherence-limit', `${what}: ${gn.warning}`);
      for (const c of frame === undefined ? gn.channels : frameNoise(gn.channels, k, frame)) {
        const on = c.targets.map((t) => qubits[t]!);
        const origin = { step: op.step, what: c.source === 'thermal' ? `thermal during ${label}` : c.source };
        if (c.source === 'coherent' || c.source.startsWith('twirl ')) pushNoisy({ op: 'unitary', qubits: on, matrix: c.kraus[0]! }, origin);
        else pushNoisy({ op: 'channel', qubits: on, kraus: c.kraus }, origin);
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
    const condition = op.kind === 'gate' || op.kind === 'reset' || op.kind === 'channel' ? op.condition : undefined;
    when = condition === undefined ? undefined : { condition, holds: true };
    switch (op.kind) {
      case 'gate': {
        const entry = profile.gateEntry(op.name, op.qubits);
        const label = `${stepName} (${op.name} on ${op.qubits.join(', ')})`;
        pushNoisy({ op: 'unitary', qubits: op.qubits, matrix: op.unitary }, { step: op.step, what: op.name });
        pushIdeal({ op: 'unitary', qubits: op.qubits, matrix: op.unitary }, { step: op.step, what: op.name });
        emitNoise(op, label, op.qubits.length, op.qubits, item.end - item.start, entry.thermal, kindsOf(op.noise, entry.kinds), options.frames?.get(op));
        break;
      }
      case 'reset': {
        const q = op.qubits[0]!;
        pushNoisy({ op: 'reset', qubit: q }, { step: op.step, what: 'reset' });
        pushIdeal({ op: 'reset', qubit: q }, { step: op.step, what: 'reset' });
        emitNoise(op, `${stepName} (reset ${q})`, 1, op.qubits, 0, false, kindsOf(op.noise, profile.reset.kinds));
        break;
      }
      case 'channel':
        emitNoise(op, `${stepName} (noise on ${op.qubits.join(', ')})`, op.qubits.length, op.qubits, 0, false, op.noise.kinds);
        break;
      case 'measure': {
        if (op.bit === undefined) break; // terminal: the results stage reads it off the final state
        const q = op.qubits[0]!;
        const origin = { step: op.step, what: `measure ${q} into bit ${op.bit}` };
        const r = profile.qubits[q]!.readout;
        recNoisy.push({ kind: 'measure', qubit: q, bit: op.bit, zeroAsOne: r.zeroAsOne, oneAsZero: r.oneAsZero, origin });
        recIdeal.push({ kind: 'measure', qubit: q, bit: op.bit, zeroAsOne: 0, oneAsZero: 0, origin });
        // the measured qubit relaxes for the measurement's duration, whatever the idle mode
        emitThermal(op.step, q, item.end - item.start, `thermal during ${stepName} (measure ${q})`);
        break;
      }
      case 'idle':
      case 'barrier':
        break;
    }
    if (condition !== undefined && profile.idle === 'thermal') {
      // where the condition fails, the step's time is idle time on each of its qubits
      when = { condition, holds: false };
      for (const q of op.qubits) emitThermal(op.step, q, item.end - item.start, `idle during ${stepName} (condition fails)`);
    }
    when = undefined;
  };
  const recordProgram = (): RecordProgram | null => (recordMode ? { bits: circuit.bits!.length, noisy: recNoisy, ideal: recIdeal } : null);

  if (!hasDrift(profile)) {
    for (const item of schedule.items) {
      for (const w of item.idleBefore) emitIdle(w);
      emitOperation(item);
    }
    for (const w of schedule.trailingIdle) emitIdle(w);
    return { n, noisy, origins, ideal, record: recordProgram() };
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
          pushNoisy({ op: 'unitary', qubits: [c.a, c.b], matrix: zzRotation(zzAngle(c.zz, ev.segment)) }, { step: -1, what });
        }
      }
      for (const q of ev.driftQubits) {
        const delta = profile.qubits[q]!.detuning;
        if (delta === 0) continue;
        pushNoisy({ op: 'unitary', qubits: [q], matrix: zRotation(detuningAngle(delta, ev.segment)) }, { step: -1, what });
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
  return { n, noisy, origins, ideal, record: recordProgram() };
}

/** JSON.stringify replacer that writes every number exactly (-0, infinities and NaN included), for cache keys. */
function exactNumbers(_key: string, v: unknown): unknown {
  return typeof v === 'number' ? exactNumberText(v) : v;
}
