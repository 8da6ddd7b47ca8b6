import { describe, expect, it } from 'vitest';
import { ctranspose, multiply, type Matrix } from 'mathjs';
import {
  applyUnitaryToState,
  createStateVector,
  PURE_RESET_TOLERANCE,
  resetStateVector,
  stateToDensityMatrix,
} from '../../src/engine/stateVector.js';
import { fromRows } from '../../src/linalg/cmatrix.js';
import { DENSE_AGREEMENT, denseReset, embed, maxDiffToMath, psiToMath, rhoDiff } from './dense.js';
import { mulberry32, randomState, randomTargets, randomUnitary } from './helpers.js';

const H = fromRows([
  [Math.SQRT1_2, Math.SQRT1_2],
  [Math.SQRT1_2, -Math.SQRT1_2],
]);
const CNOT = fromRows([
  [1, 0, 0, 0],
  [0, 1, 0, 0],
  [0, 0, 0, 1],
  [0, 0, 1, 0],
]);

function norm2(data: Float64Array): number {
  let s = 0;
  for (const v of data) s += v * v;
  return s;
}

describe('createStateVector', () => {
  it('is |0…0⟩', () => {
    const psi = createStateVector(3);
    expect(psi.dim).toBe(8);
    expect(psi.data.length).toBe(16);
    expect(psi.data[0]).toBe(1);
    expect(norm2(psi.data)).toBe(1);
  });
});

describe('applyUnitaryToState against a dense mathjs computation', () => {
  // Source: independent dense computation with mathjs (U embedded via math.kron and a permutation).
  for (const n of [1, 2, 3, 4]) {
    it(`${n} qubits, 1–${Math.min(n, 3)} targets in random order`, () => {
      const rng = mulberry32(700 + n);
      for (let k = 1; k <= Math.min(n, 3); k++) {
        const psi = randomState(rng, n);
        const targets = randomTargets(rng, n, k);
        const u = randomUnitary(rng, 1 << k);
        const expected = multiply(embed(n, targets, u), psiToMath(psi)) as Matrix;
        applyUnitaryToState(psi, targets, u);
        expect(maxDiffToMath(psi.data, psi.dim, 1, expected)).toBeLessThan(DENSE_AGREEMENT);
      }
    });
  }
});

describe('stateToDensityMatrix', () => {
  it('is |ψ⟩⟨ψ| (mathjs outer product)', () => {
    const psi = randomState(mulberry32(9), 3);
    const col = psiToMath(psi);
    expect(rhoDiff(stateToDensityMatrix(psi), multiply(col, ctranspose(col)) as Matrix)).toBeLessThan(DENSE_AGREEMENT);
  });
});

describe('resetStateVector', () => {
  // Reference: the definition |0⟩⟨0|_q ⊗ Tr_q(|ψ⟩⟨ψ|), computed densely with mathjs.
  it('keeps a product state pure and matches the definition, for every qubit and random phases', () => {
    const rng = mulberry32(4711);
    for (const n of [1, 2, 3, 4]) {
      for (let q = 0; q < n; q++) {
        // |a⟩_q ⊗ |rest⟩ built from |0…0⟩: random 1-qubit unitary on q, random unitary on the others
        const psi = createStateVector(n);
        applyUnitaryToState(psi, [q], randomUnitary(rng, 2));
        const others = Array.from({ length: n }, (_, i) => i).filter((i) => i !== q);
        if (others.length > 0) applyUnitaryToState(psi, others, randomUnitary(rng, 1 << others.length));
        const col = psiToMath(psi);
        const expected = denseReset(n, q, multiply(col, ctranspose(col)) as Matrix);
        expect(resetStateVector(psi, q)).toBe(true);
        expect(rhoDiff(stateToDensityMatrix(psi), expected)).toBeLessThan(DENSE_AGREEMENT);
        expect(Math.abs(norm2(psi.data) - 1)).toBeLessThan(DENSE_AGREEMENT);
      }
    }
  });

  it('leaves a state whose qubit is already |0⟩ exactly unchanged', () => {
    const psi = createStateVector(3);
    applyUnitaryToState(psi, [2, 1], randomUnitary(mulberry32(3), 4));
    const copy = Float64Array.from(psi.data);
    expect(resetStateVector(psi, 0)).toBe(true);
    expect(Array.from(psi.data)).toEqual(Array.from(copy));
  });

  it('maps a qubit in |1⟩ to |0⟩ with the rest untouched', () => {
    const psi = createStateVector(2);
    applyUnitaryToState(psi, [0], fromRows([[0, 1], [1, 0]]));
    applyUnitaryToState(psi, [1], H);
    expect(resetStateVector(psi, 0)).toBe(true);
    // expected |0⟩ ⊗ |+⟩: amplitudes 1/√2 at indices 0 and 1
    expect(psi.data[0]).toBeCloseTo(Math.SQRT1_2, 15);
    expect(psi.data[2]).toBeCloseTo(Math.SQRT1_2, 15);
    expect(norm2(psi.data.subarray(4))).toBe(0);
  });

  it('refuses half of a Bell pair (the result would be mixed) and leaves ψ unchanged', () => {
    // (|00⟩ + |11⟩)/√2: branches ψ0 = |0⟩/√2, ψ1 = |1⟩/√2 are orthogonal (Nielsen & Chuang §2.4.3 (from memory): reduced state I/2)
    const psi = createStateVector(2);
    applyUnitaryToState(psi, [0], H);
    applyUnitaryToState(psi, [0, 1], CNOT);
    const copy = Float64Array.from(psi.data);
    expect(resetStateVector(psi, 0)).toBe(false);
    expect(resetStateVector(psi, 1)).toBe(false);
    expect(Array.from(psi.data)).toEqual(Array.from(copy));
  });

  it('applies PURE_RESET_TOLERANCE to cos θ|00⟩ + sin θ|11⟩ (discarded weight ≈ cos²θ sin²θ)', () => {
    const make = (theta: number) => {
      const psi = createStateVector(2);
      psi.data[0] = Math.cos(theta);
      psi.data[2 * 3] = Math.sin(theta);
      return psi;
    };
    // θ = 1e-3: cos²θ sin²θ ≈ 1e-6, far above the tolerance → mixed
    expect(resetStateVector(make(1e-3), 0)).toBe(false);
    // θ = 1e-7: ≈ 1e-14, below PURE_RESET_TOLERANCE → pure; result |0⟩ ⊗ (dominant branch |0⟩), normalised
    const psi = make(1e-7);
    expect(PURE_RESET_TOLERANCE).toBeGreaterThan(1e-14);
    expect(resetStateVector(psi, 0)).toBe(true);
    expect(Math.hypot(psi.data[0]!, psi.data[1]!)).toBeCloseTo(1, 12);
    expect(Math.abs(norm2(psi.data) - 1)).toBeLessThan(DENSE_AGREEMENT);
  });

  it('refuses a generic entangled random state', () => {
    const psi = randomState(mulberry32(8), 3);
    expect(resetStateVector(psi, 1)).toBe(false);
  });
});
