import { describe, expect, it } from 'vitest';
import { type CMatrix, adjoint, fromRows, mul } from '../../src/linalg/cmatrix.js';
import { Channel } from '../../src/channels/channel.js';
import { amplitudeDampingChannel, depolarizingChannel, pauliChannel, unitaryChannel } from '../../src/channels/builtins.js';
import {
  averageGateFidelity,
  channelMetrics,
  choiStateFidelity,
  pauliErrorProbabilities,
  processFidelityToUnitary,
  unitarity,
} from '../../src/channels/metrics.js';
import { sequence } from '../../src/channels/sequence.js';
import { entanglementFidelity } from '../../src/noise/fidelity.js';
import { applyKraus, mulberry32, randomKraus, randomUnitary } from './helpers.js';

const R = Math.SQRT1_2;
/** The six Pauli eigenstates |0⟩, |1⟩, |±⟩, |±i⟩: a state 2-design on one qubit (common practice). */
const SIX: CMatrix[] = [
  fromRows([[1], [0]]),
  fromRows([[0], [1]]),
  fromRows([[R], [R]]),
  fromRows([[R], [-R]]),
  fromRows([[R], [[0, R]]]),
  fromRows([[R], [[0, -R]]]),
];

/** Exact average over the six states of ⟨ψ|U† E(ψ) U|ψ⟩. */
function designAverage(kraus: readonly CMatrix[], u: CMatrix): number {
  let s = 0;
  for (const psi of SIX) {
    const out = applyKraus(kraus, mul(psi, adjoint(psi)));
    const upsi = mul(u, psi);
    s += mul(adjoint(upsi), mul(out, upsi)).data[0]!;
  }
  return s / SIX.length;
}

describe('average gate fidelity (M. A. Nielsen, Phys. Lett. A 303, 249 (2002))', () => {
  it("Nielsen's formula (d·F_pro + 1)/(d + 1) equals the exact average over the six Pauli eigenstates (random channels, random targets)", () => {
    const rng = mulberry32(31);
    for (let t = 0; t < 8; t++) {
      const kraus = randomKraus(rng, 2, 1 + (t % 4));
      const u = t % 2 === 0 ? randomUnitary(rng, 2) : fromRows([[1, 0], [0, 1]]);
      expect(averageGateFidelity(Channel.fromKraus(kraus), u)).toBeCloseTo(designAverage(kraus, u), 12);
    }
  });

  it('depolarizing gives 1 − p(d−1)/d (Nielsen 2002 with F_pro = 1 − p + p/d², derived)', () => {
    for (const [k, p] of [
      [1, 0.1],
      [2, 0.05],
      [3, 0.2],
    ] as const) {
      const d = 1 << k;
      expect(averageGateFidelity(depolarizingChannel(k, p))).toBeCloseTo(1 - (p * (d - 1)) / d, 12);
    }
  });

  it('process fidelity to a unitary equals Σ|Tr(U†K)|²/d² of src/noise/fidelity.ts, and the Choi-state fidelity (Gilchrist et al. 2005)', () => {
    const rng = mulberry32(32);
    const kraus = randomKraus(rng, 4, 3);
    const u = randomUnitary(rng, 4);
    const e = Channel.fromKraus(kraus);
    expect(processFidelityToUnitary(e, u)).toBeCloseTo(entanglementFidelity(kraus, u), 12);
    expect(choiStateFidelity(e, Channel.fromUnitary(u))).toBeCloseTo(entanglementFidelity(kraus, u), 10);
  });
});

describe('unitarity (J. Wallman, C. Granade, R. Harper, S. T. Flammia, New J. Phys. 17, 113020 (2015))', () => {
  it('depolarizing: (1 − p)²', () => {
    for (const [k, p] of [
      [1, 0.1],
      [2, 0.3],
    ] as const) {
      expect(unitarity(depolarizingChannel(k, p))).toBeCloseTo((1 - p) ** 2, 12);
    }
  });

  it('any unitary: 1 (random 1-, 2- and 3-qubit unitaries)', () => {
    const rng = mulberry32(33);
    for (const d of [2, 4, 8]) expect(unitarity(unitaryChannel(randomUnitary(rng, d)))).toBeCloseTo(1, 12);
  });

  it('is unchanged by a unitary after the channel (Wallman et al. 2015: unitarity is invariant under unitaries)', () => {
    const rng = mulberry32(34);
    const e = Channel.fromKraus(randomKraus(rng, 2, 2));
    const ue = sequence([e, unitaryChannel(randomUnitary(rng, 2))]);
    expect(unitarity(ue)).toBeCloseTo(unitarity(e), 12);
  });
});

describe('Pauli-twirled error probabilities', () => {
  it('depolarizing: p_I = 1 − p + p/d², every other Pauli p/d² (the mixed-unitary form of src/noise/channels.ts)', () => {
    const p = 0.2;
    const probs = pauliErrorProbabilities(depolarizingChannel(2, p));
    expect(probs.length).toBe(16);
    for (const e of probs) expect(e.probability).toBeCloseTo(e.label === 'II' ? 1 - p + p / 16 : p / 16, 12);
  });

  it('a Pauli channel after a gate U, measured against U, gives back (1 − x − y − z, x, y, z)', () => {
    const rng = mulberry32(35);
    const u = randomUnitary(rng, 2);
    const e = sequence([pauliChannel(0.01, 0.02, 0.03), unitaryChannel(u)]); // U ∘ N: Λ = U†∘U∘N = N
    const probs = pauliErrorProbabilities(e, u).map((x) => x.probability);
    [0.94, 0.01, 0.02, 0.03].forEach((want, i) => expect(probs[i]!).toBeCloseTo(want, 12));
  });

  it('sum to 1 for a trace-preserving channel and are ≥ 0 for a CP one', () => {
    const probs = pauliErrorProbabilities(amplitudeDampingChannel(0.3));
    expect(probs.reduce((s, x) => s + x.probability, 0)).toBeCloseTo(1, 12);
    for (const x of probs) expect(x.probability).toBeGreaterThanOrEqual(-1e-15);
  });
});

describe('channelMetrics', () => {
  it('against a non-unitary channel: Choi-state fidelity, no average gate fidelity or Pauli errors', () => {
    const m = channelMetrics(amplitudeDampingChannel(0.1), { label: 'dep', channel: depolarizingChannel(1, 0.1) });
    expect(m.processFidelityDefinition).toBe('choi-states');
    expect(m.averageGateFidelity).toBeNull();
    expect(m.pauliErrors).toBeNull();
    expect(m.processFidelity).toBeGreaterThan(0.9);
    expect(m.processFidelity).toBeLessThan(1);
  });

  it('a channel against itself: fidelity 1, diamond distance 0', () => {
    const e = depolarizingChannel(1, 0.1);
    const m = channelMetrics(e, { label: 'self', channel: e });
    expect(m.processFidelity).toBeCloseTo(1, 10);
    expect(m.diamond.exact).toBe(true);
    expect(m.diamond.value!).toBeCloseTo(0, 12);
  });
});
