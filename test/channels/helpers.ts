/**
 * Test helpers for src/channels: seeded random isometries (QR of complex Gaussian matrices by
 * modified Gram–Schmidt, whose Q factor is the isometry), random CPTP channels from them,
 * random states, and a few direct (definition-level) computations to compare with.
 */
import { type CMatrix, add, adjoint, identity, kron, mul, zeros } from '../../src/linalg/cmatrix.js';
import { gaussian, mulberry32 } from '../helpers/random.js';
import { orthonormaliseColumns, randomGaussianMatrix } from '../engine/helpers.js';

export { gaussian, mulberry32 };
export { randomUnitary } from '../engine/helpers.js';

/** Agreement required for conversions that are exact up to rounding. */
export const ROUND_TRIP = 1e-12;

/**
 * Random CPTP channel on d dimensions with r Kraus operators: a random isometry V ((d·r) × d)
 * read with the environment factor last, K_k[a][i] = V[a·r + k][i] (so Σ K†K = V†V = I).
 */
export function randomKraus(rng: () => number, d: number, r: number): CMatrix[] {
  const v = orthonormaliseColumns(randomGaussianMatrix(rng, d * r, d));
  const out: CMatrix[] = [];
  for (let k = 0; k < r; k++) {
    const m = zeros(d, d);
    for (let a = 0; a < d; a++) {
      for (let i = 0; i < d; i++) {
        m.data[2 * (a * d + i)] = v.data[2 * ((a * r + k) * d + i)]!;
        m.data[2 * (a * d + i) + 1] = v.data[2 * ((a * r + k) * d + i) + 1]!;
      }
    }
    out.push(m);
  }
  return out;
}

/** Random d × d density matrix G G†/Tr(G G†). */
export function randomDensity(rng: () => number, d: number): CMatrix {
  const g = randomGaussianMatrix(rng, d, d);
  const r = mul(g, adjoint(g));
  let t = 0;
  for (let i = 0; i < d; i++) t += r.data[2 * (i * d + i)]!;
  for (let i = 0; i < r.data.length; i++) r.data[i] /= t;
  return r;
}

/** Random pure state as a d × 1 column. */
export function randomKet(rng: () => number, d: number): CMatrix {
  return orthonormaliseColumns(randomGaussianMatrix(rng, d, 1));
}

/** Σ_k K_k ρ K_k†, straight from the definition. */
export function applyKraus(kraus: readonly CMatrix[], rho: CMatrix): CMatrix {
  let out = zeros(rho.rows, rho.cols);
  for (const k of kraus) out = add(out, mul(mul(k, rho), adjoint(k)));
  return out;
}

/** |i⟩⟨j| on d dimensions. */
export function unit(d: number, i: number, j: number): CMatrix {
  const m = zeros(d, d);
  m.data[2 * (i * d + j)] = 1;
  return m;
}

/** Choi matrix Σ_ij |i⟩⟨j| ⊗ E(|i⟩⟨j|) built from its definition for any map on d × d matrices. */
export function choiOfMap(map: (x: CMatrix) => CMatrix, d: number): CMatrix {
  let out = zeros(d * d, d * d);
  for (let i = 0; i < d; i++) for (let j = 0; j < d; j++) out = add(out, kron(unit(d, i, j), map(unit(d, i, j))));
  return out;
}

/** Largest |a_ij − b_ij| (shapes must match). */
export function maxDiff(a: CMatrix, b: CMatrix): number {
  if (a.rows !== b.rows || a.cols !== b.cols) return Infinity;
  let w = 0;
  for (let k = 0; k < a.data.length; k += 2) w = Math.max(w, Math.hypot(a.data[k]! - b.data[k]!, a.data[k + 1]! - b.data[k + 1]!));
  return w;
}

/** The d × d identity (re-export for brevity). */
export const eye = identity;
