/**
 * Index arithmetic for operators on a subset of the register's qubits, following
 * ./layout.ts: for targets [q_0, …, q_{k−1}], the local index a ∈ [0, 2^k) of the operator
 * has q_0 as its most significant bit, and the register index of local state a on top of
 * a "rest" index r (all target bits zero) is r + offsets[a].
 */
import { qubitMask } from './layout.js';

/** Largest register the engine's 32-bit index arithmetic supports (basis indices < 2^30). */
export const MAX_REGISTER_QUBITS = 30;

/** Throws a RangeError unless n is an integer qubit count in [0, MAX_REGISTER_QUBITS]. */
export function checkQubitCount(n: number, what: string): void {
  if (!Number.isInteger(n) || n < 0 || n > MAX_REGISTER_QUBITS) {
    throw new RangeError(`${what}: invalid qubit count ${n} (0 … ${MAX_REGISTER_QUBITS})`);
  }
}

/** Throws a RangeError unless `qubits` is a non-empty list of distinct integers in [0, n). */
export function checkTargets(n: number, qubits: readonly number[], what: string): void {
  if (qubits.length === 0) throw new RangeError(`${what}: no target qubits`);
  for (let j = 0; j < qubits.length; j++) {
    const q = qubits[j]!;
    if (!Number.isInteger(q) || q < 0 || q >= n) {
      throw new RangeError(`${what}: qubit ${q} is outside the ${n}-qubit register`);
    }
    for (let i = 0; i < j; i++) {
      if (qubits[i] === q) throw new RangeError(`${what}: qubit ${q} is listed twice`);
    }
  }
}

/** Register-index offset of each local basis state of the targets (first target = most significant local bit). */
export function targetOffsets(n: number, qubits: readonly number[]): Int32Array {
  const k = qubits.length;
  const d = 1 << k;
  const off = new Int32Array(d);
  for (let a = 0; a < d; a++) {
    let o = 0;
    for (let j = 0; j < k; j++) {
      if ((a >> (k - 1 - j)) & 1) o |= qubitMask(n, qubits[j]!);
    }
    off[a] = o;
  }
  return off;
}

/** Bit mask of all target qubits in a register index. */
export function targetMask(n: number, qubits: readonly number[]): number {
  let m = 0;
  for (const q of qubits) m |= qubitMask(n, q);
  return m;
}

/**
 * The next register index after r whose target bits (mask tm) are all zero; starting from
 * r = 0 and stopping at ≥ 2^n this visits every "rest" index exactly once, in increasing order.
 */
export function nextRest(r: number, tm: number): number {
  return ((r | tm) + 1) & ~tm;
}
