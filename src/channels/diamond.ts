/**
 * The diamond distance ‖E − F‖_⋄ = max_ρ ‖((E − F) ⊗ id)(ρ)‖₁ between two maps on d × d
 * matrices (trace norm, so it ranges over [0, 2] for two channels; some authors halve it),
 * with ρ over states of the system and a d-dimensional reference. Sources: J. Watrous,
 * The Theory of Quantum Information (Cambridge 2018), §3.3 (from memory).
 *
 * Exact where a closed form holds:
 * - two unitary channels U·U†, V·V†: ‖ − ‖_⋄ = 2·√(1 − δ²) with δ the distance from 0 to the
 *   convex hull of the eigenvalues of U†V (D. Aharonov, A. Kitaev, N. Nisan, STOC 1998;
 *   Watrous 2018, §3.3; from memory). For eigenvalues e^{iθ_j} lying on an arc of angular
 *   length α < π the hull's nearest edge is the chord between the arc's ends, δ = cos(α/2),
 *   so the distance is 2·sin(α/2); otherwise 0 is in the hull and the distance is 2.
 * - a Pauli-diagonal difference Δ = Σ_i c_i P_i·P_i (E and F Pauli channels; the Pauli
 *   transfer matrix of Δ is diagonal): ‖Δ‖_⋄ = Σ_i |c_i| (derived: the maximally entangled
 *   input gives Σ|c_i| since the Choi matrix is diagonal in the orthogonal basis vec(P_i)
 *   with eigenvalues d·c_i, and the triangle inequality with ‖P·P‖_⋄ = 1 gives ≤ Σ|c_i|).
 *   Against the identity a Pauli channel with identity weight p_I is at 2(1 − p_I).
 * Otherwise a certified interval (every pure input is |ψ⟩ = (M ⊗ I)|Ω⟩ with |Ω⟩ = Σ_i |i⟩|i⟩ and
 * ‖M‖_F = 1, and gives the output H(M) = (M ⊗ I)·J_Δ·(M ⊗ I)†):
 * - lower bound: ‖H(M)‖₁ for the best input found. First along the fixed-point iteration of
 *   fixedPointBounds below (inputs M = A^{1/2}, starting at the maximally entangled input
 *   A = I/d, which alone gives ‖J_Δ‖₁/d); when that leaves a gap, also by an alternating
 *   ascent from the maximally entangled and seeded random inputs, which fixes S = sign(H(M))
 *   and replaces M by the top eigenvector of the Hermitian form M ↦ Tr(S·H(M)); since
 *   ‖H‖₁ ≥ Tr(S H) for every S with ‖S‖ ≤ 1, no step lowers the bound.
 * - upper bound: for Hermiticity-preserving Δ and any A ≻ 0 let J_A = (A^{1/2} ⊗ I) J_Δ (A^{1/2} ⊗ I)
 *   = P − Q (P, Q ⪰ 0, |J_A| = P + Q). Every pure input has H(M) = (N ⊗ I) J_A (N ⊗ I)† with
 *   N = M A^{−1/2}, so ‖H(M)‖₁ ≤ Tr((N†N ⊗ I)(P + Q)) = Tr(M†M · A^{−1/2} Tr_out|J_A| A^{−1/2})
 *   ≤ U(A) = ‖A^{−1/2} Tr_out|J_A| A^{−1/2}‖_∞ (derived from the triangle inequality and
 *   Tr M†M = 1; mixed inputs are mixtures of pure ones). A = I gives ‖Tr_out|J_Δ|‖_∞, never
 *   above ‖J_Δ‖₁ (the Hölder bound of Watrous 2018, used for maps that are not Hermiticity
 *   preserving); A = M†M of the best input found makes U(A) meet the lower bound at the
 *   optimum, where Tr_out|J_A| ∝ A (the optimality condition of the semidefinite programme
 *   for the diamond norm, J. Watrous, Theory of Computing 8, 1 (2012), from memory). The
 *   least U over A = I and A = M†M + δ·I for a few δ is used, capped at 2 for two CPTP maps.
 * When the two bounds agree to DIAMOND_EXACT_TOLERANCE the value is reported as exact.
 */
