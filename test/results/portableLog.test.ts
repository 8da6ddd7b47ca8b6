import { describe, expect, it } from 'vitest';
import { portableLog } from '../../src/results/portableLog.js';
import { mulberry32 } from '../helpers/random.js';

/** Relative agreement with Math.log (the platform's logarithm; a few units in the last place). */
const LOG_AGREEMENT = 4e-16;

describe('portableLog', () => {
  it('agrees with Math.log over 1e-300 … 1e300 and near 1', () => {
    const rng = mulberry32(3);
    for (let i = 0; i < 5000; i++) {
      const x = Math.pow(10, 600 * rng() - 300);
      const y = 1 + (rng() - 0.5) * 1e-3;
      for (const v of [x, y]) {
        const want = Math.log(v);
        expect(Math.abs(portableLog(v) - want)).toBeLessThanOrEqual(LOG_AGREEMENT * Math.max(1e-3, Math.abs(want)) + 1e-19);
      }
    }
  });

  it('exact points and edges', () => {
    expect(portableLog(1)).toBe(0);
    expect(portableLog(0)).toBe(-Infinity);
    expect(portableLog(-1)).toBeNaN();
    expect(portableLog(Infinity)).toBeNaN();
    expect(Math.abs(portableLog(2) - Math.LN2)).toBeLessThan(1e-16);
    expect(Math.abs(portableLog(Math.E) - 1)).toBeLessThan(3e-16);
    expect(Math.abs(portableLog(Number.MIN_VALUE) - Math.log(Number.MIN_VALUE))).toBeLessThan(1e-12);
  });
});
