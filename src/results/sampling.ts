/**
 * Finite-shot outcome counts drawn from an outcome distribution with the seeded generator of
 * ./random.ts, so that a given (distribution, shots, seed) gives the same counts everywhere.
 */
import { bitstring } from '../engine/layout.js';
import { createRandom } from './random.js';

/**
 * Counts of `shots` independent draws from the distribution `p` over m measured qubits
 * (outcome index k, first measured qubit most significant), as bitstring → count with only
 * nonzero counts. Each draw takes one 53-bit double u ∈ [0, 1) and picks the first outcome,
 * in ascending index order, whose cumulative probability exceeds u · Σp (binary search).
 * Negative rounding entries of p count as 0; p need not be normalised exactly.
 */
export function sampleCounts(p: Float64Array, m: number, shots: number, seed: number): Record<string, number> {
  const size = 1 << m;
  if (!Number.isInteger(m) || m < 0 || p.length !== size) {
    throw new RangeError(`sampleCounts: ${p.length} probabilities for ${m} measured qubits`);
  }
  if (!Number.isSafeInteger(shots) || shots < 0) throw new RangeError(`sampleCounts: shots must be a non-negative integer, got ${shots}`);
  const cumulative = new Float64Array(size);
  let total = 0;
  let last = -1;
  for (let k = 0; k < size; k++) {
    const v = p[k]!;
    if (v > 0) {
      total += v;
      last = k;
    }
    cumulative[k] = total;
  }
  const out: Record<string, number> = {};
  if (shots === 0) return out;
  if (!(total > 0) || !Number.isFinite(total)) throw new RangeError('sampleCounts: the distribution has no positive finite weight');
  const counts = new Float64Array(size);
  const rng = createRandom(seed);
  for (let s = 0; s < shots; s++) {
    const x = rng.nextDouble() * total;
    let lo = 0;
    let hi = last; // cumulative[last] = total > x except for rounding; clamp there.
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (cumulative[mid]! > x) hi = mid;
      else lo = mid + 1;
    }
    counts[lo]++;
  }
  for (let k = 0; k < size; k++) {
    if (counts[k]! > 0) out[m === 0 ? '' : bitstring(k, m)] = counts[k]!;
  }
  return out;
}
