import type { Circuit, Operation } from '../circuit/circuit.js';
import { fastKernels } from '../engine/fastKernels.js';
import { referenceKernels, type Kernels } from '../engine/kernels.js';
import type { DensityMatrix } from '../engine/layout.js';
import { checkMemory, checkRecordMemory, defaultMemoryLimit, MemoryLimitError } from '../engine/memory.js';
import { MAX_IDEAL_BRANCHES, runIdeal, runNoisy } from '../engine/run.js';
import { kernelFamilyOf, runCompiled, THREADS_MIN_QUBITS } from '../engine/runCompiled.js';
import { fastBranchEngine, referenceBranchEngine, runBranches, runIdealBranches, segments, type BranchEnsemble, type IdealEnsemble } from '../engine/branches.js';
import { maxBranches } from '../engine/recordProgram.js';
import { densityMatrixBytes, stateVectorBytes } from '../engine/layout.js';
import type { ThreadPool } from '../engine/threadPool.js';
import { branchWeights, computeRecordFigures } from '../results/recordFigures.js';
import { defaultThreads, sharedThreadPool } from '../engine/threadPool.js';
import { WARM_MIN_QUBITS, warmKernels } from '../engine/warmKernels.js';
import { kernelFamilyFor, type KernelFamily } from '../engine/wasmKernels.js';
import { buildPlan } from '../plan/buildPlan.js';
import { compilePlan } from '../plan/compilePlan.js';
import type { Plan, PlannedSegment } from '../plan/plan.js';
import { formatDuration, MAX_DURATION_NS } from '../format/duration.js';
import { InputError, ProblemList, warningJson, type Problem, type WarningJson } from '../format/problem.js';
import type { NoiseProfile } from '../noise/profile.js';
import { buildProgram, hasDrift, type Program } from '../program/program.js';
import type { IdealState } from '../results/fidelity.js';
import { computeFigures, DEFAULT_SEED, type Figures } from '../results/report.js';
import { scheduleOperations, type Schedule } from '../schedule/schedule.js';
import { deviceOperations } from '../schedule/deviceOperations.js';
import { warnOffMap } from '../noise/couplingMap.js';
import { warnEntryFallback } from '../noise/entryFallback.js';
import { loadCircuit, type LoadedCircuit, type LoadOptions } from './loadCircuit.js';
import { pauliStringProblem } from '../circuit/pauliString.js';
import type { PauliFrame } from '../noise/twirl.js';
import { explainCommandLine } from '../format/overrides.js';

/** Options of one simulation run. */
export interface SimulateOptions {
  /** Extra Pauli strings to report besides the circuit's `observe:` (qubit 0 leftmost). */
  readonly observe?: readonly string[];
  /** Draw this many shots from the measured distribution. */
  readonly shots?: number;
  /** Seed of the shot sampler (default DEFAULT_SEED). */
  readonly seed?: number;
  /** Refuse to allocate more than this many bytes (default: half the machine's memory). */
  readonly maxMemoryBytes?: number;
  /**
   * 'fast' (default): the noisy run as a fused plan (src/plan/) on the fast kernels;
   * 'reference': instruction by instruction on `kernels` (the plain reference kernels by default).
   */
  readonly engine?: 'fast' | 'reference';
  /** Kernels of the reference engine (giving them selects engine 'reference'). */
  readonly kernels?: Kernels;
  /** Threads that share each pass of the fast engine on large registers (default: os.availableParallelism(); 1 = off). */
  readonly threads?: number;
  /** Fuse instructions into as few passes as possible (default true); false = one general kernel call per instruction. */
  readonly fuse?: boolean;
  /** Gate applications whose noise is Pauli-framed (twirled exactly, or conjugated by a Pauli: src/noise/twirl.ts, src/transforms/twirl.ts). */
  readonly frames?: ReadonlyMap<Operation, PauliFrame>;
  /**
   * Kernels of the fast engine's real-form passes: 'wasm' the WebAssembly SIMD kernels where ρ
   * fits in WebAssembly memory (up to 13 qubits), else the JS ones; 'js' always the JS kernels;
   * by default 'wasm' from 8 qubits on (WASM_MIN_QUBITS). Both give bit-for-bit the same ρ.
   */
  readonly kernelFamily?: KernelFamily;
}

