/**
 * Mixed states as ensembles of unnormalised pure branches, σ = Σ_i |ψ_i⟩⟨ψ_i| (the form the
 * ideal run keeps after resets; layout of every branch as in ./layout.ts).
 */
import { zeros } from '../linalg/cmatrix.js';
import { hermitianEigen } from '../linalg/hermitianEigen.js';
import type { StateVector } from './layout.js';

/**
 * Eigenvalues of the branches' Gram matrix at or below this (relative to the total weight 1)
 * are rounding, not state: resets can leave more branches than σ has rank (linearly dependent
 * branches), and the zero eigenvalues they bring would come back as ≈1e-8 through square roots.
 */
export const BRANCH_SUPPORT_TOLERANCE = 1e-13;

/**
 * The same σ = Σ_i |ψ_i⟩⟨ψ_i| as orthogonal branches φ_k = Σ_i V_ik ψ_i, from the eigenvectors
 * v_k of the Gram matrix G_ij = ⟨ψ_i|ψ_j⟩ = (Ψ†Ψ)_ij: ΨΨ† = Σ_k (Ψv_k)(Ψv_k)† and ‖φ_k‖² = λ_k;
 * components with λ_k ≤ BRANCH_SUPPORT_TOLERANCE are dropped, so there are at most rank(σ).
 */
export function orthogonalBranches(states: readonly StateVector[]): StateVector[] {
  const r = states.length;
  const n = states[0]!.n;
  const D = states[0]!.dim;
  const g = zeros(r, r);
  for (let i = 0; i < r; i++) {
    const u = states[i]!.data;
    for (let j = i; j < r; j++) {
      const v = states[j]!.data;
      let sr = 0;
      let si = 0;
      for (let a = 0; a < D; a++) {
        sr += u[2 * a]! * v[2 * a]! + u[2 * a + 1]! * v[2 * a + 1]!;
        si += u[2 * a]! * v[2 * a + 1]! - u[2 * a + 1]! * v[2 * a]!;
      }
      g.data[2 * (i * r + j)] = sr;
      g.data[2 * (i * r + j) + 1] = si;
      g.data[2 * (j * r + i)] = sr;
      g.data[2 * (j * r + i) + 1] = -si;
    }
  }
  const { values, vectors } = hermitianEigen(g);
  const out: StateVector[] = [];
  for (let k = 0; k < r; k++) {
    if (!(values[k]! > BRANCH_SUPPORT_TOLERANCE)) continue;
    const phi = new Float64Array(2 * D);
    for (let i = 0; i < r; i++) {
      const cr = vectors.data[2 * (i * r + k)]!;
      const ci = vectors.data[2 * (i * r + k) + 1]!;
      const u = states[i]!.data;
      for (let a = 0; a < D; a++) {
        phi[2 * a] += cr * u[2 * a]! - ci * u[2 * a + 1]!;
        phi[2 * a + 1] += cr * u[2 * a + 1]! + ci * u[2 * a]!;
      }
    }
    out.push({ n, dim: D, data: phi });
  }
  return out;
}

