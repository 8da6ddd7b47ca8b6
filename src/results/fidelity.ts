/**
 * Figures of merit comparing the noisy final state with the ideal one, and the measured
 * outcome distribution with the ideal one.
 *
 * State fidelity uses the squared Uhlmann–Jozsa convention F(ρ, σ) = (Tr √(√σ ρ √σ))²
 * (R. Jozsa, J. Mod. Opt. 41, 2315 (1994)), so F ∈ [0, 1], F = ⟨ψ|ρ|ψ⟩ for σ = |ψ⟩⟨ψ|.
 */
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import type { DensityMatrix, StateVector } from '../engine/layout.js';
import { isDensityMatrix } from './stateKind.js';
import { hermitianEigenvalues, hermitianEmbedding } from '../linalg/hermitianEigen.js';
import { zeros } from '../linalg/cmatrix.js';
import type { IdealState } from '../engine/run.js';
import { orthogonalBranches } from '../engine/ensemble.js';

/** Eigenvalues of a density-matrix-like operator down to −this are rounding and clipped to 0; below it the input is rejected as not positive semidefinite. */
export const NEGATIVE_EIGENVALUE_TOLERANCE = 1e-9;

/**
 * Eigenvalues of a trace-one state at or below this count as outside its support (rounding
 * leaves ≈1e-16 there). Dropping a genuine eigenvalue λ below it moves √F by at most ≈√λ.
 */
export const SUPPORT_EIGENVALUE_TOLERANCE = 1e-12;

export type { IdealState };

/** Eigenvalues of Ψ†ρΨ at or below this are rounding of exact zeros (entries are O(1), rounding ≈1e-16). */
export const ROUNDING_EIGENVALUE = 1e-15;

/** Uhlmann–Jozsa fidelity F(ρ, σ) = (Tr √(√σ ρ √σ))² (squared convention) of the noisy ρ with the ideal σ. */
export function stateFidelity(rho: DensityMatrix, ideal: IdealState): number {
  if (!isDensityMatrix(rho)) throw new RangeError('stateFidelity: the noisy state must be a density matrix');
  if (ideal.kind === 'pure') return pureFidelity(rho, ideal.state);
  if (ideal.kind === 'ensemble') return ensembleFidelity(rho, ideal.states);
  return mixedFidelity(rho, ideal.rho);
}

/**
 * F(ρ, σ) for σ = Σ_i |ψ_i⟩⟨ψ_i| = ΨΨ† given by r unnormalised branches: √σ ρ √σ has the same
 * nonzero eigenvalues as ρ^½ ΨΨ† ρ^½ (XX† and X†X with X = ρ^½ σ^½ share them) and hence as the
 * r × r matrix M = Ψ†ρΨ, M_ij = ⟨ψ_i|ρ|ψ_j⟩ (AB and BA share nonzero eigenvalues). So
 * F = (Σ_k √μ_k)² over the eigenvalues μ of M — O(r·D²), no 2^n × 2^n eigenproblem.
 */
function ensembleFidelity(rho: DensityMatrix, given: readonly StateVector[]): number {
  // Orthogonal branches first: linearly dependent ones would put exact zeros among the
  // eigenvalues of M, which rounding turns into ≈1e-17 and the square roots into ≈1e-9.
  const states = orthogonalBranches(given);
  const r = states.length;
  const d = rho.dim;
  const m = zeros(r, r);
  const w = new Float64Array(2 * d);
  for (let j = 0; j < r; j++) {
    applyDensityMatrix(rho, states[j]!.data, w); // w = ρ ψ_j
    for (let i = 0; i < r; i++) {
      const u = states[i]!.data;
      let sr = 0;
      let si = 0;
      for (let a = 0; a < d; a++) {
        // conj(ψ_i[a]) · w[a]
        sr += u[2 * a]! * w[2 * a]! + u[2 * a + 1]! * w[2 * a + 1]!;
        si += u[2 * a]! * w[2 * a + 1]! - u[2 * a + 1]! * w[2 * a]!;
      }
      m.data[2 * (i * r + j)] = sr;
      m.data[2 * (i * r + j) + 1] = si;
    }
  }
  let traceSqrt = 0;
  for (const mu of hermitianEigenvalues(m)) {
    if (mu < -NEGATIVE_EIGENVALUE_TOLERANCE) throw new RangeError(`stateFidelity: Ψ†ρΨ has eigenvalue ${mu}`);
    // A rank-deficient ρ leaves exact zeros among the μ; rounding makes them ≈1e-19, whose
    // square roots (≈1e-9) would otherwise add up.
    if (mu > ROUNDING_EIGENVALUE) traceSqrt += Math.sqrt(mu);
  }
  return traceSqrt * traceSqrt;
}

