/**
 * Whole numbers on the command line in every notation JSON or YAML 1.2 reads as an integer
 * value: decimal (`1000000`, `+1000`), with a fraction or exponent that still makes a whole
 * number (`1e6`, `1.5e3`, `2.0`, `1E+06`), hexadecimal (`0x3e8`) and octal (`0o1750`). The
 * value is read exactly (BigInt), so nothing is rounded into range.
 */

const DECIMAL = /^\+?(\d*)(?:\.(\d*))?(?:[eE]([+-]?\d+))?$/;
const HEX = /^\+?0x([0-9a-fA-F]+)$/;
const OCTAL = /^\+?0o([0-7]+)$/;
/** Exponents beyond this make a number far beyond any count fray accepts (and would be slow to expand). */
const MAX_EXPONENT = 400;

/** The exact value of `text` when it is a whole number in one of the notations above, else undefined. */
export function parseWholeNumber(text: string): bigint | undefined {
  const t = text.trim();
  const hex = HEX.exec(t);
  if (hex) return BigInt(`0x${hex[1]!}`);
  const oct = OCTAL.exec(t);
  if (oct) return BigInt(`0o${oct[1]!}`);
  const dec = DECIMAL.exec(t);
  if (!dec) return undefined;
  const whole = dec[1] ?? '';
  const frac = dec[2] ?? '';
  if (whole === '' && frac === '') return undefined;
  const exponent = dec[3] !== undefined ? Number(dec[3]) : 0;
  if (Math.abs(exponent) > MAX_EXPONENT) return undefined;
  const digits = BigInt((whole + frac).replace(/^0+(?=\d)/, '') || '0');
  const scale = exponent - frac.length;
  if (scale >= 0) return digits * 10n ** BigInt(scale);
  const div = 10n ** BigInt(-scale);
  return digits % div === 0n ? digits / div : undefined;
}
