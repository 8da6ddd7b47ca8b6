/**
 * The figures of a record-mode run (format version 2, part B). Distributions are over the
 * classical record, key character i = bit i (as in ../engine/recordProgram.ts). The state
 * figures compare the branch ensembles Σ_r |r⟩⟨r| ⊗ ρ_r (every noise source, readout error
 * included) and Σ_r |r⟩⟨r| ⊗ σ_r (ideal):
 *   fidelity.state = (Σ_r Tr√(√σ_r ρ_r √σ_r))², the Uhlmann–Jozsa fidelity of the two
 *   block-diagonal states (a block-diagonal √ is the √ of each block), with unnormalised blocks;
 *   purity = Σ_r Tr ρ_r²; observables and Bloch vectors of Σ_r ρ_r.
 * Every figure goes through the one clamp of ./clamp.ts, as in version 1 (./report.ts).
 */
import type { BranchEnsemble, IdealEnsemble } from '../engine/branches.js';
import { sumBranches } from '../engine/branches.js';
import { traceOf } from '../engine/densityMatrix.js';
import { bitstring, type DensityMatrix, type StateVector } from '../engine/layout.js';
import { ensembleToDensityMatrix, MAX_IDEAL_BRANCHES, type IdealState } from '../engine/run.js';
import { classicalFidelity, purity, stateFidelity, totalVariationDistance } from './fidelity.js';
import { idealBlochVectors, idealDiagonal, idealExpectation } from './idealFigures.js';
import { blochVectors, pauliExpectation } from './observables.js';
import { clampBloch, clampSigned, clampUnit } from './clamp.js';
import { DEFAULT_SEED, LISTED_OUTCOME_THRESHOLD, type Figures } from './report.js';
import { sampleCounts } from './sampling.js';

/** What computeRecordFigures needs besides the ensembles. */
export interface RecordReportInput {
  readonly n: number;
  /** Number of record bits. */
  readonly bits: number;
  readonly observe: readonly string[];
  readonly shots?: number;
  readonly seed?: number;
}

/** Record distribution: p[k] = weight of the record whose key is bitstring(k, m). */
export function recordDistribution(weights: ReadonlyMap<string, number>, m: number): Float64Array {
  const p = new Float64Array(Math.pow(2, m));
  for (const [key, w] of weights) p[m === 0 ? 0 : parseInt(key, 2)] += w;
  return p;
}

/** Weight Tr ρ_r of every branch of an ensemble. */
export function branchWeights(branches: BranchEnsemble): Map<string, number> {
  const out = new Map<string, number>();
  for (const [key, rho] of branches) out.set(key, traceOf(rho));
  return out;
}

/** Weight Tr σ_r of every record of the ideal run. */
export function idealWeights(ideal: IdealEnsemble): Map<string, number> {
  const out = new Map<string, number>();
  for (const [key, sigma] of ideal) out.set(key, idealDiagonal(sigma).reduce((a, b) => a + b, 0));
  return out;
}

/** The ideal state with the record discarded, Σ_r σ_r: the records' pure branches together while few, else a density matrix. */
export function idealSum(n: number, ideal: IdealEnsemble): IdealState {
  const vectors: StateVector[] = [];
  const mixed: DensityMatrix[] = [];
  for (const s of ideal.values()) {
    if (s.kind === 'pure') vectors.push(s.state);
    else if (s.kind === 'ensemble') vectors.push(...s.states);
    else mixed.push(s.rho);
  }
  if (mixed.length === 0 && vectors.length <= MAX_IDEAL_BRANCHES) {
    return vectors.length === 1 ? { kind: 'pure', state: vectors[0]! } : { kind: 'ensemble', states: vectors };
  }
  const rho: DensityMatrix = vectors.length > 0 ? ensembleToDensityMatrix(vectors) : { n, dim: 1 << n, data: new Float64Array(2 * 4 ** n) };
  for (const m of mixed) for (let i = 0; i < rho.data.length; i++) rho.data[i] += m.data[i]!;
  return { kind: 'mixed', rho };
}

/**
 * Figures of a record-mode run from its ensembles: `noisy` (every noise source, readout error
 * included), `noisyWithoutReadout` (record weights of the run without readout error) and `ideal`.
 */
export function computeRecordFigures(
  noisy: BranchEnsemble,
  noisyWithoutReadout: ReadonlyMap<string, number>,
  ideal: IdealEnsemble,
  input: RecordReportInput,
): { figures: Figures; rho: DensityMatrix; ideal: IdealState } {
  const { n, bits: m } = input;
  const pIdeal = recordDistribution(idealWeights(ideal), m);
  const pNoisy = recordDistribution(noisyWithoutReadout, m);
  const pMeasured = recordDistribution(branchWeights(noisy), m);
  const ideals: Record<string, number> = {};
  const noisys: Record<string, number> = {};
  const measureds: Record<string, number> = {};
  for (let k = 0; k < pIdeal.length; k++) {
    const a = pIdeal[k]!;
    const b = pNoisy[k]!;
    const c = pMeasured[k]!;
    if (a > LISTED_OUTCOME_THRESHOLD || b > LISTED_OUTCOME_THRESHOLD || c > LISTED_OUTCOME_THRESHOLD) {
      const s = m === 0 ? '' : bitstring(k, m);
      ideals[s] = clampUnit(a);
      noisys[s] = clampUnit(b);
      measureds[s] = clampUnit(c);
    }
  }
  let rootSum = 0;
  let pur = 0;
  for (const [key, rho] of noisy) {
    pur += purity(rho);
    const sigma = ideal.get(key);
    if (sigma !== undefined) rootSum += Math.sqrt(Math.max(0, stateFidelity(rho, sigma)));
  }
  const rho = sumBranches(n, noisy);
  const idealState = idealSum(n, ideal);
  const figures: Figures = {
    probabilities: { ideal: ideals, noisy: noisys, measured: measureds },
    fidelity: { state: clampUnit(rootSum * rootSum), classical: clampUnit(classicalFidelity(pIdeal, pMeasured)) },
    tvd: clampUnit(totalVariationDistance(pIdeal, pMeasured)),
    purity: clampUnit(pur),
    bloch: { ideal: idealBlochVectors(idealState).map(clampBloch), noisy: blochVectors(rho).map(clampBloch) },
    ...(input.observe.length > 0
      ? { observables: Object.fromEntries(input.observe.map((p) => [p, { ideal: clampSigned(idealExpectation(idealState, p)), noisy: clampSigned(pauliExpectation(rho, p)) }])) }
      : {}),
    ...(input.shots !== undefined ? { counts: sampleCounts(pMeasured, m, input.shots, input.seed ?? DEFAULT_SEED) } : {}),
  };
  return { figures, rho, ideal: idealState };
}
