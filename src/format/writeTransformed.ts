/**
 * A transformed circuit written back as a readable circuit file: the source file's text with
 * its `steps:` replaced by the transformed circuit's steps (written by ./writeCircuit.ts) and a
 * header comment saying what was done. Every other section — name, device, inline noise,
 * params, gates, channels, observe, mitigation, expect, comments — stays as the user wrote it,
 * so the new file runs on the same noise. Steps carrying their own `noise:` and standalone
 * noise steps cannot be written yet (the step writer does not carry noise): those are refused,
 * located at the step.
 */
import { parseDocument } from 'yaml';
import type { Circuit } from '../circuit/circuit.js';
import { ProblemList } from './problem.js';
import { writeCircuitYaml } from './writeCircuit.js';

/** The source text with its steps replaced by `circuit`'s and `header` lines as a leading comment. Throws InputError for steps it cannot write. */
export function writeTransformedCircuit(sourceText: string, circuit: Circuit, header: readonly string[]): string {
  const problems = new ProblemList();
  for (const op of circuit.operations) {
    const ownNoise = op.kind === 'channel' || ((op.kind === 'gate' || op.kind === 'reset') && op.noise !== undefined);
    if (ownNoise) problems.error(op.at, 'cannot-write-noise', `step ${op.step + 1}: a transformed circuit cannot be written with a step's own noise yet; run the transform with fray mitigate instead`);
  }
  problems.throwIfErrors();
  const written = writeCircuitYaml(circuit, { header: [] });
  const stepsAt = written.indexOf('\nsteps:\n');
  const steps = parseDocument(written.slice(stepsAt + 1)).get('steps', true);
  const doc = parseDocument(sourceText);
  doc.set('steps', steps);
  const before = doc.commentBefore === null || doc.commentBefore === undefined ? '' : `\n${doc.commentBefore}`;
  doc.commentBefore = header.map((h) => ` ${h}`).join('\n') + before;
  return doc.toString({ lineWidth: 0 });
}
