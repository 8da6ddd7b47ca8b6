import { describe, it, expect } from 'vitest';
import * as math from 'mathjs';
import { embed, sequenceUnitary } from '../../src/circuit/compose.js';
import { builtinGate } from '../../src/circuit/gates.js';
import { type CMatrix, entry, identity, maxAbsDiff } from '../../src/linalg/cmatrix.js';
import { TIGHT, fromMath, mulberry32, randomCMatrix, toMath } from './helpers.js';

const g = (name: string, ...angles: number[]): CMatrix => builtinGate(name)!.matrix(angles);

/**
 * Independent dense reference for embed, computed with mathjs: P · (u ⊗ I) · Pᵀ, where the
 * permutation P sends "slot" order (the targets first, then the other qubits ascending) to
 * qubit order (qubit 0 most significant).
 */
function embedReference(u: CMatrix, targets: readonly number[], k: number): CMatrix {
  const rest = [...Array(k).keys()].filter((q) => !targets.includes(q));
  const qubitOfSlot = [...targets, ...rest];
  const D = 1 << k;
  const P: number[][] = Array.from({ length: D }, () => new Array<number>(D).fill(0));
  for (let x = 0; x < D; x++) {
    let y = 0;
    for (let s = 0; s < k; s++) if ((x >> (k - 1 - s)) & 1) y |= 1 << (k - 1 - qubitOfSlot[s]!);
    P[y]![x] = 1;
  }
  const Pm = math.matrix(P);
  const wide = math.kron(toMath(u), math.identity(1 << (k - targets.length)) as math.Matrix);
  return fromMath(math.multiply(math.multiply(Pm, wide), math.transpose(Pm)) as math.Matrix);
}

/** A seeded random ordered choice of m distinct qubits out of k. */
function randomTargets(m: number, k: number, rng: () => number): number[] {
  const pool = [...Array(k).keys()];
  const out: number[] = [];
  for (let j = 0; j < m; j++) out.push(pool.splice(Math.floor(rng() * pool.length), 1)[0]!);
  return out;
}

describe('embed', () => {
  it('matches the mathjs permutation-and-kron reference for random targets on k = 3 (seeded)', () => {
    const rng = mulberry32(3);
    for (let trial = 0; trial < 30; trial++) {
      const m = 1 + (trial % 3);
      const targets = randomTargets(m, 3, rng);
      const u = randomCMatrix(1 << m, rng);
      expect(maxAbsDiff(embed(u, targets, 3), embedReference(u, targets, 3)), `targets ${targets}`).toBeLessThan(TIGHT);
    }
  });

  it('with targets [0, …, k−1] in order it returns u itself', () => {
    const u = randomCMatrix(4, mulberry32(5));
    expect(maxAbsDiff(embed(u, [0, 1], 2), u)).toBe(0);
  });

  it('cx on [2, 0] of 3 qubits: control qubit 2, target qubit 0, so |001⟩ (1) → |101⟩ (5) (src/engine/layout.ts)', () => {
    const m = embed(g('cx'), [2, 0], 3);
    expect(entry(m, 5, 1)).toEqual([1, 0]);
    expect(entry(m, 1, 5)).toEqual([1, 0]);
    expect(entry(m, 4, 4)).toEqual([1, 0]); // control off: |100⟩ unchanged
    expect(entry(m, 1, 1)).toEqual([0, 0]);
  });

  it('rejects bad targets and sizes', () => {
    const cx = g('cx');
    expect(() => embed(cx, [0, 0], 2)).toThrow(/twice/);
    expect(() => embed(cx, [0, 2], 2)).toThrow(/outside/);
    expect(() => embed(cx, [0], 2)).toThrow(/does not act/);
    expect(() => embed(cx, [0, 1], -1)).toThrow(RangeError);
  });
});

describe('sequenceUnitary', () => {
  it('is U_last ··· U_first, checked against mathjs products of the embedded parts (seeded)', () => {
    const rng = mulberry32(9);
    const parts = [1, 2, 1, 3, 2].map((m) => ({ matrix: randomCMatrix(1 << m, rng), targets: randomTargets(m, 3, rng) }));
    let ref = math.identity(8) as math.Matrix;
    for (const p of parts) ref = math.multiply(toMath(embed(p.matrix, p.targets, 3)), ref) as math.Matrix;
    expect(maxAbsDiff(sequenceUnitary(3, parts), fromMath(ref))).toBeLessThan(1e-10);
  });

  it('h then cx makes the Bell state (|00⟩ + |11⟩)/√2 from |00⟩ (N&C §1.3.6, Fig. 1.12 (from memory))', () => {
    const u = sequenceUnitary(2, [
      { matrix: g('h'), targets: [0] },
      { matrix: g('cx'), targets: [0, 1] },
    ]);
    const column0 = [0, 1, 2, 3].map((r) => entry(u, r, 0));
    expect(column0).toEqual([[Math.SQRT1_2, 0], [0, 0], [0, 0], [Math.SQRT1_2, 0]]);
  });

  it('with no parts it is the identity', () => {
    expect(maxAbsDiff(sequenceUnitary(2, []), identity(4))).toBe(0);
  });
});
