import { describe, expect, it } from 'vitest';
import { BTRS_MIN_MEAN, sampleBinomial } from '../../src/results/binomial.js';
import { createRandom } from '../../src/results/random.js';

/** Standard normal 0.999 quantile (common practice: statistical tables). */
const Z_999 = 3.0902;
/** Chi-square 0.999 quantile by Wilson–Hilferty (E. B. Wilson, M. M. Hilferty, PNAS 17, 684 (1931)). */
const chiSquareCritical = (df: number) => df * (1 - 2 / (9 * df) + Z_999 * Math.sqrt(2 / (9 * df))) ** 3;

/** ln C(n, k) + k ln p + (n − k) ln(1 − p) by summing logarithms (exact definition of the binomial pmf). */
function logPmf(n: number, k: number, p: number): number {
  let s = 0;
  for (let i = 1; i <= k; i++) s += Math.log(n - k + i) - Math.log(i);
  return s + k * Math.log(p) + (n - k) * Math.log1p(-p);
}

describe('sampleBinomial', () => {
  // Pearson's chi-square against the exact binomial pmf (common practice), cells with
  // expectation below 5 pooled into their neighbours.
  it.each([
    [30, 0.2, 'waiting times (n·p = 6)'],
    [1000, 0.3, 'BTRS'],
    [50, 0.9, 'p > ½ through n − Binomial(n, 1 − p)'],
    [200, 0.5, 'BTRS at p = ½'],
  ])('n = %d, p = %d (%s): 20000 variates fit the pmf', (n, p) => {
    const rng = createRandom(77 + n);
    const draws = 20000;
    const hist = new Float64Array(n + 1);
    for (let i = 0; i < draws; i++) hist[sampleBinomial(rng, n, p)]!++;
    let chi2 = 0;
    let cells = 0;
    let obs = 0;
    let exp = 0;
    for (let k = 0; k <= n; k++) {
      obs += hist[k]!;
      exp += draws * Math.exp(logPmf(n, k, p));
      if (exp >= 5 || k === n) {
        chi2 += (obs - exp) ** 2 / Math.max(exp, 1e-300);
        cells++;
        obs = 0;
        exp = 0;
      }
    }
    expect(chi2).toBeLessThan(chiSquareCritical(cells - 1));
  });

  it('huge n (up to 2^53): mean within 5 standard errors, every variate a whole number in [0, n]', () => {
    const rng = createRandom(5);
    for (const [n, p] of [
      [2 ** 53, 0.25],
      [1e15, 1e-9],
      [1e12, 0.999],
    ] as const) {
      let sum = 0;
      const m = 200;
      for (let i = 0; i < m; i++) {
        const k = sampleBinomial(rng, n, p);
        expect(Number.isInteger(k) && k >= 0 && k <= n).toBe(true);
        sum += k;
      }
      const sd = Math.sqrt((n * p * (1 - p)) / m);
      expect(Math.abs(sum / m - n * p)).toBeLessThan(5 * sd);
    }
    expect(BTRS_MIN_MEAN).toBeGreaterThan(0);
  });

  it('edge cases and bad input', () => {
    const rng = createRandom(1);
    expect(sampleBinomial(rng, 0, 0.5)).toBe(0);
    expect(sampleBinomial(rng, 10, 0)).toBe(0);
    expect(sampleBinomial(rng, 10, 1)).toBe(10);
    expect(() => sampleBinomial(rng, 2.5, 0.5)).toThrow(RangeError);
    expect(() => sampleBinomial(rng, 10, 1.5)).toThrow(RangeError);
    expect(() => sampleBinomial(rng, 2 ** 53 + 2, 0.5)).toThrow(RangeError);
  });
});
