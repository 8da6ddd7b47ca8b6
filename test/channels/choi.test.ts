import { describe, expect, it } from 'vitest';
import { type CMatrix, add, adjoint, fromRows, identity, mul, scale, transpose } from '../../src/linalg/cmatrix.js';
import { krausToSuperoperator } from '../../src/linalg/superoperator.js';
import { choiToSuperoperator, krausToChoi, superoperatorToChoi, traceInput, traceOutput } from '../../src/channels/choi.js';
import { Channel } from '../../src/channels/channel.js';
import { checkPhysicality } from '../../src/channels/physicality.js';
import { hermitianEigenvalues } from '../../src/linalg/hermitianEigen.js';
import { amplitudeDampingChannel } from '../../src/channels/builtins.js';
import { applyKraus, choiOfMap, maxDiff, mulberry32, randomDensity, randomKraus, ROUND_TRIP } from './helpers.js';

const SWAP = fromRows([
  [1, 0, 0, 0],
  [0, 0, 1, 0],
  [0, 1, 0, 0],
  [0, 0, 0, 1],
]);

/** The transpose map X → Xᵀ on one qubit as a Choi matrix, built from the definition J = Σ |i⟩⟨j| ⊗ (|i⟩⟨j|)ᵀ. */
const TRANSPOSE_CHOI = choiOfMap(transpose, 2);

describe('Choi matrix convention (src/channels/conventions.ts)', () => {
  it('krausToChoi equals the definition Σ_ij |i⟩⟨j| ⊗ E(|i⟩⟨j|) for random channels (1 and 2 qubits)', () => {
    const rng = mulberry32(11);
    for (const d of [2, 4]) {
      const kraus = randomKraus(rng, d, 3);
      expect(maxDiff(krausToChoi(kraus), choiOfMap((x) => applyKraus(kraus, x), d))).toBeLessThan(ROUND_TRIP);
    }
  });

  it('Choi ↔ superoperator reshuffle agrees with the engine superoperator S = Σ conj(K) ⊗ K and is invertible', () => {
    const rng = mulberry32(12);
    for (const d of [2, 4, 8]) {
      const kraus = randomKraus(rng, d, 2);
      const s = krausToSuperoperator(kraus);
      expect(maxDiff(choiToSuperoperator(krausToChoi(kraus)), s)).toBeLessThan(ROUND_TRIP);
      expect(maxDiff(superoperatorToChoi(s), krausToChoi(kraus))).toBeLessThan(ROUND_TRIP);
    }
  });

  it('Tr J = d and Tr_out J = I for a trace-preserving channel; Tr_in J = E(I)', () => {
    const rng = mulberry32(13);
    const kraus = randomKraus(rng, 4, 5);
    const j = krausToChoi(kraus);
    let tr = 0;
    for (let i = 0; i < 16; i++) tr += j.data[2 * (i * 16 + i)]!;
    expect(tr).toBeCloseTo(4, 12);
    expect(maxDiff(traceOutput(j), identity(4))).toBeLessThan(ROUND_TRIP);
    expect(maxDiff(traceInput(j), applyKraus(kraus, identity(4)))).toBeLessThan(ROUND_TRIP);
  });
});

