/**
 * THE register conventions of fray, stated once; everything else refers here.
 *
 * Bit order: qubit 0 is the most significant bit of a basis index. For n qubits the
 * basis state |b_0 b_1 … b_{n-1}⟩ has index i = Σ_q b_q · 2^(n−1−q), so qubit 0 is the
 * leftmost tensor factor and the leftmost character of a bitstring. A k-qubit operator
 * applied to targets [q_0, …, q_{k−1}] has q_0 as its leftmost (most significant) factor.
 *
 * Density matrix: one Float64Array of length 2·D² (D = 2^n), row-major, real and
 * imaginary parts interleaved: ρ[r][c] = data[2(rD + c)] + i·data[2(rD + c) + 1].
 *
 * State vector: one Float64Array of length 2·D, amplitude of |i⟩ at data[2i] + i·data[2i + 1].
 */

/** Bit mask of qubit q in a basis index of an n-qubit register (qubit 0 = most significant). */
export function qubitMask(n: number, q: number): number {
  return 1 << (n - 1 - q);
}

/** A density matrix of n qubits in the layout above. */
export interface DensityMatrix {
  readonly n: number;
  readonly dim: number;
  readonly data: Float64Array;
}

/** A pure state of n qubits in the layout above. */
export interface StateVector {
  readonly n: number;
  readonly dim: number;
  readonly data: Float64Array;
}

/** Bytes taken by the density matrix of n qubits (2·4^n doubles). */
export function densityMatrixBytes(n: number): number {
  return 16 * Math.pow(4, n);
}

/** Bytes taken by the state vector of n qubits (2·2^n doubles). */
export function stateVectorBytes(n: number): number {
  return 16 * Math.pow(2, n);
}

/** The bitstring of basis index i over n qubits, qubit 0 leftmost. */
export function bitstring(i: number, n: number): string {
  return i.toString(2).padStart(n, '0');
}
