/**
 * Fidelities of Kraus channels and the two ways of combining Kraus sets.
 *
 * Definitions used throughout fray:
 * - Entanglement (process) fidelity of a channel E on d dimensions with Kraus set {K_k}
 *   against the identity: F_e(E) = ⟨Φ|(E ⊗ id)(|Φ⟩⟨Φ|)|Φ⟩ for the maximally entangled |Φ⟩,
 *   which equals Σ_k |Tr K_k|² / d² (Nielsen & Chuang §9.3, F(ρ, E) = Σ_k |tr(ρE_k)|² at
 *   ρ = I/d; equation number not given, from memory), and
 *   also equals Tr(R)/d² for the Pauli transfer matrix R_ij = Tr(P_i E(P_j))/d, i.e. the
 *   trace of the superoperator divided by d².
 * - Against a unitary U: F_e(E, U) = F_e(U†∘E) = Σ_k |Tr(U† K_k)|² / d².
 *   For the gate channel E∘U the unitary cancels: Tr(U† K_k U) = Tr(K_k), so
 *   F_e(E∘U, U) = F_e(E).
 * - Average gate fidelity F_avg = ∫dψ ⟨ψ|U†E(ψ)U|ψ⟩ = (d·F_e + 1)/(d + 1)
 *   (M. A. Nielsen, Phys. Lett. A 303, 249 (2002); M., P. and R. Horodecki, PRA 60, 1888 (1999)).
 */
import { type CMatrix, kron, mul } from '../linalg/cmatrix.js';

/**
 * Entanglement (process) fidelity Σ_k |Tr(U† K_k)|² / d² of the channel with Kraus set
 * `kraus` against the unitary `target` (against the identity when omitted).
 */
export function entanglementFidelity(kraus: readonly CMatrix[], target?: CMatrix): number {
  if (kraus.length === 0) throw new RangeError('entanglementFidelity: empty Kraus set');
  const d = kraus[0]!.rows;
  if (target !== undefined && (target.rows !== d || target.cols !== d)) {
    throw new RangeError(`entanglementFidelity: target is ${target.rows}×${target.cols}, Kraus operators are ${d}×${d}`);
  }
  let sum = 0;
  for (const k of kraus) {
    const K = k.data;
    let re = 0;
    let im = 0;
    if (target === undefined) {
      for (let i = 0; i < d; i++) {
        re += K[2 * (i * d + i)]!;
        im += K[2 * (i * d + i) + 1]!;
      }
    } else {
      // Tr(U† K) = Σ_ij conj(U_ij) K_ij
      const U = target.data;
      for (let j = 0; j < U.length; j += 2) {
        const ur = U[j]!;
        const ui = U[j + 1]!;
        const kr = K[j]!;
        const ki = K[j + 1]!;
        re += ur * kr + ui * ki;
        im += ur * ki - ui * kr;
      }
    }
    sum += re * re + im * im;
  }
  return sum / (d * d);
}

/** Average gate fidelity (d·F_pro + 1)/(d + 1) from the process (entanglement) fidelity F_pro on dimension d (Nielsen 2002). */
export function averageGateFidelity(fPro: number, d: number): number {
  return (d * fPro + 1) / (d + 1);
}

/** Process (entanglement) fidelity (F_avg·(d + 1) − 1)/d from the average gate fidelity on dimension d (inverse of averageGateFidelity). */
export function processFidelityFromAverage(fAvg: number, d: number): number {
  return (fAvg * (d + 1) - 1) / d;
}

/** Average gate fidelity of the Kraus channel against the unitary `target` (identity when omitted). */
export function krausAverageGateFidelity(kraus: readonly CMatrix[], target?: CMatrix): number {
  return averageGateFidelity(entanglementFidelity(kraus, target), kraus[0]!.rows);
}

/** Kraus set of the composition second∘first (first acts first): all products B_j·A_i, j-major. */
export function composeKraus(second: readonly CMatrix[], first: readonly CMatrix[]): CMatrix[] {
  const out: CMatrix[] = [];
  for (const b of second) for (const a of first) out.push(mul(b, a));
  return out;
}

/** Kraus set of the parallel channel a ⊗ b (a on the leftmost, most significant qubits): all A_i ⊗ B_j. */
export function tensorKraus(a: readonly CMatrix[], b: readonly CMatrix[]): CMatrix[] {
  const out: CMatrix[] = [];
  for (const x of a) for (const y of b) out.push(kron(x, y));
  return out;
}
