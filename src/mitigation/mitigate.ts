/**
 * One mitigation run on a loaded circuit, in this order: dynamical decoupling inserted into
 * the idle windows (src/transforms/decouple.ts), Pauli twirling of the 2-qubit Clifford gates
 * (exact, or averaged over seeded instances: src/transforms/twirl.ts), zero-noise extrapolation
 * of the requested Pauli observables with the noise amplified by the uniform noise scale
 * (src/noise/scale.ts) or by unitary folding (src/transforms/fold.ts), fits in
 * ./extrapolate.ts, and readout correction of the measured distribution
 * (./readoutCorrection.ts). Each figure is compared with the ideal answer, which a simulator
 * knows exactly, and with the run as it is. Every noisy run goes through the same
 * `simulateLoaded` as `fray run`; the transforms change the circuit, never the YAML.
 */
import { simulateLoaded, measuredQubits, type SimulateOptions } from '../api/simulate.js';
import type { LoadedCircuit } from '../api/loadCircuit.js';
import type { Circuit } from '../circuit/circuit.js';
import { ProblemList, warningJson, warningText } from '../format/problem.js';
import { foldCircuit, type FoldOrder } from '../transforms/fold.js';
import { scaleNoise } from '../noise/scale.js';
import type { NoiseProfile } from '../noise/profile.js';
import { insertDecoupling, type DecouplingInsertion, type DecouplingOptions, type DecouplingSequence, type DecouplingSkip } from '../transforms/decouple.js';
import { twirlFrames, twirlSampler, type TwirlMode } from '../transforms/twirl.js';
import { extrapolate, fitProblem, type FitKind, type ScalePoint } from './extrapolate.js';
import { correctReadout, type ReadoutMethod } from './readoutCorrection.js';
import { applyReadout, diagonalOf, marginal, toOutcomeMap } from '../results/probabilities.js';
import { idealDiagonal } from '../results/idealFigures.js';
import { clampUnit } from '../results/clamp.js';
import { classicalFidelity, totalVariationDistance } from '../results/fidelity.js';
import { LISTED_OUTCOME_THRESHOLD } from '../results/report.js';

/** How ZNE amplifies the noise: by the uniform noise scale (src/noise/scale.ts; exact in a simulator) or by unitary folding (what a device can run). */
export type Amplification = 'scale' | 'fold';

/** Zero-noise extrapolation: the requested scales (λ ≥ 1; distinct after folding), the fit, the amplification (default 'scale'), and for folding which gates fold first. */
export interface ZneRecipe {
  readonly scales: readonly number[];
  readonly fit: FitKind;
  readonly amplify?: Amplification;
  readonly order?: FoldOrder;
  readonly seed?: number;
}

/** Pauli twirling: the exact twirl (instances absent), or the average of this many seeded instances. */
export interface TwirlRecipe {
  readonly instances?: number;
  readonly seed?: number;
}

/** Default seed of sampled twirl instances, so that runs repeat. */
export const DEFAULT_TWIRL_SEED = 1;

/** What to mitigate and how. */
export interface MitigateOptions {
  /** Pauli strings to extrapolate (qubit 0 leftmost), besides the circuit's `observe:`. */
  readonly observe?: readonly string[];
  readonly zne?: ZneRecipe;
  readonly readout?: ReadoutMethod;
  /** Dynamical decoupling inserted before anything else. */
  readonly dd?: DecouplingOptions;
  readonly twirl?: TwirlRecipe;
  /** Engine options passed to every run (threads, engine, memory limit). */
  readonly run?: Omit<SimulateOptions, 'observe' | 'shots' | 'seed' | 'frames'>;
}

/** One observable: ideal ⟨P⟩, noisy ⟨P⟩ of the circuit as it is, the mitigated value, the fit's standard error, and the value at each achieved scale. */
export interface ObservableMitigation {
  readonly ideal: number;
  readonly noisy: number;
  readonly mitigated: number;
  readonly stderr: number | null;
  readonly points: readonly ScalePoint[];
}

/** Readout correction of the mitigated scale-1 run: distributions over the measured bitstrings and their distance to the ideal before (the circuit as it is) and after. */
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
  /** Twirling: exact, or the number of averaged instances and their seed; how many gate applications of the unfolded circuit were twirled. */
  readonly twirl?: { readonly mode: 'exact' | 'sampled'; readonly instances?: number; readonly seed?: number; readonly gates: number };
  readonly fit?: FitKind;
  readonly amplify?: Amplification;
  readonly observables: Record<string, ObservableMitigation>;
  readonly readout?: ReadoutMitigation;
  /** The measured distribution's distance to the ideal one: the circuit as it is, and as mitigated (readout corrected when asked). */
  readonly distribution: { readonly tvd_before: number; readonly tvd_after: number; readonly classical_before: number; readonly classical_after: number };
  readonly warnings: readonly string[];
}

