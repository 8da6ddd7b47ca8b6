/**
 * Readout-error correction of a measured distribution, with the per-qubit confusion known
 * exactly (the profile's `readout`). The forward model and the outcome order are those of
 * applyReadout in src/results/probabilities.ts: p_read = (⊗_j C_j) p_true with
 * C_j = [[1−a, b], [a, 1−b]] (rows = read, columns = true; a = zero_as_one, b = one_as_zero).
 *
 * - `inverse`: p = (⊗_j C_j⁻¹) p_read, C_j⁻¹ = [[1−b, −b], [−a, 1−a]] / (1 − a − b), applied
 *   qubit by qubit (a tensored inverse never forms the 2^m × 2^m matrix). Exact when the
 *   confusion is the true one, but may have negative entries when p_read carries sampling
 *   noise or model error.
 * - `bounded`: the inverse's result projected onto the probability simplex in the Euclidean
 *   norm (the nearest distribution: non-negative, summing to 1), by the sort-and-threshold
 *   algorithm of M. Held, P. Wolfe, H. P. Crowder, Math. Programming 6, 62 (1974), as
 *   presented by J. Duchi et al., ICML 2008 (from memory). It equals the inverse whenever
 *   that is already a distribution.
 */
import { applyQubitMap, CONFUSION_RANGE_TOLERANCE, type ReadoutConfusion } from '../results/probabilities.js';

/** The readout-correction methods. */
export type ReadoutMethod = 'inverse' | 'bounded';

/** The methods in the order help texts list them. */
export const READOUT_METHODS: readonly ReadoutMethod[] = ['inverse', 'bounded'];

/** Below this |1 − a − b| a qubit's confusion is treated as not invertible (its readout carries no information). */
export const SINGULAR_CONFUSION = 1e-12;

/** p_read corrected by the tensored inverse confusion (outcome order of src/results/probabilities.ts). */
export function invertReadout(pRead: Float64Array, confusion: readonly ReadoutConfusion[]): Float64Array {
  const m = confusion.length;
  const size = 1 << m;
  if (pRead.length !== size) throw new RangeError(`invertReadout: ${pRead.length} probabilities for ${m} measured qubits (expected ${size})`);
  const out = Float64Array.from(pRead);
  for (let j = 0; j < m; j++) {
    const a = confusion[j]!.zeroAsOne;
    const b = confusion[j]!.oneAsZero;
    if (!(a >= -CONFUSION_RANGE_TOLERANCE && b >= -CONFUSION_RANGE_TOLERANCE)) throw new RangeError(`invertReadout: confusion of measured qubit #${j} is not a probability`);
    if (a === 0 && b === 0) continue;
    const det = 1 - a - b;
    if (Math.abs(det) < SINGULAR_CONFUSION) throw new RangeError(`invertReadout: measured qubit #${j} has zero_as_one + one_as_zero = 1; its readout cannot be inverted`);
    applyQubitMap(out, m, j, (1 - b) / det, -b / det, -a / det, (1 - a) / det);
  }
  return out;
}

/** The Euclidean projection of `v` onto the probability simplex {p ≥ 0, Σp = 1} (Held–Wolfe–Crowder, see above). */
export function projectToSimplex(v: Float64Array): Float64Array {
  const n = v.length;
  if (n === 0) throw new RangeError('projectToSimplex: empty vector');
  const u = Float64Array.from(v).sort().reverse();
  let cumulative = 0;
  let theta = 0;
  for (let i = 0; i < n; i++) {
    cumulative += u[i]!;
    const t = (cumulative - 1) / (i + 1);
    // the largest i with u_i > t gives the threshold
    if (u[i]! - t > 0) theta = t;
  }
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = Math.max(v[i]! - theta, 0);
  return out;
}

/** Corrects p_read by `method` (see the module comment). */
export function correctReadout(pRead: Float64Array, confusion: readonly ReadoutConfusion[], method: ReadoutMethod): Float64Array {
  const inv = invertReadout(pRead, confusion);
  if (method === 'inverse') return inv;
  // Already a distribution (to rounding): keep it as is, so `bounded` equals `inverse` there.
  if (inv.every((x) => x >= 0)) return inv;
  return projectToSimplex(inv);
}
