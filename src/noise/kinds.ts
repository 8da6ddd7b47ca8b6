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
  /**
   * Coherent error right after the ideal U (angles in radians): exp(−i(x·X + y·Y + z·Z)/2) on
   * each qubit of the application, then rzz(zz) on its two qubits (2-qubit applications only).
   */
  coherent?: CoherentError;
}

/** The angles (radians) of a coherent gate error; see NoiseKinds.coherent. */
export interface CoherentError {
  readonly x: number;
  readonly y: number;
  readonly z: number;
  readonly zz: number;
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

/** Every key a noise annotation may hold (`coherent` acts first, right after U; `error` is solved last). */
export const NOISE_KIND_KEYS = ['error', 'coherent', ...NOISE_KIND_ORDER] as const;
