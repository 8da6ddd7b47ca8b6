import { instantiateOrThrow, readCircuitSource, type CircuitSource, type LoadOptions } from '../api/loadCircuit.js';
import { simulateLoaded, type Simulation } from '../api/simulate.js';
import type { Circuit } from '../circuit/circuit.js';
import type { Override } from '../format/overrides.js';
import { ProblemList } from '../format/problem.js';
import { metricName, metricProblem, type Metric } from './metrics.js';

/**
 * The one door from a study to the run path: a variant is a parsed circuit source plus a
 * choice of overrides, noise scale and layout; running it types the source for that choice
 * (no YAML parsing) and calls simulateLoaded, so every figure equals `fray run … --json`.
 */

/** What changes between variants or sweep points: overrides, the noise scale, the placement. */
export interface VariantChoice {
  /** `--set` overrides in order (later ones win). */
  readonly set?: readonly Override[];
  readonly noiseScale?: number;
  readonly layout?: readonly number[];
}

/** What every study starts from: a circuit file, optionally another device, fixed overrides, scale and placement. */
export interface StudyTarget {
  readonly file: string;
  /** A device profile replacing the circuit's own. */
  readonly device?: string;
  /** Fixed `--set` overrides (a study's own values come after them and win). */
  readonly set?: readonly Override[];
  readonly noiseScale?: number;
  readonly layout?: readonly number[];
}

/** Settings of every run of a study. */
export interface StudyRunSettings {
  /** Extra Pauli strings every run reports (what observable metrics need). */
  readonly observe?: readonly string[];
  /** Threads of each run's engine (studies default to 1: they parallelise over points). */
  readonly threads?: number;
}

/** Parsed sources by circuit path and device, so each file is parsed once per process. */
export class SourceCache {
  private readonly sources = new Map<string, CircuitSource>();

  /** The parsed circuit (and device) — read from disk the first time only. Throws InputError. */
  get(file: string, device?: string): CircuitSource {
    const key = JSON.stringify([file, device ?? null]);
    let s = this.sources.get(key);
    if (s === undefined) {
      s = readCircuitSource(file, device !== undefined ? { device } : {});
      this.sources.set(key, s);
    }
    return s;
  }
}

/** The LoadOptions of a choice. */
export function loadOptionsOf(choice: VariantChoice): LoadOptions {
  return {
    ...(choice.set !== undefined && choice.set.length > 0 ? { set: choice.set } : {}),
    ...(choice.noiseScale !== undefined ? { noiseScale: choice.noiseScale } : {}),
    ...(choice.layout !== undefined ? { layout: choice.layout } : {}),
  };
}

/**
 * Runs one variant of a parsed source. `metrics` that do not apply to the circuit (an
 * observable of the wrong length) are input errors located at its register. Throws InputError.
 */
export function runVariant(source: CircuitSource, choice: VariantChoice, settings: StudyRunSettings = {}, metrics: readonly Metric[] = []): Simulation {
  const loaded = instantiateOrThrow(source, loadOptionsOf(choice));
  const problems = new ProblemList();
  for (const m of metrics) {
    const bad = metricProblem(m, loaded.circuit.register.n);
    if (bad !== undefined) problems.error(loaded.circuit.qubitsAt, 'bad-metric', `${metricName(m)}: ${bad}`);
  }
  problems.throwIfErrors();
  return simulateLoaded(loaded, { observe: settings.observe ?? [], threads: settings.threads ?? 1 });
}

/** Operation counts of a circuit: gates on one qubit, gates on two or more, measurements, resets. */
export interface OperationCounts {
  readonly one_qubit_gates: number;
  readonly two_qubit_gates: number;
  readonly measurements: number;
  readonly resets: number;
}

/** Counts a circuit's operations (a composite custom gate counts once, by its own arity). */
export function countOperations(circuit: Circuit): OperationCounts {
  let one = 0;
  let two = 0;
  let m = 0;
  let r = 0;
  for (const op of circuit.operations) {
    if (op.kind === 'gate') {
      if (op.qubits.length === 1) one++;
      else two++;
    } else if (op.kind === 'measure') m++;
    else if (op.kind === 'reset') r++;
  }
  return { one_qubit_gates: one, two_qubit_gates: two, measurements: m, resets: r };
}
