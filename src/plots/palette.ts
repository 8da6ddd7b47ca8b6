import { OKABE_ITO } from './theme.js';

/**
 * The roles of the run report's colours. Hues are the Okabe–Ito colours of theme.ts
 * (M. Okabe and K. Ito, "Color Universal Design", 2008), chosen so neighbours also differ in
 * lightness and stay apart in grey print; every mark also carries a text label or a shape
 * (hollow vs filled bars, thin idle bands vs full boxes), so no meaning rests on colour alone.
 */

/** Ink for text and outlines. */
export const INK = '#1b1b1b';

/** Faint rules and grid lines. */
export const RULE = '#b9b4aa';

/** Fill of a scheduled operation by kind (timeline boxes). */
export const OPERATION_FILL = {
  'gate, 1 qubit': OKABE_ITO.skyBlue,
  'gate, 2+ qubits': OKABE_ITO.blue,
  measure: OKABE_ITO.vermillion,
  reset: OKABE_ITO.green,
  'noise step': OKABE_ITO.purple,
} as const;

/** A kind of timeline box (a key of OPERATION_FILL). */
export type OperationKind = keyof typeof OPERATION_FILL;

/** Text colour that reads on each operation fill (dark fills take white text). */
export const OPERATION_TEXT: Readonly<Record<OperationKind, string>> = {
  'gate, 1 qubit': INK,
  'gate, 2+ qubits': '#ffffff',
  measure: '#ffffff',
  reset: '#ffffff',
  'noise step': INK,
};

/** Idle windows: a light-to-dark ramp by cost (lightness alone carries the order, so grey print keeps it). */
export const IDLE_RAMP = ['#fbf1d6', '#e8a33d', '#8a3b12'] as const;

/**
 * The series of a comparison chart: ideal runs are drawn hollow (white fill, ink outline),
 * noisy ones filled light, measured ones filled dark — three steps of lightness; mitigated
 * ones (fray mitigate's page) black, the darkest step.
 */
export const SERIES_FILL = { ideal: '#ffffff', noisy: OKABE_ITO.skyBlue, measured: OKABE_ITO.blue, mitigated: OKABE_ITO.black } as const;

/** A series of a comparison chart (a key of SERIES_FILL). */
export type Series = keyof typeof SERIES_FILL;

/** Font stack of the pictures (the page uses the same). */
export const FONT = 'Helvetica, Arial, sans-serif';