/**
 * What ran the noisy run: 'wasm' = WebAssembly SIMD kernels for the real-form and diagonal passes
 * (the general passes always run in JS), 'js' = JS kernels throughout, 'reference' =
 * the instruction-by-instruction reference engine; and the threads the passes are split over (the
 * first passes of a run may run on the main thread alone while worker threads start; docs/engine.md).
 */
export interface EngineInfo {
  readonly kernels: KernelFamily | 'reference';
  readonly threads: number;
}

/** The JSON object of `fray run --json` (the contract's keys plus a few of fray's own). */
export interface RunResult {
  readonly name: string | null;
  readonly file: string;
  readonly device: string | null;
  readonly qubits: number;
  readonly labels?: readonly string[];
  readonly measured: readonly number[];
  readonly measured_labels?: readonly string[];
  /** Record mode: the record's bit names in order (character i of a probabilities key is bit i). */
  readonly bits?: readonly string[];
  /** Device qubit of each circuit qubit, when the run was placed with a layout. */
  readonly layout?: readonly number[];
  /** The uniform noise scale C, when not 1. */
  readonly noise_scale?: number;
  readonly schedule: 'asap' | 'alap';
  readonly duration_ns: number;
  readonly probabilities: Figures['probabilities'];
  readonly fidelity: Figures['fidelity'];
  readonly tvd: number;
  readonly purity: number;
  readonly bloch: Figures['bloch'];
  readonly observables?: Figures['observables'];
  readonly shots?: number;
  readonly seed?: number;
  readonly counts?: Figures['counts'];
  /** Which kernels ran and on how many threads (EngineInfo). */
  readonly engine: EngineInfo;
  /** Each distinct warning once, with how often it arose. */
  readonly warnings: readonly WarningJson[];
}

/** Everything one run produced: the stages' data and the result object. */
export interface Simulation {
  readonly circuit: Circuit;
  readonly profile: NoiseProfile;
  readonly schedule: Schedule;
  readonly program: Program;
  /** The plan the fast engine ran (absent on the reference engine). */
  readonly plan?: Plan;
  /** The final noisy state (record mode: Σ_r ρ_r, the record discarded). */
  readonly rho: DensityMatrix;
  /** The final ideal state (record mode: Σ_r σ_r). */
  readonly ideal: IdealState;
  /** Record mode: the branches of the run with every noise source (readout error included) and of the ideal run. */
  readonly branches?: { readonly noisy: BranchEnsemble; readonly ideal: IdealEnsemble };
  readonly result: RunResult;
  readonly warnings: readonly Problem[];
}

/** The scheduled duration (ns) of one application under a profile: its gate entry's, the reset's or measurement's, an idle step's own. */
export function operationDuration(profile: NoiseProfile): (op: Operation) => number {
  return (op: Operation): number => {
    switch (op.kind) {
      case 'gate':
        return profile.gateEntry(op.name, op.qubits).duration;
      case 'reset':
        return profile.reset.duration;
      case 'measure':
        return profile.measureDuration;
      case 'idle':
        return op.duration;
      default:
        return 0;
    }
  };
}

/** Schedules a loaded circuit with its profile's policy, durations and readout timing (split composites as their parts). */
export function scheduleCircuit(circuit: Circuit, profile: NoiseProfile): Schedule {
  return scheduleOperations(deviceOperations(circuit.operations, profile), circuit.register.n, operationDuration(profile), profile.schedule, {
    simultaneousMeasure: profile.simultaneousMeasure,
    latency: profile.measureLatency,
  });
}

/** Measured qubits, ascending: those named by `measure` steps, or all qubits when there is none; none in record mode. */
export function measuredQubits(circuit: Circuit): number[] {
  if (circuit.bits !== null) return [];
  const qs = new Set<number>();
  for (const op of circuit.operations) if (op.kind === 'measure') qs.add(op.qubits[0]!);
  if (qs.size === 0) return Array.from({ length: circuit.register.n }, (_, i) => i);
  return [...qs].sort((a, b) => a - b);
}

