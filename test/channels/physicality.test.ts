import { describe, expect, it } from 'vitest';
import { fromRows, transpose, zeros } from '../../src/linalg/cmatrix.js';
import { Channel } from '../../src/channels/channel.js';
import { checkPhysicality } from '../../src/channels/physicality.js';
import { amplitudeDampingChannel, depolarizingChannel } from '../../src/channels/builtins.js';
import { parallel } from '../../src/channels/parallel.js';
import { choiOfMap } from './helpers.js';

/** The partial transpose on the first qubit of two, X ↦ (T ⊗ id)(X), from its definition. */
function partialTransposeFirst(x: ReturnType<typeof zeros>) {
  const out = zeros(4, 4);
  for (let r = 0; r < 4; r++) {
    for (let c = 0; c < 4; c++) {
      const [i, a] = [r >> 1, r & 1];
      const [j, b] = [c >> 1, c & 1];
      const src = 2 * ((j * 2 + a) * 4 + (i * 2 + b));
      out.data[2 * (r * 4 + c)] = x.data[src]!;
      out.data[2 * (r * 4 + c) + 1] = x.data[src + 1]!;
    }
  }
  return out;
}

describe('positivity search (src/channels/positivity.ts)', () => {
  it('a Bloch-ball stretch R = diag(1, 1.2, 0, 0) is not positive: min output eigenvalue (1 − 1.2)/2 = −0.1 (derived: λ_min = (1 − |r|)/2)', () => {
    const p = checkPhysicality(Channel.fromPtm(fromRows([[1, 0, 0, 0], [0, 1.2, 0, 0], [0, 0, 0, 0], [0, 0, 0, 0]])));
    expect(p.hermiticityPreserving.ok).toBe(true);
    expect(p.tracePreserving.ok).toBe(true);
    expect(p.positive.status).toBe('not-positive');
    if (p.positive.status === 'not-positive') {
      expect(p.positive.minOutputEigenvalue).toBeCloseTo(-0.1, 10);
      // the witness is an eigenstate of X (|+⟩ or |−⟩): |ψ0|² = |ψ1|² = 1/2
      const w = p.positive.input;
      expect(w[0]! ** 2 + w[1]! ** 2).toBeCloseTo(0.5, 6);
    }
  });

  it('two qubits: the partial transpose T ⊗ id is not positive, min −1/2 at a Bell state (Peres 1996); the full transpose is positive', () => {
    const pt = checkPhysicality(Channel.fromChoi(choiOfMap(partialTransposeFirst, 4)));
    expect(pt.positive.status).toBe('not-positive');
    if (pt.positive.status === 'not-positive') expect(pt.positive.minOutputEigenvalue).toBeCloseTo(-0.5, 8);
    const full = checkPhysicality(Channel.fromChoi(choiOfMap(transpose, 4)));
    expect(full.completelyPositive.ok).toBe(false);
    expect(full.positive.status).toBe('positive');
  });

  it('a map that is not Hermiticity preserving is not tested for positivity', () => {
    const j = Channel.identity(1).choi();
    const skew = { rows: 4, cols: 4, data: Float64Array.from(j.data) };
    skew.data[2 * 1 + 1] = 0.3; // J[0][1] = 0.3i, J[1][0] = 0: J ≠ J†
    const p = checkPhysicality(Channel.fromChoi(skew));
    expect(p.hermiticityPreserving.ok).toBe(false);
    expect(p.hermiticityPreserving.value).toBeGreaterThan(0.29);
    expect(p.positive.status).toBe('not-tested');
    expect(p.cptp).toBe(false);
  });
});

describe('unital (E(I) = I) and the CPTP verdict', () => {
  it('amplitude damping is CPTP but not unital, with ‖E(I) − I‖ = γ (E(I) = diag(1 + γ, 1 − γ), N&C §8.3.5, derived)', () => {
    const p = checkPhysicality(amplitudeDampingChannel(0.3));
    expect(p.cptp).toBe(true);
    expect(p.unital.ok).toBe(false);
    expect(p.unital.value).toBeCloseTo(0.3, 12);
  });

  it('depolarizing (any k) is CPTP and unital; so is a tensor product of such channels', () => {
    for (const c of [depolarizingChannel(1, 0.2), depolarizingChannel(3, 0.05), parallel([depolarizingChannel(1, 0.1), depolarizingChannel(2, 0.3)])]) {
      const p = checkPhysicality(c);
      expect(p.cptp).toBe(true);
      expect(p.unital.ok).toBe(true);
    }
  });

  it('a map scaled up by 1.1 is CP but not TP: ‖Tr_out J − I‖ = 0.1', () => {
    const j = Channel.identity(1).choi();
    const scaled = { rows: 4, cols: 4, data: j.data.map((x) => 1.1 * x) };
    const p = checkPhysicality(Channel.fromChoi(scaled));
    expect(p.completelyPositive.ok).toBe(true);
    expect(p.tracePreserving.value).toBeCloseTo(0.1, 12);
    expect(p.cptp).toBe(false);
  });
});