import { type CMatrix, add, adjoint, identity, kron, mul, scale, sub, zeros } from '../linalg/cmatrix.js';
import { createRandom } from '../results/random.js';
import type { Channel } from './channel.js';
import { traceOutput } from './choi.js';
import { hermitianEigen } from '../linalg/hermitianEigen.js';
import { antiHermitianDeviation, hermitianFunction, maxAbs, traceNorm } from './norms.js';
import { pauliBasis } from './ptm.js';
import { PHYSICALITY_TOLERANCE } from './tolerances.js';

/** Upper and lower bound closer than this count as the exact value. */
export const DIAMOND_EXACT_TOLERANCE = 1e-9;
/** Largest off-diagonal entry of the difference's Pauli transfer matrix for the Pauli-diagonal closed form. */
export const PAULI_DIAGONAL_TOLERANCE = 1e-12;
/** Largest residual ‖W q − λ q‖ accepted for an eigenpair of the unitary U†V. */
export const UNITARY_EIGEN_TOLERANCE = 1e-10;
/** Seeded random starts of the lower-bound search (besides the maximally entangled input), for 1 and 2 qubits. */
export const DIAMOND_RANDOM_STARTS = 4;
/** Seeded random starts for 3 qubits, where each step costs two 128 × 128 real eigenproblems. */
export const DIAMOND_RANDOM_STARTS_LARGE = 1;
/** Most ascent steps per start (1 and 2 qubits). */
export const DIAMOND_MAX_ITERATIONS = 60;
/** Most ascent steps per start for 3 qubits. */
export const DIAMOND_MAX_ITERATIONS_LARGE = 15;
/** Most fixed-point steps of the two-sided bound (1 and 2 qubits). */
export const DIAMOND_FIXED_POINT_ITERATIONS = 300;
/** Most fixed-point steps for 3 qubits (each costs a 128 × 128 real eigenproblem). */
export const DIAMOND_FIXED_POINT_ITERATIONS_LARGE = 25;
/** Weight of I/d mixed into the fixed-point iterate, keeping it positive definite. */
export const DIAMOND_FIXED_POINT_MIX = 1e-7;
/** The ascent stops when a step raises the bound by less than this, relative to max(1, bound). */
export const DIAMOND_ASCENT_CONVERGENCE = 1e-13;
/** Regularisations δ of the upper bound's A = M†M + δ·I (M of the best input; ‖M‖_F = 1). */
export const DIAMOND_REGULARISATIONS: readonly number[] = [1e-2, 1e-4, 1e-6, 1e-8, 1e-10];
/** Seed of the random starts (fixed, so the bounds are reproducible). */
export const DIAMOND_SEED = 7_031_998;

/** How a diamond distance was obtained. */
export type DiamondMethod = 'unitaries' | 'pauli' | 'bounds';

/** A diamond distance: exact (lower = upper = value) or a certified interval [lower, upper]. */
export interface DiamondDistance {
  readonly lower: number;
  readonly upper: number;
  readonly exact: boolean;
  /** The exact value, when known. */
  readonly value?: number;
  readonly method: DiamondMethod;
}

