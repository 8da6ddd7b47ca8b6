/**
 * Zero-noise extrapolation fits: given an expectation value measured at several noise
 * scales λ ≥ 1 (λ = 1 is the device as it is), estimate its value at λ = 0.
 *
 * - `linear`: least-squares line y = a + b·λ; the estimate is a.
 * - `richardson`: the polynomial of degree k − 1 through all k points (Richardson
 *   extrapolation, K. Temme, S. Bravyi, J. M. Gambetta, Phys. Rev. Lett. 119, 180509 (2017));
 *   the estimate is its value at 0 by Lagrange's formula, exact for data that is a
 *   polynomial of degree < k. It interpolates, so it has no standard error.
 * - `exponential`: y = A·e^{−c·λ}, fitted by least squares on ln|y| (all values of one
 *   sign, none zero); the estimate is A. Exact for data of that form (a gate-count power of
 *   a depolarizing factor, for example).
 *
 * Standard errors (where there are more points than parameters) are the ordinary
 * least-squares ones: σ̂² = RSS/(k − p), Cov = σ̂²·(XᵀX)⁻¹ (common practice); for the
 * exponential fit the error of ln A is carried to A by the delta method, se(A) = |A|·se(ln A).
 */
import { inverse, Matrix } from 'ml-matrix';

/** The extrapolation models of ZNE. */
export type FitKind = 'linear' | 'richardson' | 'exponential';

/** The fit kinds in the order help texts list them. */
export const FIT_KINDS: readonly FitKind[] = ['linear', 'richardson', 'exponential'];

/** One measured point: a noise scale λ (dimensionless, 1 = as is) and the value there. */
export interface ScalePoint {
  readonly scale: number;
  readonly value: number;
}

/** The zero-noise estimate, its least-squares standard error (null when the fit interpolates) and the model's coefficients. */
export interface Extrapolation {
  readonly fit: FitKind;
  readonly value: number;
  readonly stderr: number | null;
  /** linear: [a, b]; richardson: []; exponential: [A, c]. */
  readonly coefficients: readonly number[];
}

/** Why a fit cannot be made from these points (thrown as RangeError; callers validate first). */
export function fitProblem(points: readonly ScalePoint[], fit: FitKind): string | undefined {
  const scales = points.map((p) => p.scale);
  if (new Set(scales).size !== scales.length) return 'the noise scales must be distinct';
  if (points.length < 2) return `a ${fit} fit needs at least 2 noise scales`;
  if (fit === 'exponential') {
    const pos = points.every((p) => p.value > 0);
    const neg = points.every((p) => p.value < 0);
    if (!pos && !neg) return 'an exponential fit needs values of one sign, none zero';
  }
  return undefined;
}

/** Extrapolates `points` to zero noise with the model `fit` (see the module comment). */
export function extrapolate(points: readonly ScalePoint[], fit: FitKind): Extrapolation {
  const bad = fitProblem(points, fit);
  if (bad !== undefined) throw new RangeError(`extrapolate: ${bad}`);
  if (fit === 'richardson') return { fit, value: lagrangeAtZero(points), stderr: null, coefficients: [] };
  if (fit === 'linear') {
    const { beta, se } = leastSquaresLine(points.map((p) => p.scale), points.map((p) => p.value));
    return { fit, value: beta[0]!, stderr: se === null ? null : se[0]!, coefficients: beta };
  }
  const sign = points[0]!.value > 0 ? 1 : -1;
  const { beta, se } = leastSquaresLine(points.map((p) => p.scale), points.map((p) => Math.log(sign * p.value)));
  const a = sign * Math.exp(beta[0]!);
  return { fit, value: a, stderr: se === null ? null : Math.abs(a) * se[0]!, coefficients: [a, -beta[1]!] };
}

/** The value at λ = 0 of the polynomial through all points (Lagrange: Σ y_i Π_{j≠i} λ_j/(λ_j − λ_i)). */
function lagrangeAtZero(points: readonly ScalePoint[]): number {
  let sum = 0;
  for (let i = 0; i < points.length; i++) {
    let w = 1;
    for (let j = 0; j < points.length; j++) {
      if (j !== i) w *= points[j]!.scale / (points[j]!.scale - points[i]!.scale);
    }
    sum += w * points[i]!.value;
  }
  return sum;
}

/** Ordinary least squares y = β0 + β1·x with the coefficients' standard errors (null for 2 points). */
function leastSquaresLine(x: readonly number[], y: readonly number[]): { beta: number[]; se: number[] | null } {
  const k = x.length;
  const X = new Matrix(x.map((xi) => [1, xi]));
  const Y = Matrix.columnVector([...y]);
  const xtxInv = inverse(X.transpose().mmul(X));
  const beta = xtxInv.mmul(X.transpose()).mmul(Y).getColumn(0);
  if (k <= 2) return { beta, se: null };
  let rss = 0;
  for (let i = 0; i < k; i++) {
    const r = y[i]! - (beta[0]! + beta[1]! * x[i]!);
    rss += r * r;
  }
  const s2 = rss / (k - 2);
  return { beta, se: [Math.sqrt(s2 * xtxInv.get(0, 0)), Math.sqrt(s2 * xtxInv.get(1, 1))] };
}
