import type { DensityMatrix } from '../engine/layout.js';
import { classicalFidelity, purity, stateFidelity, totalVariationDistance, type IdealState } from './fidelity.js';
import { blochVectors, pauliExpectation } from './observables.js';
import { applyReadout, diagonalOf, marginal, type ReadoutConfusion } from './probabilities.js';
import { sampleCounts } from './sampling.js';
import { idealBlochVectors, idealDiagonal, idealExpectation } from './idealFigures.js';
import { bitstring } from '../engine/layout.js';
import { clampBloch, clampSigned, clampUnit } from './clamp.js';

/** Outcomes whose probability exceeds this in any of ideal / noisy / measured are listed (the contract's 1e-15). */
export const LISTED_OUTCOME_THRESHOLD = 1e-15;

/** Everything the results stage needs besides the two final states. */
export interface ReportInput {
  readonly n: number;
  /** Measured qubits, ascending; bitstring character i is measured[i]. */
  readonly measured: readonly number[];
  /** Readout confusion of each measured qubit, in measured order. */
  readonly readout: readonly ReadoutConfusion[];
  readonly observe: readonly string[];
  readonly shots?: number;
  readonly seed?: number;
}

/** The figures of one run: distributions over measured bitstrings (qubit measured[0] leftmost) and fidelities. */
export interface Figures {
  readonly probabilities: {
    readonly ideal: Record<string, number>;
    readonly noisy: Record<string, number>;
    readonly measured: Record<string, number>;
  };
  /** fidelity.state: Uhlmann–Jozsa, squared; fidelity.classical: (Σ √(p_ideal p_measured))². */
  readonly fidelity: { readonly state: number; readonly classical: number };
  /** ½ Σ |p_ideal − p_measured|. */
  readonly tvd: number;
  /** Tr ρ² of the noisy state. */
  readonly purity: number;
  /** Per-qubit Bloch vectors (⟨X⟩, ⟨Y⟩, ⟨Z⟩) of the reduced states, qubit 0 first. */
  readonly bloch: { readonly ideal: [number, number, number][]; readonly noisy: [number, number, number][] };
  /** ⟨P⟩ = Tr(Pρ) for each requested Pauli string. */
  readonly observables?: Record<string, { ideal: number; noisy: number }>;
  /** Sampled counts of `shots` draws from probabilities.measured. */
  readonly counts?: Record<string, number>;
}

/** Computes the figures of a run from its final noisy and ideal states, rounding excess over their ranges clamped (./clamp.ts). */
export function computeFigures(rho: DensityMatrix, ideal: IdealState, input: ReportInput): Figures {
  const { n, measured } = input;
  const m = measured.length;
  const pIdeal = marginal(idealDiagonal(ideal), n, measured);
  const pNoisy = marginal(diagonalOf(rho), n, measured);
  const pMeasured = applyReadout(pNoisy, input.readout);
  const ideals: Record<string, number> = {};
  const noisys: Record<string, number> = {};
  const measureds: Record<string, number> = {};
  for (let k = 0; k < 1 << m; k++) {
    const a = pIdeal[k]!;
    const b = pNoisy[k]!;
    const c = pMeasured[k]!;
    if (a > LISTED_OUTCOME_THRESHOLD || b > LISTED_OUTCOME_THRESHOLD || c > LISTED_OUTCOME_THRESHOLD) {
      const s = bitstring(k, m);
      ideals[s] = clampUnit(a);
      noisys[s] = clampUnit(b);
      measureds[s] = clampUnit(c);
    }
  }
  const figures: Figures = {
    probabilities: { ideal: ideals, noisy: noisys, measured: measureds },
    fidelity: { state: clampUnit(stateFidelity(rho, ideal)), classical: clampUnit(classicalFidelity(pIdeal, pMeasured)) },
    tvd: clampUnit(totalVariationDistance(pIdeal, pMeasured)),
    purity: clampUnit(purity(rho)),
    bloch: { ideal: idealBlochVectors(ideal).map(clampBloch), noisy: blochVectors(rho).map(clampBloch) },
  };
  const extra: { observables?: Figures['observables']; counts?: Figures['counts'] } = {};
  if (input.observe.length > 0) {
    extra.observables = {};
    for (const p of input.observe) {
      extra.observables[p] = { ideal: clampSigned(idealExpectation(ideal, p)), noisy: clampSigned(pauliExpectation(rho, p)) };
    }
  }
  if (input.shots !== undefined) {
    extra.counts = sampleCounts(pMeasured, m, input.shots, input.seed ?? DEFAULT_SEED);
  }
  return { ...figures, ...extra };
}

/** Seed used for --shots when none is given, so that runs repeat by default. */
export const DEFAULT_SEED = 1;

