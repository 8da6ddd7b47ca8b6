/** Test helpers for OpenQASM: load program text (and a device) as a circuit, run it. */
import { readFileSync } from 'node:fs';
import { parseCircuitText, type LoadedCircuit } from '../../../src/api/loadCircuit.js';
import { simulateLoaded, type Simulation } from '../../../src/api/simulate.js';
import { formatProblem, ProblemList } from '../../../src/format/problem.js';

/** Loads program text under `file` (its extension picks the reader); `device` is a profile's YAML text. */
export function loadProgram(text: string, file = 'p.qasm', device?: string): LoadedCircuit {
  const problems = new ProblemList();
  const loaded = parseCircuitText(text, file, problems, {
    ...(device !== undefined ? { device: 'dev.yaml' } : {}),
    readDevice: (path) => (path === 'dev.yaml' && device !== undefined ? { text: device, file: 'dev.yaml' } : undefined),
  });
  if (loaded === undefined) throw new Error(`did not load:\n${problems.items.map(formatProblem).join('\n')}`);
  return loaded;
}

/** Runs program text (reference engine, small registers). */
export function runProgram(text: string, file = 'p.qasm', device?: string): Simulation {
  return simulateLoaded(loadProgram(text, file, device), { engine: 'reference' });
}

/** The errors of loading program text, each as `FILE:LINE:COL: message`. */
export function errorsOf(text: string, file = 'p.qasm'): string[] {
  const problems = new ProblemList();
  parseCircuitText(text, file, problems, {});
  return problems.errors.map(formatProblem);
}

/** A repository file's text. */
export const repoFile = (path: string): string => readFileSync(new URL(`../../../${path}`, import.meta.url), 'utf8');

/** The largest difference between two results' figures: probabilities, fidelities, tvd, purity, Bloch vectors. */
export function figureDistance(a: Simulation['result'], b: Simulation['result']): number {
  let worst = 0;
  const cmp = (x: number, y: number): void => {
    worst = Math.max(worst, Math.abs(x - y));
  };
  for (const kind of ['ideal', 'noisy', 'measured'] as const) {
    const keys = new Set([...Object.keys(a.probabilities[kind]), ...Object.keys(b.probabilities[kind])]);
    for (const k of keys) cmp(a.probabilities[kind][k] ?? 0, b.probabilities[kind][k] ?? 0);
  }
  cmp(a.fidelity.state, b.fidelity.state);
  cmp(a.fidelity.classical, b.fidelity.classical);
  cmp(a.tvd, b.tvd);
  cmp(a.purity, b.purity);
  cmp(a.duration_ns, b.duration_ns);
  for (const side of ['ideal', 'noisy'] as const) a.bloch[side].forEach((v, i) => v.forEach((x, j) => cmp(x, b.bloch[side][i]![j]!)));
  return worst;
}
