import type { Circuit, Condition, NoiseOverride, Operation } from '../circuit/circuit.js';
import type { Instruction, Origin } from '../engine/instruction.js';
import type { RecordInstruction, RecordProgram } from '../engine/recordProgram.js';
import { plainKinds, type NoiseKindsSpec } from '../format/noiseKindsSpec.js';
import { ProblemList, type SourcePosition } from '../format/problem.js';
import { CustomChannelError, ErrorSolveError, gateNoise, idleChannel, type QubitDecay } from '../noise/gateNoise.js';
import type { NoiseProfile } from '../noise/profile.js';
import type { IdleWindow, Schedule } from '../schedule/schedule.js';

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

/**
 * Builds the instruction lists. Channels on disjoint qubits commute, so emitting every
 * operation in program order, each preceded by the idle windows that end at its start on
 * its own qubits, reproduces the timed evolution exactly. In record mode the same holds for
 * measurements (an instrument on its own qubit) and conditioned steps: a bit's reads and
 * writes are in program order, and the schedule never depends on outcomes.
 */
export function buildProgram(circuit: Circuit, profile: NoiseProfile, schedule: Schedule, problems: ProblemList): Program {
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
  ): void => {
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
        pushNoisy({ op: 'channel', qubits: c.targets.map((t) => qubits[t]!), kraus: c.kraus }, { step: op.step, what: c.source === 'thermal' ? `thermal during ${label}` : c.source });
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

  for (const item of schedule.items) {
    for (const w of item.idleBefore) emitIdle(w);
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
        emitNoise(op, label, op.qubits.length, op.qubits, item.end - item.start, entry.thermal, kindsOf(op.noise, entry.kinds));
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
  }
  for (const w of schedule.trailingIdle) emitIdle(w);
  const record: RecordProgram | null = recordMode ? { bits: circuit.bits!.length, noisy: recNoisy, ideal: recIdeal } : null;
  return { n, noisy, origins, ideal, record };
}
