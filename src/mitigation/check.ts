/**
 * Expectations that CI can gate on: the `expect:` conditions of circuit files, in the one
 * condition language of `--require` (src/studies/conditions.ts: `METRIC OP NUMBER`), extended
 * with `mitigated.` figures — `mitigated.observable:P` (|⟨P⟩mitigated − ⟨P⟩ideal|),
 * `mitigated.tvd` and `mitigated.classical` (of the mitigated, readout-corrected distribution)
 * — computed by running the file's `mitigation:` recipe. A baseline stores every figure of a
 * run; checking against it flags every figure that moved by more than a tolerance.
 */
import { loadCircuit, type LoadedCircuit, type LoadOptions } from '../api/loadCircuit.js';
import { simulateLoaded } from '../api/simulate.js';
import { ProblemList, type SourcePosition } from '../format/problem.js';
import { parseCondition, compareWith, type Condition } from '../studies/conditions.js';
import { metricName, metricProblem, metricValue, METRIC_NAMES, type Metric } from '../studies/metrics.js';
import { mitigate } from './mitigate.js';
import { recipeOptions } from './recipe.js';

/** The prefix of figures taken after mitigation. */
export const MITIGATED_PREFIX = 'mitigated.';

/** Default largest move of a figure from its baseline that still passes (absolute; results are exact to rounding). */
export const DEFAULT_BASELINE_TOLERANCE = 1e-9;

/** One parsed expectation: the condition, whether it reads the mitigated figure, and where it is written. */
export interface Expectation {
  readonly text: string;
  readonly at: SourcePosition;
  readonly mitigated: boolean;
  readonly condition: Condition;
}

/** One expectation's outcome: its text, location (FILE:LINE:COL), the figure's value and whether it holds. */
export interface ExpectationOutcome {
  readonly expectation: string;
  readonly at: string;
  readonly value: number;
  readonly pass: boolean;
}

/** A figure compared with its baseline (null value: the figure is no longer produced). */
export interface BaselineDrift {
  readonly figure: string;
  readonly baseline: number;
  readonly value: number | null;
  readonly pass: boolean;
}

/** One file's check: 'no-expectations' when it has no `expect:` (and no baseline entry), which is not a pass. */
export interface FileCheck {
  readonly file: string;
  readonly status: 'pass' | 'fail' | 'no-expectations';
  readonly expectations: readonly ExpectationOutcome[];
  /** Every figure of the run (and, with a `mitigation:` block, of the mitigated run), by name. */
  readonly figures: Record<string, number>;
  readonly baseline?: readonly BaselineDrift[];
}

/** The result of `check` (the JSON object of `fray check --json`). */
export interface CheckResult {
  readonly files: readonly FileCheck[];
  /** True when every file passed (a file without expectations does not pass). */
  readonly passed: boolean;
}

/** Stored figures per file (the file of `fray check --write-baseline`). */
export interface Baseline {
  readonly fray_baseline: 1;
  readonly files: Record<string, Record<string, number>>;
}

/** Options of `check`. */
export interface CheckOptions {
  readonly load?: LoadOptions;
  readonly baseline?: Baseline;
  readonly tolerance?: number;
}

/** The mitigated metrics a condition may name after `mitigated.`. */
const MITIGATED_KINDS: readonly Metric['kind'][] = ['observable', 'tvd', 'classical'];

/** Parses a circuit's `expect:` entries; problems are located at each entry. */
export function parseExpectations(loaded: LoadedCircuit, problems: ProblemList): Expectation[] {
  const out: Expectation[] = [];
  const hasRecipe = loaded.circuit.mitigation !== undefined;
  for (const e of loaded.circuit.expect ?? []) {
    const raw = e.value.trim();
    const mitigated = raw.startsWith(MITIGATED_PREFIX);
    const c = parseCondition(mitigated ? raw.slice(MITIGATED_PREFIX.length) : raw);
    if ('error' in c) {
      problems.error(e.at, 'bad-expectation', `expect: ${c.error}${mitigated ? '' : `; a mitigated figure is written ${MITIGATED_PREFIX}METRIC`}`);
      continue;
    }
    const bad = metricProblem(c.metric, loaded.circuit.register.n);
    if (bad !== undefined) {
      problems.error(e.at, 'bad-expectation', `expect: '${raw}': ${bad}`);
      continue;
    }
    if (mitigated && !MITIGATED_KINDS.includes(c.metric.kind)) {
      problems.error(e.at, 'bad-expectation', `expect: '${raw}': mitigation changes ${MITIGATED_KINDS.map((k) => (k === 'observable' ? 'observable:P' : k)).join(', ')}, not ${metricName(c.metric)}`);
      continue;
    }
    if (mitigated && !hasRecipe) {
      problems.error(e.at, 'bad-expectation', `expect: '${raw}' reads a mitigated figure, and the file has no 'mitigation:' block saying how to mitigate`);
      continue;
    }
    out.push({ text: (mitigated ? MITIGATED_PREFIX : '') + c.text, at: e.at, mitigated, condition: c });
  }
  return out;
}