/** Eigenvalues [re, im] of a unitary (normal) W: eigenvectors of the Hermitian Re(e^{−iα}W) for a generic α, checked by their residual. */
export function unitaryEigenvalues(w: CMatrix): Array<[number, number]> {
  const n = w.rows;
  const wd = adjoint(w);
  for (const alpha of [0.6180339887498949, 1.4142135623730951, 2.718281828459045, 0.3183098861837907]) {
    const c = Math.cos(alpha);
    const s = Math.sin(alpha);
    // Re(e^{−iα}W) = (e^{−iα}W + e^{iα}W†)/2
    const h = zeros(n, n);
    for (let k = 0; k < h.data.length; k += 2) {
      const ar = c * w.data[k]! + s * w.data[k + 1]!;
      const ai = c * w.data[k + 1]! - s * w.data[k]!;
      const br = c * wd.data[k]! - s * wd.data[k + 1]!;
      const bi = c * wd.data[k + 1]! + s * wd.data[k]!;
      h.data[k] = 0.5 * (ar + br);
      h.data[k + 1] = 0.5 * (ai + bi);
    }
    const { vectors } = hermitianEigen(h);
    const wq = mul(w, vectors);
    const out: Array<[number, number]> = [];
    let ok = true;
    for (let k = 0; k < n && ok; k++) {
      // λ = q† W q
      let lr = 0;
      let li = 0;
      for (let r = 0; r < n; r++) {
        const qr = vectors.data[2 * (r * n + k)]!;
        const qi = vectors.data[2 * (r * n + k) + 1]!;
        const xr = wq.data[2 * (r * n + k)]!;
        const xi = wq.data[2 * (r * n + k) + 1]!;
        lr += qr * xr + qi * xi;
        li += qr * xi - qi * xr;
      }
      let res = 0;
      for (let r = 0; r < n; r++) {
        const qr = vectors.data[2 * (r * n + k)]!;
        const qi = vectors.data[2 * (r * n + k) + 1]!;
        res += (wq.data[2 * (r * n + k)]! - (lr * qr - li * qi)) ** 2 + (wq.data[2 * (r * n + k) + 1]! - (lr * qi + li * qr)) ** 2;
      }
      if (Math.sqrt(res) > UNITARY_EIGEN_TOLERANCE) ok = false;
      out.push([lr, li]);
    }
    if (ok) return out;
  }
  throw new RangeError('unitaryEigenvalues: no eigenbasis found; is the matrix unitary?');
}

/** ‖U·U† − V·V†‖_⋄ = 2√(1 − δ²), δ the distance from 0 to the convex hull of the eigenvalues of U†V (see the file comment). */
export function unitaryDiamondDistance(u: CMatrix, v: CMatrix): number {
  const angles = unitaryEigenvalues(mul(adjoint(u), v))
    .map(([re, im]) => Math.atan2(im, re))
    .sort((a, b) => a - b);
  let gap = angles[0]! + 2 * Math.PI - angles[angles.length - 1]!;
  for (let i = 1; i < angles.length; i++) gap = Math.max(gap, angles[i]! - angles[i - 1]!);
  const arc = 2 * Math.PI - gap; // the eigenvalues lie on an arc of this angular length
  return arc >= Math.PI ? 2 : 2 * Math.sin(arc / 2);
}

/** Σ_i |c_i| for the Pauli-diagonal difference with Choi matrix j (c_i = vec(P_i)† J vec(P_i)/d²), or undefined when it is not Pauli diagonal. */
function pauliDiagonalNorm(e: Channel, f: Channel): number | undefined {
  const r = sub(e.ptm(), f.ptm());
  const D = r.rows;
  for (let i = 0; i < D; i++) {
    for (let k = 0; k < D; k++) {
      if (i !== k && Math.hypot(r.data[2 * (i * D + k)]!, r.data[2 * (i * D + k) + 1]!) > PAULI_DIAGONAL_TOLERANCE) return undefined;
    }
  }
  const j = sub(e.choi(), f.choi());
  const b = pauliBasis(e.qubits);
  const d = e.dim;
  let sum = 0;
  for (let i = 0; i < D; i++) {
    // (B† J B)_ii = Σ_rc conj(b_ri) J_rc b_ci
    let re = 0;
    for (let rr = 0; rr < D; rr++) {
      const xr = b.data[2 * (rr * D + i)]!;
      const xi = -b.data[2 * (rr * D + i) + 1]!;
      for (let c = 0; c < D; c++) {
        const jr = j.data[2 * (rr * D + c)]!;
        const ji = j.data[2 * (rr * D + c) + 1]!;
        const yr = b.data[2 * (c * D + i)]!;
        const yi = b.data[2 * (c * D + i) + 1]!;
        const tr = jr * yr - ji * yi;
        const ti = jr * yi + ji * yr;
        re += xr * tr - xi * ti;
      }
    }
    sum += Math.abs(re / d);
  }
  return sum;
}

