import { describe, expect, it } from 'vitest';
import { referenceKernels } from '../../src/engine/kernels.js';
import { cloneDensityMatrix, createDensityMatrix, hermiticityResidual, minEigenvalue, traceOf } from '../../src/engine/densityMatrix.js';
import { krausToSuperoperator } from '../../src/linalg/superoperator.js';
import { fromRows, identity } from '../../src/linalg/cmatrix.js';
import { DENSE_AGREEMENT, denseChannel, denseReset, rhoDiff, rhoToMath } from './dense.js';
import { mulberry32, randInt, randomDensityMatrix, randomKraus, randomTargets, randomUnitary } from './helpers.js';

/** Tolerance for trace and Hermiticity drift over long random circuits (rounding only). */
const DRIFT_TOLERANCE = 1e-12;
/** Allowed negative rounding in the smallest eigenvalue of a valid state. */
const PSD_TOLERANCE = 1e-12;

const X = fromRows([
  [0, 1],
  [1, 0],
]);
const CNOT = fromRows([
  [1, 0, 0, 0],
  [0, 1, 0, 0],
  [0, 0, 0, 1],
  [0, 0, 1, 0],
]);

describe('layout of targets', () => {
  it('X on qubit 0 of 2 moves |00⟩ to |10⟩ (index 2, qubit 0 most significant; layout.ts convention)', () => {
    const rho = createDensityMatrix(2);
    referenceKernels.applyUnitary(rho, [0], X);
    expect(rho.data[2 * (2 * 4 + 2)]).toBe(1);
    expect(traceOf(rho)).toBe(1);
  });

  it('CNOT with targets [1, 0] uses qubit 1 as control (first target = leftmost factor)', () => {
    // |01⟩ (index 1): control qubit 1 is set, so qubit 0 flips → |11⟩ (index 3)
    const rho = createDensityMatrix(2);
    referenceKernels.applyUnitary(rho, [1], X);
    referenceKernels.applyUnitary(rho, [1, 0], CNOT);
    expect(rho.data[2 * (3 * 4 + 3)]).toBe(1);
    // with targets [0, 1] the control is qubit 0 (clear), nothing happens
    const rho2 = createDensityMatrix(2);
    referenceKernels.applyUnitary(rho2, [1], X);
    referenceKernels.applyUnitary(rho2, [0, 1], CNOT);
    expect(rho2.data[2 * (1 * 4 + 1)]).toBe(1);
  });
});

describe('reference kernels against a dense mathjs computation', () => {
  // Source: independent dense computation with mathjs (full 2^n × 2^n operators from math.kron
  // and permutation matrices; U ρ U† and Σ K ρ K†), see ./helpers.ts.
  const cases: Array<[n: number, k: number]> = [
    [1, 1],
    [2, 1],
    [2, 2],
    [3, 1],
    [3, 2],
    [3, 3],
    [4, 1],
    [4, 2],
    [4, 3],
  ];

  it.each(cases)('applyUnitary on %i qubits, %i targets in random order', (n, k) => {
    const rng = mulberry32(1000 + 10 * n + k);
    for (let trial = 0; trial < 3; trial++) {
      const rho = randomDensityMatrix(rng, n);
      const targets = randomTargets(rng, n, k);
      const u = randomUnitary(rng, 1 << k);
      const expected = denseChannel(n, targets, [u], rhoToMath(rho));
      referenceKernels.applyUnitary(rho, targets, u);
      expect(rhoDiff(rho, expected)).toBeLessThan(DENSE_AGREEMENT);
    }
  });

  it.each(cases)('applyKraus on %i qubits, %i targets, random CPTP channel', (n, k) => {
    const rng = mulberry32(2000 + 10 * n + k);
    for (let trial = 0; trial < 2; trial++) {
      const rho = randomDensityMatrix(rng, n);
      const targets = randomTargets(rng, n, k);
      const kraus = randomKraus(rng, 1 << k, 1 + randInt(rng, 4));
      const expected = denseChannel(n, targets, kraus, rhoToMath(rho));
      referenceKernels.applyKraus(rho, targets, kraus);
      expect(rhoDiff(rho, expected)).toBeLessThan(DENSE_AGREEMENT);
    }
  });

  it.each(cases)('applySuperoperator of Σ conj(K)⊗K on %i qubits, %i targets', (n, k) => {
    const rng = mulberry32(3000 + 10 * n + k);
    const rho = randomDensityMatrix(rng, n);
    const targets = randomTargets(rng, n, k);
    const kraus = randomKraus(rng, 1 << k, 2);
    const expected = denseChannel(n, targets, kraus, rhoToMath(rho));
    referenceKernels.applySuperoperator(rho, targets, krausToSuperoperator(kraus));
    expect(rhoDiff(rho, expected)).toBeLessThan(DENSE_AGREEMENT);
  });

  it('applyKraus also acts correctly on a non-Hermitian operand (linearity of the map)', () => {
    // The kernels act on any matrix; check on a random non-Hermitian ρ-shaped array.
    const rng = mulberry32(4242);
    const n = 3;
    const rho = randomDensityMatrix(rng, n);
    for (let i = 0; i < rho.data.length; i++) rho.data[i] += 0.1 * (rng() - 0.5);
    const targets = [2, 0];
    const kraus = randomKraus(rng, 4, 3);
    const expected = denseChannel(n, targets, kraus, rhoToMath(rho));
    referenceKernels.applyKraus(rho, targets, kraus);
    expect(rhoDiff(rho, expected)).toBeLessThan(DENSE_AGREEMENT);
  });
});

