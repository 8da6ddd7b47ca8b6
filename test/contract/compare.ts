/**
 * Comparison of fray's `--json` result object with the contract oracle's result, and the
 * file plumbing to run a generated case through fray's public entry point.
 */
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { simulate } from '../../src/api/simulate.js';
import type { ReferenceResult } from './reference.js';
import { referenceRun } from './reference.js';

/** Agreement required between fray and the oracle (issue 2, "Done means": 1e-9). */
export const AGREEMENT_TOLERANCE = 1e-9;
/** An outcome the oracle puts above this must be listed in all three of fray's maps (contract: 1e-15; margin for rounding). */
export const LISTED_OUTCOME_THRESHOLD = 1e-12;

/** The part of fray's result object that the contract fixes. */
export interface FrayResult {
  readonly name: string | null;
  readonly qubits: number;
  readonly measured: readonly number[];
  readonly measured_labels?: readonly string[];
  readonly duration_ns: number;
  readonly probabilities: { ideal: Record<string, number>; noisy: Record<string, number>; measured: Record<string, number> };
  readonly fidelity: { state: number; classical: number };
  readonly tvd: number;
  readonly purity: number;
  readonly observables?: Record<string, { ideal: number; noisy: number }>;
  readonly warnings?: readonly unknown[];
}

let scratch: string | undefined;

/** Writes a circuit (and its device profile) into a scratch folder and returns the circuit path. */
export function writeCase(fileName: string, circuitYaml: string, devicePath?: string, deviceYaml?: string): string {
  scratch ??= mkdtempSync(join(tmpdir(), 'fray-contract-'));
  const path = join(scratch, fileName);
  writeFileSync(path, circuitYaml);
  if (devicePath !== undefined && deviceYaml !== undefined) {
    const dp = join(scratch, devicePath);
    mkdirSync(dirname(dp), { recursive: true });
    writeFileSync(dp, deviceYaml);
  }
  return path;
}

/** Removes the scratch folder of the written cases. */
export function removeScratch(): void {
  if (scratch !== undefined) rmSync(scratch, { recursive: true, force: true });
  scratch = undefined;
}

/** Runs one case through fray and through the oracle. */
export function runBoth(fileName: string, circuitYaml: string, devicePath?: string, deviceYaml?: string): { fray: FrayResult; ref: ReferenceResult } {
  const path = writeCase(fileName, circuitYaml, devicePath, deviceYaml);
  const fray = simulate(path, {}).result as unknown as FrayResult;
  const ref = referenceRun(circuitYaml, deviceYaml);
  return { fray, ref };
}

function close(a: number | undefined, b: number, tol = AGREEMENT_TOLERANCE): boolean {
  return a !== undefined && Number.isFinite(a) && Math.abs(a - b) <= tol;
}

/** Every disagreement between fray's result and the oracle's, one line each. */
export function disagreements(fray: FrayResult, ref: ReferenceResult): string[] {
  const out: string[] = [];
  if (fray.qubits !== ref.qubits) out.push(`qubits: fray ${fray.qubits}, reference ${ref.qubits}`);
  if (JSON.stringify(fray.measured) !== JSON.stringify(ref.measured)) out.push(`measured: fray ${JSON.stringify(fray.measured)}, reference ${JSON.stringify(ref.measured)}`);
  if (ref.measured_labels && JSON.stringify(fray.measured_labels) !== JSON.stringify(ref.measured_labels)) {
    out.push(`measured_labels: fray ${JSON.stringify(fray.measured_labels)}, reference ${JSON.stringify(ref.measured_labels)}`);
  }
  if (!close(fray.duration_ns, ref.duration_ns)) out.push(`duration_ns: fray ${fray.duration_ns}, reference ${ref.duration_ns}`);
  for (const which of ['ideal', 'noisy', 'measured'] as const) {
    const f = fray.probabilities[which];
    const r = ref.probabilities[which];
    const keys = new Set([...Object.keys(f), ...Object.keys(r)]);
    for (const k of [...keys].sort()) {
      const fv = f[k] ?? 0;
      const rv = r[k] ?? 0;
      if (!close(fv, rv)) out.push(`probabilities.${which}[${k}]: fray ${fv}, reference ${rv}, diff ${fv - rv}`);
    }
  }
  // "Probability maps list every outcome above 1e-15 in any of the three."
  for (const k of Object.keys(ref.probabilities.ideal)) {
    const above = (['ideal', 'noisy', 'measured'] as const).some((w) => ref.probabilities[w][k]! > LISTED_OUTCOME_THRESHOLD);
    if (!above) continue;
    for (const w of ['ideal', 'noisy', 'measured'] as const) {
      if (!(k in fray.probabilities[w])) out.push(`probabilities.${w} does not list outcome ${k} (above 1e-15 in another map)`);
    }
  }
  if (!close(fray.fidelity.state, ref.fidelity.state)) out.push(`fidelity.state: fray ${fray.fidelity.state}, reference ${ref.fidelity.state}, diff ${fray.fidelity.state - ref.fidelity.state}`);
  if (!close(fray.fidelity.classical, ref.fidelity.classical)) out.push(`fidelity.classical: fray ${fray.fidelity.classical}, reference ${ref.fidelity.classical}, diff ${fray.fidelity.classical - ref.fidelity.classical}`);
  if (!close(fray.tvd, ref.tvd)) out.push(`tvd: fray ${fray.tvd}, reference ${ref.tvd}, diff ${fray.tvd - ref.tvd}`);
  if (!close(fray.purity, ref.purity)) out.push(`purity: fray ${fray.purity}, reference ${ref.purity}, diff ${fray.purity - ref.purity}`);
  if (ref.observables) {
    for (const [ps, v] of Object.entries(ref.observables)) {
      const fv = fray.observables?.[ps];
      if (!fv || !close(fv.ideal, v.ideal) || !close(fv.noisy, v.noisy)) out.push(`observables.${ps}: fray ${JSON.stringify(fv)}, reference ${JSON.stringify(v)}`);
    }
  }
  if (ref.warnings.length > 0 && (fray.warnings ?? []).length === 0) out.push(`warnings: reference expects a coherence-limit warning (${ref.warnings.join('; ')}), fray gave none`);
  return out;
}

/** A readable failure report: the seed, the files and every disagreement. */
export function failureReport(title: string, circuitYaml: string, deviceYaml: string | undefined, lines: readonly string[]): string {
  return [
    `=== ${title}: ${lines.length} disagreement(s) ===`,
    ...lines.map((l) => `  ${l}`),
    '--- circuit ---',
    circuitYaml,
    ...(deviceYaml !== undefined ? ['--- device ---', deviceYaml] : []),
  ].join('\n');
}