/** A planned run: the stages up to the plan, before anything large is allocated. */
export interface PlannedRun {
  readonly schedule: Schedule;
  readonly program: Program;
  /** The plan of the noisy run (record mode: of its instructions outside any segment, i.e. empty; see `segments`). */
  readonly plan: Plan;
  /** The kernel family the real-form passes would run on (SimulateOptions.kernelFamily, where it can run). */
  readonly kernels: KernelFamily;
  /** Record mode: the noisy run's segments in order, each run of instructions with its own plan. */
  readonly segments?: readonly PlannedSegment[];
  /** Record mode: the record's bit names in order. */
  readonly bits?: readonly string[];
  readonly problems: ProblemList;
}

/**
 * Whether the ideal run can stay on state vectors: each reset at most doubles the rank of σ,
 * which is also at most 2^n, and runIdeal keeps up to MAX_IDEAL_BRANCHES vectors (a few MiB,
 * inside the estimate's overhead) before it needs a density matrix.
 */
function idealStaysOnVectors(program: Program): boolean {
  const resets = program.ideal.filter((ins) => ins.op === 'reset').length;
  return Math.min(resets, program.n) <= Math.log2(MAX_IDEAL_BRANCHES);
}

/** True when the options select the reference engine (engine 'reference' or explicit kernels). */
function usesReference(options: SimulateOptions): boolean {
  return options.engine === 'reference' || options.kernels !== undefined;
}

/** Schedules and builds the program of a loaded circuit; throws InputError on bad input. */
function prepare(loaded: LoadedCircuit, options: SimulateOptions): { schedule: Schedule; program: Program; problems: ProblemList } {
  const { circuit, profile } = loaded;
  const problems = new ProblemList();
  for (const w of loaded.warnings) problems.add(w);
  const n = circuit.register.n;
  for (const p of options.observe ?? []) {
    const bad = pauliStringProblem(p, n);
    // Located at the register the string must match.
    if (bad !== undefined) problems.error(circuit.qubitsAt, 'bad-pauli', `--observe ${p}: ${bad}`);
  }
  const schedule = scheduleCircuit(circuit, profile);
  const overrun = schedule.items.find((it) => !(it.end <= MAX_DURATION_NS));
  if (overrun !== undefined) {
    problems.error(overrun.op.at, 'too-long', `step ${overrun.op.step + 1} ends after ${formatDuration(overrun.end)}; a circuit may last at most ${formatDuration(MAX_DURATION_NS)}`);
    problems.throwIfErrors();
  }
  const ops = schedule.items.map((it) => it.op);
  warnEntryFallback(ops, circuit, profile, problems);
  warnOffMap(schedule, profile.couplings, circuit.register, problems);
  const program = buildProgram(circuit, profile, schedule, problems, options.frames !== undefined ? { frames: options.frames } : {});
  // Problems at positions on the command line name the --set they came from.
  if (loaded.overrideTexts !== undefined) problems.items.splice(0, problems.items.length, ...explainCommandLine(problems.items, loaded.overrideTexts));
  if (loaded.noiseScale !== undefined) {
    // An `error:` the scale pushed out of reach is the scale's doing: say so.
    problems.items.forEach((p, i) => {
      if (p.code === 'error-unreachable') problems.items[i] = { ...p, message: `--noise-scale ${loaded.noiseScale}: ${p.message}` };
    });
  }
  problems.throwIfErrors();
  return { schedule, program, problems };
}

/** The plan of kernel calls the fast engine would run for a loaded circuit (nothing is simulated). Throws InputError on bad input. */
export function planLoaded(loaded: LoadedCircuit, options: SimulateOptions = {}): PlannedRun {
  const { schedule, program, problems } = prepare(loaded, options);
  const planOptions = { fuse: options.fuse !== false, keepDiagonal: hasDrift(loaded.profile) };
  const plan = buildPlan(program.n, program.noisy, planOptions);
  const kernels = kernelFamilyFor(program.n, options.kernelFamily);
  if (program.record === null) return { schedule, program, plan, kernels, problems };
  const planned = segments(program.record.noisy).map((seg): PlannedSegment =>
    seg.kind === 'measure'
      ? { kind: 'measure', qubit: seg.qubit, bit: seg.bit }
      : { kind: 'apply', ...(seg.when !== undefined ? { when: seg.when } : {}), plan: buildPlan(program.n, seg.instructions, planOptions), origins: seg.origins },
  );
  return { schedule, program, plan, kernels, segments: planned, bits: loaded.circuit.bits ?? [], problems };
}

