import { describe, it, expect } from 'vitest';
import * as math from 'mathjs';
import {
  applyReadout,
  diagonalOf,
  diagonalOfDensity,
  diagonalOfPure,
  marginal,
  toOutcomeMap,
} from '../../src/results/probabilities.js';
import { bitstring } from '../../src/engine/layout.js';
import { mulberry32, projector, randomDensity, randomState, stateFrom } from './helpers.js';

function randomDistribution(size: number, rand: () => number): Float64Array {
  const p = new Float64Array(size);
  let s = 0;
  for (let k = 0; k < size; k++) {
    p[k] = rand();
    s += p[k]!;
  }
  for (let k = 0; k < size; k++) p[k] /= s;
  return p;
}

describe('diagonalOf', () => {
  it('gives |⟨i|ψ⟩|² for a state vector and the same for |ψ⟩⟨ψ| (Born rule, Nielsen & Chuang §2.2.3, from memory)', () => {
    const rand = mulberry32(21);
    for (let n = 1; n <= 3; n++) {
      const psi = randomState(n, rand);
      const a = diagonalOf(psi);
      const b = diagonalOf(projector(psi));
      expect(a.length).toBe(1 << n);
      for (let i = 0; i < a.length; i++) {
        const amp = math.complex(psi.data[2 * i]!, psi.data[2 * i + 1]!);
        expect(a[i]).toBeCloseTo((math.abs(amp) as unknown as number) ** 2, 14);
        expect(b[i]).toBeCloseTo(a[i]!, 14);
      }
      expect(Array.from(diagonalOfPure(psi))).toEqual(Array.from(a));
      expect(Array.from(diagonalOfDensity(projector(psi)))).toEqual(Array.from(b));
    }
  });

  it('puts qubit 0 in the most significant bit (layout.ts): |01⟩ → index 1', () => {
    const psi = stateFrom([0, 1, 0, 0]);
    expect(Array.from(diagonalOf(psi))).toEqual([0, 1, 0, 0]);
  });

  it('sums to the trace of a random density matrix', () => {
    const rho = randomDensity(3, mulberry32(22));
    const s = diagonalOf(rho).reduce((a, b) => a + b, 0);
    expect(s).toBeCloseTo(1, 13);
  });

  it('rejects data that fits neither layout', () => {
    expect(() => diagonalOf({ n: 2, dim: 4, data: new Float64Array(10) })).toThrow(RangeError);
  });
});

describe('marginal', () => {
  it('hand case: |011⟩ measured on qubits [0, 2] reads "01"', () => {
    const diag = new Float64Array(8);
    diag[0b011] = 1;
    expect(Array.from(marginal(diag, 3, [0, 2]))).toEqual([0, 1, 0, 0]);
    expect(Array.from(marginal(diag, 3, [1]))).toEqual([0, 1]);
    expect(Array.from(marginal(diag, 3, [0]))).toEqual([1, 0]);
  });

  it('agrees with summing over bitstring characters (independent string bookkeeping)', () => {
    const rand = mulberry32(23);
    const n = 4;
    const diag = randomDistribution(16, rand);
    for (const measured of [[0], [3], [0, 1], [1, 3], [0, 2, 3], [0, 1, 2, 3]]) {
      const out = marginal(diag, n, measured);
      const expected = new Float64Array(1 << measured.length);
      for (let i = 0; i < 16; i++) {
        const b = bitstring(i, n);
        const key = measured.map((q) => b[q]).join('');
        expected[parseInt(key, 2)] += diag[i]!;
      }
      for (let k = 0; k < expected.length; k++) expect(out[k]).toBeCloseTo(expected[k]!, 15);
    }
  });

  it('on no qubits gives the total weight, and checks its input', () => {
    const diag = Float64Array.from([0.25, 0.25, 0.5, 0]);
    expect(Array.from(marginal(diag, 2, []))).toEqual([1]);
    expect(() => marginal(diag, 2, [2])).toThrow(RangeError);
    expect(() => marginal(diag, 2, [1, 1])).toThrow(RangeError);
    expect(() => marginal(diag, 3, [0])).toThrow(RangeError);
  });
});