describe("Choi's theorem: CP iff the Choi matrix is PSD (M.-D. Choi, Linear Algebra Appl. 10, 285 (1975))", () => {
  it('the transpose map takes random density matrices to density matrices (it is positive)', () => {
    const rng = mulberry32(21);
    for (let t = 0; t < 50; t++) {
      const rho = randomDensity(rng, 2);
      const out = transpose(rho);
      const ev = hermitianEigenvalues(out);
      expect(ev[1]!).toBeGreaterThan(-1e-15);
      expect(out.data[0]! + out.data[6]!).toBeCloseTo(1, 14);
    }
  });

  it('its Choi matrix is the SWAP operator, with eigenvalue −1 (so it is not completely positive)', () => {
    expect(maxDiff(TRANSPOSE_CHOI, SWAP)).toBe(0);
    const ev = hermitianEigenvalues(TRANSPOSE_CHOI);
    expect(Array.from(ev).map((x) => Math.round(x * 1e12) / 1e12)).toEqual([1, 1, 1, -1]);
  });

  it('fray reports the transpose map as positive but not completely positive (and TP, unital)', () => {
    const p = checkPhysicality(Channel.fromChoi(TRANSPOSE_CHOI));
    expect(p.hermiticityPreserving.ok).toBe(true);
    expect(p.completelyPositive.ok).toBe(false);
    expect(p.completelyPositive.value).toBeCloseTo(-1, 12);
    expect(p.positive.status).toBe('positive');
    if (p.positive.status === 'positive') expect(Math.abs(p.positive.minOutputEigenvalue)).toBeLessThan(1e-12); // pure states stay pure
    expect(p.tracePreserving.ok).toBe(true);
    expect(p.unital.ok).toBe(true);
    expect(p.cptp).toBe(false);
  });

  it('Peres: the partial transpose of the Bell projector |Φ+⟩⟨Φ+| is SWAP/2 (A. Peres, PRL 77, 1413 (1996))', () => {
    // |Φ+⟩⟨Φ+| = J(id)/2; transposing the second factor gives (id ⊗ T)(|Φ+⟩⟨Φ+|) = J(T)/2.
    const bell = scale(Channel.identity(1).choi(), 0.5);
    const pt = fromRows(
      Array.from({ length: 4 }, (_, r) =>
        Array.from({ length: 4 }, (_, c) => {
          const [i, a] = [r >> 1, r & 1];
          const [j, b] = [c >> 1, c & 1];
          const k = 2 * ((i * 2 + b) * 4 + (j * 2 + a)); // swap the second-factor indices
          return [bell.data[k]!, bell.data[k + 1]!] as [number, number];
        }),
      ),
    );
    expect(maxDiff(pt, scale(SWAP, 0.5))).toBeLessThan(1e-15);
    expect(hermitianEigenvalues(pt)[3]!).toBeCloseTo(-0.5, 14);
  });

  it('random CPTP channels have PSD Choi matrices and pass every check', () => {
    const rng = mulberry32(22);
    for (const d of [2, 4]) {
      const p = checkPhysicality(Channel.fromKraus(randomKraus(rng, d, 3)));
      expect(p.cptp).toBe(true);
      expect(p.completelyPositive.value).toBeGreaterThan(-1e-12);
      expect(p.positive.status).toBe('implied-by-cp');
    }
  });
});

describe('trace preservation iff Tr_out J = I (Nielsen & Chuang §8.2.3 Σ K†K = I, with Tr_out J = (Σ K†K)ᵀ, derived)', () => {
  it('a Kraus set scaled by c has ‖Tr_out J − I‖ = |c² − 1| and fails; unscaled passes', () => {
    const base = amplitudeDampingChannel(0.3).kraus();
    for (const c of [0.9, 1.05]) {
      const scaled: CMatrix[] = base.map((k) => scale(k, c));
      const p = checkPhysicality(Channel.fromKraus(scaled));
      expect(p.tracePreserving.ok).toBe(false);
      expect(p.tracePreserving.value).toBeCloseTo(Math.abs(c * c - 1), 12);
      expect(p.completelyPositive.ok).toBe(true);
    }
    expect(checkPhysicality(Channel.fromKraus(base)).tracePreserving.value).toBeLessThan(1e-15);
  });

  it('Tr_out J equals (Σ K†K)ᵀ for a non-trace-preserving set', () => {
    const rng = mulberry32(23);
    const kraus = randomKraus(rng, 2, 2).map((k, i) => scale(k, 1 + 0.1 * i));
    const s = add(mul(adjoint(kraus[0]!), kraus[0]!), mul(adjoint(kraus[1]!), kraus[1]!));
    expect(maxDiff(traceOutput(krausToChoi(kraus)), transpose(s))).toBeLessThan(ROUND_TRIP);
  });
});
