/**
 * The minimal Kraus form of a completely positive map from the eigen-decomposition of its
 * Choi matrix: J = Σ_k λ_k z_k z_k† with λ_k > 0 gives K_k = √λ_k · unvec(z_k) (column-stacked
 * vec, ./conventions.ts), and the number of operators is the rank of J — no Kraus set of the
 * map is shorter (Nielsen & Chuang §8.2.4, Theorem 8.2 on the unitary freedom of Kraus
 * operators, from memory: every Kraus set spans the same space as these orthogonal ones).
 */
import { type CMatrix, adjoint, mul, trace } from '../linalg/cmatrix.js';
import { unvec } from './choi.js';
import type { HermitianEigen } from '../linalg/hermitianEigen.js';
import { antiHermitianDeviation } from './norms.js';
import { KRAUS_EIGENVALUE_TOLERANCE, KRAUS_ORTHOGONALITY_TOLERANCE, PHYSICALITY_TOLERANCE } from './tolerances.js';

/** Thrown when a Kraus or Stinespring form is asked of a map that is not completely positive. */
export class NotCompletelyPositiveError extends RangeError {
  constructor(
    message: string,
    /** Smallest eigenvalue of the Hermitian part of the Choi matrix. */
    readonly minEigenvalue: number,
  ) {
    super(message);
    this.name = 'NotCompletelyPositiveError';
  }
}

/** The same operator times the phase that makes its largest-magnitude entry (first in row-major order) real and positive. */
export function fixPhase(k: CMatrix): CMatrix {
  let best = 0;
  for (let i = 0; i < k.data.length; i += 2) best = Math.max(best, Math.hypot(k.data[i]!, k.data[i + 1]!));
  if (best === 0) return k;
  let pr = 1;
  let pi = 0;
  for (let i = 0; i < k.data.length; i += 2) {
    const m = Math.hypot(k.data[i]!, k.data[i + 1]!);
    if (m >= best * (1 - 1e-9)) {
      pr = k.data[i]! / m;
      pi = -k.data[i + 1]! / m;
      break;
    }
  }
  const data = new Float64Array(k.data.length);
  for (let i = 0; i < k.data.length; i += 2) {
    const xr = k.data[i]!;
    const xi = k.data[i + 1]!;
    data[i] = xr * pr - xi * pi;
    data[i + 1] = xr * pi + xi * pr;
  }
  return { rows: k.rows, cols: k.cols, data };
}

/**
 * Minimal Kraus operators from the Choi matrix `j` and its eigen-decomposition `eig`
 * (of the Hermitian part, descending): one operator √λ·unvec(z) per eigenvalue above
 * KRAUS_EIGENVALUE_TOLERANCE, largest first, each with its largest entry made real positive.
 * Throws NotCompletelyPositiveError when J is not Hermitian or has an eigenvalue below
 * −PHYSICALITY_TOLERANCE.
 */
export function choiToMinimalKraus(j: CMatrix, eig: HermitianEigen): CMatrix[] {
  const D = j.rows;
  const d = Math.round(Math.sqrt(D));
  const ah = antiHermitianDeviation(j);
  if (ah > PHYSICALITY_TOLERANCE) {
    throw new NotCompletelyPositiveError(`the Choi matrix is not Hermitian (largest |J − J†| entry ${ah.toExponential(2)}), so the map has no Kraus form`, NaN);
  }
  const min = eig.values[D - 1]!;
  if (min < -PHYSICALITY_TOLERANCE) {
    throw new NotCompletelyPositiveError(`the Choi matrix has the negative eigenvalue ${min.toExponential(3)}, so the map is not completely positive and has no Kraus form`, min);
  }
  const out: CMatrix[] = [];
  const V = eig.vectors.data;
  const z = new Float64Array(2 * D);
  for (let k = 0; k < D; k++) {
    const lambda = eig.values[k]!;
    if (!(lambda > KRAUS_EIGENVALUE_TOLERANCE)) break;
    for (let r = 0; r < D; r++) {
      z[2 * r] = V[2 * (r * D + k)]!;
      z[2 * r + 1] = V[2 * (r * D + k) + 1]!;
    }
    out.push(fixPhase(unvec(z, d, Math.sqrt(lambda))));
  }
  if (out.length === 0) throw new NotCompletelyPositiveError('the map is zero: its Choi matrix has no positive eigenvalue', min);
  return out;
}

/**
 * The given Kraus operators as a minimal set when they already are one: nonzero and mutually
 * orthogonal in the Hilbert–Schmidt product (then vec(K_k) are eigenvectors of J = Σ vec(K)vec(K)†
 * and the set is a Choi eigen-decomposition). Returned without the zero operators, ordered by
 * ‖K‖_F² descending; undefined when they are not orthogonal.
 */
export function orthogonalKraus(kraus: readonly CMatrix[]): CMatrix[] | undefined {
  const norms = kraus.map((k) => trace(mul(adjoint(k), k))[0]);
  const keep: number[] = [];
  norms.forEach((n, i) => {
    if (n > KRAUS_EIGENVALUE_TOLERANCE) keep.push(i);
  });
  for (let a = 0; a < keep.length; a++) {
    for (let b = a + 1; b < keep.length; b++) {
      const [re, im] = trace(mul(adjoint(kraus[keep[a]!]!), kraus[keep[b]!]!));
      if (Math.hypot(re, im) > KRAUS_ORTHOGONALITY_TOLERANCE * Math.sqrt(norms[keep[a]!]! * norms[keep[b]!]!)) return undefined;
    }
  }
  if (keep.length === 0) return undefined;
  return keep.sort((a, b) => norms[b]! - norms[a]!).map((i) => kraus[i]!);
}
