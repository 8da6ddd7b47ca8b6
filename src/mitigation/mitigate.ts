/**
 * One mitigation run on a loaded circuit, in this order: dynamical decoupling inserted into
 * the idle windows (src/transforms/decouple.ts), zero-noise extrapolation of the requested
 * Pauli observables by unitary folding (src/transforms/fold.ts, fits in ./extrapolate.ts), and
 * readout correction of the measured distribution (./readoutCorrection.ts). Each figure is
 * compared with the ideal answer, which a simulator knows exactly, and with the run as it is. Every noisy run goes through the
 * same `simulateLoaded` as `fray run`; folding changes the circuit, never the YAML.
 */
import { simulateLoaded, measuredQubits, type SimulateOptions, type Simulation } from '../api/simulate.js';
import type { LoadedCircuit } from '../api/loadCircuit.js';
import { foldCircuit, type FoldOrder } from '../transforms/fold.js';
import { insertDecoupling, type DecouplingInsertion, type DecouplingOptions, type DecouplingSequence, type DecouplingSkip } from '../transforms/decouple.js';
import { ProblemList } from '../format/problem.js';
import { extrapolate, fitProblem, type FitKind, type ScalePoint } from './extrapolate.js';
import { correctReadout, type ReadoutMethod } from './readoutCorrection.js';
import { applyReadout, diagonalOf, marginal, toOutcomeMap } from '../results/probabilities.js';
import { idealDiagonal } from '../results/idealFigures.js';
import { classicalFidelity, totalVariationDistance } from '../results/fidelity.js';
import { LISTED_OUTCOME_THRESHOLD } from '../results/report.js';

/** Zero-noise extrapolation by folding: the requested scales (λ ≥ 1, distinct after folding), the fit, and which gates fold first. */
export interface ZneRecipe {
  readonly scales: readonly number[];
  readonly fit: FitKind;
  readonly order?: FoldOrder;
  readonly seed?: number;
}

/** What to mitigate and how. */
export interface MitigateOptions {
  /** Pauli strings to extrapolate (qubit 0 leftmost), besides the circuit's `observe:`. */
  readonly observe?: readonly string[];
  readonly zne?: ZneRecipe;
  readonly readout?: ReadoutMethod;
  /** Dynamical decoupling inserted before anything else (src/transforms/decouple.ts). */
  readonly dd?: DecouplingOptions;
  /** Engine options passed to every run (threads, engine, memory limit). */
  readonly run?: Omit<SimulateOptions, 'observe' | 'shots' | 'seed'>;
}

/** One observable: ideal ⟨P⟩, noisy ⟨P⟩ at scale 1, the zero-noise estimate, its standard error, and the value at each achieved scale. */
export interface ObservableMitigation {
  readonly ideal: number;
  readonly noisy: number;
  readonly mitigated: number;
  readonly stderr: number | null;
  readonly points: readonly ScalePoint[];
}

/** Readout correction of the scale-1 run (decoupled when asked): distributions over the measured bitstrings and their distance to the ideal before and after. */
export interface ReadoutMitigation {
  readonly method: ReadoutMethod;
  readonly ideal: Record<string, number>;
  /** As read (readout error included) in the unmitigated run. */
  readonly measured: Record<string, number>;
  readonly mitigated: Record<string, number>;
  readonly tvd_before: number;
  readonly tvd_after: number;
  readonly classical_before: number;
  readonly classical_after: number;
}

/** The result of `mitigate` (the JSON object of `fray mitigate --json`). */
export interface MitigationResult {
  readonly file: string;
  /** What the decoupling transform inserted and left (times in ns of the unmitigated schedule). */
  readonly decoupling?: {
    readonly sequence: DecouplingSequence;
    readonly min_idle_ns: number;
    readonly inserted: readonly DecouplingInsertion[];
    readonly skipped: readonly DecouplingSkip[];
  };
  readonly fit?: FitKind;
  readonly amplify?: 'fold';
  readonly observables: Record<string, ObservableMitigation>;
  readonly readout?: ReadoutMitigation;
  readonly warnings: readonly string[];
}

