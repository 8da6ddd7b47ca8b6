import { describe, expect, it } from 'vitest';
import { CompiledPlanBuilder } from '../../src/engine/compiledPlan.js';
import type { Instruction } from '../../src/engine/instruction.js';
import { diag, type CMatrix } from '../../src/linalg/cmatrix.js';
import { CompositionMemo } from '../../src/plan/compositionMemo.js';
import { diagonalTable, memoisedDiagonalTable, type DiagonalMember } from '../../src/plan/diagonalBatch.js';
import { composeEmbedded } from '../../src/plan/embedSuperoperator.js';
import { instructionSuperoperator, memoisedInstructionSuperoperator } from '../../src/plan/instructionSuperoperator.js';
import { numbersKey } from '../../src/linalg/exactKeys.js';
import { mulberry32, randomKraus, randomUnitary, sameBits } from '../engine/helpers.js';

/**
 * The definition of the diagonal table, entry by entry (the plan's implementation before it kept
 * partial products over the qubits seen so far): every entry starts at 1 and is multiplied by
 * each member's factor in member order, (xr·fr − xi·fi, xr·fi + xi·fr).
 */
function tableByEntries(members: readonly DiagonalMember[], bin: readonly number[]): Float64Array {
  const k = bin.length;
  const d = 1 << k;
  const t = new Float64Array(2 * d * d);
  for (let i = 0; i < d * d; i++) t[2 * i] = 1;
  for (const m of members) {
    if (!m.qubits.every((q) => bin.includes(q))) continue;
    const pos = m.qubits.map((q) => bin.indexOf(q));
    const dm = 1 << pos.length;
    const bits = (x: number): number => pos.reduce((v, p) => (v << 1) | ((x >> (k - 1 - p)) & 1), 0);
    for (let row = 0; row < d; row++) {
      for (let col = 0; col < d; col++) {
        const idx = bits(row) + bits(col) * dm;
        const fr = m.superop.data[2 * (idx * dm * dm + idx)]!;
        const fi = m.superop.data[2 * (idx * dm * dm + idx) + 1]!;
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

/** A superoperator-shaped matrix on k qubits with a random diagonal (some entries ±0) and zeros elsewhere. */
function randomDiagonalSuperoperator(rng: () => number, k: number): CMatrix {
  const entry = (): number => (rng() < 0.1 ? (rng() < 0.5 ? 0 : -0) : 2 * rng() - 1);
  return diag(Array.from({ length: 1 << (2 * k) }, () => [entry(), entry()] as [number, number]));
}

describe('plan memos and the diagonal table are exact', () => {
  it('diagonalTable has the bits of the entry-by-entry product (members in any qubit order, outside the bin, repeated qubits)', () => {
    const rng = mulberry32(31_000);
    for (let trial = 0; trial < 200; trial++) {
      const k = 1 + Math.floor(rng() * 6);
      const bin = Array.from({ length: k }, (_, i) => 2 * i + (trial % 2));
      const members: DiagonalMember[] = [];
      for (let j = Math.floor(rng() * 7); j > 0; j--) {
        const km = 1 + Math.floor(rng() * Math.min(3, k));
        const qubits = [...bin, 99].sort(() => rng() - 0.5).slice(0, km);
        members.push({ qubits, superop: randomDiagonalSuperoperator(rng, km) });
      }
      expect(sameBits(diagonalTable(members, bin), tableByEntries(members, bin))).toBe(true);
    }
  });

  it('numbersKey tells −0 from 0 and gives equal bits equal keys', () => {
    expect(numbersKey(new Float64Array([0, 1.5]))).toBe(numbersKey(new Float64Array([0, 1.5])));
    expect(numbersKey(new Float64Array([0, 1.5]))).not.toBe(numbersKey(new Float64Array([-0, 1.5])));
    expect(numbersKey(new Float64Array([1, 2]))).not.toBe(numbersKey(new Float64Array([2, 1])));
  });

  it('memoised superoperators and tables are shared between identical inputs and equal the plain computation', () => {
    const rng = mulberry32(31_100);
    const superoperatorOf = memoisedInstructionSuperoperator();
    const u = randomUnitary(rng, 4);
    const kraus = randomKraus(rng, 2, 3);
    const copy = (m: CMatrix): CMatrix => ({ rows: m.rows, cols: m.cols, data: Float64Array.from(m.data) });
    const a: Instruction = { op: 'unitary', qubits: [0, 1], matrix: u };
    const b: Instruction = { op: 'unitary', qubits: [2, 3], matrix: copy(u) };
    const c: Instruction = { op: 'channel', qubits: [1], kraus };
    const d: Instruction = { op: 'channel', qubits: [0], kraus: kraus.map(copy) };
    expect(superoperatorOf(b)).toBe(superoperatorOf(a));
    expect(superoperatorOf(d)).toBe(superoperatorOf(c));
    expect(superoperatorOf(c)).not.toBe(superoperatorOf(a));
    expect(sameBits(superoperatorOf(a).data, instructionSuperoperator(a).data)).toBe(true);
    expect(sameBits(superoperatorOf(c).data, instructionSuperoperator(c).data)).toBe(true);
    const tableOf = memoisedDiagonalTable();
    const m1: DiagonalMember = { qubits: [1, 3], superop: randomDiagonalSuperoperator(rng, 2) };
    const m2: DiagonalMember = { qubits: [0], superop: randomDiagonalSuperoperator(rng, 1) };
    const t = tableOf([m1, m2], [0, 1, 3]);
    expect(tableOf([{ ...m1, superop: copy(m1.superop) }, m2], [0, 1, 3])).toBe(t);
    expect(tableOf([m2, m1], [0, 1, 3])).not.toBe(t);
    expect(sameBits(t, diagonalTable([m1, m2], [0, 1, 3]))).toBe(true);
  });

  it('a composition is computed once per operand objects and equals composeEmbedded', () => {
    const rng = mulberry32(31_200);
    const memo = new CompositionMemo();
    const s = instructionSuperoperator({ op: 'channel', qubits: [0], kraus: randomKraus(rng, 2, 2) });
    const g = instructionSuperoperator({ op: 'unitary', qubits: [0, 1], matrix: randomUnitary(rng, 4) });
    const r = memo.after(s, [1], 2, g);
    expect(memo.after(s, [1], 2, g)).toBe(r);
    expect(memo.after(s, [0], 2, g)).not.toBe(r);
    expect(sameBits(r.data, composeEmbedded(s, [1], 2, g).data)).toBe(true);
  });

  it('the composition memo empties itself past its byte bound, and a result computed again has the same bits', () => {
    const rng = mulberry32(31_201);
    const s = instructionSuperoperator({ op: 'channel', qubits: [0], kraus: randomKraus(rng, 2, 2) });
    const g = instructionSuperoperator({ op: 'unitary', qubits: [0, 1], matrix: randomUnitary(rng, 4) });
    // a 2-qubit result is 16 × 16 complex = 4 KiB: room for two, so the third empties the memo
    const memo = new CompositionMemo(2 * 4096);
    const first = memo.after(s, [1], 2, g);
    memo.after(s, [0], 2, g);
    expect(memo.size).toBe(2);
    memo.before(g, s, [1], 2);
    expect(memo.size).toBe(1);
    const again = memo.after(s, [1], 2, g);
    expect(again).not.toBe(first);
    expect(sameBits(again.data, first.data)).toBe(true);
  });

  it('the compiled plan stores an array shared by several calls once', () => {
    const b = new CompiledPlanBuilder(3);
    const table = new Float64Array(32);
    const other = new Float64Array(32);
    const off = b.addNumbers(table);
    expect(b.addNumbers(table)).toBe(off);
    expect(b.addNumbers(other)).toBe(off + 32);
    expect(b.build().arena.length).toBe(64);
  });
});