/** ⟨ψ|ρ|ψ⟩ (real part): the fidelity of ρ with the pure state |ψ⟩⟨ψ|; O(D²). */
function pureFidelity(rho: DensityMatrix, psi: StateVector): number {
  if (isDensityMatrix(psi) && psi.dim !== 1) throw new RangeError('stateFidelity: a pure ideal state must be a state vector');
  if (psi.n !== rho.n) throw new RangeError(`stateFidelity: ${rho.n}-qubit state against ${psi.n}-qubit ideal`);
  const v = psi.data;
  const w = new Float64Array(2 * rho.dim);
  applyDensityMatrix(rho, v, w);
  let acc = 0;
  for (let i = 0; i < rho.dim; i++) acc += v[2 * i]! * w[2 * i]! + v[2 * i + 1]! * w[2 * i + 1]!;
  return acc;
}

/** out = ρ·v for a state vector's amplitudes v (interleaved, length 2D). */
function applyDensityMatrix(rho: DensityMatrix, v: Float64Array, out: Float64Array): void {
  const d = rho.dim;
  const R = rho.data;
  for (let a = 0; a < d; a++) {
    let wr = 0;
    let wi = 0;
    const row = 2 * a * d;
    for (let b = 0; b < d; b++) {
      const ar = R[row + 2 * b]!;
      const ai = R[row + 2 * b + 1]!;
      const br = v[2 * b]!;
      const bi = v[2 * b + 1]!;
      wr += ar * br - ai * bi;
      wi += ar * bi + ai * br;
    }
    out[2 * a] = wr;
    out[2 * a + 1] = wi;
  }
}

/** Eigen-decomposition of the real embedding of a density matrix, checked positive semidefinite. */
function psdEigen(state: DensityMatrix, what: string): EigenvalueDecomposition {
  const eig = new EigenvalueDecomposition(hermitianEmbedding(state.data, state.dim), { assumeSymmetric: true });
  for (const lambda of eig.realEigenvalues) {
    if (lambda < -NEGATIVE_EIGENVALUE_TOLERANCE) {
      throw new RangeError(`stateFidelity: ${what} has eigenvalue ${lambda}, it is not positive semidefinite`);
    }
  }
  return eig;
}

/** Number of eigenvalues above SUPPORT_EIGENVALUE_TOLERANCE (in the embedding: twice the complex rank). */
function supportSize(eig: EigenvalueDecomposition): number {
  let r = 0;
  for (const lambda of eig.realEigenvalues) if (lambda > SUPPORT_EIGENVALUE_TOLERANCE) r++;
  return r;
}

/**
 * (Tr √(√σ ρ √σ))² for a mixed σ. F is symmetric, so the state of smaller numerical rank r
 * is taken as σ; with σ = V Λ Vᵀ on its support (real embedding, V of 2r orthonormal
 * columns), √σ ρ √σ = V L Vᵀ with L = Λ^½ Vᵀ ρ V Λ^½, so the nonzero eigenvalues μ of the
 * embedded √σ ρ √σ are those of the 2r × 2r matrix L, each complex eigenvalue twice:
 * Tr √(√σ ρ √σ) = ½ Σ √μ. Working on the support keeps rounding-level eigenvalues (≈1e-16,
 * whose square roots ≈1e-8 would otherwise add up) out of the sum.
 */
