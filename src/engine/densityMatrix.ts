/**
 * Creation and diagnostics of n-qubit density matrices in the layout of ./layout.ts.
 */
import { EigenvalueDecomposition } from 'ml-matrix';
import { hermitianEmbedding } from '../linalg/hermitianEigen.js';
import type { DensityMatrix } from './layout.js';
import { checkQubitCount } from './targets.js';

/** Largest register for which minEigenvalue is offered (its dense real embedding is 2^(n+1) square). */
export const MIN_EIGENVALUE_MAX_QUBITS = 8;

/** The n-qubit pure state |0…0⟩⟨0…0|. */
export function createDensityMatrix(n: number): DensityMatrix {
  checkQubitCount(n, 'createDensityMatrix');
  const dim = 1 << n;
  const data = new Float64Array(2 * dim * dim);
  data[0] = 1;
  return { n, dim, data };
}

/** An independent copy of ρ. */
export function cloneDensityMatrix(rho: DensityMatrix): DensityMatrix {
  return { n: rho.n, dim: rho.dim, data: Float64Array.from(rho.data) };
}

/** Real part of Tr ρ = Σ_i ρ_ii (1 for a normalised state). */
export function traceOf(rho: DensityMatrix): number {
  const D = rho.dim;
  let t = 0;
  for (let i = 0; i < D; i++) t += rho.data[2 * (i * D + i)]!;
  return t;
}

/** Hermiticity residual max_ij |ρ_ij − conj(ρ_ji)| (0 for an exactly Hermitian matrix). */
export function hermiticityResidual(rho: DensityMatrix): number {
  const D = rho.dim;
  const R = rho.data;
  let worst = 0;
  for (let i = 0; i < D; i++) {
    for (let j = i; j < D; j++) {
      const a = 2 * (i * D + j);
      const b = 2 * (j * D + i);
      const dr = R[a]! - R[b]!;
      const di = R[a + 1]! + R[b + 1]!;
      const e = Math.hypot(dr, di);
      if (e > worst) worst = e;
    }
  }
  return worst;
}

/**
 * Smallest eigenvalue of the Hermitian part of ρ = A + iB (A, B real), computed with ml-matrix on
 * the real symmetric embedding [[A, −B], [B, A]], whose eigenvalues are those of A + iB, each
 * twice. For small registers only (n ≤ MIN_EIGENVALUE_MAX_QUBITS); used to check positivity.
 */
export function minEigenvalue(rho: DensityMatrix): number {
  if (rho.n > MIN_EIGENVALUE_MAX_QUBITS) {
    throw new RangeError(`minEigenvalue: ${rho.n} qubits exceeds the limit of ${MIN_EIGENVALUE_MAX_QUBITS}`);
  }
  const m = hermitianEmbedding(rho.data, rho.dim);
  const eig = new EigenvalueDecomposition(m, { assumeSymmetric: true });
  let lo = Infinity;
  for (const v of eig.realEigenvalues) if (v < lo) lo = v;
  return lo;
}
