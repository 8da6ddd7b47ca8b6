import { describe, expect, it } from 'vitest';
import { type CMatrix, adjoint, fromRows, kron, mul } from '../../src/linalg/cmatrix.js';
import { Channel } from '../../src/channels/channel.js';
import { amplitudeDampingChannel, bitFlipChannel, phaseDampingChannel, unitaryChannel } from '../../src/channels/builtins.js';
import { parallel } from '../../src/channels/parallel.js';
import { tensorKraus } from '../../src/noise/fidelity.js';
import { applyKraus, maxDiff, mulberry32, randomKraus, ROUND_TRIP } from './helpers.js';

describe('parallel (first listed on the leftmost qubits)', () => {
  it('agrees with the Kraus tensor product {A_i ⊗ B_j} for random channels (1+1 and 1+2 qubits)', () => {
    const rng = mulberry32(52);
    for (const [d1, d2] of [
      [2, 2],
      [2, 4],
      [4, 2],
    ] as const) {
      const a = randomKraus(rng, d1, 2);
      const b = randomKraus(rng, d2, 2);
      const c = parallel([Channel.fromKraus(a), Channel.fromKraus(b)]);
      expect(maxDiff(c.superoperator(), Channel.fromKraus(tensorKraus(a, b)).superoperator())).toBeLessThan(ROUND_TRIP);
    }
  });

  it('amplitude damping on qubit 0 beside the identity decays |10⟩ towards |00⟩ (register convention: qubit 0 leftmost)', () => {
    const c = parallel([amplitudeDampingChannel(0.25), Channel.identity(1)]);
    const rho = fromRows([
      [0, 0, 0, 0],
      [0, 0, 0, 0],
      [0, 0, 1, 0],
      [0, 0, 0, 0],
    ]);
    const out = applyKraus(c.minimalKraus(), rho);
    expect(out.data[0]!).toBeCloseTo(0.25, 12); // |00⟩
    expect(out.data[2 * 10]!).toBeCloseTo(0.75, 12); // |10⟩
  });

  it('three factors and the 3-qubit cap', () => {
    const c = parallel([phaseDampingChannel(0.1), bitFlipChannel(0.2), amplitudeDampingChannel(0.3)]);
    expect(c.qubits).toBe(3);
    expect(c.minimalKraus().length).toBe(8);
    expect(() => parallel([c, bitFlipChannel(0.1)])).toThrow(/at most 3/);
  });

  it('a unitary channel in parallel with itself is the unitary U ⊗ U', () => {
    const h = fromRows([
      [Math.SQRT1_2, Math.SQRT1_2],
      [Math.SQRT1_2, -Math.SQRT1_2],
    ]);
    const c = parallel([unitaryChannel(h), unitaryChannel(h)]);
    const u = c.unitary();
    expect(u).toBeDefined();
    const hh: CMatrix = kron(h, h);
    // equal up to a global phase: |Tr(U† (H⊗H))| = 4
    const g = mul(adjoint(u!), hh);
    let re = 0;
    let im = 0;
    for (let i = 0; i < 4; i++) {
      re += g.data[2 * (i * 4 + i)]!;
      im += g.data[2 * (i * 4 + i) + 1]!;
    }
    expect(Math.hypot(re, im)).toBeCloseTo(4, 12);
  });
});
