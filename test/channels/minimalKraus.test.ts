import { describe, expect, it } from 'vitest';
import { type CMatrix, add, adjoint, identity, mul, scale } from '../../src/linalg/cmatrix.js';
import { Channel } from '../../src/channels/channel.js';
import {
  amplitudeDampingChannel,
  depolarizingChannel,
  phaseDampingChannel,
  thermalRelaxationChannel,
  unitaryChannel,
} from '../../src/channels/builtins.js';
import { NotCompletelyPositiveError } from '../../src/channels/minimalKraus.js';
import { hermitianEigen } from '../../src/linalg/hermitianEigen.js';
import { maxDiff, mulberry32, randomKraus, randomUnitary, ROUND_TRIP } from './helpers.js';

/** Minimal Kraus count of a map given by its Choi matrix only (forces the eigen-decomposition route). */
function countViaChoi(c: Channel): number {
  return Channel.fromChoi(c.choi()).minimalKraus().length;
}

describe('minimal Kraus counts = Choi rank (N&C §8.2.4, Theorem 8.2, from memory)', () => {
  it('unitary: 1', () => {
    const u = randomUnitary(mulberry32(1), 4);
    expect(countViaChoi(unitaryChannel(u))).toBe(1);
  });

  it('amplitude damping (0 < γ < 1): 2; phase damping (0 < λ < 1): 2', () => {
    expect(countViaChoi(amplitudeDampingChannel(0.3))).toBe(2);
    expect(countViaChoi(phaseDampingChannel(0.2))).toBe(2);
  });

  it('depolarizing with 0 < p < 1: 4 on one qubit, 16 on two (degenerate Choi spectrum)', () => {
    expect(countViaChoi(depolarizingChannel(1, 0.1))).toBe(4);
    expect(countViaChoi(depolarizingChannel(2, 0.1))).toBe(16);
    expect(countViaChoi(depolarizingChannel(1, 0))).toBe(1);
  });

  it('a redundant Kraus set (parallel and split operators) reduces to its rank', () => {
    const ad = amplitudeDampingChannel(0.4).kraus();
    // K0/√2 twice and K1: same map, 3 operators, rank 2
    const redundant = [scale(ad[0]!, Math.SQRT1_2), scale(ad[0]!, Math.SQRT1_2), ad[1]!];
    const c = Channel.fromKraus(redundant);
    expect(c.minimalKraus().length).toBe(2);
    expect(maxDiff(Channel.fromKraus(c.minimalKraus()).choi(), c.choi())).toBeLessThan(ROUND_TRIP);
  });

  it('minimal Kraus operators are Hilbert–Schmidt orthogonal and reproduce the channel (random 2-qubit channels)', () => {
    const rng = mulberry32(5);
    for (let t = 0; t < 3; t++) {
      const c = Channel.fromChoi(Channel.fromKraus(randomKraus(rng, 4, 5)).choi());
      const ks = c.minimalKraus();
      expect(ks.length).toBe(5);
      for (let a = 0; a < ks.length; a++) {
        for (let b = a + 1; b < ks.length; b++) {
          const g = mul(adjoint(ks[a]!), ks[b]!);
          let re = 0;
          let im = 0;
          for (let i = 0; i < 4; i++) {
            re += g.data[2 * (i * 4 + i)]!;
            im += g.data[2 * (i * 4 + i) + 1]!;
          }
          expect(Math.hypot(re, im)).toBeLessThan(1e-12);
        }
      }
      let sum: CMatrix = scale(identity(4), 0);
      for (const k of ks) sum = add(sum, mul(adjoint(k), k));
      expect(maxDiff(sum, identity(4))).toBeLessThan(ROUND_TRIP);
    }
  });

  it('thermal relaxation at zero temperature with T2 < 2T1 has Kraus rank 3 (amplitude and extra phase damping)', () => {
    // Derived from the Kraus forms of src/noise/channels.ts: with pe = 0 the channel is phase damping
    // {B0, B1} after amplitude damping {A0, A1}; B1·A1 = diag(0, √λ)·[[0, √γ], [0, 0]] = 0 and the other
    // three products (two independent diagonals and one upper off-diagonal) are linearly independent.
    const c = thermalRelaxationChannel({ t1: 50_000, t2: 30_000, excited: 0, time: 200 });
    expect(countViaChoi(c)).toBe(3);
  });

  it('a map that is not completely positive has no Kraus form', () => {
    const swap = Channel.fromChoi({
      rows: 4,
      cols: 4,
      data: Float64Array.from([1, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 1, 0, 0, 0, 0, 0, 1, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 1, 0]),
    });
    expect(() => swap.minimalKraus()).toThrow(NotCompletelyPositiveError);
  });
});

describe('Stinespring isometry V = Σ K_k ⊗ |k⟩ (N&C §8.2.3, from memory)', () => {
  it('V†V = I (trace preservation) while VV† ≠ I (V is not unitary when r > 1)', () => {
    for (const c of [amplitudeDampingChannel(0.25), depolarizingChannel(2, 0.3)]) {
      const v = c.stinespring();
      expect(v.rows).toBe(c.dim * c.minimalKraus().length);
      expect(maxDiff(mul(adjoint(v), v), identity(c.dim))).toBeLessThan(ROUND_TRIP);
      expect(maxDiff(mul(v, adjoint(v)), identity(v.rows))).toBeGreaterThan(0.1);
    }
  });
});

describe('Hermitian eigen-decomposition through the real symmetric embedding', () => {
  it('H q = λ q with orthonormal q for random Hermitian matrices, including a degenerate spectrum', () => {
    const rng = mulberry32(9);
    const mats: CMatrix[] = [];
    for (const n of [2, 5, 16]) {
      const g = randomKraus(rng, n, 1)[0]!; // any matrix; H = G + G†
      mats.push(add(g, adjoint(g)));
    }
    mats.push(depolarizingChannel(2, 0.3).choi()); // eigenvalue p/4·… with multiplicity 15
    for (const h of mats) {
      const { values, vectors } = hermitianEigen(h);
      const n = h.rows;
      expect(maxDiff(mul(adjoint(vectors), vectors), identity(n))).toBeLessThan(1e-12);
      const hv = mul(h, vectors);
      for (let k = 0; k < n; k++) {
        for (let r = 0; r < n; r++) {
          const er = hv.data[2 * (r * n + k)]! - values[k]! * vectors.data[2 * (r * n + k)]!;
          const ei = hv.data[2 * (r * n + k) + 1]! - values[k]! * vectors.data[2 * (r * n + k) + 1]!;
          expect(Math.hypot(er, ei)).toBeLessThan(1e-12);
        }
        if (k > 0) expect(values[k]!).toBeLessThanOrEqual(values[k - 1]!);
      }
    }
  });
});
