/**
 * Comparison of fray's `--json` result object with the version-2 oracle (issues 7 and 8):
 * everything the version-1 comparison checks, plus the coupling-map warnings (one per
 * gate application) and, in record mode, the record's bit names.
 */
import { expect } from 'vitest';
import { simulate } from '../../src/api/simulate.js';
import type { FrayResult } from './compare.js';
import { AGREEMENT_TOLERANCE, disagreements, failureReport, writeCase } from './compare.js';
import type { ReferenceResult } from './reference.js';
import type { ReferenceResultV2 } from './referenceV2.js';
import { referenceRunV2 } from './referenceV2.js';

/** fray's result in version 2: the version-1 keys plus the record's bits. */
export interface FrayResultV2 extends FrayResult {
  readonly bits?: readonly string[];
  readonly bloch?: { ideal: readonly (readonly number[])[]; noisy: readonly (readonly number[])[] };
}

/** A fray warning that is about the coupling map (matched on its text: it must name the couplings). */
export const COUPLING_WARNING = /coupl/i;

/** Runs one case through fray and through the version-2 oracle. */
export function runBothV2(fileName: string, circuitYaml: string, devicePath?: string, deviceYaml?: string): { fray: FrayResultV2; ref: ReferenceResultV2 } {
  const path = writeCase(fileName, circuitYaml, devicePath, deviceYaml);
  const fray = simulate(path, {}).result as unknown as FrayResultV2;
  const ref = referenceRunV2(circuitYaml, deviceYaml);
  return { fray, ref };
}

/** Every disagreement between fray's result and the version-2 oracle's, one line each. */
export function disagreementsV2(fray: FrayResultV2, ref: ReferenceResultV2): string[] {
  const out = disagreements(fray, ref as unknown as ReferenceResult);
  const couplingWarnings = (fray.warnings ?? []).filter((w) => COUPLING_WARNING.test(JSON.stringify(w)));
  if (couplingWarnings.length !== ref.couplingWarnings.length) {
    const expected = ref.couplingWarnings.map((w) => `${w.gate} [${w.qubits.join(', ')}] at step ${w.step + 1}`);
    out.push(`coupling-map warnings: fray ${couplingWarnings.length} (${couplingWarnings.map((w) => JSON.stringify(w)).join('; ')}), reference ${expected.length} (${expected.join('; ')})`);
  }
  for (const which of ['ideal', 'noisy'] as const) {
    ref.bloch[which].forEach((v, q) => {
      const f = fray.bloch?.[which][q];
      if (!f || v.some((x, i) => !(Math.abs(f[i]! - x) <= AGREEMENT_TOLERANCE))) out.push(`bloch.${which}[${q}]: fray ${JSON.stringify(f)}, reference ${JSON.stringify(v)}`);
    });
  }
  if (ref.bits !== undefined && JSON.stringify(fray.bits) !== JSON.stringify(ref.bits)) out.push(`bits: fray ${JSON.stringify(fray.bits)}, reference ${JSON.stringify(ref.bits)}`);
  return out;
}

/** Runs one case both ways and fails the test with the seed/title, the YAML and every disagreement; returns the oracle's result. */
export function expectAgreementV2(title: string, circuitYaml: string, devicePath?: string, deviceYaml?: string): ReferenceResultV2 {
  const fileName = `${title.replace(/[^A-Za-z0-9]+/g, '-')}.yaml`;
  const { fray, ref } = runBothV2(fileName, circuitYaml, devicePath, deviceYaml);
  const lines = disagreementsV2(fray, ref);
  if (lines.length > 0) console.log(failureReport(title, circuitYaml, deviceYaml, lines));
  expect(lines, failureReport(title, circuitYaml, deviceYaml, lines)).toEqual([]);
  return ref;
}
