import { describe, expect, it } from 'vitest';
import { sub } from '../../src/linalg/cmatrix.js';
import { Channel } from '../../src/channels/channel.js';
import { amplitudeDampingChannel, depolarizingChannel } from '../../src/channels/builtins.js';
import { nearestCptp } from '../../src/channels/nearestCptp.js';
import { checkPhysicality } from '../../src/channels/physicality.js';
import { frobeniusNorm } from '../../src/channels/norms.js';
import { mulberry32 } from './helpers.js';

/** A tomography-like fit: the true PTM plus small real noise outside the first row (so it stays TP). */
function noisyFit(truth: Channel, eps: number, seed: number): Channel {
  const rng = mulberry32(seed);
  const r = truth.ptm();
  const D = r.rows;
  const data = Float64Array.from(r.data);
  for (let i = 1; i < D; i++) for (let j = 0; j < D; j++) data[2 * (i * D + j)] += eps * (2 * rng() - 1);
  for (let i = 0; i < data.length; i += 2) data[i + 1] = 0;
  return Channel.fromPtm({ rows: D, cols: D, data });
}

describe("nearest CPTP channel (Dykstra's alternating projections, Boyle & Dykstra 1986, from memory)", () => {
  it('repairs slightly unphysical fits into CPTP channels no farther than the true channel (it is the nearest)', () => {
    for (const [truth, seed] of [
      [amplitudeDampingChannel(0.2), 61],
      [amplitudeDampingChannel(0.05), 62],
      [depolarizingChannel(2, 0.01), 63],
    ] as const) {
      const fit = noisyFit(truth, 0.02, seed);
      expect(checkPhysicality(fit).completelyPositive.ok).toBe(false);
      const r = nearestCptp(fit);
      expect(r.converged).toBe(true);
      const p = checkPhysicality(r.channel);
      expect(p.cptp).toBe(true);
      // the true channel is CPTP, so the Frobenius-nearest CPTP point is at least as close (common practice: projection property)
      expect(r.distance).toBeLessThanOrEqual(frobeniusNorm(sub(fit.choi(), truth.choi())) + 1e-9);
      expect(r.distance).toBeGreaterThan(0);
    }
  });

  it('leaves a CPTP channel where it is', () => {
    const c = amplitudeDampingChannel(0.3);
    const r = nearestCptp(c);
    expect(r.distance).toBeLessThan(1e-10);
    expect(r.iterations).toBeLessThanOrEqual(2);
  });
});
