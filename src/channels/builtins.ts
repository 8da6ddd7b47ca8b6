/**
 * The built-in noise kinds of the foundation (src/noise/channels.ts, where each Kraus set and
 * its source are documented) as Channel values, plus the identity and unitary channels.
 * Parameters are probabilities in [0, 1]; times are in ns.
 */
import type { CMatrix } from '../linalg/cmatrix.js';
import {
  amplitudeDamping as amplitudeDampingKraus,
  bitFlip as bitFlipKraus,
  bitPhaseFlip as bitPhaseFlipKraus,
  depolarizing as depolarizingKraus,
  generalizedAmplitudeDamping as generalizedAmplitudeDampingKraus,
  pauliChannel as pauliChannelKraus,
  phaseDamping as phaseDampingKraus,
  phaseFlip as phaseFlipKraus,
  thermalRelaxation as thermalRelaxationKraus,
  type ThermalRelaxationParams,
} from '../noise/channels.js';
import { Channel } from './channel.js';

/** k-qubit depolarizing channel ρ → (1 − p)ρ + p·I/d. */
export function depolarizingChannel(k: number, p: number): Channel {
  return Channel.fromKraus(depolarizingKraus(k, p).kraus);
}

/** Amplitude damping with decay probability γ (|1⟩ → |0⟩). */
export function amplitudeDampingChannel(gamma: number): Channel {
  return Channel.fromKraus(amplitudeDampingKraus(gamma).kraus);
}

/** Generalized amplitude damping: decay probability γ towards the state with excited population pe. */
export function generalizedAmplitudeDampingChannel(gamma: number, excited: number): Channel {
  return Channel.fromKraus(generalizedAmplitudeDampingKraus(gamma, excited).kraus);
}

/** Phase damping with parameter λ (ρ01 scales by √(1−λ)). */
export function phaseDampingChannel(lambda: number): Channel {
  return Channel.fromKraus(phaseDampingKraus(lambda).kraus);
}

/** Bit flip ρ → (1 − p)ρ + p·XρX. */
export function bitFlipChannel(p: number): Channel {
  return Channel.fromKraus(bitFlipKraus(p).kraus);
}

/** Phase flip ρ → (1 − p)ρ + p·ZρZ. */
export function phaseFlipChannel(p: number): Channel {
  return Channel.fromKraus(phaseFlipKraus(p).kraus);
}

/** Bit-phase flip ρ → (1 − p)ρ + p·YρY. */
export function bitPhaseFlipChannel(p: number): Channel {
  return Channel.fromKraus(bitPhaseFlipKraus(p).kraus);
}

/** One-qubit Pauli channel ρ → (1 − x − y − z)ρ + x·XρX + y·YρY + z·ZρZ. */
export function pauliChannel(x: number, y: number, z: number): Channel {
  return Channel.fromKraus(pauliChannelKraus(x, y, z).kraus);
}

/** Thermal relaxation of one qubit for `time` ns with T1, T2 in ns (Infinity = none) and excited population pe. */
export function thermalRelaxationChannel(params: ThermalRelaxationParams): Channel {
  return Channel.fromKraus(thermalRelaxationKraus(params).kraus);
}

/** The unitary channel ρ → UρU†. */
export function unitaryChannel(u: CMatrix): Channel {
  return Channel.fromUnitary(u);
}

/** The identity channel on k qubits. */
export function identityChannel(k: number): Channel {
  return Channel.identity(k);
}