/** H(M) = (M ⊗ I)·J·(M ⊗ I)† for M d × d (acting on the first, reference factor of J). */
function outputFor(j: CMatrix, m: CMatrix, d: number): CMatrix {
  const D = d * d;
  const k = zeros(D, D);
  for (let r = 0; r < d; r++) {
    for (let i = 0; i < d; i++) {
      const mr = m.data[2 * (r * d + i)]!;
      const mi = m.data[2 * (r * d + i) + 1]!;
      for (let a = 0; a < d; a++) {
        k.data[2 * ((r * d + a) * D + (i * d + a))] = mr;
        k.data[2 * ((r * d + a) * D + (i * d + a)) + 1] = mi;
      }
    }
  }
  return mul(mul(k, j), adjoint(k));
}

/** One ascent step: the M (‖M‖_F = 1) maximising Tr(S·H(M)) for S = sign(H(M_old)), with ‖H(M_old)‖₁. */
function ascend(j: CMatrix, m: CMatrix, d: number): { next: CMatrix; value: number } {
  const D = d * d;
  const h = outputFor(j, m, d);
  // One eigen-decomposition gives both ‖H‖₁ = Σ|λ| and S = sign(H) = Σ sgn(λ) q q†.
  const eig = hermitianEigen(h);
  let value = 0;
  for (const x of eig.values) value += Math.abs(x);
  const s = zeros(D, D);
  const V = eig.vectors.data;
  for (let k = 0; k < D; k++) {
    const sg = eig.values[k]! > 0 ? 1 : eig.values[k]! < 0 ? -1 : 0;
    if (sg === 0) continue;
    for (let r = 0; r < D; r++) {
      const xr = V[2 * (r * D + k)]!;
      const xi = V[2 * (r * D + k) + 1]!;
      for (let c = 0; c < D; c++) {
        const yr = V[2 * (c * D + k)]!;
        const yi = -V[2 * (c * D + k) + 1]!;
        s.data[2 * (r * D + c)] += sg * (xr * yr - xi * yi);
        s.data[2 * (r * D + c) + 1] += sg * (xr * yi + xi * yr);
      }
    }
  }
  // Q[(s,j),(r,i)] = Σ_{a,b} S[(s,b),(r,a)] J[(i,a),(j,b)], a form on m[(r,i)] = M[r][i].
  const q = zeros(D, D);
  const S = s.data;
  const J = j.data;
  for (let sIdx = 0; sIdx < d; sIdx++) {
    for (let jIdx = 0; jIdx < d; jIdx++) {
      const row = sIdx * d + jIdx;
      for (let r = 0; r < d; r++) {
        for (let i = 0; i < d; i++) {
          let re = 0;
          let im = 0;
          for (let a = 0; a < d; a++) {
            for (let b = 0; b < d; b++) {
              const si = 2 * ((sIdx * d + b) * D + (r * d + a));
              const ji = 2 * ((i * d + a) * D + (jIdx * d + b));
              re += S[si]! * J[ji]! - S[si + 1]! * J[ji + 1]!;
              im += S[si]! * J[ji + 1]! + S[si + 1]! * J[ji]!;
            }
          }
          q.data[2 * (row * D + r * d + i)] = re;
          q.data[2 * (row * D + r * d + i) + 1] = im;
        }
      }
    }
  }
  const { vectors } = hermitianEigen(q);
  const next = zeros(d, d);
  for (let t = 0; t < D; t++) {
    next.data[2 * t] = vectors.data[2 * (t * D)]!;
    next.data[2 * t + 1] = vectors.data[2 * (t * D) + 1]!;
  }
  return { next, value };
}

