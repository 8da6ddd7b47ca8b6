/**
 * Multiplying gates on a small block of k local qubits into one 2^k × 2^k unitary (used to
 * fold the sub-steps of a composite gate). Conventions of src/engine/layout.ts: local
 * qubit 0 is the most significant bit; targets[0] is the gate's leftmost tensor factor.
 */
import { type CMatrix, identity, mul, zeros } from '../linalg/cmatrix.js';

/** Largest block a composite gate may span (a 2^10 × 2^10 complex matrix is 16 MiB). */
export const MAX_BLOCK_QUBITS = 10;

/**
 * The 2^k × 2^k matrix of the gate u acting on local qubits `targets` of a k-qubit block
 * (identity on the others). targets may be in any order: targets[j] carries the gate's
 * j-th tensor factor, so embed(cx, [2, 0], 3) has control qubit 2 and target qubit 0.
 */
export function embed(u: CMatrix, targets: readonly number[], k: number): CMatrix {
  if (!Number.isInteger(k) || k < 0 || k > MAX_BLOCK_QUBITS) {
    throw new RangeError(`embed: block size ${k} is not an integer in [0, ${MAX_BLOCK_QUBITS}]`);
  }
  const m = targets.length;
  const d = 1 << m;
  if (u.rows !== d || u.cols !== d) throw new RangeError(`embed: a ${u.rows}×${u.cols} matrix does not act on ${m} qubit(s)`);
  const D = 1 << k;
  // masks[j] = bit of local qubit targets[j] in a block index.
  const masks = new Int32Array(m);
  let targetMask = 0;
  for (let j = 0; j < m; j++) {
    const q = targets[j]!;
    if (!Number.isInteger(q) || q < 0 || q >= k) throw new RangeError(`embed: target ${q} is outside the block of ${k} qubit(s)`);
    masks[j] = 1 << (k - 1 - q);
    if (targetMask & masks[j]!) throw new RangeError(`embed: target ${q} is listed twice`);
    targetMask |= masks[j]!;
  }
  // sub[x] = the index into u formed by the target bits of x, targets[0] most significant.
  const sub = new Int32Array(D);
  for (let x = 0; x < D; x++) {
    let s = 0;
    for (let j = 0; j < m; j++) s = (s << 1) | ((x & masks[j]!) !== 0 ? 1 : 0);
    sub[x] = s;
  }
  const restMask = (D - 1) & ~targetMask;
  const out = zeros(D, D);
  const O = out.data;
  const U = u.data;
  for (let r = 0; r < D; r++) {
    const ur = sub[r]! * d;
    for (let c = 0; c < D; c++) {
      if (((r ^ c) & restMask) !== 0) continue; // the untouched qubits must agree
      const src = 2 * (ur + sub[c]!);
      O[2 * (r * D + c)] = U[src]!;
      O[2 * (r * D + c) + 1] = U[src + 1]!;
    }
  }
  return out;
}

/** The unitary of gates applied in order on a k-qubit block: U_last ··· U_2 · U_1. */
export function sequenceUnitary(k: number, parts: readonly { matrix: CMatrix; targets: readonly number[] }[]): CMatrix {
  if (!Number.isInteger(k) || k < 0 || k > MAX_BLOCK_QUBITS) {
    throw new RangeError(`sequenceUnitary: block size ${k} is not an integer in [0, ${MAX_BLOCK_QUBITS}]`);
  }
  let acc = identity(1 << k);
  for (const p of parts) acc = mul(embed(p.matrix, p.targets, k), acc);
  return acc;
}
