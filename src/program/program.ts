import type { Circuit, NoiseOverride, Operation } from '../circuit/circuit.js';
import type { Instruction } from '../engine/instruction.js';
import { plainKinds, type NoiseKindsSpec } from '../format/noiseKindsSpec.js';
import { ProblemList } from '../format/problem.js';
import { CustomChannelError, ErrorSolveError, gateNoise, idleChannel, type QubitDecay } from '../noise/gateNoise.js';
import type { NoiseProfile } from '../noise/profile.js';
import type { IdleWindow, Schedule } from '../schedule/schedule.js';

/** Where a noisy instruction comes from: the step (0-based; −1 for idle windows) and what it is. */
export interface Origin {
  readonly step: number;
  /** e.g. 'cx', 'thermal during cx', 'idle 120 ns', 'depolarizing', 'reset'. */
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

/**
 * Builds the instruction lists. Channels on disjoint qubits commute, so emitting every
 * operation in program order, each preceded by the idle windows that end at its start on
 * its own qubits, reproduces the timed evolution exactly.
 */
export function buildProgram(circuit: Circuit, profile: NoiseProfile, schedule: Schedule, problems: ProblemList): Program {
  const n = circuit.register.n;
  const noisy: Instruction[] = [];
  const origins: Origin[] = [];
  const ideal: Instruction[] = [];
  const decay = (q: number): QubitDecay => profile.qubits[q]!;
  const channels = circuit.channels;
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
    try {
      const gn = gateNoise({
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
      for (const c of gn.channels) {
        noisy.push({ op: 'channel', qubits: c.targets.map((t) => qubits[t]!), kraus: c.kraus });
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

  for (const item of schedule.items) {
    for (const w of item.idleBefore) emitIdle(w);
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
  }
  for (const w of schedule.trailingIdle) emitIdle(w);
  return { n, noisy, origins, ideal };
}