/** Reads a circuit file and returns its plan (`fray run --plan`). Throws InputError on bad input. */
export function planFile(path: string, options: SimulateOptions & LoadOptions = {}): PlannedRun {
  return planLoaded(loadCircuit(path, options), options);
}

/** Runs a loaded circuit: schedule, program, memory check, noisy and ideal runs, figures. Throws InputError on bad input. */
export function simulateLoaded(loaded: LoadedCircuit, options: SimulateOptions = {}): Simulation {
  const { circuit, profile } = loaded;
  const n = circuit.register.n;
  const extraObserve = options.observe ?? [];
  const fast = !usesReference(options);
  const threads = options.threads ?? defaultThreads();
  if (fast && (!Number.isInteger(threads) || threads < 1)) throw new RangeError(`simulate: threads must be a whole number ≥ 1, not ${threads}`);
  // start the workers first: they boot and warm up while this thread schedules, plans and warms its own kernels
  const family = kernelFamilyFor(n, options.kernelFamily);
  const pool = fast && threads > 1 && n >= THREADS_MIN_QUBITS ? sharedThreadPool(threads, family === 'js') : undefined;
  // the WebAssembly kernels need no JIT warm-up; the JS ones do
  if (fast && family === 'js' && n >= WARM_MIN_QUBITS) warmKernels();
  const { schedule, program, problems } = prepare(loaded, options);
  if (program.record !== null) return simulateRecord(loaded, options, schedule, program, problems, fast ? pool : undefined, fast);
  refuseOverMemory(circuit, problems, () => checkMemory(n, idealStaysOnVectors(program), options.maxMemoryBytes ?? defaultMemoryLimit()));
  let rho: DensityMatrix;
  let plan: Plan | undefined;
  let ideal: IdealState;
  let engine: EngineInfo;
  if (!fast) {
    engine = { kernels: 'reference', threads: 1 };
    const kernels = options.kernels ?? referenceKernels;
    rho = runNoisy(n, program.noisy, kernels);
    ideal = runIdeal(n, program.ideal, kernels);
  } else {
    plan = buildPlan(n, program.noisy, { fuse: options.fuse !== false, keepDiagonal: hasDrift(profile) });
    rho = runCompiled(compilePlan(plan), pool, THREADS_MIN_QUBITS, family);
    engine = { kernels: kernelFamilyOf(rho), threads: pool !== undefined ? pool.splitThreads : 1 };
    ideal = runIdeal(n, program.ideal, fastKernels);
  }
  const measured = measuredQubits(circuit);
  const observe = [...new Set([...circuit.observe.map((o) => o.value), ...extraObserve])];
  const figures = computeFigures(rho, ideal, {
    n,
    measured,
    readout: measured.map((q) => profile.qubits[q]!.readout),
    observe,
    ...(options.shots !== undefined ? { shots: options.shots, seed: options.seed ?? DEFAULT_SEED } : {}),
  });
  const result = runResult(loaded, schedule, figures, measured, null, options, problems, engine);
  return { circuit, profile, schedule, program, ...(plan !== undefined ? { plan } : {}), rho, ideal, result, warnings: problems.warnings };
}

