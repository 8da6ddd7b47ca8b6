import { describe, expect, it } from 'vitest';
import * as math from 'mathjs';
import { extrapolate, fitProblem } from '../../src/mitigation/extrapolate.js';
import { mulberry32 } from '../helpers/random.js';

/** Agreement of two double-precision computations of the same fit. */
const FIT_TOLERANCE = 1e-12;

describe('zero-noise extrapolation fits', () => {
  it('Richardson returns the intercept of any polynomial of degree < k exactly (derived: the interpolating polynomial is unique)', () => {
    const rng = mulberry32(10);
    for (let trial = 0; trial < 20; trial++) {
      const k = 2 + (trial % 4);
      const coeffs = Array.from({ length: k }, () => 2 * rng() - 1);
      const scales = Array.from({ length: k }, (_, i) => 1 + i * (0.5 + rng()));
      const points = scales.map((s) => ({ scale: s, value: coeffs.reduce((acc, c, j) => acc + c * s ** j, 0) }));
      const fit = extrapolate(points, 'richardson');
      expect(Math.abs(fit.value - coeffs[0]!)).toBeLessThan(1e-10);
      expect(fit.stderr).toBeNull();
    }
  });

  it('Richardson on scales 1, 3 is (3y₁ − y₃)/2 and on 1, 2, 3 is 3y₁ − 3y₂ + y₃ (derived from Lagrange at 0)', () => {
    expect(extrapolate([{ scale: 1, value: 0.9 }, { scale: 3, value: 0.75 }], 'richardson').value).toBeCloseTo((3 * 0.9 - 0.75) / 2, 15);
    expect(extrapolate([{ scale: 1, value: 0.9 }, { scale: 2, value: 0.8 }, { scale: 3, value: 0.72 }], 'richardson').value).toBeCloseTo(3 * 0.9 - 3 * 0.8 + 0.72, 14);
  });

  it('linear least squares and its standard error agree with the normal equations solved densely by mathjs (common practice: σ̂² = RSS/(k−2), Cov = σ̂²(XᵀX)⁻¹)', () => {
    const rng = mulberry32(11);
    for (let trial = 0; trial < 10; trial++) {
      const k = 3 + (trial % 4);
      const x = Array.from({ length: k }, (_, i) => 1 + i + rng());
      const y = x.map((s) => 0.9 - 0.05 * s + 0.01 * (rng() - 0.5));
      const X = math.matrix(x.map((s) => [1, s]));
      const xtxInv = math.inv(math.multiply(math.transpose(X), X)) as math.Matrix;
      const beta = math.multiply(math.multiply(xtxInv, math.transpose(X)), math.matrix(y)) as math.Matrix;
      const b = beta.toArray() as number[];
      const rss = x.reduce((acc, s, i) => acc + (y[i]! - b[0]! - b[1]! * s) ** 2, 0);
      const se0 = Math.sqrt((rss / (k - 2)) * (xtxInv.get([0, 0]) as number));
      const fit = extrapolate(x.map((s, i) => ({ scale: s, value: y[i]! })), 'linear');
      expect(Math.abs(fit.value - b[0]!)).toBeLessThan(FIT_TOLERANCE);
      expect(Math.abs(fit.stderr! - se0)).toBeLessThan(FIT_TOLERANCE);
    }
  });

  it('a fit through as many points as parameters has no standard error; a line through collinear points has zero error', () => {
    expect(extrapolate([{ scale: 1, value: 0.8 }, { scale: 2, value: 0.7 }], 'linear').stderr).toBeNull();
    const fit = extrapolate([1, 2, 3, 4].map((s) => ({ scale: s, value: 1 - 0.1 * s })), 'linear');
    expect(fit.value).toBeCloseTo(1, 14);
    expect(fit.stderr!).toBeLessThan(1e-14);
  });

  it('the exponential fit is exact for y = A·e^(−cλ) of either sign (derived)', () => {
    for (const a of [0.93, -0.61]) {
      const points = [1, 2, 3.5, 5].map((s) => ({ scale: s, value: a * Math.exp(-0.07 * s) }));
      const fit = extrapolate(points, 'exponential');
      expect(Math.abs(fit.value - a)).toBeLessThan(1e-13);
      expect(Math.abs(fit.coefficients[1]! - 0.07)).toBeLessThan(1e-13);
      expect(fit.stderr!).toBeLessThan(1e-13);
    }
  });

  it('refuses points it cannot fit', () => {
    expect(fitProblem([{ scale: 1, value: 1 }], 'linear')).toMatch(/at least 2/);
    expect(fitProblem([{ scale: 1, value: 1 }, { scale: 1, value: 0.9 }], 'richardson')).toMatch(/distinct/);
    expect(fitProblem([{ scale: 1, value: 0.1 }, { scale: 3, value: -0.1 }], 'exponential')).toMatch(/one sign/);
    expect(() => extrapolate([{ scale: 1, value: 0 }, { scale: 3, value: 0 }], 'exponential')).toThrow(RangeError);
  });
});
