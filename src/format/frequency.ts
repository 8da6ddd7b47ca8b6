/**
 * Frequencies in input files: a number with a unit, always in hertz inside fray. Units: Hz,
 * kHz, MHz, GHz. Either sign is allowed (a detuning or a ZZ strength may be negative). A bare
 * number is refused, because `detuning: 20` could mean hertz or kilohertz.
 */
import { NUMBER_SOURCE, PLAIN_NUMBER_RE } from './numberSyntax.js';

/** Hertz per unit. */
export const FREQUENCY_UNITS: Readonly<Record<string, number>> = {
  Hz: 1,
  kHz: 1e3,
  MHz: 1e6,
  GHz: 1e9,
};

/** A frequency as written: a signed number, optional spaces, a unit of FREQUENCY_UNITS (the JSON Schemas use this pattern too). */
export const FREQUENCY_PATTERN = `^\\s*(${NUMBER_SOURCE})\\s*(Hz|kHz|MHz|GHz)\\s*$`;
const FREQUENCY_RE = new RegExp(FREQUENCY_PATTERN);
/** A number followed by some word: tells a wrongly cased unit from something else. */
const NUMBER_THEN_WORD_RE = new RegExp(`^\\s*${NUMBER_SOURCE}\\s*([A-Za-z]+)\\s*$`);

/** Parses '80kHz', '-1.5MHz', '20 Hz' into hertz, or returns an error message. */
export function parseFrequency(text: string): { hz: number } | { error: string } {
  const m = FREQUENCY_RE.exec(text);
  if (m === null) {
    if (PLAIN_NUMBER_RE.test(text)) {
      return { error: `frequency '${text}' has no unit; write it with Hz, kHz, MHz or GHz, e.g. '${text.trim()}kHz'` };
    }
    const unit = NUMBER_THEN_WORD_RE.exec(text)?.[1];
    if (unit !== undefined && Object.keys(FREQUENCY_UNITS).some((u) => u.toLowerCase() === unit.toLowerCase())) {
      const right = Object.keys(FREQUENCY_UNITS).find((u) => u.toLowerCase() === unit.toLowerCase())!;
      return { error: `frequency '${text}': the unit is written '${right}' (units are case-sensitive: Hz, kHz, MHz, GHz)` };
    }
    return { error: `'${text}' is not a frequency; expected a number with a unit Hz, kHz, MHz or GHz, e.g. 80kHz or -1.5MHz` };
  }
  const value = Number(m[1]) * FREQUENCY_UNITS[m[2]!]!;
  if (!Number.isFinite(value)) return { error: `frequency '${text}' is not finite` };
  return { hz: value };
}

/** Formats hertz for people: 80 kHz, −1.5 MHz. */
export function formatFrequency(hz: number): string {
  const a = Math.abs(hz);
  const [v, u] = a === 0 ? [0, 'Hz'] : a < 1e3 ? [hz, 'Hz'] : a < 1e6 ? [hz / 1e3, 'kHz'] : a < 1e9 ? [hz / 1e6, 'MHz'] : [hz / 1e9, 'GHz'];
  return `${String(Number(v.toPrecision(6)))} ${u}`;
}
