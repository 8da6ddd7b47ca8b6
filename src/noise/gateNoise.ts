/**
 * The noise that follows one gate application: which channels act, on which of the
 * gate's qubits, in which order, and the solve that turns a calibrated `error: r`
 * (average gate infidelity) into a depolarizing probability.
 */
import { embed } from '../circuit/compose.js';
import { type CMatrix, identity, mul, trace } from '../linalg/cmatrix.js';
import { krausToSuperoperator } from '../linalg/superoperator.js';
import {
  type KrausChannel,
  amplitudeDamping,
  bitFlip,
  bitPhaseFlip,
  depolarizing,
  pauliChannel,
  phaseDamping,
  phaseFlip,
  thermalRelaxation,
} from './channels.js';
import { coherentRotation, zzRotation } from './coherent.js';
import { entanglementFidelity } from './fidelity.js';
import { type NoiseKinds, NOISE_KIND_ORDER } from './kinds.js';

/** Relaxation constants of one qubit: T1 and T2 in ns (Infinity = none), equilibrium excited population. */
export interface QubitDecay {
  t1: number;
  t2: number;
  excited: number;
}

/** Everything that decides the noise after one application of a k-qubit gate. */
export interface GateNoiseInput {
  /** Gate arity. */
  k: number;
  /** Gate duration in ns. */
  duration: number;
  /** Whether the gate's qubits relax (T1/T2) during the gate. */
  thermal: boolean;
  /** Relaxation constants per gate qubit, in target order (length k when thermal is on). */
  decay: readonly QubitDecay[];
  /** Listed noise kinds, after precedence resolution. */
  kinds: NoiseKinds;
  /** Custom channels of the circuit by name. */
  channels: ReadonlyMap<string, KrausChannel>;
}

/**
 * One channel placed after the gate: `targets` are LOCAL indices 0..k−1 into the gate's
 * qubit list (first target = leftmost factor of every Kraus operator); `source` is a short
 * label ('thermal', a noise-kind name, 'channel:<name>', or 'error' for the solved depolarizing).
 */
export type PlacedChannel = {
  readonly targets: readonly number[];
  readonly kraus: readonly CMatrix[];
  readonly source: string;
};

/** The channel sequence after one gate application, in the order they act. */
export interface GateNoise {
  channels: PlacedChannel[];
  /** Depolarizing probability solved from `error:` (0 when the listed noise already exceeds it). */
  solvedDepolarizing?: number;
  /** Set when `error:` is below what the other noise already causes. */
  warning?: string;
}

/** Thrown when `error: r` would need a depolarizing probability above 1. */
export class ErrorSolveError extends Error {
  constructor(
    message: string,
    readonly error: number,
    readonly requiredProbability: number,
    readonly maxReachable: number,
  ) {
    super(message);
    this.name = 'ErrorSolveError';
  }
}

/** Thrown when a custom channel named in `channel:` is missing or its arity fits neither 1 nor k. */
export class CustomChannelError extends Error {
  constructor(
    message: string,
    readonly channelName: string,
  ) {
    super(message);
    this.name = 'CustomChannelError';
  }
}

/**
 * Slack of the error solve: a solved p in [−tol, 0) is set to 0 without a warning (rounding
 * when r equals what the other noise causes), p in (1, 1 + tol] is set to 1.
 */
export const ERROR_SOLVE_TOLERANCE = 1e-12;

/** Thermal relaxation of one idle qubit for `time` ns, or undefined when nothing happens (time 0, or T1 = T2 = ∞). */
export function idleChannel(decay: QubitDecay, time: number): KrausChannel | undefined {
  if (!(time > 0)) return undefined;
  if (!Number.isFinite(decay.t1) && !Number.isFinite(decay.t2)) return undefined;
  const ch = thermalRelaxation({ t1: decay.t1, t2: decay.t2, excited: decay.excited, time });
  return isIdentityChannel(ch.kraus) ? undefined : ch;
}

/**
 * Coherence-limited average gate infidelity 1 − F_avg of a k-qubit gate of `duration` ns
 * from thermal relaxation alone (each qubit relaxing independently). F_e of a tensor
 * product is the product of the F_e's (Tr(A ⊗ B) = Tr A · Tr B), then F_avg = (d·F_e + 1)/(d + 1).
 */
export function coherenceLimitedInfidelity(k: number, duration: number, decay: readonly QubitDecay[]): number {
  if (decay.length !== k) throw new RangeError(`coherenceLimitedInfidelity: ${decay.length} decay entries for a ${k}-qubit gate`);
  let fe = 1;
  for (const q of decay) {
    const ch = idleChannel(q, duration);
    if (ch !== undefined) fe *= entanglementFidelity(ch.kraus);
  }
  const d = 1 << k;
  return (d * (1 - fe)) / (d + 1); // = 1 − (d·F_e + 1)/(d + 1), without cancellation
}