/** Every figure of one loaded file (and of its mitigated run), with its expectations evaluated. Throws InputError on bad input. */
export function checkLoaded(loaded: LoadedCircuit): FileCheck {
  const problems = new ProblemList();
  const expectations = parseExpectations(loaded, problems);
  problems.throwIfErrors();
  const paulis = [...new Set([...loaded.circuit.observe.map((o) => o.value), ...expectations.flatMap((e) => (e.condition.metric.kind === 'observable' ? [e.condition.metric.pauli] : []))])];
  const run = simulateLoaded(loaded, { observe: paulis }).result;
  const figures: Record<string, number> = {};
  for (const kind of METRIC_NAMES) figures[kind] = metricValue(run, { kind });
  for (const p of paulis) figures[`observable:${p}`] = metricValue(run, { kind: 'observable', pauli: p });
  if (loaded.circuit.mitigation !== undefined) {
    const m = mitigate(loaded, { ...recipeOptions(loaded.circuit.mitigation), observe: paulis });
    for (const p of paulis) {
      // readout correction leaves ⟨P⟩ = Tr(Pρ) as it is: without ZNE, DD or twirling the figure is the unmitigated one
      const o = m.observables[p];
      figures[`${MITIGATED_PREFIX}observable:${p}`] = o === undefined ? figures[`observable:${p}`]! : Math.abs(o.mitigated - o.ideal);
    }
    figures[`${MITIGATED_PREFIX}tvd`] = m.distribution.tvd_after;
    figures[`${MITIGATED_PREFIX}classical`] = m.distribution.classical_after;
  }
  const outcomes = expectations.map((e): ExpectationOutcome => {
    const value = figures[(e.mitigated ? MITIGATED_PREFIX : '') + metricName(e.condition.metric)]!;
    return { expectation: e.text, at: `${e.at.file}:${e.at.line}:${e.at.col}`, value, pass: compareWith(value, e.condition.op, e.condition.value) };
  });
  const status = outcomes.length === 0 ? 'no-expectations' : outcomes.every((o) => o.pass) ? 'pass' : 'fail';
  return { file: loaded.circuit.file, status, expectations: outcomes, figures };
}

/** Checks each file's expectations, and with a baseline every stored figure (see the module comment). Throws InputError on bad input. */
export function check(paths: readonly string[], options: CheckOptions = {}): CheckResult {
  const tolerance = options.tolerance ?? DEFAULT_BASELINE_TOLERANCE;
  const files = paths.map((path): FileCheck => {
    const fc = checkLoaded(loadCircuit(path, options.load ?? {}));
    const stored = options.baseline?.files[path];
    if (stored === undefined) return fc;
    const drift = Object.entries(stored).map(([figure, baseline]): BaselineDrift => {
      const value = fc.figures[figure];
      return { figure, baseline, value: value ?? null, pass: value !== undefined && Math.abs(value - baseline) <= tolerance };
    });
    const ok = drift.every((d) => d.pass) && fc.status !== 'fail';
    return { ...fc, baseline: drift, status: ok ? 'pass' : 'fail' };
  });
  return { files, passed: files.every((f) => f.status === 'pass') };
}

/** The baseline of a check: every figure of every file. */
export function baselineOf(result: CheckResult): Baseline {
  return { fray_baseline: 1, files: Object.fromEntries(result.files.map((f) => [f.file, f.figures])) };
}
