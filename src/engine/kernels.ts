/**
 * The in-place operations of the density-matrix engine, behind one small interface so a
 * faster implementation can replace the reference one. Register layout: ./layout.ts;
 * superoperator (vectorisation) convention: ./superoperator.ts.
 *
 * The reference kernels never build a 2^n × 2^n operator: for k target qubits (d = 2^k)
 * they visit every pair (rest-row r, rest-col c) of indices whose target bits are zero,
 * gather the d × d sub-block B[a][b] = ρ[r + off(a)][c + off(b)], transform it and scatter
 * it back. The only scratch memory is a few buffers of 2·d² doubles, allocated once per call.
 */
import type { CMatrix } from '../linalg/cmatrix.js';
import { qubitMask, type DensityMatrix } from './layout.js';
import { krausToSuperoperator } from '../linalg/superoperator.js';
import { checkTargets, nextRest, targetMask, targetOffsets } from './targets.js';

/** The in-place register operations the engine runs on a density matrix. */
export interface Kernels {
  /** ρ → U ρ U† with U (2^k × 2^k) acting on `qubits` (first listed = most significant factor). */
  applyUnitary(rho: DensityMatrix, qubits: readonly number[], u: CMatrix): void;
  /** vec(ρ_block) → S·vec(ρ_block) on `qubits`, S a 4^k × 4^k superoperator in the column-stacking convention of ./superoperator.ts. */
  applySuperoperator(rho: DensityMatrix, qubits: readonly number[], s: CMatrix): void;
  /** ρ → Σ_k K_k ρ K_k† with each K_k (2^k × 2^k) acting on `qubits`. */
  applyKraus(rho: DensityMatrix, qubits: readonly number[], kraus: readonly CMatrix[]): void;
  /** ρ → |0⟩⟨0|_q ⊗ Tr_q ρ (reset of one qubit to |0⟩). */
  reset(rho: DensityMatrix, qubit: number): void;
}

function checkSquare(m: CMatrix, d: number, what: string): void {
  if (m.rows !== d || m.cols !== d) {
    throw new RangeError(`${what}: matrix is ${m.rows}×${m.cols}, expected ${d}×${d}`);
  }
}

/** ρ → U ρ U† on the target qubits, block by block (reference implementation). */
function applyUnitary(rho: DensityMatrix, qubits: readonly number[], u: CMatrix): void {
  const n = rho.n;
  const D = rho.dim;
  checkTargets(n, qubits, 'applyUnitary');
  const k = qubits.length;
  const d = 1 << k;
  checkSquare(u, d, 'applyUnitary');
  const off = targetOffsets(n, qubits);
  const tm = targetMask(n, qubits);
  const R = rho.data;
  const U = u.data;
  const blk = new Float64Array(2 * d * d);
  const tmp = new Float64Array(2 * d * d);
  for (let r = 0; r < D; r = nextRest(r, tm)) {
    for (let c = 0; c < D; c = nextRest(c, tm)) {
      // gather B[a][b] = ρ[r + off(a)][c + off(b)]
      for (let a = 0; a < d; a++) {
        const rowBase = (r + off[a]!) * D + c;
        for (let b = 0; b < d; b++) {
          const src = 2 * (rowBase + off[b]!);
          const dst = 2 * (a * d + b);
          blk[dst] = R[src]!;
          blk[dst + 1] = R[src + 1]!;
        }
      }
      // tmp = U · B
      for (let a = 0; a < d; a++) {
        for (let b = 0; b < d; b++) {
          let sr = 0;
          let si = 0;
          for (let m = 0; m < d; m++) {
            const ur = U[2 * (a * d + m)]!;
            const ui = U[2 * (a * d + m) + 1]!;
            const br = blk[2 * (m * d + b)]!;
            const bi = blk[2 * (m * d + b) + 1]!;
            sr += ur * br - ui * bi;
            si += ur * bi + ui * br;
          }
          tmp[2 * (a * d + b)] = sr;
          tmp[2 * (a * d + b) + 1] = si;
        }
      }
      // ρ block = tmp · U†, i.e. Σ_m tmp[a][m] · conj(U[b][m]); scatter directly
      for (let a = 0; a < d; a++) {
        const rowBase = (r + off[a]!) * D + c;
        for (let b = 0; b < d; b++) {
          let sr = 0;
          let si = 0;
          for (let m = 0; m < d; m++) {
            const tr = tmp[2 * (a * d + m)]!;
            const ti = tmp[2 * (a * d + m) + 1]!;
            const ur = U[2 * (b * d + m)]!;
            const ui = -U[2 * (b * d + m) + 1]!;
            sr += tr * ur - ti * ui;
            si += tr * ui + ti * ur;
          }
          const dst = 2 * (rowBase + off[b]!);
          R[dst] = sr;
          R[dst + 1] = si;
        }
      }
    }
  }
}