describe('applyReadout', () => {
  it('one qubit, analytic: |0⟩ reads (1 − a, a) and |1⟩ reads (b, 1 − b) (definition of the confusion probabilities)', () => {
    const c = [{ zeroAsOne: 0.02, oneAsZero: 0.07 }];
    const r0 = applyReadout(Float64Array.from([1, 0]), c);
    const r1 = applyReadout(Float64Array.from([0, 1]), c);
    expect(r0[0]).toBeCloseTo(0.98, 15);
    expect(r0[1]).toBeCloseTo(0.02, 15);
    expect(r1[0]).toBeCloseTo(0.07, 15);
    expect(r1[1]).toBeCloseTo(0.93, 15);
    // A mixture is read linearly: ¼|0⟩ + ¾|1⟩ → (¼·0.98 + ¾·0.07, ¼·0.02 + ¾·0.93).
    const r = applyReadout(Float64Array.from([0.25, 0.75]), c);
    expect(r[0]).toBeCloseTo(0.25 * 0.98 + 0.75 * 0.07, 15);
    expect(r[1]).toBeCloseTo(0.25 * 0.02 + 0.75 * 0.93, 15);
  });

  it('several qubits: equals (C_0 ⊗ C_1 ⊗ …) p with C = [[1−a, b], [a, 1−b]] (dense mathjs kron)', () => {
    const rand = mulberry32(24);
    for (const m of [2, 3]) {
      const conf = Array.from({ length: m }, () => ({ zeroAsOne: 0.2 * rand(), oneAsZero: 0.2 * rand() }));
      const p = randomDistribution(1 << m, rand);
      let big: math.Matrix = math.matrix([[1]]);
      for (const { zeroAsOne: a, oneAsZero: b } of conf) {
        big = math.kron(big, math.matrix([
          [1 - a, b],
          [a, 1 - b],
        ]));
      }
      const expected = (math.multiply(big, math.matrix(Array.from(p))) as math.Matrix).toArray() as number[];
      const out = applyReadout(p, conf);
      for (let k = 0; k < expected.length; k++) expect(out[k]).toBeCloseTo(expected[k]!, 14);
      expect(out.reduce((x, y) => x + y, 0)).toBeCloseTo(1, 14);
    }
  });

  it('does not modify its input and rejects bad confusion values', () => {
    const p = Float64Array.from([0.5, 0.5]);
    applyReadout(p, [{ zeroAsOne: 0.3, oneAsZero: 0.1 }]);
    expect(Array.from(p)).toEqual([0.5, 0.5]);
    expect(() => applyReadout(p, [{ zeroAsOne: 1.5, oneAsZero: 0 }])).toThrow(RangeError);
    expect(() => applyReadout(p, [{ zeroAsOne: 0, oneAsZero: Number.NaN }])).toThrow(RangeError);
    expect(() => applyReadout(p, [])).toThrow(RangeError);
  });
});

describe('toOutcomeMap', () => {
  it('maps index k to its bitstring, first measured qubit leftmost, dropping outcomes at or below the threshold', () => {
    const p = Float64Array.from([0.5, 0, 1e-15, 0.5 - 1e-15]);
    expect(toOutcomeMap(p, 2)).toEqual({ '00': 0.5, '11': 0.5 - 1e-15 });
    expect(toOutcomeMap(p, 2, 0)).toEqual({ '00': 0.5, '10': 1e-15, '11': 0.5 - 1e-15 });
    expect(toOutcomeMap(Float64Array.from([1]), 0)).toEqual({ '': 1 });
    expect(() => toOutcomeMap(p, 3)).toThrow(RangeError);
  });
});
