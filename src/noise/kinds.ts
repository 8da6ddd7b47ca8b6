/**
 * The noise kinds a gate entry, a step annotation or a standalone noise step may list,
 * with their parameters as validated by the format layer (probabilities in [0, 1]).
 */
export interface NoiseKinds {
  /** Calibrated average gate infidelity r of the whole gate channel (solved into a depolarizing p). */
  error?: number;
  /** k-qubit depolarizing p: ρ → (1 − p)ρ + p·I/d. */
  depolarizing?: number;
  amplitude_damping?: number;
  phase_damping?: number;
  bit_flip?: number;
  phase_flip?: number;
  bit_phase_flip?: number;
  pauli?: { x: number; y: number; z: number };
  /** Name of a custom channel from the circuit's `channels:` map. */
  channel?: string;
}

/** The order in which listed noise kinds act after a gate (the contract's order). */
export const NOISE_KIND_ORDER = [
  'amplitude_damping',
  'phase_damping',
  'bit_flip',
  'phase_flip',
  'bit_phase_flip',
  'pauli',
  'channel',
  'depolarizing',
] as const;

/** Every key a noise annotation may hold. */
export const NOISE_KIND_KEYS = ['error', ...NOISE_KIND_ORDER] as const;
