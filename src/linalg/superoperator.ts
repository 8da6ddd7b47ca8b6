/**
 * THE superoperator convention of fray, stated once; everything else refers here.
 *
 * Vectorisation is column stacking: for a d × d matrix B, vec(B) is the d²-vector with
 * vec(B)[i + j·d] = B[i][j] (column j of B occupies entries j·d … j·d + d − 1).
 * With this ordering vec(A·ρ·B) = (Bᵀ ⊗ A)·vec(ρ), where ⊗ is the Kronecker product of
 * ../linalg/cmatrix.ts (left factor most significant). Hence the channel ρ → K ρ K† has
 * superoperator (K†)ᵀ ⊗ K = conj(K) ⊗ K, and a Kraus set {K_k} has S = Σ_k conj(K_k) ⊗ K_k,
 * a d² × d² matrix acting as vec(Φ(ρ)) = S·vec(ρ).
 *
 * The k-qubit block the kernels transform follows ./layout.ts: local index i of the
 * block has the first target qubit as its most significant bit.
 */
import { add, conj, kron, zeros, type CMatrix } from './cmatrix.js';

/** Superoperator S = Σ_k conj(K_k) ⊗ K_k of the channel ρ → Σ_k K_k ρ K_k† (column-stacking vec). */
export function krausToSuperoperator(kraus: readonly CMatrix[]): CMatrix {
  if (kraus.length === 0) throw new RangeError('krausToSuperoperator: empty Kraus set');
  const d = kraus[0]!.rows;
  let s = zeros(d * d, d * d);
  for (const k of kraus) {
    if (k.rows !== d || k.cols !== d) {
      throw new RangeError(`krausToSuperoperator: Kraus operator is ${k.rows}×${k.cols}, expected ${d}×${d}`);
    }
    s = add(s, kron(conj(k), k));
  }
  return s;
}

/** Superoperator conj(U) ⊗ U of the unitary conjugation ρ → U ρ U† (column-stacking vec). */
export function superoperatorOf(u: CMatrix): CMatrix {
  return krausToSuperoperator([u]);
}
