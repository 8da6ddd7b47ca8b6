import type { DensityMatrix, StateVector } from '../engine/layout.js';

/**
 * True when `state` holds a density matrix (2·D² doubles) rather than a state vector
 * (2·D doubles); the two layouts of ../engine/layout.ts have the same shape of object, so
 * the length of the data tells them apart. For n = 0 (D = 1) the lengths coincide and the
 * state is read as a density matrix.
 */
export function isDensityMatrix(state: DensityMatrix | StateVector): boolean {
  const d = state.dim;
  if (d !== 1 << state.n) throw new RangeError(`state: dim ${d} is not 2^n for n = ${state.n}`);
  if (state.data.length === 2 * d * d) return true;
  if (state.data.length === 2 * d) return false;
  throw new RangeError(
    `state: data length ${state.data.length} fits neither a density matrix (${2 * d * d}) nor a state vector (${2 * d}) of ${state.n} qubits`,
  );
}
