/**
 * The diagonal kernel: one pass that multiplies every element ρ[r][c] by a factor, the product
 * of any number of diagonal superoperators (phase-type noise, z rotations, cz, dephasing …).
 *
 * A diagonal map on qubits Q scales ρ[r][c] by f(bits of r on Q, bits of c on Q). The plan
 * multiplies all the factors of a batch into at most two tables over disjoint qubit sets A
 * and B ("bins"): T_A[row_A · d_A + col_A] with row_A, col_A the bits of r and c on A packed
 * (first listed qubit = most significant, as in ./layout.ts), likewise T_B; then
 * ρ[r][c] ← ρ[r][c] · T_A[…] · T_B[…]. Tables are complex, interleaved re/im, in the arena.
 */
import { partStart } from './partition.js';

// Allocated by the first call for registers up to 16 qubits (or more): the optimised kernel then
// never reaches the growth branch (V8 would deoptimise at an allocation site it has no feedback
// for), and a process that applies no diagonal pass (2 × 256 KiB) allocates nothing.
const PACK_MIN_LENGTH = 1 << 16;
let packA = new Int32Array(0);
let packB = new Int32Array(0);

/** Packed bits of every register index i < 2^n on `qubits` (first listed = most significant), into `out`. */
function packBits(n: number, qubits: ArrayLike<number>, out: Int32Array): void {
  const D = 1 << n;
  const k = qubits.length;
  out.fill(0, 0, D);
  for (let t = 0; t < k; t++) {
    const shift = n - 1 - qubits[t]!;
    const to = k - 1 - t;
    for (let i = 0; i < D; i++) out[i] = out[i]! | (((i >> shift) & 1) << to);
  }
}

/**
 * ρ[r][c] ← ρ[r][c] · T_A[pack_A(r)·d_A + pack_A(c)] · T_B[pack_B(r)·d_B + pack_B(c)] for the rows
 * of part `part` of `parts` (a contiguous range, ./partition.ts); T_A at arena[offA …] over qubits `a`, T_B at arena[offB …] over `b` (b may be empty).
 */
export function applyDiagonal(
  data: Float64Array,
  n: number,
  a: ArrayLike<number>,
  b: ArrayLike<number>,
  arena: Float64Array,
  offA: number,
  offB: number,
  part: number,
  parts: number,
): void {
  const D = 1 << n;
  const rowStart = partStart(D, part, parts);
  const rowEnd = partStart(D, part + 1, parts);
  if (packA.length < D) {
    packA = new Int32Array(Math.max(D, PACK_MIN_LENGTH));
    packB = new Int32Array(Math.max(D, PACK_MIN_LENGTH));
  }
  packBits(n, a, packA);
  const dA = 1 << a.length;
  const PA = packA;
  if (b.length === 0) {
    for (let r = rowStart; r < rowEnd; r++) {
      const ra = offA + 2 * PA[r]! * dA;
      const base = 2 * r * D;
      for (let c = 0; c < D; c++) {
        const t = ra + 2 * PA[c]!;
        const fr = arena[t]!;
        const fi = arena[t + 1]!;
        const i = base + 2 * c;
        const xr = data[i]!;
        const xi = data[i + 1]!;
        data[i] = xr * fr - xi * fi;
        data[i + 1] = xr * fi + xi * fr;
      }
    }
    return;
  }
  packBits(n, b, packB);
  const dB = 1 << b.length;
  const PB = packB;
  for (let r = rowStart; r < rowEnd; r++) {
    const ra = offA + 2 * PA[r]! * dA;
    const rb = offB + 2 * PB[r]! * dB;
    const base = 2 * r * D;
    for (let c = 0; c < D; c++) {
      const ta = ra + 2 * PA[c]!;
      const tb = rb + 2 * PB[c]!;
      const ar = arena[ta]!;
      const ai = arena[ta + 1]!;
      const br = arena[tb]!;
      const bi = arena[tb + 1]!;
      const fr = ar * br - ai * bi;
      const fi = ar * bi + ai * br;
      const i = base + 2 * c;
      const xr = data[i]!;
      const xi = data[i + 1]!;
      data[i] = xr * fr - xi * fi;
      data[i + 1] = xr * fi + xi * fr;
    }
  }
}
