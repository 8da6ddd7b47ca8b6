/**
 * An angle (radians) as text for a written circuit: a simple multiple of π when it is one
 * to the last bit (`pi/2`, `-3*pi/4`), otherwise the shortest decimal that reads back as
 * the same double. Both fray's expressions and OpenQASM read the result.
 */

/** Denominators tried for a multiple of π. */
const PI_DENOMINATORS = [1, 2, 3, 4, 6, 8, 16];

/** The angle as text, exact when read back (to the last bit for decimals, to one rounding for π multiples). */
export function angleText(x: number): string {
  if (x === 0) return '0';
  for (const d of PI_DENOMINATORS) {
    const k = Math.round((x * d) / Math.PI);
    if (k !== 0 && Math.abs(k) <= 64 && (k * Math.PI) / d === x) {
      const sign = k < 0 ? '-' : '';
      const a = Math.abs(k);
      return `${sign}${a === 1 ? '' : `${a}*`}pi${d === 1 ? '' : `/${d}`}`;
    }
  }
  return String(x);
}