/** vec(B) → S·vec(B) for every target block B (column-stacking vec; reference implementation). */
function applySuperoperator(rho: DensityMatrix, qubits: readonly number[], s: CMatrix): void {
  const n = rho.n;
  const D = rho.dim;
  checkTargets(n, qubits, 'applySuperoperator');
  const k = qubits.length;
  const d = 1 << k;
  const d2 = d * d;
  checkSquare(s, d2, 'applySuperoperator');
  const off = targetOffsets(n, qubits);
  const tm = targetMask(n, qubits);
  const R = rho.data;
  const S = s.data;
  const v = new Float64Array(2 * d2);
  for (let r = 0; r < D; r = nextRest(r, tm)) {
    for (let c = 0; c < D; c = nextRest(c, tm)) {
      // gather vec(B)[a + b·d] = ρ[r + off(a)][c + off(b)]
      for (let a = 0; a < d; a++) {
        const rowBase = (r + off[a]!) * D + c;
        for (let b = 0; b < d; b++) {
          const src = 2 * (rowBase + off[b]!);
          const dst = 2 * (a + b * d);
          v[dst] = R[src]!;
          v[dst + 1] = R[src + 1]!;
        }
      }
      // scatter (S · vec(B))[a + b·d] into ρ[r + off(a)][c + off(b)]
      for (let a = 0; a < d; a++) {
        const rowBase = (r + off[a]!) * D + c;
        for (let b = 0; b < d; b++) {
          const row = a + b * d;
          let sr = 0;
          let si = 0;
          for (let m = 0; m < d2; m++) {
            const xr = S[2 * (row * d2 + m)]!;
            const xi = S[2 * (row * d2 + m) + 1]!;
            const yr = v[2 * m]!;
            const yi = v[2 * m + 1]!;
            sr += xr * yr - xi * yi;
            si += xr * yi + xi * yr;
          }
          const dst = 2 * (rowBase + off[b]!);
          R[dst] = sr;
          R[dst + 1] = si;
        }
      }
    }
  }
}

/** ρ → Σ_k K_k ρ K_k† via the superoperator Σ_k conj(K_k) ⊗ K_k (reference implementation). */
function applyKraus(rho: DensityMatrix, qubits: readonly number[], kraus: readonly CMatrix[]): void {
  checkTargets(rho.n, qubits, 'applyKraus');
  const d = 1 << qubits.length;
  if (kraus.length === 0) throw new RangeError('applyKraus: empty Kraus set');
  for (const k of kraus) checkSquare(k, d, 'applyKraus');
  applySuperoperator(rho, qubits, krausToSuperoperator(kraus));
}

/** ρ → |0⟩⟨0|_q ⊗ Tr_q ρ: ρ'[r][c] = ρ[r][c] + ρ[r|m][c|m] on the q = 0 block, zero elsewhere. */
function reset(rho: DensityMatrix, qubit: number): void {
  const n = rho.n;
  const D = rho.dim;
  checkTargets(n, [qubit], 'reset');
  const m = qubitMask(n, qubit);
  const R = rho.data;
  for (let r = 0; r < D; r = nextRest(r, m)) {
    const r1 = r | m;
    for (let c = 0; c < D; c = nextRest(c, m)) {
      const c1 = c | m;
      const i00 = 2 * (r * D + c);
      const i01 = 2 * (r * D + c1);
      const i10 = 2 * (r1 * D + c);
      const i11 = 2 * (r1 * D + c1);
      R[i00] = R[i00]! + R[i11]!;
      R[i00 + 1] = R[i00 + 1]! + R[i11 + 1]!;
      R[i01] = 0;
      R[i01 + 1] = 0;
      R[i10] = 0;
      R[i10 + 1] = 0;
      R[i11] = 0;
      R[i11 + 1] = 0;
    }
  }
}

/** The straightforward, correctness-first kernels (gather / transform / scatter per target block). */
export const referenceKernels: Kernels = {
  applyUnitary,
  applySuperoperator,
  applyKraus,
  reset,
};