/** Best lower bound ‖(id ⊗ Δ)(ψψ†)‖₁ found by the alternating ascent (see the file comment), with the M that reached it. */
function lowerBound(j: CMatrix, d: number, hermitian: boolean): { value: number; m: CMatrix } {
  const starts: CMatrix[] = [];
  const id = zeros(d, d);
  for (let i = 0; i < d; i++) id.data[2 * (i * d + i)] = 1 / Math.sqrt(d);
  starts.push(id);
  if (!hermitian) return { value: traceNorm(outputFor(j, id, d)), m: id };
  const rng = createRandom(DIAMOND_SEED);
  const randomStarts = d > 4 ? DIAMOND_RANDOM_STARTS_LARGE : DIAMOND_RANDOM_STARTS;
  for (let t = 0; t < randomStarts; t++) {
    const m = zeros(d, d);
    let norm = 0;
    for (let i = 0; i < m.data.length; i++) {
      // Box–Muller normal deviates (common practice).
      m.data[i] = Math.sqrt(-2 * Math.log(1 - rng.nextDouble())) * Math.cos(2 * Math.PI * rng.nextDouble());
      norm += m.data[i]! ** 2;
    }
    for (let i = 0; i < m.data.length; i++) m.data[i] /= Math.sqrt(norm);
    starts.push(m);
  }
  let best = { value: -Infinity, m: id };
  for (const start of starts) {
    let m = start;
    let last = -Infinity;
    const maxIt = d > 4 ? DIAMOND_MAX_ITERATIONS_LARGE : DIAMOND_MAX_ITERATIONS;
    for (let it = 0; it < maxIt; it++) {
      const { next, value } = ascend(j, m, d);
      if (value > best.value) best = { value, m };
      if (!(value > last + DIAMOND_ASCENT_CONVERGENCE * Math.max(1, value))) break;
      last = value;
      m = next;
    }
    const value = traceNorm(outputFor(j, m, d));
    if (value > best.value) best = { value, m };
  }
  return best;
}

/**
 * U(A) = ‖A^{−1/2}·Tr_out|J_A|·A^{−1/2}‖_∞ with J_A = (A^{1/2} ⊗ I) J (A^{1/2} ⊗ I), an upper
 * bound for every A ≻ 0 (see the file comment); A = I gives ‖Tr_out|J|‖_∞.
 */
function upperBoundAt(j: CMatrix, a: CMatrix, d: number): number {
  const root = hermitianFunction(a, (x) => Math.sqrt(x));
  const invRoot = hermitianFunction(a, (x) => 1 / Math.sqrt(x));
  const k = kron(root, identity(d));
  const ja = mul(k, mul(j, k));
  const t = traceOutput(hermitianFunction(ja, Math.abs));
  return hermitianEigen(mul(invRoot, mul(t, invRoot))).values[0]!;
}

/**
 * Upper bound: for Hermiticity-preserving Δ the least U(A) over A = I and A = M†M + δ·I for
 * the best input found (M) and a few δ; otherwise ‖J_Δ‖₁.
 */
function upperBound(j: CMatrix, d: number, hermitian: boolean, best: CMatrix): number {
  if (!hermitian) return traceNorm(j);
  let u = upperBoundAt(j, identity(d), d);
  const g = mul(adjoint(best), best);
  for (const delta of DIAMOND_REGULARISATIONS) {
    const a = add(g, scale(identity(d), delta));
    const v = upperBoundAt(j, a, d);
    if (Number.isFinite(v) && v < u) u = v;
  }
  return u;
}

/**
 * Both bounds at once along the fixed-point iteration A ← A^{1/2} T_A² A^{1/2} / Tr(…) with
 * T_A = A^{−1/2} Tr_out|J_A| A^{−1/2}: the input (A^{1/2} ⊗ I)|Ω⟩ gives the lower bound
 * ‖J_A‖₁ = Tr(A·T_A), and U(A) = ‖T_A‖_∞ the upper one; they meet exactly when T_A ∝ I, the
 * optimality condition, which the iteration drives towards (the square over-relaxes the plain
 * step A^{1/2} T_A A^{1/2}; an empirical choice). A is kept positive definite by mixing in
 * DIAMOND_FIXED_POINT_MIX·I/d, so every U(A) is a valid bound.
 */
