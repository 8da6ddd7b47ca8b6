import { describe, expect, it } from 'vitest';
import { fastKernels } from '../../src/engine/fastKernels.js';
import { referenceKernels } from '../../src/engine/kernels.js';
import { cloneDensityMatrix } from '../../src/engine/densityMatrix.js';
import { DENSE_AGREEMENT, denseChannel, denseReset, rhoDiff, rhoToMath } from './dense.js';
import { mulberry32, randInt, randomDensityMatrix, randomKraus, randomTargets, randomUnitary } from './helpers.js';

/** Agreement required between the fast and the reference kernels (issue 4: 1e-12). */
const FAST_AGREEMENT = 1e-12;

function maxDiff(a: Float64Array, b: Float64Array): number {
  let w = 0;
  for (let i = 0; i < a.length; i++) w = Math.max(w, Math.abs(a[i]! - b[i]!));
  return w;
}

describe('fast kernels against the reference kernels', () => {
  const cases: Array<[n: number, k: number]> = [];
  for (let n = 1; n <= 6; n++) for (let k = 1; k <= Math.min(3, n); k++) cases.push([n, k]);

  it.each(cases)('applyKraus on %i qubits, %i targets (real1 / real2 / general)', (n, k) => {
    const rng = mulberry32(6000 + 10 * n + k);
    for (let trial = 0; trial < 3; trial++) {
      const rho = randomDensityMatrix(rng, n);
      const ref = cloneDensityMatrix(rho);
      const targets = randomTargets(rng, n, k);
      const kraus = randomKraus(rng, 1 << k, 1 + randInt(rng, 4));
      fastKernels.applyKraus(rho, targets, kraus);
      referenceKernels.applyKraus(ref, targets, kraus);
      expect(maxDiff(rho.data, ref.data)).toBeLessThan(FAST_AGREEMENT);
    }
  });

  it.each(cases)('applyUnitary on %i qubits, %i targets', (n, k) => {
    const rng = mulberry32(7000 + 10 * n + k);
    const rho = randomDensityMatrix(rng, n);
    const ref = cloneDensityMatrix(rho);
    const targets = randomTargets(rng, n, k);
    const u = randomUnitary(rng, 1 << k);
    fastKernels.applyUnitary(rho, targets, u);
    referenceKernels.applyUnitary(ref, targets, u);
    expect(maxDiff(rho.data, ref.data)).toBeLessThan(FAST_AGREEMENT);
  });

  it.each([1, 2, 3, 4, 5, 6])('reset on every qubit of %i', (n) => {
    const rng = mulberry32(8000 + n);
    for (let q = 0; q < n; q++) {
      const rho = randomDensityMatrix(rng, n);
      const ref = cloneDensityMatrix(rho);
      fastKernels.reset(rho, q);
      referenceKernels.reset(ref, q);
      expect(maxDiff(rho.data, ref.data)).toBeLessThan(FAST_AGREEMENT);
    }
  });

  it('keeps a Hermitian ρ exactly Hermitian (real form and mirrored half)', () => {
    const rng = mulberry32(8100);
    const rho = randomDensityMatrix(rng, 4);
    fastKernels.applyKraus(rho, [2, 0], randomKraus(rng, 4, 3));
    fastKernels.applyKraus(rho, [1], randomKraus(rng, 2, 2));
    const D = rho.dim;
    for (let r = 0; r < D; r++) {
      for (let c = 0; c < D; c++) {
        // === (not Object.is): +0 and −0 count as equal
        expect(rho.data[2 * (r * D + c)] === rho.data[2 * (c * D + r)]).toBe(true);
        expect(rho.data[2 * (r * D + c) + 1] === -rho.data[2 * (c * D + r) + 1]!).toBe(true);
      }
    }
  });
});

describe('fast kernels against the dense mathjs reference', () => {
  // Source: independent dense computation with mathjs (full 2^n × 2^n operators, ./dense.ts).
  it.each([
    [2, 1],
    [3, 2],
    [4, 2],
    [4, 3],
  ])('%i qubits, %i targets', (n, k) => {
    const rng = mulberry32(9000 + 10 * n + k);
    const rho = randomDensityMatrix(rng, n);
    const targets = randomTargets(rng, n, k);
    const kraus = randomKraus(rng, 1 << k, 2);
    const expected = denseChannel(n, targets, kraus, rhoToMath(rho));
    fastKernels.applyKraus(rho, targets, kraus);
    expect(rhoDiff(rho, expected)).toBeLessThan(DENSE_AGREEMENT);
    const q = randInt(rng, n);
    const afterReset = denseReset(n, q, rhoToMath(rho));
    fastKernels.reset(rho, q);
    expect(rhoDiff(rho, afterReset)).toBeLessThan(DENSE_AGREEMENT);
  });
});
