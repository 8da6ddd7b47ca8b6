/**
 * The natural logarithm from IEEE 754 addition, subtraction, multiplication and division only,
 * so that it gives the same bits on every machine and every JavaScript engine (Math.log is
 * not specified to the last bit). Used by the shot sampler, whose counts must not depend on
 * the machine.
 *
 * Method: x = m·2^e with m ∈ [√2/2, √2) by exact scaling with powers of two; then
 * ln m = 2·atanh(s) = 2(s + s³/3 + s⁵/5 + …) with s = (m − 1)/(m + 1), |s| ≤ 0.1716, summed to
 * the term s^25/25 (the rest is below 1e-19 relative), and ln x = e·ln 2 + ln m.
 * Accuracy about 2e-16 relative (checked against Math.log in test/results/portableLog.test.ts).
 */

/** √2, the upper end of the reduced argument. */
const SQRT2 = 1.4142135623730951;
/** 2^64, the step of the coarse scaling. */
const TWO_POW_64 = 18446744073709551616;

/** Natural logarithm of x (x > 0 and finite; 0 gives −Infinity; otherwise NaN). */
export function portableLog(x: number): number {
  if (!(x > 0) || x === Infinity) return x === 0 ? -Infinity : NaN;
  let m = x;
  let e = 0;
  while (m >= TWO_POW_64) {
    m /= TWO_POW_64;
    e += 64;
  }
  while (m < 1 / TWO_POW_64) {
    m *= TWO_POW_64;
    e -= 64;
  }
  while (m >= SQRT2) {
    m /= 2;
    e += 1;
  }
  while (m < SQRT2 / 2) {
    m *= 2;
    e -= 1;
  }
  const s = (m - 1) / (m + 1);
  const s2 = s * s;
  // Horner form of 1 + s²/3 + s⁴/5 + … + s²⁴/25
  let t = 1 / 25;
  for (let k = 23; k >= 1; k -= 2) t = 1 / k + s2 * t;
  return e * Math.LN2 + 2 * s * t;
}
