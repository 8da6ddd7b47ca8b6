/**
 * Binomial random variates from the seeded generator of ./random.ts, in O(1) expected uniform
 * draws for any number of trials up to 2^53, with only IEEE 754 basic operations and
 * portableLog (./portableLog.ts), so the same seed gives the same variates on every machine.
 *
 * Method (L. Devroye, "Non-Uniform Random Variate Generation", Springer 1986, ch. X; W. Hörmann,
 * "The generation of binomial random variates", J. Statist. Comput. Simul. 46, 101–110 (1993),
 * algorithm BTRS; both from memory): with p ≤ ½ (else n − Binomial(n, 1 − p)),
 *  - n·p < BTRS_MIN_MEAN: the number of geometric waiting times ⌈ln U / ln(1 − p)⌉ that fit
 *    into n trials (about n·p + 1 uniforms);
 *  - otherwise transformed rejection with squeeze (BTRS): k = ⌊(2a/u_s + b)·u + c⌋ from two
 *    uniforms, accepted at once inside the squeeze, else against the log-pmf ratio written with
 *    Stirling tails (exact factorial logarithms for k ≤ 9).
 */
import { portableLog } from './portableLog.js';
import type { SeededRandom } from './random.js';

/** Below this mean n·p (p ≤ ½) the waiting-time method is used (Hörmann's threshold for BTRS). */
export const BTRS_MIN_MEAN = 10;

/** ½·ln(2π). */
const HALF_LN_2PI = 0.5 * portableLog(2 * Math.PI);

/**
 * Stirling tails fc(k) = ln k! − (½ ln 2π + (k + ½) ln(k + 1) − (k + 1)) for k = 0 … 9, from the
 * exact factorials (k! < 2^53).
 */
const STIRLING_TAIL: readonly number[] = (() => {
  const out: number[] = [];
  let factorial = 1;
  for (let k = 0; k <= 9; k++) {
    if (k > 0) factorial *= k;
    out.push(portableLog(factorial) - (HALF_LN_2PI + (k + 0.5) * portableLog(k + 1) - (k + 1)));
  }
  return out;
})();

/** fc(k): the table above, else the asymptotic series 1/(12(k+1)) − 1/(360(k+1)³) + 1/(1260(k+1)⁵). */
function stirlingTail(k: number): number {
  if (k <= 9) return STIRLING_TAIL[k]!;
  const k1 = k + 1;
  const k1sq = k1 * k1;
  return (1 / 12 - (1 / 360 - 1 / 1260 / k1sq) / k1sq) / k1;
}

/** Number of successes in n independent trials of probability p (n a whole number ≤ 2^53, p ∈ [0, 1]). */
export function sampleBinomial(rng: SeededRandom, n: number, p: number): number {
  if (!Number.isInteger(n) || n < 0 || n > 2 ** 53) throw new RangeError(`sampleBinomial: n must be a whole number ≤ 2^53, got ${n}`);
  if (!(p >= 0 && p <= 1)) throw new RangeError(`sampleBinomial: p must lie in [0, 1], got ${p}`);
  if (n === 0 || p === 0) return 0;
  if (p === 1) return n;
  if (p > 0.5) return n - sampleBinomial(rng, n, 1 - p);
  return n * p < BTRS_MIN_MEAN ? waitingTimes(rng, n, p) : btrs(rng, n, p);
}

/** Successes counted as geometric waiting times that fit into n trials (p ≤ ½, n·p small). */
function waitingTimes(rng: SeededRandom, n: number, p: number): number {
  const lnQ = portableLog(1 - p);
  let used = 0;
  let successes = 0;
  for (;;) {
    // 1 − U ∈ (0, 1]: ln(1 − U) ≤ 0, and −Infinity never occurs
    used += Math.max(1, Math.ceil(portableLog(1 - rng.nextDouble()) / lnQ));
    if (used > n) return successes;
    successes++;
  }
}

/** BTRS (transformed rejection with squeeze), p ≤ ½ and n·p ≥ BTRS_MIN_MEAN. */
function btrs(rng: SeededRandom, n: number, p: number): number {
  const q = 1 - p;
  const spq = Math.sqrt(n * p * q);
  const b = 1.15 + 2.53 * spq;
  const a = -0.0873 + 0.0248 * b + 0.01 * p;
  const c = n * p + 0.5;
  const vr = 0.92 - 4.2 / b;
  const r = p / q;
  const alpha = (2.83 + 5.1 / b) * spq;
  const m = Math.floor((n + 1) * p);
  for (;;) {
    const u = rng.nextDouble() - 0.5;
    let v = rng.nextDouble();
    const us = 0.5 - Math.abs(u);
    const k = Math.floor(((2 * a) / us + b) * u + c);
    if (k < 0 || k > n) continue;
    if (us >= 0.07 && v <= vr) return k;
    if (v === 0) continue;
    v = portableLog((v * alpha) / (a / (us * us) + b));
    const bound =
      (m + 0.5) * portableLog((m + 1) / (r * (n - m + 1))) +
      (n + 1) * portableLog((n - m + 1) / (n - k + 1)) +
      (k + 0.5) * portableLog((r * (n - k + 1)) / (k + 1)) +
      stirlingTail(m) +
      stirlingTail(n - m) -
      stirlingTail(k) -
      stirlingTail(n - k);
    if (v <= bound) return k;
  }
}
