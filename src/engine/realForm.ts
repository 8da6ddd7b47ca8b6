/**
 * The "real form" of a Hermiticity-preserving map on k qubits (d = 2^k), the representation
 * the fast kernels use.
 *
 * Basis: the 4^k Hermitian matrices G_J = G_{j_1} ⊗ … ⊗ G_{j_k} (first factor = first target,
 * the most significant local bit, as in ./layout.ts), built from the 2 × 2 Hermitian basis
 *   G_0 = |0⟩⟨0|,  G_1 = |1⟩⟨1|,  G_2 = σ_x = |0⟩⟨1| + |1⟩⟨0|,  G_3 = σ_y = −i|0⟩⟨1| + i|1⟩⟨0|.
 * Any d × d block X = Σ_J x_J G_J with complex coordinates x_J (x_J real iff X Hermitian). A map Φ
 * with Φ(X†) = Φ(X)† (every CPTP map, every U·U†) sends each G_J to a Hermitian matrix, so
 * Φ(G_J) = Σ_I M_IJ G_I with M real: on coordinates Φ acts as the REAL 4^k × 4^k matrix M
 * applied to complex vectors — half the arithmetic of the complex superoperator.
 *
 * The kernels compute unscaled coordinates u_J with sums and differences only, per factor
 * (entries p_ab of the factor's 2 × 2 index pair): u_0 = p_00, u_1 = p_11, u_2 = p_01 + p_10,
 * u_3 = i(p_01 − p_10); then x_J = 2^(−w(J)) u_J with w(J) the number of factors with j ∈ {2, 3}.
 * The inverse per factor is p_00 = y_0, p_11 = y_1, p_01 = y_2 − i·y_3, p_10 = y_2 + i·y_3.
 * The matrix handed to the kernels is M' = M · diag(2^(−w(J))), row-major, so y = M'·u.
 */
import type { CMatrix } from '../linalg/cmatrix.js';

/**
 * Largest imaginary part (relative to max(1, max |M_IJ|)) the real-form matrix of a map may
 * have for the map to count as Hermiticity-preserving; above it the kernels fall back to the
 * complex superoperator. Rounding in a fused CPTP map stays orders of magnitude below it.
 */
export const HERMITICITY_PRESERVING_TOLERANCE = 1e-12;

/**
 * Largest deviation of the trace rows of a 1-qubit real-form matrix from a trace-preserving
 * map's for the kernel that takes the trace as exact (applyReal1Tp). Fused CPTP maps meet it
 * to rounding (~1e-16); a map merely close to trace-preserving keeps the general kernel, so
 * the shortcut never changes a result by more than rounding.
 */
export const TRACE_PRESERVING_TOLERANCE = 1e-14;

/**
 * True when the 1-qubit real-form matrix M' (see below) is that of a trace-preserving map:
 * Tr Φ(X) = y_0 + y_1 and Tr X = u_0 + u_1, so M'_0J + M'_1J = 1 for J ∈ {0, 1} and 0 for J ∈ {2, 3},
 * within TRACE_PRESERVING_TOLERANCE.
 */
export function isTracePreservingRealForm(m: Float64Array): boolean {
  if (m.length !== 16) return false;
  for (let j = 0; j < 4; j++) {
    if (Math.abs(m[j]! + m[4 + j]! - (j < 2 ? 1 : 0)) > TRACE_PRESERVING_TOLERANCE) return false;
  }
  return true;
}

/** Number of factors j_t ∈ {2, 3} in the base-4 digits of J over k factors. */
function offDiagonalWeight(J: number, k: number): number {
  let w = 0;
  for (let t = 0; t < k; t++) if (((J >> (2 * t)) & 3) >= 2) w++;
  return w;
}

/** Nonzero entries of the 2 × 2 basis G_j: [a, b, re, im] per entry. */
const BASIS_ENTRIES: readonly (readonly (readonly [number, number, number, number])[])[] = [
  [[0, 0, 1, 0]],
  [[1, 1, 1, 0]],
  [
    [0, 1, 1, 0],
    [1, 0, 1, 0],
  ],
  [
    [0, 1, 0, -1],
    [1, 0, 0, 1],
  ],
];

/** Nonzero weights f_j(a, b) of entry p_ab in the unscaled coordinate u_j (u_3 = i(p_01 − p_10)): [a, b, re, im]. */
const COORDINATE_WEIGHTS: readonly (readonly (readonly [number, number, number, number])[])[] = [
  [[0, 0, 1, 0]],
  [[1, 1, 1, 0]],
  [
    [0, 1, 1, 0],
    [1, 0, 1, 0],
  ],
  [
    [0, 1, 0, 1],
    [1, 0, 0, -1],
  ],
];

