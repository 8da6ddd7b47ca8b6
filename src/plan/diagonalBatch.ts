/**
 * Batches of diagonal superoperators for the single-pass diagonal kernel
 * (src/engine/kernelDiagonal.ts). A superoperator that is diagonal in the column-stacking
 * vec basis (phase-type noise, z rotations, cz, pure dephasing) multiplies each block entry
 * B[a][b] by S[(a + b·d), (a + b·d)]; diagonal maps all commute, so any number of them can be
 * multiplied together. The kernel takes the product as at most two tables over disjoint
 * "bins" of qubits A and B; every member must lie inside one bin.
 */
import type { CMatrix } from '../linalg/cmatrix.js';
import { memoised, numbersKey } from '../linalg/exactKeys.js';

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

/** The diagonal S[i][i] of a member's superoperator (complex, interleaved; i < 4^k). */
function memberDiagonal(m: DiagonalMember): Float64Array {
  const dm2 = 1 << (2 * m.qubits.length);
  const S = m.superop.data;
  const out = new Float64Array(2 * dm2);
  for (let i = 0; i < dm2; i++) {
    out[2 * i] = S[2 * (i * dm2 + i)]!;
    out[2 * i + 1] = S[2 * (i * dm2 + i) + 1]!;
  }
  return out;
}

/** For every index x < 2^v over the bin positions `over` (first = most significant): the bits of x at the positions `pos`, packed (first = most significant). */
function packedAt(pos: readonly number[], over: readonly number[]): Int32Array {
  const v = over.length;
  const shifts = pos.map((p) => v - 1 - over.indexOf(p));
  const out = new Int32Array(1 << v);
  for (let x = 0; x < 1 << v; x++) {
    let y = 0;
    for (const sh of shifts) y = (y << 1) | ((x >> sh) & 1);
    out[x] = y;
  }
  return out;
}

/**
 * The product table over `bin` (ascending qubits, k of them, d = 2^k) of the members lying in
 * it: T[row·d + col] (complex, interleaved) = Π_members S_m[(a_m + b_m·d_m), same], where a_m, b_m
 * are the bits of row and col on the member's qubits (first listed = most significant); every
 * entry starts at exactly 1 and is multiplied by the members' factors in member order.
 *
 * The partial product after the first j members depends only on the bits of the qubits U_j
 * those members act on, so it is kept as a table over U_j, widened when a member brings new
 * qubits (4^|U_j| entries instead of 4^k per member); each entry still goes through the very
 * same multiplications in the same order, so the table has the same bits as the entry-by-entry
 * product.
 */
export function diagonalTable(members: readonly DiagonalMember[], bin: readonly number[]): Float64Array {
  let covered: number[] = [];
  let partial: Float64Array = new Float64Array([1, 0]);
  for (const m of members) {
    const pos = m.qubits.map((q) => bin.indexOf(q));
    if (pos.some((p) => p < 0)) continue;
    const fresh = pos.filter((p) => !covered.includes(p));
    const widened = fresh.length > 0 ? [...covered, ...fresh] : covered;
    partial = multiplyWidened(partial, covered.length, widened.length, memberDiagonal(m), packedAt(pos, widened));
    covered = widened;
  }
  return inBinOrder(partial, covered, bin.length);
}

/**
 * out[r·2^v + c] = P[(r ≫ (v−u))·2^u + (c ≫ (v−u))] · f[a_r + a_c·d_m] for r, c < 2^v: the partial
 * product P over u qubits, widened by v − u new least significant qubits, times a member's
 * factor (f its diagonal, a its packed bits of every index), as xr·fr − xi·fi, xr·fi + xi·fr.
 */
function multiplyWidened(P: Float64Array, u: number, v: number, f: Float64Array, a: Int32Array): Float64Array {
  const dv = 1 << v;
  const du = 1 << u;
  const shift = v - u;
  const dm = Math.sqrt(f.length / 2);
  const out = v === u ? P : new Float64Array(2 * dv * dv);
  for (let r = 0; r < dv; r++) {
    const srcRow = (r >> shift) * du;
    const ar = a[r]!;
    for (let c = 0; c < dv; c++) {
      const s = 2 * (srcRow + (c >> shift));
      const i = 2 * (ar + a[c]! * dm);
      const xr = P[s]!;
      const xi = P[s + 1]!;
      const fr = f[i]!;
      const fi = f[i + 1]!;
      const e = 2 * (r * dv + c);
      out[e] = xr * fr - xi * fi;
      out[e + 1] = xr * fi + xi * fr;
    }
  }
  return out;
}

/** The table over the k bin positions in bin order from the partial product P over `covered` (bits of uncovered positions do not matter). */
function inBinOrder(P: Float64Array, covered: readonly number[], k: number): Float64Array {
  if (covered.length === k && covered.every((p, j) => p === j)) return P;
  const d = 1 << k;
  const du = 1 << covered.length;
  const all = Array.from({ length: k }, (_, p) => p);
  const packed = packedAt(covered, all);
  const out = new Float64Array(2 * d * d);
  for (let r = 0; r < d; r++) {
    for (let c = 0; c < d; c++) {
      const s = 2 * (packed[r]! * du + packed[c]!);
      out[2 * (r * d + c)] = P[s]!;
      out[2 * (r * d + c) + 1] = P[s + 1]!;
    }
  }
  return out;
}

/** Exact key of what diagonalTable(members, bin) reads: the bin, and each member in it with its qubits and diagonal. */
function diagonalTableKey(members: readonly DiagonalMember[], bin: readonly number[]): string {
  const parts = [bin.join(',')];
  for (const m of members) if (m.qubits.every((q) => bin.includes(q))) parts.push(`${m.qubits.join(',')}:${numbersKey(memberDiagonal(m))}`);
  return parts.join(';');
}

/**
 * diagonalTable memoised by what it reads, bit for bit: the same batch recurring in every layer
 * of a circuit is multiplied out once, and its calls share one table (never modified; the
 * compiled plan stores it once, src/engine/compiledPlan.ts).
 */
export function memoisedDiagonalTable(): (members: readonly DiagonalMember[], bin: readonly number[]) => Float64Array {
  const memo = new Map<string, Float64Array>();
  return (members, bin) => memoised(memo, diagonalTableKey(members, bin), () => diagonalTable(members, bin));
}