/** Runs the circuit as it is and as mitigated (decoupled, then folded and extrapolated), and/or corrects its readout (see the module comment). Throws InputError on bad input. */
export function mitigate(loaded: LoadedCircuit, options: MitigateOptions): MitigationResult {
  const extra = options.observe ?? [];
  const runOptions: SimulateOptions = { ...(options.run ?? {}), observe: extra };
  const base = simulateLoaded(loaded, runOptions);
  const warnings = [...base.result.warnings];
  const dd = options.dd === undefined ? undefined : insertDecoupling(loaded.circuit, loaded.profile, options.dd);
  const mitigated: LoadedCircuit = dd === undefined ? loaded : { ...loaded, circuit: dd.circuit };
  const first = dd === undefined ? base : simulateLoaded(mitigated, runOptions);
  const observables: Record<string, ObservableMitigation> = {};
  const zne = options.zne;
  if (zne !== undefined) {
    const runs: { scale: number; sim: Simulation }[] = [];
    for (const requested of zne.scales) {
      const folded = foldCircuit(mitigated.circuit, { scale: requested, ...(zne.order !== undefined ? { order: zne.order } : {}), ...(zne.seed !== undefined ? { seed: zne.seed } : {}) });
      const sim = folded.scale === 1 ? first : simulateLoaded({ ...mitigated, circuit: folded.circuit }, runOptions);
      runs.push({ scale: folded.scale, sim });
    }
    refuseUnfittable(mitigated, runs.map((r) => r.scale), zne);
    const problems = new ProblemList();
    const fits: [string, ObservableMitigation][] = [];
    for (const [p, v] of Object.entries(base.result.observables ?? {})) {
      const points = runs.map((r) => ({ scale: r.scale, value: r.sim.result.observables![p]!.noisy }));
      const bad = fitProblem(points, zne.fit);
      if (bad !== undefined) {
        // Located at the register, as a bad --observe string is.
        problems.error(loaded.circuit.qubitsAt, 'zne-fit', `cannot extrapolate ⟨${p}⟩: ${bad} (values ${points.map((q) => q.value.toPrecision(6)).join(', ')}); choose another --fit`);
        continue;
      }
      const fit = extrapolate(points, zne.fit);
      fits.push([p, { ideal: v.ideal, noisy: v.noisy, mitigated: fit.value, stderr: fit.stderr, points }]);
    }
    problems.throwIfErrors();
    for (const [p, o] of fits) observables[p] = o;
  } else if (dd !== undefined) {
    for (const [p, v] of Object.entries(base.result.observables ?? {})) {
      const value = first.result.observables![p]!.noisy;
      observables[p] = { ideal: v.ideal, noisy: v.noisy, mitigated: value, stderr: null, points: [{ scale: 1, value }] };
    }
  }
  return {
    file: loaded.circuit.file,
    ...(dd !== undefined ? { decoupling: { sequence: options.dd!.sequence, min_idle_ns: options.dd!.minIdle, inserted: dd.inserted, skipped: dd.skipped } } : {}),
    ...(zne !== undefined ? { fit: zne.fit, amplify: 'fold' as const } : {}),
    observables,
    ...(options.readout !== undefined ? { readout: readoutMitigation(base, first, options.readout) } : {}),
    warnings,
  };
}

/** Two requested scales that fold to the same achieved scale cannot both be fitted: an input error at the `steps:` key. */
function refuseUnfittable(loaded: LoadedCircuit, achieved: readonly number[], zne: ZneRecipe): void {
  const problems = new ProblemList();
  const gates = loaded.circuit.operations.filter((op) => op.kind === 'gate').length;
  if (gates === 0) {
    problems.error(loaded.circuit.stepsAt, 'zne-scales', '--zne folds gates, and this circuit has no gate application to fold');
    problems.throwIfErrors();
  }
  for (let i = 0; i < achieved.length; i++) {
    const j = achieved.indexOf(achieved[i]!);
    if (j < i) {
      problems.error(
        loaded.circuit.stepsAt,
        'zne-scales',
        `--zne scales ${zne.scales[j]} and ${zne.scales[i]} both fold to ${achieved[i]} with ${gates} gate application${gates === 1 ? '' : 's'}; choose scales at least ${(2 / gates).toPrecision(3)} apart`,
      );
    }
  }
  if (achieved.length < 2) problems.error(loaded.circuit.stepsAt, 'zne-scales', `--zne needs at least 2 noise scales, got ${achieved.length}`);
  problems.throwIfErrors();
}

/** The readout correction of the mitigated run's measured distribution, against the ideal one and the unmitigated run's. */
function readoutMitigation(base: Simulation, sim: Simulation, method: ReadoutMethod): ReadoutMitigation {
  const { circuit, profile } = sim;
  const n = circuit.register.n;
  const measured = measuredQubits(circuit);
  const m = measured.length;
  const confusion = measured.map((q) => profile.qubits[q]!.readout);
  const pIdeal = marginal(idealDiagonal(sim.ideal), n, measured);
  const pBefore = applyReadout(marginal(diagonalOf(base.rho), n, measured), confusion);
  const pRead = applyReadout(marginal(diagonalOf(sim.rho), n, measured), confusion);
  const pFixed = correctReadout(pRead, confusion, method);
  return {
    method,
    ideal: toOutcomeMap(pIdeal, m, LISTED_OUTCOME_THRESHOLD),
    measured: toOutcomeMap(pBefore, m, LISTED_OUTCOME_THRESHOLD),
    // an inverse can have negative entries: list every outcome whose magnitude is above the cut
    mitigated: signedOutcomeMap(pFixed, m),
    tvd_before: totalVariationDistance(pIdeal, pBefore),
    tvd_after: totalVariationDistance(pIdeal, pFixed),
    classical_before: classicalFidelity(pIdeal, pBefore),
    // classicalFidelity counts an inverse's negative entries as 0
    classical_after: classicalFidelity(pIdeal, pFixed),
  };
}

function signedOutcomeMap(p: Float64Array, m: number): Record<string, number> {
  const out: Record<string, number> = {};
  const all = toOutcomeMap(p.map(Math.abs), m, LISTED_OUTCOME_THRESHOLD);
  for (const key of Object.keys(all)) out[key] = p[parseInt(key === '' ? '0' : key, 2)]!;
  return out;
}

