/**
 * Circuits accept every channel definition form in their `channels:` map, refuse maps that
 * are not CPTP with a located error naming the property and its size, and hand the engine the
 * minimal Kraus form (src/format/customChannels.ts).
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { simulate } from '../../src/api/simulate.js';
import { readCircuit } from '../../src/format/circuitFile.js';
import { formatProblem, ProblemList } from '../../src/format/problem.js';

function circuit(channels: string, noise = 'channel: c'): string {
  return `qubits: 1\nchannels:\n${channels}steps:\n  - h: 0\n  - noise: { ${noise} }\n    on: 0\n  - measure: 0\n`;
}

/** The located errors of a circuit's text. */
function errorsOf(text: string): string[] {
  const problems = new ProblemList();
  readCircuit(text, 'c.yaml', problems);
  return problems.errors.map(formatProblem);
}

function tempFile(text: string): string {
  const path = join(mkdtempSync(join(tmpdir(), 'fray-cc-')), 'c.yaml');
  writeFileSync(path, text);
  return path;
}

describe('circuit channels: CPTP required, located errors', () => {
  it('a PTM with a negative Choi eigenvalue is refused as not completely positive, with the eigenvalue', () => {
    const errs = errorsOf(circuit('  c:\n    ptm: [[1, 0, 0, 0], [0, 1.1, 0, 0], [0, 0, 1, 0], [0, 0, 0, 1]]\n'));
    expect(errs.length).toBe(1);
    expect(errs[0]).toMatch(/^c\.yaml:4:10: custom channel 'c' is not completely positive: its Choi matrix has the eigenvalue -5\.00e-2/);
  });

  it('a Choi matrix that is not trace preserving is refused with the size of Σ K†K − I', () => {
    // 0.9 × the identity channel's Choi matrix: Σ K†K = 0.9·I
    const errs = errorsOf(circuit('  c:\n    choi: [[0.9, 0, 0, 0.9], [0, 0, 0, 0], [0, 0, 0, 0], [0.9, 0, 0, 0.9]]\n'));
    expect(errs).toEqual(["c.yaml:4:11: custom channel 'c' is not trace preserving: the largest entry of Σ K†K − I is 1.00e-1 (allowed 1e-9)"]);
  });

  it('a Choi matrix that is not Hermitian is refused', () => {
    const errs = errorsOf(circuit('  c:\n    choi: [[1, 0, 0, 1], [0, 0, 0, 0], [0, 0, 0, 0], ["1+0.1i", 0, 0, 1]]\n'));
    expect(errs[0]).toContain("custom channel 'c' is not completely positive: its Choi matrix is not Hermitian");
  });

  it('a refused channel is not also reported as unknown where a step names it', () => {
    const errs = errorsOf(circuit('  c:\n    choi: [[0.9, 0, 0, 0.9], [0, 0, 0, 0], [0, 0, 0, 0], [0.9, 0, 0, 0.9]]\n'));
    expect(errs.some((e) => e.includes('unknown channel'))).toBe(false);
  });

  it('the Kraus form keeps the foundation wording and position', () => {
    const errs = errorsOf(circuit('  c:\n    kraus: [ [[1,0],[0,0.8]], [[0,0.5],[0,0]] ]\n'));
    expect(errs).toEqual(["c.yaml:4:12: custom channel 'c' is not trace preserving: the largest entry of Σ K†K − I is 1.10e-1 (allowed 1e-9)"]);
  });
});

describe('circuit channels: minimal Kraus form, same physics in every form', () => {
  it('a redundant Kraus set reaches the engine as its minimal form', () => {
    // bit flip 0.1 written with three operators: √0.45·I twice and √0.1·X
    const problems = new ProblemList();
    const c = readCircuit(circuit('  c:\n    kraus:\n      - [["sqrt(0.45)", 0], [0, "sqrt(0.45)"]]\n      - [["sqrt(0.45)", 0], [0, "sqrt(0.45)"]]\n      - [[0, "sqrt(0.1)"], ["sqrt(0.1)", 0]]\n'), 'c.yaml', problems);
    expect(problems.errors).toEqual([]);
    expect(c!.channels.get('c')!.kraus.length).toBe(2);
  });

  it('amplitude damping as PTM, Choi, Stinespring, sequence and built-in: identical runs', () => {
    const g = 0.2;
    const s = Math.sqrt(1 - g);
    const forms = [
      `  c: { amplitude_damping: ${g} }\n`,
      `  c: { ptm: [[1, 0, 0, 0], [0, ${s}, 0, 0], [0, 0, ${s}, 0], [${g}, 0, 0, ${1 - g}]] }\n`,
      `  c: { choi: [[1, 0, 0, ${s}], [0, 0, 0, 0], [0, 0, ${g}, 0], [${s}, 0, 0, ${1 - g}]] }\n`,
      `  c: { stinespring: [[1, 0], [0, ${Math.sqrt(g)}], [0, ${s}], [0, 0]] }\n`,
      '  a: { amplitude_damping: 0.1 }\n  b: { amplitude_damping: "1 - 0.8/0.9" }\n  c: { sequence: [a, b] }\n',
    ];
    const results = forms.map((f) => simulate(tempFile(circuit(f))).result);
    for (const r of results.slice(1)) {
      expect(r.fidelity.state).toBeCloseTo(results[0]!.fidelity.state, 12);
      expect(r.purity).toBeCloseTo(results[0]!.purity, 12);
    }
    // |+⟩ after amplitude damping γ: fidelity with |+⟩ is (1 + √(1−γ))/2 (N&C §8.3.5 Bloch map, derived)
    expect(results[0]!.fidelity.state).toBeCloseTo((1 + s) / 2, 12);
  });

  it('a two-qubit channel built from thermal relaxation runs on a two-qubit gate (minimal Kraus rank 4·4 = 16)', () => {
    const text =
      'qubits: 2\nchannels:\n  relax: { thermal: { t1: 45us, t2: 30us, time: 1.2us, excited: 0.02 } }\n  pair: { parallel: [relax, relax] }\n' +
      'steps:\n  - h: 0\n  - cx: [0, 1]\n    noise: { channel: pair }\n  - measure: all\n';
    const sim = simulate(tempFile(text));
    expect(sim.circuit.channels.get('pair')!.kraus.length).toBe(16);
    expect(sim.result.fidelity.state).toBeLessThan(1);
    expect(sim.result.fidelity.state).toBeGreaterThan(0.9);
  });
});