/**
 * The channels that follow one application of a k-qubit gate, in the contract's order:
 * the coherent error (exp(−i(x·X + y·Y + z·Z)/2) on each qubit, then rzz(zz) on a 2-qubit gate) →
 * thermal relaxation for `duration` on each qubit (when `thermal` is on and the qubit has a
 * finite T1 or T2) → amplitude_damping, phase_damping, bit_flip, phase_flip, bit_phase_flip,
 * pauli (each on every gate qubit) → channel (custom; k-qubit on all gate qubits in order, or
 * 1-qubit on each) → depolarizing (k-qubit) → the depolarizing solved from `error:`.
 * Channels that are exactly the identity (a parameter of 0) are omitted.
 *
 * The `error: r` solve (derived from Nielsen, Phys. Lett. A 303, 249 (2002) and the
 * linearity of F_e in the channel): let N be the channel before the solved one and D_p the
 * k-qubit depolarizing channel, d = 2^k. D_p∘N = (1 − p)·N + p·(ρ ↦ Tr ρ · I/d), and the
 * completely depolarizing map has F_e = 1/d², so F_e(D_p∘N) = (1 − p)·F_e(N) + p/d². The
 * unitary of the gate cancels (F_e(E∘U, U) = F_e(E)), so requiring F_avg = 1 − r, i.e.
 * F_e = F_target = ((1 − r)(d + 1) − 1)/d, gives p = (F_e(N) − F_target)/(F_e(N) − 1/d²).
 * p < 0 means N alone already exceeds r: p is set to 0 and a warning returned. p > 1 throws
 * ErrorSolveError. F_e(N) is computed from the composed superoperator of N on k qubits.
 */
