/**
 * Finite-shot outcome counts drawn from an outcome distribution with the seeded generator of
 * ./random.ts, so that a given (distribution, shots, seed) gives the same counts everywhere.
 */
import { bitstring } from '../engine/layout.js';
import { sampleBinomial } from './binomial.js';
import { createRandom } from './random.js';

/** Most shots a run may draw: 2^53, the largest whole number every count below stays exact at. */
export const MAX_SHOTS = 2 ** 53;

/**
 * Counts of `shots` independent draws from the distribution `p` over m measured qubits
 * (outcome index k, first measured qubit most significant), as bitstring → count with only
 * nonzero counts. The multinomial is drawn by successive binomials in ascending outcome order:
 * outcome k gets Binomial(N_k, p_k / P_k) of the N_k shots not yet assigned, P_k = Σ_{j ≥ k} p_j
 * (the last outcome of positive weight gets the rest), so the cost is O(number of outcomes),
 * not O(shots) (./binomial.ts). Negative rounding entries of p count as 0; p need not be
 * normalised exactly. `shots` is a whole number up to MAX_SHOTS.
 */
export function sampleCounts(p: Float64Array, m: number, shots: number, seed: number): Record<string, number> {
  const size = 1 << m;
  if (!Number.isInteger(m) || m < 0 || p.length !== size) {
    throw new RangeError(`sampleCounts: ${p.length} probabilities for ${m} measured qubits`);
  }
  if (!Number.isInteger(shots) || shots < 0 || shots > MAX_SHOTS) throw new RangeError(`sampleCounts: shots must be a whole number from 0 to 2^53, got ${shots}`);
  // suffix sums P_k of the positive weights (summed from the end, so no cancellation)
  const rest = new Float64Array(size + 1);
  let last = -1;
  for (let k = size - 1; k >= 0; k--) {
    const v = p[k]!;
    rest[k] = rest[k + 1]! + (v > 0 ? v : 0);
    if (v > 0 && last < 0) last = k;
  }
  const out: Record<string, number> = {};
  if (shots === 0) return out;
  const total = rest[0]!;
  if (!(total > 0) || !Number.isFinite(total)) throw new RangeError('sampleCounts: the distribution has no positive finite weight');
  const rng = createRandom(seed);
  let left = shots;
  for (let k = 0; k <= last && left > 0; k++) {
    const v = p[k]!;
    if (!(v > 0)) continue;
    const count = k === last ? left : sampleBinomial(rng, left, Math.min(1, v / rest[k]!));
    if (count > 0) out[m === 0 ? '' : bitstring(k, m)] = count;
    left -= count;
  }
  return out;
}
