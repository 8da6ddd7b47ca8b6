/**
 * Execution of an instruction program on an n-qubit register starting in |0…0⟩: the noisy
 * run on a density matrix, and the ideal run on a state vector for as long as it stays pure.
 */
import { createDensityMatrix } from './densityMatrix.js';
import { orthogonalBranches } from './ensemble.js';
import type { Instruction } from './instruction.js';
import { referenceKernels, type Kernels } from './kernels.js';
import type { DensityMatrix, StateVector } from './layout.js';
import { krausToSuperoperator } from '../linalg/superoperator.js';
import { applyUnitaryToState, createStateVector, resetStateVector, splitReset } from './stateVector.js';

/**
 * A channel with r Kraus operators on k qubits (d = 2^k) is applied through its superoperator
 * when r > SUPEROPERATOR_BREAK_EVEN·d (cost model in runNoisy: r·2·d³ vs d⁴ per block), else
 * through its Kraus operators.
 */
export const SUPEROPERATOR_BREAK_EVEN = 0.5;

/**
 * The final ideal state: a state vector while the run stayed pure; after resets that made it
 * mixed, an ensemble of unnormalised pure branches (σ = Σ_i |ψ_i⟩⟨ψ_i|, Σ_i ‖ψ_i‖² = 1), or a
 * density matrix once there are more than MAX_IDEAL_BRANCHES branches.
 */
export type IdealState =
  | { kind: 'pure'; state: StateVector }
  | { kind: 'ensemble'; states: StateVector[] }
  | { kind: 'mixed'; rho: DensityMatrix };

/**
 * Most pure branches the ideal run keeps. Branches keep exact zeros exact (a density matrix
 * accumulates rounding of ≈1e-16 on its diagonal, which square-root figures such as the
 * classical fidelity magnify to ≈1e-8) and cost 2^n instead of 4^n each.
 */
export const MAX_IDEAL_BRANCHES = 64;

/** Branches whose squared norm is below this carry no weight and are dropped. */
export const NEGLIGIBLE_BRANCH_WEIGHT = 1e-30;


/** Final density matrix of `program` (unitaries, Kraus channels, resets in order) applied to |0…0⟩⟨0…0|. */
export function runNoisy(n: number, program: readonly Instruction[], kernels: Kernels = referenceKernels): DensityMatrix {
  const rho = createDensityMatrix(n);
  for (const ins of program) applyInstruction(rho, ins, kernels);
  return rho;
}

/** Applies one instruction to ρ in place with `kernels`. */
export function applyInstruction(rho: DensityMatrix, ins: Instruction, kernels: Kernels = referenceKernels): void {
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

/**
 * Final state of the ideal `program` (only 'unitary' and 'reset'; a 'channel' throws) applied
 * to |0…0⟩. A reset that keeps the state pure acts in place (resetStateVector); one that makes
 * it mixed splits the branch in two (splitReset), and the branches are then made orthogonal
 * (at most rank σ of them). Past `maxBranches` (MAX_IDEAL_BRANCHES) branches the run
 * continues on the density matrix Σ_i |ψ_i⟩⟨ψ_i| with `kernels`.
 */
export function runIdeal(
  n: number,
  program: readonly Instruction[],
  kernels: Kernels = referenceKernels,
  maxBranches: number = MAX_IDEAL_BRANCHES,
): IdealState {
  for (const ins of program) {
    if (ins.op === 'channel') throw new TypeError("runIdeal: the ideal program may not contain a 'channel' instruction");
  }
  const run: IdealRun = { branches: [createStateVector(n)] };
  for (const ins of program) applyIdeal(run, ins, kernels, maxBranches);
  return finishIdeal(run);
}

/** The ideal state while a run is under way: unnormalised pure branches, or a density matrix once there are too many. */
export interface IdealRun {
  branches: StateVector[];
  rho?: DensityMatrix;
}

/** Applies a 'unitary' or 'reset' instruction to an ideal run in place (see runIdeal); a 'channel' throws. */
export function applyIdeal(run: IdealRun, ins: Instruction, kernels: Kernels = referenceKernels, maxBranches: number = MAX_IDEAL_BRANCHES): void {
  if (ins.op === 'channel') throw new TypeError("applyIdeal: the ideal program may not contain a 'channel' instruction");
  if (ins.op === 'unitary') {
    if (run.rho) kernels.applyUnitary(run.rho, ins.qubits, ins.matrix);
    else for (const b of run.branches) applyUnitaryToState(b, ins.qubits, ins.matrix);
    return;
  }
  if (run.rho) {
    kernels.reset(run.rho, ins.qubit);
    return;
  }
  const next: StateVector[] = [];
  for (const b of run.branches) {
    if (resetStateVector(b, ins.qubit)) next.push(b);
    else for (const part of splitReset(b, ins.qubit)) if (squaredNorm(part) > NEGLIGIBLE_BRANCH_WEIGHT) next.push(part);
  }
  setIdealBranches(run, next, maxBranches);
}

/** Replaces the branches of an ideal run by `states`, made orthogonal, or by their density matrix past maxBranches. */
export function setIdealBranches(run: IdealRun, states: StateVector[], maxBranches: number = MAX_IDEAL_BRANCHES): void {
  const compact = states.length > 1 ? orthogonalBranches(states) : states;
  if (compact.length > maxBranches) {
    run.rho = ensembleToDensityMatrix(compact);
    run.branches = [];
  } else run.branches = compact;
}

/** The final IdealState of a run: pure (one branch), an ensemble, or mixed. */
export function finishIdeal(run: IdealRun): IdealState {
  if (run.rho) return { kind: 'mixed', rho: run.rho };
  return run.branches.length === 1 ? { kind: 'pure', state: run.branches[0]! } : { kind: 'ensemble', states: run.branches };
}

/** ‖ψ‖² of an unnormalised state vector. */
export function squaredNorm(psi: StateVector): number {
  let s = 0;
  for (let i = 0; i < psi.data.length; i++) s += psi.data[i]! * psi.data[i]!;
  return s;
}

/** Σ_i |ψ_i⟩⟨ψ_i| of unnormalised branches, in the layout of ./layout.ts. */
export function ensembleToDensityMatrix(states: readonly StateVector[]): DensityMatrix {
  const rho = createDensityMatrix(states[0]!.n);
  rho.data.fill(0);
  for (const psi of states) addOuter(rho, psi);
  return rho;
}

/** ρ += |ψ⟩⟨ψ| for an unnormalised state vector ψ (zero amplitudes skipped). */
export function addOuter(rho: DensityMatrix, psi: StateVector): void {
  const D = rho.dim;
  const R = rho.data;
  const P = psi.data;
  for (let i = 0; i < D; i++) {
    const ar = P[2 * i]!;
    const ai = P[2 * i + 1]!;
    if (ar === 0 && ai === 0) continue;
    for (let j = 0; j < D; j++) {
      const br = P[2 * j]!;
      const bi = -P[2 * j + 1]!;
      R[2 * (i * D + j)] += ar * br - ai * bi;
      R[2 * (i * D + j) + 1] += ar * bi + ai * br;
    }
  }
}
