/**
 * Outcome probabilities of a final state in the computational basis: the diagonal, its
 * marginal on the measured qubits, and the classical readout confusion applied to it.
 *
 * Outcome order: for measured qubits [q_0, …, q_{m−1}] (the contract passes them sorted
 * ascending), outcome index k has bit m−1−j equal to the result of q_j, so q_0 is the most
 * significant bit and the leftmost character of the bitstring, as in ../engine/layout.ts.
 */
import { bitstring, type DensityMatrix, type StateVector } from '../engine/layout.js';
import { isDensityMatrix } from './stateKind.js';

/** Default cut below which toOutcomeMap leaves an outcome out (probability, dimensionless). */
export const OUTCOME_THRESHOLD = 1e-12;

/** Tolerance on a confusion probability lying outside [0, 1] before it is rejected. */
export const CONFUSION_RANGE_TOLERANCE = 1e-12;

/** Readout confusion of one measured qubit: P(read 1 | true 0) and P(read 0 | true 1). */
export interface ReadoutConfusion {
  readonly zeroAsOne: number;
  readonly oneAsZero: number;
}

/** The computational-basis populations ⟨i|ρ|i⟩ (real part of ρ_ii) of a density matrix, index i as in layout.ts. */
export function diagonalOfDensity(rho: DensityMatrix): Float64Array {
  const d = rho.dim;
  const out = new Float64Array(d);
  const a = rho.data;
  for (let i = 0; i < d; i++) out[i] = a[2 * (i * d + i)]!;
  return out;
}

/** The computational-basis populations |⟨i|ψ⟩|² of a state vector, index i as in layout.ts. */
export function diagonalOfPure(psi: StateVector): Float64Array {
  const d = psi.dim;
  const out = new Float64Array(d);
  const a = psi.data;
  for (let i = 0; i < d; i++) {
    const re = a[2 * i]!;
    const im = a[2 * i + 1]!;
    out[i] = re * re + im * im;
  }
  return out;
}

/** The computational-basis populations of a density matrix or a state vector (told apart by data length). */
export function diagonalOf(state: DensityMatrix | StateVector): Float64Array {
  return isDensityMatrix(state) ? diagonalOfDensity(state) : diagonalOfPure(state);
}

/**
 * Marginal of the n-qubit basis distribution `diag` (length 2^n) on the `measured` qubits:
 * p(k) = Σ over the unmeasured bits, k indexed with measured[0] as most significant bit.
 * O(2^n · m).
 */
export function marginal(diag: Float64Array, n: number, measured: readonly number[]): Float64Array {
  const d = 1 << n;
  if (diag.length !== d) throw new RangeError(`marginal: diagonal has ${diag.length} entries, expected 2^${n} = ${d}`);
  const m = measured.length;
  const masks = new Int32Array(m);
  let seen = 0;
  for (let j = 0; j < m; j++) {
    const q = measured[j]!;
    if (!Number.isInteger(q) || q < 0 || q >= n) throw new RangeError(`marginal: measured qubit ${q} is not in 0..${n - 1}`);
    const mask = 1 << (n - 1 - q);
    if (seen & mask) throw new RangeError(`marginal: qubit ${q} is measured twice`);
    seen |= mask;
    masks[j] = mask;
  }
  const out = new Float64Array(1 << m);
  for (let i = 0; i < d; i++) {
    let k = 0;
    for (let j = 0; j < m; j++) k = (k << 1) | ((i & masks[j]!) !== 0 ? 1 : 0);
    out[k] += diag[i]!;
  }
  return out;
}

/**
 * Distribution of the read outcomes given the true outcome distribution `p` over m measured
 * qubits: each qubit j independently flips 0→1 with confusion[j].zeroAsOne and 1→0 with
 * confusion[j].oneAsZero, i.e. p ← (⊗_j C_j) p with C_j = [[1−a, b], [a, 1−b]] (rows = read,
 * columns = true). Returns a new array; O(m · 2^m).
 */
export function applyReadout(p: Float64Array, confusion: readonly ReadoutConfusion[]): Float64Array {
  const m = confusion.length;
  const size = 1 << m;
  if (p.length !== size) throw new RangeError(`applyReadout: ${p.length} probabilities for ${m} measured qubits (expected ${size})`);
  const out = Float64Array.from(p);
  for (let j = 0; j < m; j++) {
    const a = confusion[j]!.zeroAsOne;
    const b = confusion[j]!.oneAsZero;
    if (!(a >= -CONFUSION_RANGE_TOLERANCE && a <= 1 + CONFUSION_RANGE_TOLERANCE)) {
      throw new RangeError(`applyReadout: zeroAsOne of measured qubit #${j} is ${a}, not a probability`);
    }
    if (!(b >= -CONFUSION_RANGE_TOLERANCE && b <= 1 + CONFUSION_RANGE_TOLERANCE)) {
      throw new RangeError(`applyReadout: oneAsZero of measured qubit #${j} is ${b}, not a probability`);
    }
    if (a === 0 && b === 0) continue;
    applyQubitMap(out, m, j, 1 - a, b, a, 1 - b);
  }
  return out;
}

/**
 * Applies the real 2×2 map [[m00, m01], [m10, m11]] (rows = new value, columns = old) to
 * measured qubit j of the distribution `p` over m qubits, in place (outcome order above).
 */
export function applyQubitMap(p: Float64Array, m: number, j: number, m00: number, m01: number, m10: number, m11: number): void {
  const bit = 1 << (m - 1 - j);
  for (let k = 0; k < p.length; k++) {
    if (k & bit) continue;
    const p0 = p[k]!;
    const p1 = p[k | bit]!;
    p[k] = m00 * p0 + m01 * p1;
    p[k | bit] = m10 * p0 + m11 * p1;
  }
}

/**
 * The distribution `p` over m measured qubits as a map bitstring → probability, keeping only
 * outcomes with probability > threshold (m = 0 gives the single key ''). Beware: JavaScript orders integer-like keys such as
 * '10' before others such as '01', so sort the keys when order matters.
 */
export function toOutcomeMap(p: Float64Array, m: number, threshold: number = OUTCOME_THRESHOLD): Record<string, number> {
  if (p.length !== 1 << m) throw new RangeError(`toOutcomeMap: ${p.length} probabilities for ${m} measured qubits`);
  const out: Record<string, number> = {};
  for (let k = 0; k < p.length; k++) {
    const v = p[k]!;
    if (v > threshold) out[m === 0 ? '' : bitstring(k, m)] = v;
  }
  return out;
}