function fixedPointBounds(j: CMatrix, d: number, maxIterations: number): { lower: number; upper: number } {
  let a = scale(identity(d), 1 / d);
  let lower = 0;
  let upper = Infinity;
  for (let it = 0; it < maxIterations; it++) {
    const root = hermitianFunction(a, (x) => Math.sqrt(Math.max(x, 0)));
    const invRoot = hermitianFunction(a, (x) => 1 / Math.sqrt(x));
    const k = kron(root, identity(d));
    const t = traceOutput(hermitianFunction(mul(k, mul(j, k)), Math.abs));
    const tA = mul(invRoot, mul(t, invRoot));
    const eig = hermitianEigen(tA);
    let g = 0;
    for (let i = 0; i < d; i++) g += t.data[2 * (i * d + i)]!;
    lower = Math.max(lower, g);
    upper = Math.min(upper, eig.values[0]!);
    if (upper - lower <= DIAMOND_EXACT_TOLERANCE || !(g > 0)) break;
    const next = mul(root, mul(hermitianFunction(tA, (x) => Math.max(x, 0) ** 2), root));
    let tr = 0;
    for (let i = 0; i < d; i++) tr += next.data[2 * (i * d + i)]!;
    a = add(scale(next, (1 - DIAMOND_FIXED_POINT_MIX) / tr), scale(identity(d), DIAMOND_FIXED_POINT_MIX / d));
  }
  return { lower, upper };
}

/** Options of diamondDistance. */
export interface DiamondOptions {
  /** Skip the closed forms and return the interval of the bounds (for testing the bounds). */
  readonly boundsOnly?: boolean;
}

/** ‖E − F‖_⋄ for two maps on the same qubits: exact for unitaries and Pauli-diagonal differences, else a certified interval. */
export function diamondDistance(e: Channel, f: Channel, options: DiamondOptions = {}): DiamondDistance {
  if (e.qubits !== f.qubits) throw new RangeError(`diamondDistance: maps on ${e.qubits} and ${f.qubits} qubits`);
  if (!options.boundsOnly) {
    const u = e.unitary();
    const v = f.unitary();
    if (u !== undefined && v !== undefined) {
      const value = unitaryDiamondDistance(u, v);
      return { lower: value, upper: value, exact: true, value, method: 'unitaries' };
    }
    const pauli = pauliDiagonalNorm(e, f);
    if (pauli !== undefined) return { lower: pauli, upper: pauli, exact: true, value: pauli, method: 'pauli' };
  }
  const d = e.dim;
  const j = sub(e.choi(), f.choi());
  const hermitian = antiHermitianDeviation(j) <= PHYSICALITY_TOLERANCE * Math.max(1, maxAbs(j));
  let lower: number;
  let upper: number;
  if (!hermitian) {
    lower = lowerBound(j, d, false).value;
    upper = traceNorm(j);
  } else {
    const fp = fixedPointBounds(j, d, d > 4 ? DIAMOND_FIXED_POINT_ITERATIONS_LARGE : DIAMOND_FIXED_POINT_ITERATIONS);
    lower = fp.lower;
    upper = fp.upper;
    if (upper - lower > DIAMOND_EXACT_TOLERANCE) {
      const lb = lowerBound(j, d, true);
      lower = Math.max(lower, lb.value);
      upper = Math.min(upper, upperBound(j, d, true, lb.m));
    }
  }
  const bothChannels = isCptp(e) && isCptp(f);
  if (bothChannels) upper = Math.min(upper, 2);
  upper = Math.max(upper, lower); // rounding can put the bounds a few ulps apart the wrong way
  if (upper - lower <= DIAMOND_EXACT_TOLERANCE) {
    const value = 0.5 * (lower + upper);
    return { lower, upper, exact: true, value, method: 'bounds' };
  }
  return { lower, upper, exact: false, method: 'bounds' };
}

function isCptp(c: Channel): boolean {
  const v = c.choiEigen().values;
  if (v[v.length - 1]! < -PHYSICALITY_TOLERANCE) return false;
  const t = traceOutput(c.choi());
  const d = c.dim;
  for (let i = 0; i < d; i++) {
    for (let k = 0; k < d; k++) {
      const want = i === k ? 1 : 0;
      if (Math.hypot(t.data[2 * (i * d + k)]! - want, t.data[2 * (i * d + k) + 1]!) > PHYSICALITY_TOLERANCE) return false;
    }
  }
  return antiHermitianDeviation(c.choi()) <= PHYSICALITY_TOLERANCE;
}
