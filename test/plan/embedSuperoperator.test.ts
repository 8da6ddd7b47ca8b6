import { describe, expect, it } from 'vitest';
import { krausToSuperoperator } from '../../src/linalg/superoperator.js';
import { identity, kron, maxAbsDiff, mul, type CMatrix } from '../../src/linalg/cmatrix.js';
import { composeEmbedded, composeEmbeddedBefore, embedSuperoperator } from '../../src/plan/embedSuperoperator.js';
import { superoperatorOfKraus } from '../../src/plan/instructionSuperoperator.js';
import { mulberry32, randomKraus } from '../engine/helpers.js';

/** SWAP of two qubits (common practice). */
const SWAP: CMatrix = { rows: 4, cols: 4, data: new Float64Array([1, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 1, 0, 0, 0, 0, 0, 1, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 1, 0]) };

describe('embedSuperoperator', () => {
  const rng = mulberry32(31);
  const kraus = randomKraus(rng, 2, 2);
  const s = krausToSuperoperator(kraus);

  it('on position 0 of 2 it is the superoperator of the Kraus set {K ⊗ I} (first factor most significant)', () => {
    const expected = krausToSuperoperator(kraus.map((k) => kron(k, identity(2))));
    expect(maxAbsDiff(embedSuperoperator(s, [0], 2), expected)).toBeLessThan(1e-15);
  });

  it('on position 1 of 2 it is the superoperator of {I ⊗ K}', () => {
    const expected = krausToSuperoperator(kraus.map((k) => kron(identity(2), k)));
    expect(maxAbsDiff(embedSuperoperator(s, [1], 2), expected)).toBeLessThan(1e-15);
  });

  it('a 2-qubit map listed in reverse order is the SWAP-conjugated map', () => {
    const k2 = randomKraus(rng, 4, 2);
    const swapped = krausToSuperoperator(k2.map((k) => mul(mul(SWAP, k), SWAP)));
    expect(maxAbsDiff(embedSuperoperator(krausToSuperoperator(k2), [1, 0], 2), swapped)).toBeLessThan(1e-14);
  });

  it('composeEmbedded(s, positions, k, g) = embed(s) · g', () => {
    const g = krausToSuperoperator(randomKraus(rng, 8, 2));
    for (const pos of [[0], [1], [2], [2, 0], [1, 2]]) {
      const sk = krausToSuperoperator(randomKraus(rng, 1 << pos.length, 2));
      expect(maxAbsDiff(composeEmbedded(sk, pos, 3, g), mul(embedSuperoperator(sk, pos, 3), g))).toBeLessThan(1e-14);
    }
  });
});

describe('composeEmbeddedBefore and superoperatorOfKraus', () => {
  const rng = mulberry32(32);
  it('composeEmbeddedBefore(g, s, positions, k) = g · embed(s)', () => {
    const g = krausToSuperoperator(randomKraus(rng, 8, 2));
    for (const pos of [[0], [2], [1, 0], [0, 2]]) {
      const sk = krausToSuperoperator(randomKraus(rng, 1 << pos.length, 3));
      expect(maxAbsDiff(composeEmbeddedBefore(g, sk, pos, 3), mul(g, embedSuperoperator(sk, pos, 3)))).toBeLessThan(1e-14);
    }
  });

  it('superoperatorOfKraus equals krausToSuperoperator (Σ conj(K) ⊗ K, column-stacking vec)', () => {
    for (const d of [2, 4, 8]) {
      const kraus = randomKraus(rng, d, 3);
      expect(maxAbsDiff(superoperatorOfKraus(kraus), krausToSuperoperator(kraus))).toBeLessThan(1e-15);
    }
  });
});
