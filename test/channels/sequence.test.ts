import { describe, expect, it } from 'vitest';
import { Channel } from '../../src/channels/channel.js';
import { amplitudeDampingChannel, bitFlipChannel, depolarizingChannel } from '../../src/channels/builtins.js';
import { sequence } from '../../src/channels/sequence.js';
import { composeKraus } from '../../src/noise/fidelity.js';
import { maxDiff, mulberry32, randomKraus, ROUND_TRIP } from './helpers.js';

describe('sequence (first listed acts first)', () => {
  it('amplitude damping γ1 then γ2 is amplitude damping 1 − (1−γ1)(1−γ2) (N&C §8.3.5: √(1−γ) factors multiply, derived)', () => {
    const c = sequence([amplitudeDampingChannel(0.2), amplitudeDampingChannel(0.3)]);
    expect(maxDiff(c.choi(), amplitudeDampingChannel(1 - 0.8 * 0.7).choi())).toBeLessThan(ROUND_TRIP);
  });

  it('agrees with the Kraus composition {B_j A_i} of src/noise/fidelity.ts, and the order matters', () => {
    const rng = mulberry32(51);
    const a = randomKraus(rng, 2, 2);
    const b = randomKraus(rng, 2, 3);
    const c = sequence([Channel.fromKraus(a), Channel.fromKraus(b)]);
    expect(maxDiff(c.choi(), Channel.fromKraus(composeKraus(b, a)).choi())).toBeLessThan(ROUND_TRIP);
    const rev = sequence([Channel.fromKraus(b), Channel.fromKraus(a)]);
    expect(maxDiff(rev.choi(), c.choi())).toBeGreaterThan(1e-3);
  });

  it('refuses channels on different numbers of qubits', () => {
    expect(() => sequence([bitFlipChannel(0.1), depolarizingChannel(2, 0.1)])).toThrow(/qubits/);
  });
});