/** What one (possibly averaged) run yields for mitigation: ⟨P⟩ per observable and the measured distribution before readout error. */
interface RunFigures {
  readonly values: Record<string, number>;
  readonly trueOutcomes: Float64Array;
}

/** Runs the circuit as it is and as mitigated (see the module comment). Throws InputError on bad input. */
export function mitigate(loaded: LoadedCircuit, options: MitigateOptions): MitigationResult {
  if (options.readout !== undefined && loaded.circuit.bits !== null) {
    // record mode: readout error acts on the record's bits, not on the final state's outcomes
    const problems = new ProblemList();
    problems.error(loaded.circuit.stepsAt, 'readout-record-mode', 'readout correction works on circuits without a classical record (no measure … into:); this circuit keeps a record');
    problems.throwIfErrors();
  }
  const runOptions: SimulateOptions = { ...(options.run ?? {}), observe: options.observe ?? [] };
  const base = simulateLoaded(loaded, runOptions);
  const warnings: string[] = base.result.warnings.map(warningText);
  const measured = measuredQubits(loaded.circuit);
  const n = loaded.circuit.register.n;
  const dd = options.dd === undefined ? undefined : insertDecoupling(loaded.circuit, loaded.profile, options.dd);
  const prepared = dd === undefined ? loaded.circuit : dd.circuit;
  const tw = options.twirl;
  const figuresOf = (circuit: Circuit, profile: NoiseProfile = loaded.profile): RunFigures => {
    const modes: TwirlMode[] = [];
    // no twirl runs once without frames (`framed` below stays undefined)
    if (tw === undefined || tw.instances === undefined) modes.push({ kind: 'exact' });
    else {
      const next = twirlSampler(tw.seed ?? DEFAULT_TWIRL_SEED);
      for (let i = 0; i < tw.instances; i++) modes.push({ kind: 'sample', next });
    }
    const values: Record<string, number> = {};
    const trueOutcomes = new Float64Array(1 << measured.length);
    for (const mode of modes) {
      const framed = tw === undefined ? undefined : twirlFrames(circuit, profile, mode);
      for (const w of framed?.warnings ?? []) if (!warnings.includes(w)) warnings.push(w);
      const sim = simulateLoaded({ ...loaded, circuit, profile }, { ...runOptions, ...(framed !== undefined ? { frames: framed.frames } : {}) });
      for (const [p, v] of Object.entries(sim.result.observables ?? {})) values[p] = (values[p] ?? 0) + v.noisy / modes.length;
      const p = marginal(diagonalOf(sim.rho), n, measured);
      for (let k = 0; k < p.length; k++) trueOutcomes[k] += p[k]! / modes.length;
    }
    return { values, trueOutcomes };
  };
  const unchanged = dd === undefined && tw === undefined;
  const first: RunFigures = unchanged
    ? { values: Object.fromEntries(Object.entries(base.result.observables ?? {}).map(([p, v]) => [p, v.noisy])), trueOutcomes: marginal(diagonalOf(base.rho), n, measured) }
    : figuresOf(prepared);

  const observables: Record<string, ObservableMitigation> = {};
  const zne = options.zne;
  const baseObs = Object.entries(base.result.observables ?? {});
  if (zne !== undefined) {
    const runs: { scale: number; figures: RunFigures }[] = [];
    if ((zne.amplify ?? 'scale') === 'scale') {
      for (const c of zne.scales) {
        if (c === 1) {
          runs.push({ scale: 1, figures: first });
          continue;
        }
        const problems = new ProblemList();
        const scaled = scaleNoise(prepared, loaded.profile, c, problems);
        // the scale's range errors name `--noise-scale C`; here the scale is one of --zne's
        problems.items.forEach((p, i) => (problems.items[i] = { ...p, message: p.message.replace(/^--noise-scale /, '--zne scale ') }));
        problems.throwIfErrors();
        for (const w of problems.warnings) {
          const text = warningText(warningJson(w));
          if (!warnings.includes(text)) warnings.push(text);
        }
        runs.push({ scale: c, figures: figuresOf(scaled.circuit, scaled.profile) });
      }
    } else {
      for (const requested of zne.scales) {
        const folded = foldCircuit(prepared, { scale: requested, ...(zne.order !== undefined ? { order: zne.order } : {}), ...(zne.seed !== undefined ? { seed: zne.seed } : {}) });
        runs.push({ scale: folded.scale, figures: folded.scale === 1 ? first : figuresOf(folded.circuit) });
      }
      refuseUnfittable(loaded, prepared, runs.map((r) => r.scale), zne);
    }
    const problems = new ProblemList();
    for (const [p, v] of baseObs) {
      const points = runs.map((r) => ({ scale: r.scale, value: r.figures.values[p]! }));
      const bad = fitProblem(points, zne.fit);
      if (bad !== undefined) {
        // Located at the register, as a bad --observe string is.
        problems.error(loaded.circuit.qubitsAt, 'zne-fit', `cannot extrapolate ⟨${p}⟩: ${bad} (values ${points.map((q) => q.value.toPrecision(6)).join(', ')}); choose another --fit`);
        continue;
      }
      const fit = extrapolate(points, zne.fit);
      observables[p] = { ideal: v.ideal, noisy: v.noisy, mitigated: fit.value, stderr: fit.stderr, points };
    }
    problems.throwIfErrors();
  } else if (!unchanged) {
    for (const [p, v] of baseObs) {
      const value = first.values[p]!;
      observables[p] = { ideal: v.ideal, noisy: v.noisy, mitigated: value, stderr: null, points: [{ scale: 1, value }] };
    }
  }

  // gate applications twirled in the circuit as run at scale 1 (folding adds more)
  const twirled = tw === undefined ? 0 : twirlFrames(prepared, loaded.profile, { kind: 'exact' }).twirled;
  const confusion = measured.map((q) => loaded.profile.qubits[q]!.readout);
  const pIdeal = marginal(idealDiagonal(base.ideal), n, measured);
  const pBefore = applyReadout(marginal(diagonalOf(base.rho), n, measured), confusion);
  const pRead = applyReadout(first.trueOutcomes, confusion);
  const pAfter = options.readout === undefined ? pRead : correctReadout(pRead, confusion, options.readout);
  return {
    file: loaded.circuit.file,
    ...(dd !== undefined ? { decoupling: { sequence: options.dd!.sequence, min_idle_ns: options.dd!.minIdle, inserted: dd.inserted, skipped: dd.skipped } } : {}),
    ...(tw !== undefined
      ? { twirl: tw.instances === undefined ? { mode: 'exact' as const, gates: twirled } : { mode: 'sampled' as const, instances: tw.instances, seed: tw.seed ?? DEFAULT_TWIRL_SEED, gates: twirled } }
      : {}),
    ...(zne !== undefined ? { fit: zne.fit, amplify: zne.amplify ?? 'scale' } : {}),
    observables,
    ...(options.readout !== undefined
      ? { readout: readoutMitigation(pIdeal, pBefore, pRead, confusion, options.readout, measured.length) }
      : {}),
    distribution: distributionDistances(pIdeal, pBefore, pAfter, options.readout),
    warnings,
  };
}

