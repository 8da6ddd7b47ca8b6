/**
 * Pure-state (state-vector) operations for the ideal run, in the layout of ./layout.ts.
 */
import type { CMatrix } from '../linalg/cmatrix.js';
import { qubitMask, type DensityMatrix, type StateVector } from './layout.js';
import { checkQubitCount, checkTargets, nextRest, targetMask, targetOffsets } from './targets.js';

/**
 * Relative tolerance of the purity test in resetStateVector: the reset of a pure state is
 * taken to stay pure when ‖ψ0‖²‖ψ1‖² − |⟨ψ0|ψ1⟩|² ≤ PURE_RESET_TOLERANCE · (‖ψ0‖² + ‖ψ1‖²)².
 * For a normalised state the left side is (up to a factor in [1/2, 1]) the weight of the
 * second eigenvalue of the reset state that the pure result drops.
 */
export const PURE_RESET_TOLERANCE = 1e-12;

/** The n-qubit basis state |0…0⟩. */
export function createStateVector(n: number): StateVector {
  checkQubitCount(n, 'createStateVector');
  const dim = 1 << n;
  const data = new Float64Array(2 * dim);
  data[0] = 1;
  return { n, dim, data };
}

/** ψ → U ψ in place, U (2^k × 2^k) acting on `qubits` (first listed = most significant factor). */
export function applyUnitaryToState(psi: StateVector, qubits: readonly number[], u: CMatrix): void {
  const n = psi.n;
  const D = psi.dim;
  checkTargets(n, qubits, 'applyUnitaryToState');
  const d = 1 << qubits.length;
  if (u.rows !== d || u.cols !== d) {
    throw new RangeError(`applyUnitaryToState: matrix is ${u.rows}×${u.cols}, expected ${d}×${d}`);
  }
  const off = targetOffsets(n, qubits);
  const tm = targetMask(n, qubits);
  const P = psi.data;
  const U = u.data;
  const v = new Float64Array(2 * d);
  for (let r = 0; r < D; r = nextRest(r, tm)) {
    for (let a = 0; a < d; a++) {
      const src = 2 * (r + off[a]!);
      v[2 * a] = P[src]!;
      v[2 * a + 1] = P[src + 1]!;
    }
    for (let a = 0; a < d; a++) {
      let sr = 0;
      let si = 0;
      for (let m = 0; m < d; m++) {
        const ur = U[2 * (a * d + m)]!;
        const ui = U[2 * (a * d + m) + 1]!;
        const xr = v[2 * m]!;
        const xi = v[2 * m + 1]!;
        sr += ur * xr - ui * xi;
        si += ur * xi + ui * xr;
      }
      const dst = 2 * (r + off[a]!);
      P[dst] = sr;
      P[dst + 1] = si;
    }
  }
}

/**
 * Reset of qubit q to |0⟩ on a pure state, when the result is still pure.
 * With ψ = |0⟩_q ⊗ ψ0 + |1⟩_q ⊗ ψ1 (branches over the other qubits), the reset state is
 * |0⟩⟨0|_q ⊗ (|ψ0⟩⟨ψ0| + |ψ1⟩⟨ψ1|), which is pure iff ψ0 and ψ1 are linearly dependent
 * (|⟨ψ0|ψ1⟩|² = ‖ψ0‖²‖ψ1‖², within PURE_RESET_TOLERANCE). Then ψ becomes |0⟩_q ⊗ φ with
 * |φ⟩⟨φ| = |ψ0⟩⟨ψ0| + |ψ1⟩⟨ψ1| (φ the dominant eigenvector, scaled so ‖φ‖² = ‖ψ‖²; global phase
 * arbitrary) and the result is true; otherwise ψ is left unchanged and the result is false.
 */