/** A sparse vector over vec indices a + b·d: parallel arrays of index, re, im. */
interface SparseVec {
  readonly index: number[];
  readonly re: number[];
  readonly im: number[];
}

/** The tensor product over k factors (digit t of J, base 4, most significant first) of a per-factor entry table, as a sparse vec. */
function tensorEntries(J: number, k: number, table: typeof BASIS_ENTRIES): SparseVec {
  const d = 1 << k;
  let acc: { a: number; b: number; re: number; im: number }[] = [{ a: 0, b: 0, re: 1, im: 0 }];
  for (let t = 0; t < k; t++) {
    const j = (J >> (2 * (k - 1 - t))) & 3;
    const next: typeof acc = [];
    for (const x of acc) {
      for (const [a, b, fr, fi] of table[j]!) next.push({ a: 2 * x.a + a, b: 2 * x.b + b, re: x.re * fr - x.im * fi, im: x.re * fi + x.im * fr });
    }
    acc = next;
  }
  return { index: acc.map((x) => x.a + x.b * d), re: acc.map((x) => x.re), im: acc.map((x) => x.im) };
}

const tableCache = new Map<number, { basis: SparseVec[]; coords: SparseVec[]; scale: Float64Array }>();

/** vec(G_J), the coordinate functionals u_I and the scales 2^(−w(J)) for k factors (cached). */
function tablesFor(k: number): { basis: SparseVec[]; coords: SparseVec[]; scale: Float64Array } {
  let t = tableCache.get(k);
  if (t === undefined) {
    const d2 = 1 << (2 * k);
    const basis: SparseVec[] = [];
    const coords: SparseVec[] = [];
    const scale = new Float64Array(d2);
    for (let J = 0; J < d2; J++) {
      basis.push(tensorEntries(J, k, BASIS_ENTRIES));
      coords.push(tensorEntries(J, k, COORDINATE_WEIGHTS));
      scale[J] = Math.pow(0.5, offDiagonalWeight(J, k));
    }
    t = { basis, coords, scale };
    tableCache.set(k, t);
  }
  return t;
}

/**
 * The real-form matrix M' (4^k × 4^k, row-major, see above) of the superoperator `s` (column-
 * stacking vec of ./superoperator.ts) on k qubits, or undefined when the map is not
 * Hermiticity-preserving within HERMITICITY_PRESERVING_TOLERANCE.
 * M_IJ = 2^(−w(I)) · u_I(S·vec(G_J)) and M'_IJ = M_IJ · 2^(−w(J)); both vectors are sparse.
 */
export function realFormOf(s: CMatrix, k: number): Float64Array | undefined {
  const d2 = 1 << (2 * k);
  if (s.rows !== d2 || s.cols !== d2) throw new RangeError(`realFormOf: superoperator is ${s.rows}×${s.cols}, expected ${d2}×${d2}`);
  const S = s.data;
  const { basis, coords, scale } = tablesFor(k);
  const out = new Float64Array(d2 * d2);
  let worstIm = 0;
  let largest = 1;
  for (let I = 0; I < d2; I++) {
    const f = coords[I]!;
    for (let J = 0; J < d2; J++) {
      const g = basis[J]!;
      let mr = 0;
      let mi = 0;
      for (let x = 0; x < f.index.length; x++) {
        const row = f.index[x]!;
        const fr = f.re[x]!;
        const fi = f.im[x]!;
        for (let y = 0; y < g.index.length; y++) {
          const e = 2 * (row * d2 + g.index[y]!);
          const sr = S[e]!;
          const si = S[e + 1]!;
          const gr = g.re[y]!;
          const gi = g.im[y]!;
          // f · S · g
          const tr = sr * gr - si * gi;
          const ti = sr * gi + si * gr;
          mr += fr * tr - fi * ti;
          mi += fr * ti + fi * tr;
        }
      }
      mr *= scale[I]!;
      mi *= scale[I]!;
      worstIm = Math.max(worstIm, Math.abs(mi));
      largest = Math.max(largest, Math.abs(mr));
      out[I * d2 + J] = mr * scale[J]!;
    }
  }
  return worstIm <= HERMITICITY_PRESERVING_TOLERANCE * largest ? out : undefined;
}