/** Two requested scales that fold to the same achieved scale cannot both be fitted: an input error at the `steps:` key. */
function refuseUnfittable(loaded: LoadedCircuit, prepared: Circuit, achieved: readonly number[], zne: ZneRecipe): void {
  const problems = new ProblemList();
  const gates = prepared.operations.filter((op) => op.kind === 'gate').length;
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

/** The readout correction of the mitigated run's read distribution, against the ideal one and the unmitigated run's. */
function readoutMitigation(
  pIdeal: Float64Array,
  pBefore: Float64Array,
  pRead: Float64Array,
  confusion: Parameters<typeof correctReadout>[1],
  method: ReadoutMethod,
  m: number,
): ReadoutMitigation {
  const pFixed = correctReadout(pRead, confusion, method);
  return {
    method,
    ideal: toOutcomeMap(pIdeal.map(clampUnit), m, LISTED_OUTCOME_THRESHOLD),
    measured: toOutcomeMap(pBefore.map(clampUnit), m, LISTED_OUTCOME_THRESHOLD),
    // an inverse can have negative entries: list every outcome whose magnitude is above the cut
    mitigated: signedOutcomeMap(pFixed, m),
    ...distributionDistances(pIdeal, pBefore, pFixed, method),
  };
}

/**
 * TVD and classical fidelity of the measured distribution to the ideal one, before and after
 * mitigation. Both lie in [0, 1] for true distributions, so they go through the one clamp of
 * src/results/clamp.ts. After `inverse` readout correction they do not: the corrected
 * quasi-distribution may have negative entries (the method's nature, not rounding), so its
 * TVD can exceed 1 and its classical fidelity (negative entries counted as 0) too; those two
 * are reported as computed, and so are the corrected entries themselves.
 */
export function distributionDistances(pIdeal: Float64Array, pBefore: Float64Array, pAfter: Float64Array, method: ReadoutMethod | undefined) {
  const after = method === 'inverse' ? (x: number) => x : clampUnit;
  return {
    tvd_before: clampUnit(totalVariationDistance(pIdeal, pBefore)),
    tvd_after: after(totalVariationDistance(pIdeal, pAfter)),
    classical_before: clampUnit(classicalFidelity(pIdeal, pBefore)),
    classical_after: after(classicalFidelity(pIdeal, pAfter)),
  };
}

function signedOutcomeMap(p: Float64Array, m: number): Record<string, number> {
  const out: Record<string, number> = {};
  const all = toOutcomeMap(p.map(Math.abs), m, LISTED_OUTCOME_THRESHOLD);
  for (const key of Object.keys(all)) out[key] = p[parseInt(key === '' ? '0' : key, 2)]!;
  return out;
}
