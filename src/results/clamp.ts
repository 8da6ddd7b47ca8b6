/**
 * Reported figures and their ranges. Floating-point rounding can push a figure that is
 * mathematically in its range slightly out of it (a probability of −3.6e-15, a fidelity of
 * 1 + 4e-15). fray reports such a value as the range's end when the excess is at most
 * REPORT_ROUNDING_TOLERANCE, and only then: a larger excess is a real error and is reported
 * as computed, so it stays visible.
 */

/**
 * Largest excess over a figure's range that is treated as rounding (absolute). The engine
 * keeps the trace within ≈1e-13 on the registers it simulates (the issue-13 fuzzing measured
 * 8e-14); 1e-12 covers that with margin and is far below the 6 decimals the report prints.
 */
export const REPORT_ROUNDING_TOLERANCE = 1e-12;

/** `x` clamped into [lo, hi] when it lies outside by at most REPORT_ROUNDING_TOLERANCE; otherwise `x` unchanged. */
export function clampRounding(x: number, lo: number, hi: number): number {
  if (x < lo && x >= lo - REPORT_ROUNDING_TOLERANCE) return lo;
  if (x > hi && x <= hi + REPORT_ROUNDING_TOLERANCE) return hi;
  return x;
}

/** A probability, fidelity or distance in [0, 1], rounding excess clamped. */
export function clampUnit(x: number): number {
  return clampRounding(x, 0, 1);
}

/** An expectation value of a Pauli operator or a Bloch component in [−1, 1], rounding excess clamped. */
export function clampSigned(x: number): number {
  return clampRounding(x, -1, 1);
}

/** A Bloch vector (x, y, z), each component in [−1, 1] with rounding excess clamped. */
export function clampBloch(v: [number, number, number]): [number, number, number] {
  return [clampSigned(v[0]), clampSigned(v[1]), clampSigned(v[2])];
}
