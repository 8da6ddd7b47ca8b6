import { fromRows, type CMatrix } from '../linalg/cmatrix.js';

/**
 * One step the engine executes on the register, in program order. Qubit lists follow
 * the convention of ./layout.ts: the first listed qubit is the leftmost tensor factor
 * of the matrix (or of every Kraus operator).
 */
export type Instruction =
  /** ρ → U ρ U† (ψ → U ψ in the ideal run); U is 2^k × 2^k for k = qubits.length. */
  | { readonly op: 'unitary'; readonly qubits: readonly number[]; readonly matrix: CMatrix }
  /** ρ → Σ_k K_k ρ K_k†, a CPTP map given by its Kraus operators (each 2^k × 2^k). */
  | { readonly op: 'channel'; readonly qubits: readonly number[]; readonly kraus: readonly CMatrix[] }
  /** ρ → |0⟩⟨0|_q ⊗ Tr_q ρ. */
  | { readonly op: 'reset'; readonly qubit: number };

/** Where an instruction comes from: the step (0-based; −1 for idle windows) and what it is (e.g. 'cx', 'thermal during cx', 'idle 120 ns', 'depolarizing', 'reset'). */
export interface Origin {
  readonly step: number;
  readonly what: string;
}

/** Kraus operators of the 'reset' instruction on one qubit: |0⟩⟨0| and |0⟩⟨1| (ρ → |0⟩⟨0| Tr ρ). */
export const RESET_KRAUS: readonly CMatrix[] = [
  fromRows([
    [1, 0],
    [0, 0],
  ]),
  fromRows([
    [0, 1],
    [0, 0],
  ]),
];
