import { describe, expect, it } from 'vitest';
import * as math from 'mathjs';
import { correctReadout, invertReadout, projectToSimplex } from '../../src/mitigation/readoutCorrection.js';
import { applyReadout, type ReadoutConfusion } from '../../src/results/probabilities.js';
import { mulberry32 } from '../helpers/random.js';

/** Rounding of a few dozen multiply-adds on probabilities. */
const EXACT = 1e-12;

function randomDistribution(rng: () => number, size: number): Float64Array {
  const p = Float64Array.from({ length: size }, () => rng());
  const s = p.reduce((a, b) => a + b, 0);
  return p.map((x) => x / s);
}

function randomConfusion(rng: () => number, m: number): ReadoutConfusion[] {
  return Array.from({ length: m }, () => ({ zeroAsOne: 0.2 * rng(), oneAsZero: 0.2 * rng() }));
}

describe('readout correction', () => {
  it('the inverse undoes the forward confusion to 1e-12 (derived: C⁻¹C = I qubit by qubit)', () => {
    const rng = mulberry32(20);
    for (let trial = 0; trial < 20; trial++) {
      const m = 1 + (trial % 4);
      const p = randomDistribution(rng, 1 << m);
      const c = randomConfusion(rng, m);
      const back = invertReadout(applyReadout(p, c), c);
      for (let k = 0; k < p.length; k++) expect(Math.abs(back[k]! - p[k]!)).toBeLessThan(EXACT);
    }
  });

  it('the tensored inverse equals the dense inverse of ⊗_j C_j computed by mathjs (qubit 0 the leftmost factor)', () => {
    const rng = mulberry32(21);
    const c = randomConfusion(rng, 3);
    const dense = c.map(({ zeroAsOne: a, oneAsZero: b }) => math.matrix([[1 - a, b], [a, 1 - b]])).reduce((acc, m) => math.kron(acc, m) as math.Matrix);
    const read = randomDistribution(rng, 8);
    const expected = (math.multiply(math.inv(dense), math.matrix([...read])) as math.Matrix).toArray() as number[];
    const got = invertReadout(read, c);
    for (let k = 0; k < 8; k++) expect(Math.abs(got[k]! - expected[k]!)).toBeLessThan(EXACT);
  });

  it('the bounded variant returns a distribution, and equals the inverse whenever that is one', () => {
    const rng = mulberry32(22);
    let projected = 0;
    for (let trial = 0; trial < 40; trial++) {
      const m = 1 + (trial % 3);
      const c = randomConfusion(rng, m);
      // a read distribution that did not come from the confusion (sampling noise): its inverse may go negative
      const read = randomDistribution(rng, 1 << m).map((x, k) => (k === 0 ? x + 0.3 * rng() : x));
      const s = read.reduce((a, b) => a + b, 0);
      const readN = read.map((x) => x / s);
      const inv = invertReadout(readN, c);
      const bounded = correctReadout(readN, c, 'bounded');
      expect(Math.abs(bounded.reduce((a, b) => a + b, 0) - 1)).toBeLessThan(EXACT);
      expect(Math.min(...bounded)).toBeGreaterThanOrEqual(0);
      if (inv.every((x) => x >= 0)) expect([...bounded]).toEqual([...inv]);
      else projected++;
    }
    expect(projected).toBeGreaterThan(0);
  });

  it('the simplex projection meets the optimality conditions of min ‖p − v‖² on {p ≥ 0, Σp = 1} (derived from the Lagrangian: v_i − p_i = θ where p_i > 0, v_i ≤ θ where p_i = 0)', () => {
    const rng = mulberry32(23);
    for (let trial = 0; trial < 30; trial++) {
      const v = Float64Array.from({ length: 2 + (trial % 7) }, () => 2 * rng() - 0.6);
      const p = projectToSimplex(v);
      expect(Math.abs(p.reduce((a, b) => a + b, 0) - 1)).toBeLessThan(EXACT);
      const support = [...p.keys()].filter((i) => p[i]! > 0);
      const theta = v[support[0]!]! - p[support[0]!]!;
      for (let i = 0; i < v.length; i++) {
        if (p[i]! > 0) expect(Math.abs(v[i]! - p[i]! - theta)).toBeLessThan(EXACT);
        else expect(v[i]!).toBeLessThanOrEqual(theta + EXACT);
      }
    }
  });

  it('a qubit whose readout carries no information cannot be inverted', () => {
    expect(() => invertReadout(Float64Array.from([0.5, 0.5]), [{ zeroAsOne: 0.5, oneAsZero: 0.5 }])).toThrow(/cannot be inverted/);
  });
});