function mixedFidelity(rho: DensityMatrix, sigma: DensityMatrix): number {
  if (!isDensityMatrix(sigma)) throw new RangeError('stateFidelity: a mixed ideal state must be a density matrix');
  if (sigma.n !== rho.n) throw new RangeError(`stateFidelity: ${rho.n}-qubit state against ${sigma.n}-qubit ideal`);
  const eigSigma = psdEigen(sigma, 'the ideal state');
  const eigRho = psdEigen(rho, 'the noisy state');
  const sigmaFirst = supportSize(eigSigma) <= supportSize(eigRho);
  const outer = sigmaFirst ? eigSigma : eigRho;
  const other = sigmaFirst ? rho : sigma;
  const lambdas = outer.realEigenvalues;
  const vectors = outer.eigenvectorMatrix;
  const size = lambdas.length;
  const keep: number[] = [];
  for (let c = 0; c < size; c++) if (lambdas[c]! > SUPPORT_EIGENVALUE_TOLERANCE) keep.push(c);
  const r = keep.length;
  if (r === 0) return 0;
  // W = V Λ^½ restricted to the support (size × r).
  const w = new Matrix(size, r);
  for (let k = 0; k < r; k++) {
    const c = keep[k]!;
    const s = Math.sqrt(lambdas[c]!);
    for (let row = 0; row < size; row++) w.set(row, k, vectors.get(row, c) * s);
  }
  const l = w.transpose().mmul(hermitianEmbedding(other.data, other.dim)).mmul(w);
  const sym = l.add(l.transpose()).mul(0.5);
  const mu = new EigenvalueDecomposition(sym, { assumeSymmetric: true }).realEigenvalues;
  let traceSqrt = 0;
  for (const x of mu) {
    if (x < -NEGATIVE_EIGENVALUE_TOLERANCE) throw new RangeError(`stateFidelity: √σ ρ √σ has eigenvalue ${x}`);
    if (x > 0) traceSqrt += Math.sqrt(x);
  }
  // Every eigenvalue appears twice in the embedding.
  const t = 0.5 * traceSqrt;
  return t * t;
}

function checkSameLength(p: Float64Array, q: Float64Array, what: string): void {
  if (p.length !== q.length) throw new RangeError(`${what}: distributions of ${p.length} and ${q.length} outcomes`);
}

/** Classical (Bhattacharyya-squared) fidelity (Σ_x √(p(x) q(x)))² of two outcome distributions; rounding negatives count as 0. */
export function classicalFidelity(p: Float64Array, q: Float64Array): number {
  checkSameLength(p, q, 'classicalFidelity');
  let s = 0;
  for (let k = 0; k < p.length; k++) {
    const x = p[k]! * q[k]!;
    if (x > 0) s += Math.sqrt(x);
  }
  return s * s;
}

/** Total variation distance ½ Σ_x |p(x) − q(x)| of two outcome distributions. */
export function totalVariationDistance(p: Float64Array, q: Float64Array): number {
  checkSameLength(p, q, 'totalVariationDistance');
  let s = 0;
  for (let k = 0; k < p.length; k++) s += Math.abs(p[k]! - q[k]!);
  return 0.5 * s;
}

/** Purity Tr ρ² = Σ_rc |ρ_rc|² of a Hermitian density matrix (1 for pure states, 1/D for the maximally mixed one). */
export function purity(rho: DensityMatrix): number {
  if (!isDensityMatrix(rho)) throw new RangeError('purity: expects a density matrix');
  const a = rho.data;
  let s = 0;
  for (let k = 0; k < a.length; k++) s += a[k]! * a[k]!;
  return s;
}
