import { describe, it, expect } from 'vitest';
import { sampleCounts } from '../../src/results/sampling.js';
import { createRandom } from '../../src/results/random.js';
import { sampleBinomial } from '../../src/results/binomial.js';

/** Standard normal 0.999 quantile (common practice: statistical tables). */
const Z_999 = 3.0902;
import { bitstring } from '../../src/engine/layout.js';

const total = (c: Record<string, number>) => Object.values(c).reduce((a, b) => a + b, 0);

describe('sampleCounts', () => {
  const p = Float64Array.from([0.05, 0.2, 0, 0.1, 0.3, 0.0001, 0.1499, 0.2]);

  it('same seed → identical counts; another seed → different counts', () => {
    const a = sampleCounts(p, 3, 5000, 99);
    const b = sampleCounts(p, 3, 5000, 99);
    const c = sampleCounts(p, 3, 5000, 100);
    expect(a).toEqual(b);
    expect(a).not.toEqual(c);
  });

  it('counts sum to the number of shots, keys are m-bit strings, zero-probability outcomes never appear', () => {
    for (const shots of [1, 17, 1000]) {
      const c = sampleCounts(p, 3, shots, 5);
      expect(total(c)).toBe(shots);
      for (const [k, v] of Object.entries(c)) {
        expect(k).toMatch(/^[01]{3}$/);
        expect(v).toBeGreaterThan(0);
        expect(Number.isInteger(v)).toBe(true);
      }
      expect(c['010']).toBeUndefined();
    }
  });

  it('empirical frequencies of 100000 shots lie within 5σ = 5√(p(1−p)/N) of p (binomial statistics, common practice)', () => {
    const N = 100000;
    const c = sampleCounts(p, 3, N, 31337);
    for (let k = 0; k < 8; k++) {
      const f = (c[bitstring(k, 3)] ?? 0) / N;
      const sigma = Math.sqrt((p[k]! * (1 - p[k]!)) / N);
      expect(Math.abs(f - p[k]!)).toBeLessThanOrEqual(5 * sigma);
    }
  });

  it('draws the multinomial by successive binomials in ascending outcome order (the documented method)', () => {
    // Re-derive the counts from the definition in src/results/sampling.ts with the binomial sampler.
    for (const shots of [50, 123_456, 1e12]) {
      const rng = createRandom(4242);
      const expected: Record<string, number> = {};
      let left = shots;
      for (let k = 0; k < 8 && left > 0; k++) {
        if (p[k]! === 0) continue;
        // P_k = Σ_{j ≥ k} p_j, summed from the end
        const mass = [...p.slice(k)].reverse().reduce((s, v) => s + v, 0);
        const isLast = p.slice(k + 1).every((v) => v === 0);
        const c = isLast ? left : sampleBinomial(rng, left, Math.min(1, p[k]! / mass));
        if (c > 0) expected[bitstring(k, 3)] = c;
        left -= c;
      }
      expect(sampleCounts(p, 3, shots, 4242)).toEqual(expected);
    }
  });

  // Pearson's chi-square goodness of fit (common practice); critical value by the Wilson–Hilferty
  // approximation (E. B. Wilson, M. M. Hilferty, PNAS 17, 684 (1931)) at the 0.999 quantile.
  const chiSquareCritical = (df: number) => df * (1 - 2 / (9 * df) + Z_999 * Math.sqrt(2 / (9 * df))) ** 3;
  it.each([1000, 1e6, 1e12, 2 ** 53])('%d shots: counts fit the distribution (chi-square below its 0.999 quantile for this seed)', (N) => {
    const c = sampleCounts(p, 3, N, 2718);
    expect(total(c)).toBe(N);
    let chi2 = 0;
    let df = -1;
    for (let k = 0; k < 8; k++) {
      if (p[k]! === 0) continue;
      const e = p[k]! * N;
      chi2 += ((c[bitstring(k, 3)] ?? 0) - e) ** 2 / e;
      df++;
    }
    expect(chi2).toBeLessThan(chiSquareCritical(df));
  });

  it('a certain outcome takes every shot; no shots gives no counts; m = 0 has the empty outcome', () => {
    expect(sampleCounts(Float64Array.from([0, 0, 1, 0]), 2, 1234, 1)).toEqual({ '10': 1234 });
    expect(sampleCounts(p, 3, 0, 1)).toEqual({});
    expect(sampleCounts(Float64Array.from([1]), 0, 3, 1)).toEqual({ '': 3 });
  });

  it('tolerates rounding negatives and unnormalised weight, rejects bad input', () => {
    const c = sampleCounts(Float64Array.from([-1e-17, 0.5 + 1e-15, 0.5, 0]), 2, 1000, 1);
    expect(total(c)).toBe(1000);
    expect(c['00']).toBeUndefined();
    expect(c['11']).toBeUndefined();
    // Weights 2 : 6 are sampled as 1/4 : 3/4 (5σ with σ = √(3/16/1000)).
    const w = sampleCounts(Float64Array.from([2, 6]), 1, 1000, 2);
    expect(Math.abs(w['0']! / 1000 - 0.25)).toBeLessThan(5 * Math.sqrt(3 / 16 / 1000));
    expect(() => sampleCounts(Float64Array.from([0.5, 0.5]), 2, 10, 1)).toThrow(RangeError);
    expect(() => sampleCounts(Float64Array.from([0, 0]), 1, 10, 1)).toThrow(RangeError);
    expect(() => sampleCounts(Float64Array.from([0.5, 0.5]), 1, -1, 1)).toThrow(RangeError);
    expect(() => sampleCounts(Float64Array.from([0.5, 0.5]), 1, 2.5, 1)).toThrow(RangeError);
    expect(() => sampleCounts(Float64Array.from([0.5, 0.5]), 1, 2 ** 53 + 2, 1)).toThrow(RangeError);
  });
});
