/**
 * Figures of the ideal final state in any of the forms the ideal run produces (a pure state,
 * an ensemble of unnormalised pure branches, or a density matrix). Populations, Bloch vectors
 * and Pauli expectations are linear in σ, so an ensemble's are the sums over its branches.
 */
import type { IdealState } from '../engine/run.js';
import type { DensityMatrix, StateVector } from '../engine/layout.js';
import { blochVectors, pauliExpectation } from './observables.js';
import { diagonalOf } from './probabilities.js';

function forms(ideal: IdealState): readonly (DensityMatrix | StateVector)[] {
  return ideal.kind === 'pure' ? [ideal.state] : ideal.kind === 'ensemble' ? ideal.states : [ideal.rho];
}

/** Computational-basis populations of the ideal state (index order of src/engine/layout.ts). */
export function idealDiagonal(ideal: IdealState): Float64Array {
  const parts = forms(ideal).map(diagonalOf);
  const out = parts[0]!;
  for (let k = 1; k < parts.length; k++) for (let i = 0; i < out.length; i++) out[i]! += parts[k]![i]!;
  return out;
}

/** Per-qubit Bloch vectors (⟨X⟩, ⟨Y⟩, ⟨Z⟩) of the ideal state, qubit 0 first. */
export function idealBlochVectors(ideal: IdealState): [number, number, number][] {
  const parts = forms(ideal).map(blochVectors);
  return parts[0]!.map((_, q) => {
    const sum: [number, number, number] = [0, 0, 0];
    for (const p of parts) for (let c = 0; c < 3; c++) sum[c] += p[q]![c]!;
    return sum;
  });
}

/** Tr(Pσ) of the ideal state for a Pauli string P (qubit 0 leftmost). */
export function idealExpectation(ideal: IdealState, pauli: string): number {
  let sum = 0;
  for (const f of forms(ideal)) sum += pauliExpectation(f, pauli);
  return sum;
}
