/**
 * Execution of an instruction program on an n-qubit register starting in |0…0⟩: the noisy
 * run on a density matrix, and the ideal run on a state vector for as long as it stays pure.
 */
import { createDensityMatrix } from './densityMatrix.js';
import type { Instruction } from './instruction.js';
import { referenceKernels, type Kernels } from './kernels.js';
import type { DensityMatrix, StateVector } from './layout.js';
import { krausToSuperoperator } from '../linalg/superoperator.js';
import { applyUnitaryToState, createStateVector, resetStateVector, stateToDensityMatrix } from './stateVector.js';

/**
 * A channel with r Kraus operators on k qubits (d = 2^k) is applied through its superoperator
 * when r > SUPEROPERATOR_BREAK_EVEN·d (cost model in runNoisy: r·2·d³ vs d⁴ per block), else
 * through its Kraus operators.
 */
export const SUPEROPERATOR_BREAK_EVEN = 0.5;

/** The final ideal state: a state vector while the run stayed pure, else a density matrix. */
export type IdealState = { kind: 'pure'; state: StateVector } | { kind: 'mixed'; rho: DensityMatrix };

/** Final density matrix of `program` (unitaries, Kraus channels, resets in order) applied to |0…0⟩⟨0…0|. */
export function runNoisy(n: number, program: readonly Instruction[], kernels: Kernels = referenceKernels): DensityMatrix {
  const rho = createDensityMatrix(n);
  for (const ins of program) {
    switch (ins.op) {
      case 'unitary':
        kernels.applyUnitary(rho, ins.qubits, ins.matrix);
        break;
      case 'channel':
        // Cheaper form, chosen per instruction. Per d × d block (d = 2^k), r Kraus operators cost
        // about r·2·d³ multiply-adds (K·B then (K·B)·K†), the superoperator d⁴ (a d² × d² matrix on
        // vec(B)); so the superoperator wins when r > d/2. Building S = Σ conj(K) ⊗ K (r·d⁴, once
        // per instruction) is negligible beside the 4^(n−k) blocks of the register.
        if (ins.kraus.length > SUPEROPERATOR_BREAK_EVEN * (1 << ins.qubits.length)) {
          kernels.applySuperoperator(rho, ins.qubits, krausToSuperoperator(ins.kraus));
        } else {
          kernels.applyKraus(rho, ins.qubits, ins.kraus);
        }
        break;
      case 'reset':
        kernels.reset(rho, ins.qubit);
        break;
    }
  }
  return rho;
}

/**
 * Final state of the ideal `program` (only 'unitary' and 'reset'; a 'channel' throws) applied
 * to |0…0⟩: on a state vector while pure, switching to a density matrix (via |ψ⟩⟨ψ|) the first
 * time a reset makes the state mixed; `kernels` serve the mixed part.
 */
export function runIdeal(n: number, program: readonly Instruction[], kernels: Kernels = referenceKernels): IdealState {
  for (const ins of program) {
    if (ins.op === 'channel') throw new TypeError("runIdeal: the ideal program may not contain a 'channel' instruction");
  }
  const psi = createStateVector(n);
  let rho: DensityMatrix | undefined;
  for (const ins of program) {
    if (ins.op === 'unitary') {
      if (rho) kernels.applyUnitary(rho, ins.qubits, ins.matrix);
      else applyUnitaryToState(psi, ins.qubits, ins.matrix);
    } else if (ins.op === 'reset') {
      if (rho) kernels.reset(rho, ins.qubit);
      else if (!resetStateVector(psi, ins.qubit)) {
        rho = stateToDensityMatrix(psi);
        kernels.reset(rho, ins.qubit);
      }
    }
  }
  return rho ? { kind: 'mixed', rho } : { kind: 'pure', state: psi };
}
