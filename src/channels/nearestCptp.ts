/**
 * The nearest CPTP channel to a slightly unphysical map (e.g. a process-tomography fit), in
 * the Frobenius norm of the Choi matrix: the projection of the Hermitian part of J onto the
 * intersection of the positive semidefinite cone {J ⪰ 0} (complete positivity) and the
 * affine set {Tr_out J = I} (trace preservation), both convex.
 *
 * Method: Dykstra's alternating projections, which converge to the projection onto an
 * intersection of convex sets, not just to some point of it (R. L. Dykstra, J. Amer. Statist.
 * Assoc. 78, 837 (1983); J. P. Boyle and R. L. Dykstra, Lecture Notes in Statistics 37, 28
 * (1986); from memory). The projection onto the PSD cone clips negative eigenvalues to zero
 * (N. J. Higham, Linear Algebra Appl. 103, 103 (1988), from memory); the projection onto the
 * trace-preserving set is J − ((Tr_out J − I) ⊗ I)/d (derived: X ↦ X ⊗ I is the adjoint of
 * Tr_out and Tr_out(X ⊗ I) = d·X). The same CPTP projection is used for process tomography by
 * G. C. Knee, E. Bolduc, J. Leach and E. M. Gauger, Phys. Rev. A 98, 062336 (2018) (from memory).
 * After the iterations stop, a last clip of the eigenvalues and the rescaling
 * J ← (A ⊗ I) J (A ⊗ I) with A = (Tr_out J)^{−1/2} make the result exactly CPTP (to rounding);
 * that final step moves J by about the residual of the iteration.
 */
import { type CMatrix, add, identity, kron, mul, scale, sub } from '../linalg/cmatrix.js';
import { Channel } from './channel.js';
import { traceOutput } from './choi.js';
import { frobeniusNorm, hermitianFunction } from './norms.js';

/** Iterations stop when one Dykstra cycle moves the iterate by less than this (Frobenius norm of the Choi matrix). */
export const NEAREST_CPTP_TOLERANCE = 1e-12;
/** Largest number of Dykstra cycles (1 and 2 qubits). */
export const NEAREST_CPTP_MAX_ITERATIONS = 500;
/** Largest number of Dykstra cycles for 3 qubits (each cycle costs a 128 × 128 real eigenproblem). */
export const NEAREST_CPTP_MAX_ITERATIONS_LARGE = 100;

/** The repaired channel and how it was found. */
export interface CptpRepair {
  /** The CPTP channel (given as its Choi matrix). */
  readonly channel: Channel;
  /** ‖J − J'‖_F between the Choi matrices of the map and of the repaired channel. */
  readonly distance: number;
  /** Dykstra cycles run. */
  readonly iterations: number;
  /** Whether the iteration met NEAREST_CPTP_TOLERANCE before NEAREST_CPTP_MAX_ITERATIONS. */
  readonly converged: boolean;
  /** The method, in words. */
  readonly method: string;
}

/** The method of nearestCptp in one line, for reports. */
export const NEAREST_CPTP_METHOD =
  "Frobenius-nearest CPTP Choi matrix by Dykstra's alternating projections (PSD cone by eigenvalue clipping, trace-preserving affine set), then an exact CPTP rescaling";

function hermitianPart(m: CMatrix): CMatrix {
  const n = m.rows;
  const out = { rows: n, cols: n, data: new Float64Array(m.data.length) };
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      out.data[2 * (i * n + j)] = 0.5 * (m.data[2 * (i * n + j)]! + m.data[2 * (j * n + i)]!);
      out.data[2 * (i * n + j) + 1] = 0.5 * (m.data[2 * (i * n + j) + 1]! - m.data[2 * (j * n + i) + 1]!);
    }
  }
  return out;
}

function projectPsd(m: CMatrix): CMatrix {
  return hermitianFunction(m, (x) => (x > 0 ? x : 0));
}

function projectTracePreserving(m: CMatrix, d: number): CMatrix {
  const dev = sub(traceOutput(m), identity(d));
  return sub(m, scale(kron(dev, identity(d)), 1 / d));
}

/** The CPTP channel nearest to `channel` in the Frobenius norm of the Choi matrix (see the file comment). */
export function nearestCptp(channel: Channel): CptpRepair {
  const d = channel.dim;
  const j0 = hermitianPart(channel.choi());
  let x = j0;
  let p = scale(j0, 0);
  let q = scale(j0, 0);
  let iterations = 0;
  let converged = false;
  const maxIterations = d > 4 ? NEAREST_CPTP_MAX_ITERATIONS_LARGE : NEAREST_CPTP_MAX_ITERATIONS;
  while (iterations < maxIterations) {
    iterations++;
    const y = projectPsd(add(x, p));
    p = sub(add(x, p), y);
    const next = projectTracePreserving(add(y, q), d);
    q = sub(add(y, q), next);
    const change = frobeniusNorm(sub(next, x));
    x = next;
    if (change < NEAREST_CPTP_TOLERANCE) {
      converged = true;
      break;
    }
  }
  // Exact CPTP: clip, then J ← (A ⊗ I) J (A ⊗ I) with A = (Tr_out J)^{-1/2}, so Tr_out J = A·T·A = I.
  const clipped = projectPsd(x);
  const a = hermitianFunction(traceOutput(clipped), (t) => (t > 0 ? 1 / Math.sqrt(t) : 0));
  const ai = kron(a, identity(d));
  const fixed = hermitianPart(mul(ai, mul(clipped, ai)));
  return {
    channel: Channel.fromChoi(fixed),
    distance: frobeniusNorm(sub(channel.choi(), fixed)),
    iterations,
    converged,
    method: NEAREST_CPTP_METHOD,
  };
}
