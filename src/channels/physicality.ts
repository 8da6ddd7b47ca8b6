/**
 * Physicality checks of a linear map E on d × d matrices, from its Choi matrix J
 * (./conventions.ts). Every deviation is a spectral (operator) norm:
 * - Hermiticity preserving ⇔ J = J† (E(X†) = E(X)†): deviation ‖J − J†‖;
 * - completely positive ⇔ J ⪰ 0 (M.-D. Choi, Linear Algebra Appl. 10, 285 (1975)): the
 *   smallest eigenvalue of the Hermitian part of J;
 * - trace preserving ⇔ Tr_out J = I: deviation ‖Tr_out J − I‖, which equals the largest change
 *   of trace max_ρ |Tr E(ρ) − Tr ρ| over density matrices ρ (Tr E(ρ) = Tr((Tr_out J)ᵀ ρ));
 * - unital ⇔ E(I) = Tr_in J = I: deviation ‖Tr_in J − I‖;
 * - positive (PSD inputs give PSD outputs): implied by CP; otherwise searched numerically by
 *   ./positivity.ts (only meaningful for Hermiticity-preserving maps).
 * A property holds when its deviation is at most PHYSICALITY_TOLERANCE.
 */
import { adjoint, identity, sub } from '../linalg/cmatrix.js';
import type { Channel } from './channel.js';
import { traceInput, traceOutput } from './choi.js';
import { spectralNorm } from './norms.js';
import { searchMinOutputEigenvalue } from './positivity.js';
import { PHYSICALITY_TOLERANCE } from './tolerances.js';

/** One yes/no property with the figure it was decided by. */
export interface PropertyCheck {
  readonly ok: boolean;
  /** Deviation in the spectral norm (for complete positivity: the smallest Choi eigenvalue). */
  readonly value: number;
}

/** Outcome of the positivity test. */
export type PositivityCheck =
  /** Completely positive, hence positive. */
  | { readonly status: 'implied-by-cp' }
  /** Not Hermiticity preserving: positivity is not tested. */
  | { readonly status: 'not-tested' }
  /** The search found no input with a negative output eigenvalue (min found ≥ −tolerance). */
  | { readonly status: 'positive'; readonly minOutputEigenvalue: number; readonly method: string }
  /** An input with a negative output eigenvalue was found: a proof of non-positivity. */
  | { readonly status: 'not-positive'; readonly minOutputEigenvalue: number; readonly input: Float64Array; readonly method: string };

/** All physicality figures of a map. */
export interface Physicality {
  readonly hermiticityPreserving: PropertyCheck;
  readonly completelyPositive: PropertyCheck;
  readonly tracePreserving: PropertyCheck;
  readonly unital: PropertyCheck;
  readonly positive: PositivityCheck;
  /** Completely positive and trace preserving: a quantum channel. */
  readonly cptp: boolean;
  /** The tolerance every deviation was compared with. */
  readonly tolerance: number;
}

/** Hermiticity preservation, complete positivity, trace preservation, unitality and positivity of the map (see the file comment). */
export function checkPhysicality(channel: Channel): Physicality {
  const tol = PHYSICALITY_TOLERANCE;
  const j = channel.choi();
  const d = channel.dim;
  const hp = spectralNorm(sub(j, adjoint(j)));
  const eig = channel.choiEigen().values;
  const minEig = eig[eig.length - 1]!;
  const tp = spectralNorm(sub(traceOutput(j), identity(d)));
  const un = spectralNorm(sub(traceInput(j), identity(d)));
  const hermiticityPreserving = { ok: hp <= tol, value: hp };
  const completelyPositive = { ok: hermiticityPreserving.ok && minEig >= -tol, value: minEig };
  let positive: PositivityCheck;
  if (completelyPositive.ok) positive = { status: 'implied-by-cp' };
  else if (!hermiticityPreserving.ok) positive = { status: 'not-tested' };
  else {
    const r = searchMinOutputEigenvalue(channel.superoperator());
    positive =
      r.minOutputEigenvalue >= -tol
        ? { status: 'positive', minOutputEigenvalue: r.minOutputEigenvalue, method: r.method }
        : { status: 'not-positive', minOutputEigenvalue: r.minOutputEigenvalue, input: r.input, method: r.method };
  }
  const tracePreserving = { ok: tp <= tol, value: tp };
  return {
    hermiticityPreserving,
    completelyPositive,
    tracePreserving,
    unital: { ok: un <= tol, value: un },
    positive,
    cptp: completelyPositive.ok && tracePreserving.ok,
    tolerance: tol,
  };
}
