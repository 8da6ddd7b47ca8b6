/**
 * The Pauli transfer matrix R_ij = Tr(P_i E(P_j))/d (Paulis ordered I, X, Y, Z, qubit 0
 * leftmost, strings in the lexicographic order of src/noise/channels.ts pauliLabels; see
 * ./conventions.ts) and its exchange with the superoperator.
 *
 * With B the d² × d² matrix whose column j is vec(P_j)/√d (unitary, since Tr(P_i P_j) = d·δ_ij),
 * R_ij = vec(P_i)†·S·vec(P_j)/d because Tr(P_i X) = vec(P_i)†vec(X) for Hermitian P_i; so
 * R = B†·S·B and S = B·R·B†.
 */
import { adjoint, type CMatrix, mul } from '../linalg/cmatrix.js';
import { pauliLabels, pauliMatrix } from '../noise/channels.js';
import { vec } from './choi.js';

const BASES = new Map<number, CMatrix>();

/** The unitary B whose column j is vec(P_j)/√d for the j-th k-qubit Pauli string (cached per k). */
export function pauliBasis(k: number): CMatrix {
  const cached = BASES.get(k);
  if (cached !== undefined) return cached;
  const d = 1 << k;
  const D = d * d;
  const data = new Float64Array(2 * D * D);
  const inv = 1 / Math.sqrt(d);
  pauliLabels(k).forEach((label, j) => {
    const v = vec(pauliMatrix(label));
    for (let r = 0; r < D; r++) {
      data[2 * (r * D + j)] = v[2 * r]! * inv;
      data[2 * (r * D + j) + 1] = v[2 * r + 1]! * inv;
    }
  });
  const b = { rows: D, cols: D, data };
  BASES.set(k, b);
  return b;
}

function qubitsOfSize(D: number, what: string): number {
  for (let k = 1; k <= 6; k++) if (1 << (2 * k) === D) return k;
  throw new RangeError(`${what}: ${D}×${D} is not 4^k × 4^k`);
}

/** R = B†·S·B: the Pauli transfer matrix of the map with superoperator `s` (complex; real for Hermiticity-preserving maps). */
export function superoperatorToPtm(s: CMatrix): CMatrix {
  const b = pauliBasis(qubitsOfSize(s.rows, 'superoperatorToPtm'));
  return mul(adjoint(b), mul(s, b));
}

/** S = B·R·B†: the superoperator (column-stacking vec) of the map with Pauli transfer matrix `r`. */
export function ptmToSuperoperator(r: CMatrix): CMatrix {
  const b = pauliBasis(qubitsOfSize(r.rows, 'ptmToSuperoperator'));
  return mul(b, mul(r, adjoint(b)));
}