/** Record mode (format version 2, part B): the branch ensembles of the noisy, readout-free and ideal runs, and their figures. */
function simulateRecord(
  loaded: LoadedCircuit,
  options: SimulateOptions,
  schedule: Schedule,
  program: Program,
  problems: ProblemList,
  pool: ThreadPool | undefined,
  fast: boolean,
): Simulation {
  const { circuit, profile } = loaded;
  const n = circuit.register.n;
  const record = program.record!;
  const bits = circuit.bits!;
  const branchCount = maxBranches(record.noisy);
  // an ideal record keeps at most MAX_IDEAL_BRANCHES state vectors before it becomes a density matrix
  const idealPerBranch = Math.min(densityMatrixBytes(n), MAX_IDEAL_BRANCHES * stateVectorBytes(n));
  refuseOverMemory(circuit, problems, () => checkRecordMemory(n, branchCount, idealPerBranch, options.maxMemoryBytes ?? defaultMemoryLimit()));
  const engine = fast ? fastBranchEngine({ fuse: options.fuse !== false, keepDiagonal: hasDrift(profile) }, pool) : referenceBranchEngine(options.kernels ?? referenceKernels);
  const hasReadout = record.noisy.some((ins) => ins.kind === 'measure' && (ins.zeroAsOne !== 0 || ins.oneAsZero !== 0));
  // the readout-free run only feeds probabilities.noisy: keep its weights, free its branches
  const withoutReadout = hasReadout ? branchWeights(runBranches(n, bits.length, record.noisy, engine, { readout: false })) : undefined;
  const noisy = runBranches(n, bits.length, record.noisy, engine);
  const idealBranches = runIdealBranches(n, bits.length, record.ideal, fast ? fastKernels : (options.kernels ?? referenceKernels));
  const observe = [...new Set([...circuit.observe.map((o) => o.value), ...(options.observe ?? [])])];
  const { figures, rho, ideal } = computeRecordFigures(noisy, withoutReadout ?? branchWeights(noisy), idealBranches, {
    n,
    bits: bits.length,
    observe,
    ...(options.shots !== undefined ? { shots: options.shots, seed: options.seed ?? DEFAULT_SEED } : {}),
  });
  const engineInfo: EngineInfo = fast ? { kernels: 'js', threads: pool !== undefined && n >= THREADS_MIN_QUBITS ? pool.splitThreads : 1 } : { kernels: 'reference', threads: 1 };
  const result = runResult(loaded, schedule, figures, [], bits, options, problems, engineInfo);
  return { circuit, profile, schedule, program, rho, ideal, branches: { noisy, ideal: idealBranches }, result, warnings: problems.warnings };
}

/** The JSON object of a run; `bits` (record mode) adds the record's bit names after `measured`. */
function runResult(
  loaded: LoadedCircuit,
  schedule: Schedule,
  figures: Figures,
  measured: readonly number[],
  bits: readonly string[] | null,
  options: SimulateOptions,
  problems: ProblemList,
  engine: EngineInfo,
): RunResult {
  const { circuit, profile } = loaded;
  const labels = circuit.register.labels;
  return {
    name: circuit.name,
    file: circuit.file,
    device: profile.name,
    qubits: circuit.register.n,
    ...(labels !== null ? { labels } : {}),
    measured,
    ...(labels !== null ? { measured_labels: measured.map((q) => labels[q]!) } : {}),
    ...(bits !== null ? { bits } : {}),
    ...(loaded.layout !== undefined ? { layout: loaded.layout } : {}),
    ...(loaded.noiseScale !== undefined ? { noise_scale: loaded.noiseScale } : {}),
    schedule: schedule.policy,
    duration_ns: schedule.duration,
    probabilities: figures.probabilities,
    fidelity: figures.fidelity,
    tvd: figures.tvd,
    purity: figures.purity,
    bloch: figures.bloch,
    ...(figures.observables !== undefined ? { observables: figures.observables } : {}),
    ...(options.shots !== undefined ? { shots: options.shots, seed: options.seed ?? DEFAULT_SEED, counts: figures.counts } : {}),
    engine,
    warnings: problems.warnings.map(warningJson),
  };
}

/** Runs `check` (a memory estimate); a MemoryLimitError becomes an input error located at the register. */
function refuseOverMemory(circuit: Circuit, problems: ProblemList, check: () => void): void {
  try {
    check();
  } catch (e) {
    if (e instanceof MemoryLimitError) {
      problems.error(circuit.qubitsAt, 'memory-limit', e.message);
      problems.throwIfErrors();
    }
    throw e;
  }
}

/** Reads, validates and runs a circuit file (the one easy call). Throws InputError on bad input. */
export function simulate(path: string, options: SimulateOptions & LoadOptions = {}): Simulation {
  return simulateLoaded(loadCircuit(path, options), options);
}

export { InputError };