export function gateNoise(input: GateNoiseInput): GateNoise {
  const { k, duration, thermal, decay, kinds, channels } = input;
  if (!Number.isInteger(k) || k < 1) throw new RangeError(`gateNoise: arity ${k} must be a positive integer`);
  const all = Array.from({ length: k }, (_, i) => i);
  const placed: PlacedChannel[] = [];
  let thermalCount = 0;

  const coherent = kinds.coherent;
  if (coherent !== undefined) {
    if (coherent.x !== 0 || coherent.y !== 0 || coherent.z !== 0) {
      const u = coherentRotation(coherent.x, coherent.y, coherent.z);
      for (let q = 0; q < k; q++) placed.push({ targets: [q], kraus: [u], source: 'coherent' });
    }
    if (coherent.zz !== 0) {
      if (k !== 2) throw new RangeError(`gateNoise: a coherent zz error needs a 2-qubit gate, not ${k} qubits`);
      placed.push({ targets: all, kraus: [zzRotation(coherent.zz)], source: 'coherent' });
    }
  }

  if (thermal) {
    if (decay.length !== k) throw new RangeError(`gateNoise: ${decay.length} decay entries for a ${k}-qubit gate`);
    for (let q = 0; q < k; q++) {
      const ch = idleChannel(decay[q]!, duration);
      if (ch === undefined) continue;
      placed.push({ targets: [q], kraus: ch.kraus, source: 'thermal' });
      thermalCount++;
    }
  }

  const onEach = (source: string, ch: KrausChannel): void => {
    if (isIdentityChannel(ch.kraus)) return;
    for (let q = 0; q < k; q++) placed.push({ targets: [q], kraus: ch.kraus, source });
  };

  for (const kind of NOISE_KIND_ORDER) {
    switch (kind) {
      case 'amplitude_damping':
        if (kinds.amplitude_damping !== undefined) onEach(kind, amplitudeDamping(kinds.amplitude_damping));
        break;
      case 'phase_damping':
        if (kinds.phase_damping !== undefined) onEach(kind, phaseDamping(kinds.phase_damping));
        break;
      case 'bit_flip':
        if (kinds.bit_flip !== undefined) onEach(kind, bitFlip(kinds.bit_flip));
        break;
      case 'phase_flip':
        if (kinds.phase_flip !== undefined) onEach(kind, phaseFlip(kinds.phase_flip));
        break;
      case 'bit_phase_flip':
        if (kinds.bit_phase_flip !== undefined) onEach(kind, bitPhaseFlip(kinds.bit_phase_flip));
        break;
      case 'pauli':
        if (kinds.pauli !== undefined) onEach(kind, pauliChannel(kinds.pauli.x, kinds.pauli.y, kinds.pauli.z));
        break;
      case 'channel': {
        const name = kinds.channel;
        if (name === undefined) break;
        const ch = channels.get(name);
        if (ch === undefined) throw new CustomChannelError(`unknown channel '${name}'`, name);
        const source = `channel:${name}`;
        if (ch.qubits === k) {
          if (!isIdentityChannel(ch.kraus)) placed.push({ targets: all, kraus: ch.kraus, source });
        } else if (ch.qubits === 1) {
          onEach(source, ch);
        } else {
          throw new CustomChannelError(
            `channel '${name}' acts on ${ch.qubits} qubits; a ${k}-qubit gate takes a 1-qubit or ${k}-qubit channel`,
            name,
          );
        }
        break;
      }
      case 'depolarizing':
        if (kinds.depolarizing !== undefined) {
          const ch = depolarizing(k, kinds.depolarizing);
          if (!isIdentityChannel(ch.kraus)) placed.push({ targets: all, kraus: ch.kraus, source: 'depolarizing' });
        }
        break;
    }
  }

  const result: GateNoise = { channels: placed };
  const r = kinds.error;
  if (r === undefined) return result;

  const d = 1 << k;
  const invD2 = 1 / (d * d);
  const feN = sequenceEntanglementFidelity(placed, k);
  const fTarget = ((1 - r) * (d + 1) - 1) / d;
  const rN = (d * (1 - feN)) / (d + 1); // average gate infidelity of N alone
  const denom = feN - invD2;
  const maxReachable = Math.max(rN, (d - 1) / d); // r is linear in p: extremes at p = 0 and p = 1
  let p: number;
  if (rN > r + ERROR_SOLVE_TOLERANCE) {
    // The contract: when the channel before the solved depolarizing already exceeds r, warn and
    // add nothing — also where N is worse than full depolarization (denom < 0) and some p would
    // bring the infidelity back down to r.
    const kindsCount = placed.length - thermalCount; // the coherent error counts as listed noise
    const cause =
      thermalCount > 0 && kindsCount > 0
        ? 'relaxation and the listed noise already cause'
        : thermalCount > 0
          ? 'relaxation during the gate already causes (the coherence limit)'
          : 'the listed noise already causes';
    result.warning = `calibrated error ${r} is below what ${cause} (${fmt(rN)}); no depolarizing added`;
    p = 0;
  } else {
    // Here rN ≤ r (within the tolerance). With denom > 0 the solve gives p ≥ 0 (up to rounding);
    // with denom ≤ 0 (N at least as noisy as full depolarization) no p ∈ [0, 1] raises the
    // infidelity above rN, so any r beyond it is unreachable.
    if (Math.abs(denom) < ERROR_SOLVE_TOLERANCE) p = Math.abs(feN - fTarget) <= ERROR_SOLVE_TOLERANCE ? 0 : Infinity;
    else p = (feN - fTarget) / denom;
    if (p < -ERROR_SOLVE_TOLERANCE) p = Infinity;
    if (p > 1 + ERROR_SOLVE_TOLERANCE) {
      throw new ErrorSolveError(
        Number.isFinite(p)
          ? `error ${r} needs a depolarizing probability ${fmt(p)} > 1; the largest reachable average gate infidelity for a ${k}-qubit gate here is ${fmt(maxReachable)}`
          : `error ${r} cannot be reached by adding depolarizing noise; the largest reachable average gate infidelity for a ${k}-qubit gate here is ${fmt(maxReachable)}`,
        r,
        p,
        maxReachable,
      );
    }
    if (p < 0) p = 0;
  }
  if (p > 1) p = 1;
  result.solvedDepolarizing = p;
  if (p > 0) placed.push({ targets: all, kraus: depolarizing(k, p).kraus, source: 'error' });
  return result;
}

/** Three significant digits for messages. */
function fmt(x: number): string {
  return String(Number(x.toPrecision(3)));
}

/** True when the Kraus set is a single operator equal to the identity. */
function isIdentityChannel(kraus: readonly CMatrix[]): boolean {
  if (kraus.length !== 1) return false;
  const m = kraus[0]!;
  const id = identity(m.rows);
  for (let i = 0; i < m.data.length; i++) if (m.data[i] !== id.data[i]) return false;
  return true;
}

/**
 * Entanglement fidelity (vs the identity) of the sequence of placed channels on k qubits:
 * F_e = Tr(S_n ⋯ S_1)/d², each S the superoperator of a channel embedded on its local targets
 * (Tr S = Σ_k |Tr K_k|² in any vectorisation, so F_e = Σ |Tr K|²/d² for one channel).
 */
function sequenceEntanglementFidelity(placed: readonly PlacedChannel[], k: number): number {
  if (placed.length === 0) return 1;
  const d = 1 << k;
  let total: CMatrix | undefined;
  for (const ch of placed) {
    const s = krausToSuperoperator(ch.kraus.map((op) => embed(op, ch.targets, k)));
    total = total === undefined ? s : mul(s, total);
  }
  return trace(total!)[0] / (d * d);
}
