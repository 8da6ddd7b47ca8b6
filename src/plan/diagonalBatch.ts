/**
 * Batches of diagonal superoperators for the single-pass diagonal kernel
 * (src/engine/kernelDiagonal.ts). A superoperator that is diagonal in the column-stacking
 * vec basis (phase-type noise, z rotations, cz, pure dephasing) multiplies each block entry
 * B[a][b] by S[(a + b·d), (a + b·d)]; diagonal maps all commute, so any number of them can be
 * multiplied together. The kernel takes the product as at most two tables over disjoint
 * "bins" of qubits A and B; every member must lie inside one bin.
 */
import type { CMatrix } from '../linalg/cmatrix.js';

/** Largest number of qubits of one bin (a table of 4^7 complex entries is 256 KiB). */
export const DIAGONAL_BIN_MAX_QUBITS = 7;

/** One diagonal map of a batch: its qubits (first = most significant) and superoperator. */
export interface DiagonalMember {
  readonly qubits: readonly number[];
  readonly superop: CMatrix;
}

/** True when every off-diagonal entry of the superoperator is exactly zero. */
export function isDiagonalSuperoperator(s: CMatrix): boolean {
  const n = s.rows;
  const S = s.data;
  for (let r = 0; r < n; r++) {
    for (let c = 0; c < n; c++) {
      if (r === c) continue;
      if (S[2 * (r * n + c)] !== 0 || S[2 * (r * n + c) + 1] !== 0) return false;
    }
  }
  return true;
}

/**
 * Splits the qubits of `members` into bins A and B (each ascending, at most
 * DIAGONAL_BIN_MAX_QUBITS, no member across both; B may be empty), or undefined when they do not fit.
 * Members sharing a qubit are kept together (connected components, placed largest first).
 */
export function diagonalBins(members: readonly DiagonalMember[]): [number[], number[]] | undefined {
  const parent = new Map<number, number>();
  const find = (q: number): number => {
    let r = q;
    while (parent.get(r) !== r) r = parent.get(r)!;
    parent.set(q, r);
    return r;
  };
  for (const m of members) for (const q of m.qubits) if (!parent.has(q)) parent.set(q, q);
  for (const m of members) for (let j = 1; j < m.qubits.length; j++) parent.set(find(m.qubits[j]!), find(m.qubits[0]!));
  const comps = new Map<number, number[]>();
  for (const q of parent.keys()) {
    const r = find(q);
    if (!comps.has(r)) comps.set(r, []);
    comps.get(r)!.push(q);
  }
  const sorted = [...comps.values()].sort((x, y) => y.length - x.length || x[0]! - y[0]!);
  const a: number[] = [];
  const b: number[] = [];
  for (const c of sorted) {
    if (a.length + c.length <= DIAGONAL_BIN_MAX_QUBITS) a.push(...c);
    else if (b.length + c.length <= DIAGONAL_BIN_MAX_QUBITS) b.push(...c);
    else return undefined;
  }
  a.sort((x, y) => x - y);
  b.sort((x, y) => x - y);
  return [a, b];
}

/**
 * The product table over `bin` (ascending qubits, k of them, d = 2^k) of the members lying in
 * it: T[row·d + col] (complex, interleaved) = Π_members S_m[(a_m + b_m·d_m), same], where a_m, b_m
 * are the bits of row and col on the member's qubits (first listed = most significant).
 */
export function diagonalTable(members: readonly DiagonalMember[], bin: readonly number[]): Float64Array {
  const k = bin.length;
  const d = 1 << k;
  const t = new Float64Array(2 * d * d);
  for (let i = 0; i < d * d; i++) t[2 * i] = 1;
  for (const m of members) {
    if (!m.qubits.every((q) => bin.includes(q))) continue;
    const pos = m.qubits.map((q) => bin.indexOf(q));
    const km = pos.length;
    const dm = 1 << km;
    const dm2 = dm * dm;
    const S = m.superop.data;
    // the member's bits of every bin index, computed once (not once per table entry)
    const local = new Int32Array(d);
    for (let x = 0; x < d; x++) {
      let v = 0;
      for (let j = 0; j < km; j++) v = (v << 1) | ((x >> (k - 1 - pos[j]!)) & 1);
      local[x] = v;
    }
    for (let row = 0; row < d; row++) {
      const am = local[row]!;
      for (let col = 0; col < d; col++) {
        const idx = am + local[col]! * dm;
        const fr = S[2 * (idx * dm2 + idx)]!;
        const fi = S[2 * (idx * dm2 + idx) + 1]!;
        const e = 2 * (row * d + col);
        const xr = t[e]!;
        const xi = t[e + 1]!;
        t[e] = xr * fr - xi * fi;
        t[e + 1] = xr * fi + xi * fr;
      }
    }
  }
  return t;
}