export function resetStateVector(psi: StateVector, q: number): boolean {
  const n = psi.n;
  const D = psi.dim;
  checkTargets(n, [q], 'resetStateVector');
  const m = qubitMask(n, q);
  const P = psi.data;
  // Gram matrix G = [[n0, o], [conj(o), n1]] of the branches, o = ⟨ψ0|ψ1⟩.
  let n0 = 0;
  let n1 = 0;
  let or = 0;
  let oi = 0;
  for (let r = 0; r < D; r = nextRest(r, m)) {
    const i0 = 2 * r;
    const i1 = 2 * (r | m);
    const ar = P[i0]!;
    const ai = P[i0 + 1]!;
    const br = P[i1]!;
    const bi = P[i1 + 1]!;
    n0 += ar * ar + ai * ai;
    n1 += br * br + bi * bi;
    // conj(a) · b
    or += ar * br + ai * bi;
    oi += ar * bi - ai * br;
  }
  const total = n0 + n1;
  const det = n0 * n1 - (or * or + oi * oi);
  if (det > PURE_RESET_TOLERANCE * total * total) return false;
  if (n1 === 0) return true; // qubit already |0⟩ (or ψ = 0): nothing to do
  // Dominant eigenpair of G: λ = (n0+n1)/2 + sqrt(((n0−n1)/2)² + |o|²); eigenvector
  // v = (o, λ − n0) or, equivalently, v = (λ − n1, conj(o)); take the better conditioned one.
  const half = 0.5 * (n0 - n1);
  const lambda = 0.5 * total + Math.sqrt(half * half + or * or + oi * oi);
  let v0r: number;
  let v0i: number;
  let v1r: number;
  let v1i: number;
  const ca = or * or + oi * oi + (lambda - n0) * (lambda - n0);
  const cb = (lambda - n1) * (lambda - n1) + or * or + oi * oi;
  if (ca === 0 && cb === 0) {
    // o = 0 and n0 = n1 = λ would mean independent branches; unreachable after the test above
    v0r = 1;
    v0i = 0;
    v1r = 0;
    v1i = 0;
  } else if (ca >= cb) {
    v0r = or;
    v0i = oi;
    v1r = lambda - n0;
    v1i = 0;
  } else {
    v0r = lambda - n1;
    v0i = 0;
    v1r = or;
    v1i = -oi;
  }
  // φ = v0·ψ0 + v1·ψ1 has ‖φ‖² = λ‖v‖²; scale to ‖φ‖² = total.
  const vNorm2 = v0r * v0r + v0i * v0i + v1r * v1r + v1i * v1i;
  const scale = Math.sqrt(total / (lambda * vNorm2));
  for (let r = 0; r < D; r = nextRest(r, m)) {
    const i0 = 2 * r;
    const i1 = 2 * (r | m);
    const ar = P[i0]!;
    const ai = P[i0 + 1]!;
    const br = P[i1]!;
    const bi = P[i1 + 1]!;
    P[i0] = scale * (v0r * ar - v0i * ai + v1r * br - v1i * bi);
    P[i0 + 1] = scale * (v0r * ai + v0i * ar + v1r * bi + v1i * br);
    P[i1] = 0;
    P[i1 + 1] = 0;
  }
  return true;
}

/** The density matrix |ψ⟩⟨ψ| of a state vector (ρ_rc = ψ_r · conj(ψ_c)). */
export function stateToDensityMatrix(psi: StateVector): DensityMatrix {
  const D = psi.dim;
  const P = psi.data;
  const data = new Float64Array(2 * D * D);
  for (let r = 0; r < D; r++) {
    const ar = P[2 * r]!;
    const ai = P[2 * r + 1]!;
    for (let c = 0; c < D; c++) {
      const br = P[2 * c]!;
      const bi = -P[2 * c + 1]!;
      data[2 * (r * D + c)] = ar * br - ai * bi;
      data[2 * (r * D + c) + 1] = ar * bi + ai * br;
    }
  }
  return { n: psi.n, dim: D, data };
}

/**
 * The two branches of a reset of qubit q that keeps purity per branch: with
 * ψ = |0⟩_q ⊗ ψ0 + |1⟩_q ⊗ ψ1, the reset state |0⟩⟨0|_q ⊗ (|ψ0⟩⟨ψ0| + |ψ1⟩⟨ψ1|) is the sum of
 * the projectors on |0⟩_q ⊗ ψ0 and |0⟩_q ⊗ ψ1, returned as new unnormalised state vectors.
 */
export function splitReset(psi: StateVector, q: number): [StateVector, StateVector] {
  const n = psi.n;
  const D = psi.dim;
  checkTargets(n, [q], 'splitReset');
  const m = qubitMask(n, q);
  const P = psi.data;
  const b0 = new Float64Array(2 * D);
  const b1 = new Float64Array(2 * D);
  for (let r = 0; r < D; r = nextRest(r, m)) {
    b0[2 * r] = P[2 * r]!;
    b0[2 * r + 1] = P[2 * r + 1]!;
    b1[2 * r] = P[2 * (r | m)]!;
    b1[2 * r + 1] = P[2 * (r | m) + 1]!;
  }
  return [
    { n, dim: D, data: b0 },
    { n, dim: D, data: b1 },
  ];
}