describe('reset against its definition |0⟩⟨0|_q ⊗ Tr_q ρ', () => {
  // Source: dense mathjs computation of the definition (partial trace by sub-blocks), ./helpers.ts.
  for (const n of [1, 2, 3, 4]) {
    it(`every qubit of a random ${n}-qubit state`, () => {
      const rng = mulberry32(5000 + n);
      for (let q = 0; q < n; q++) {
        const rho = randomDensityMatrix(rng, n);
        const expected = denseReset(n, q, rhoToMath(rho));
        referenceKernels.reset(rho, q);
        expect(rhoDiff(rho, expected)).toBeLessThan(DENSE_AGREEMENT);
      }
    });
  }

  it('is idempotent and leaves |0⟩⟨0| on the qubit', () => {
    const rng = mulberry32(77);
    const rho = randomDensityMatrix(rng, 3);
    referenceKernels.reset(rho, 1);
    const once = cloneDensityMatrix(rho);
    referenceKernels.reset(rho, 1);
    expect(Array.from(rho.data)).toEqual(Array.from(once.data));
  });
});

describe('argument checks', () => {
  it('rejects repeated, out-of-range and mismatched targets', () => {
    const rho = createDensityMatrix(2);
    expect(() => referenceKernels.applyUnitary(rho, [0, 0], CNOT)).toThrow(RangeError);
    expect(() => referenceKernels.applyUnitary(rho, [2], X)).toThrow(RangeError);
    expect(() => referenceKernels.applyUnitary(rho, [0], CNOT)).toThrow(RangeError);
    expect(() => referenceKernels.applyKraus(rho, [0, 1], [X])).toThrow(RangeError);
    expect(() => referenceKernels.applySuperoperator(rho, [0], identity(2))).toThrow(RangeError);
    expect(() => referenceKernels.reset(rho, -1)).toThrow(RangeError);
  });
});

describe('long random noisy circuit keeps ρ a valid state', () => {
  it('4 qubits, 200 random unitaries / channels / resets: trace 1, Hermitian, PSD', () => {
    // A CPTP map preserves trace, Hermiticity and positivity (Nielsen & Chuang §8.2, from memory).
    const rng = mulberry32(20240601);
    const n = 4;
    const rho = createDensityMatrix(n);
    for (let step = 0; step < 200; step++) {
      const kind = randInt(rng, 3);
      if (kind === 2) {
        referenceKernels.reset(rho, randInt(rng, n));
      } else {
        const k = 1 + randInt(rng, 2);
        const targets = randomTargets(rng, n, k);
        if (kind === 0) referenceKernels.applyUnitary(rho, targets, randomUnitary(rng, 1 << k));
        else referenceKernels.applyKraus(rho, targets, randomKraus(rng, 1 << k, 1 + randInt(rng, 4)));
      }
      if (step % 20 === 19) {
        expect(Math.abs(traceOf(rho) - 1)).toBeLessThan(DRIFT_TOLERANCE);
        expect(hermiticityResidual(rho)).toBeLessThan(DRIFT_TOLERANCE);
        expect(minEigenvalue(rho)).toBeGreaterThan(-PSD_TOLERANCE);
      }
    }
  });
});
