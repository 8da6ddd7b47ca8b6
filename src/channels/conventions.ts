/**
 * THE channel conventions of fray, stated once; every file of src/channels refers here.
 *
 * A channel (more generally a linear map) E takes d × d matrices to d × d matrices, d = 2^k
 * for k = 1 … MAX_CHANNEL_QUBITS qubits. Qubit order and tensor factors follow
 * src/engine/layout.ts (qubit 0 = leftmost, most significant factor); vectorisation follows
 * src/linalg/superoperator.ts (column stacking, vec(B)[i + j·d] = B[i][j]). In those terms:
 *
 * - Kraus form: E(ρ) = Σ_k K_k ρ K_k†, each K_k a d × d matrix (only for completely positive
 *   maps). The MINIMAL Kraus form has as many operators as the rank of the Choi matrix.
 * - Choi matrix (d² × d², input factor first, unnormalised):
 *     J(E) = Σ_ij |i⟩⟨j| ⊗ E(|i⟩⟨j|),  so J[i·d + a][j·d + b] = E(|i⟩⟨j|)[a][b],
 *   Tr J = d for a trace-preserving map. From Kraus operators J = Σ_k vec(K_k) vec(K_k)†
 *   (column-stacked vec puts the column index i in the most significant place, matching the
 *   input-first order). Partial traces: Tr_out J = (Σ_k K_k†K_k)ᵀ, Tr_in J = E(I).
 * - Superoperator (d² × d²) acting on the column-stacked vec(ρ): vec(E(ρ)) = S·vec(ρ), so
 *   vec(AρB) = (Bᵀ ⊗ A)·vec(ρ) and S = Σ_k conj(K_k) ⊗ K_k (src/linalg/superoperator.ts).
 *   Choi and superoperator hold the same numbers reshuffled:
 *     S[a + b·d][i + j·d] = J[i·d + a][j·d + b].
 * - Pauli transfer matrix (d² × d², real for Hermiticity-preserving maps):
 *     R_ij = Tr(P_i E(P_j)) / d,
 *   Paulis ordered I, X, Y, Z; a k-qubit Pauli is a tensor product with qubit 0 leftmost and
 *   the strings are enumerated lexicographically (II, IX, IY, IZ, XI, …; src/noise/channels.ts
 *   pauliLabels). With B the unitary whose column j is vec(P_j)/√d, R = B†·S·B.
 * - Stinespring isometry V ((d·r) × d, environment factor LAST):
 *     V = Σ_k K_k ⊗ |k⟩,  so V[a·r + k][i] = K_k[a][i],  E(ρ) = Tr_env(V ρ V†),
 *   V†V = Σ_k K_k†K_k = I for a trace-preserving map; r is the number of Kraus operators.
 * - Unitary channel: E(ρ) = U ρ U†, one Kraus operator U.
 * - Composition ("sequence"): the first listed channel acts first, S = S_n ⋯ S_2 S_1.
 * - Tensor product ("parallel"): the first listed channel acts on the leftmost qubits.
 */

/** Largest number of qubits a channel of src/channels may act on (dense d² × d² matrices, d = 2^k ≤ 8). */
export const MAX_CHANNEL_QUBITS = 3;

/** The representations a channel can be converted to (a unitary is a special Kraus form). */
export type ChannelForm = 'kraus' | 'choi' | 'superoperator' | 'ptm' | 'stinespring';

/** Every representation name, in the order reports list them. */
export const CHANNEL_FORMS: readonly ChannelForm[] = ['kraus', 'choi', 'superoperator', 'ptm', 'stinespring'];

/** k when d = 2^k for k = 1 … MAX_CHANNEL_QUBITS, else undefined. */
export function qubitsOfDim(d: number): number | undefined {
  for (let k = 1; k <= MAX_CHANNEL_QUBITS; k++) if (1 << k === d) return k;
  return undefined;
}
