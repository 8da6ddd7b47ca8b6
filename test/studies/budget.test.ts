import { describe, expect, it } from 'vitest';
import { XMLValidator } from 'fast-xml-parser';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { fray, tempFile } from '../helpers/cli.js';
import { noiseBudget } from '../../src/studies/index.js';
import { ghzChain, tinyDevice } from './fixtures.js';

/** Agreement demanded of exact identities through the run path. */
const EXACT = 1e-12;

describe('fray budget', () => {
  it('with one source only, its share is the whole loss and the remainder is zero', () => {
    const file = tempFile('one.yaml', 'qubits: 2\nnoise:\n  gates: { cx: { depolarizing: 0.05 } }\nsteps:\n  - h: 0\n  - cx: [0, 1]\n');
    const r = noiseBudget(file);
    expect(r.sources.map((s) => s.id)).toEqual(['gate:cx']);
    expect(Math.abs(r.sources[0]!.share - 1)).toBeLessThan(EXACT);
    expect(Math.abs(r.sources[0]!.removed_when_off - r.total)).toBeLessThan(EXACT);
    expect(Math.abs(r.remainder)).toBeLessThan(EXACT);
  });

  // Derived: for a product state ρ0 ⊗ ρ1 against a product ideal, the fidelity factorises,
  // F = F0·F1 (Nielsen & Chuang §9.2.2, fidelity of tensor products). With independent noise on
  // disjoint qubits the loss is 1 − (1 − l0)(1 − l1) = l0 + l1 − l0·l1: the remainder is −l0·l1.
  it('independent sources on disjoint qubits combine as 1 − (1 − l0)(1 − l1); the remainder is −l0·l1', () => {
    const file = tempFile('two.yaml', 'qubits: 2\nnoise:\n  gates: { x: { bit_flip: 0.1 }, h: { phase_damping: 0.3 } }\nsteps:\n  - x: 0\n  - h: 1\n');
    const r = noiseBudget(file);
    const l = new Map(r.sources.map((s) => [s.id, s.only_on]));
    const l0 = l.get('gate:x')!;
    const l1 = l.get('gate:h')!;
    expect(Math.abs(l0 - 0.1)).toBeLessThan(EXACT); // bit flip p on |1⟩: F = 1 − p (derived)
    expect(Math.abs(r.total - (1 - (1 - l0) * (1 - l1)))).toBeLessThan(EXACT);
    expect(Math.abs(r.remainder - -l0 * l1)).toBeLessThan(EXACT);
    expect(Math.abs(r.sum_only_on + r.remainder - r.total)).toBeLessThan(EXACT);
  });

  it('the total equals the plain run’s loss (error: frozen to its solved depolarizing changes nothing)', async () => {
    const file = ghzChain(tinyDevice());
    const r = noiseBudget(file);
    const single = JSON.parse((await fray('run', file, '--json')).out);
    expect(Math.abs(r.total - (1 - single.fidelity.state))).toBeLessThan(EXACT);
    expect(r.sources.map((s) => s.id).sort()).toEqual(['dephasing', 'gate:cx', 'gate:h', 'readout', 'relaxation']);
    // the weak qubit 2 (T1 12 µs) leads the per-qubit relaxation rows
    expect(r.qubits[0]!.id).toBe('relaxation:2');
    expect(r.where.map((w) => w.id)).toEqual(['where:idle', 'where:gates']);
  });

  it('prints the tables and the remainder, and plots SVG', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'fray-budget-'));
    const svg = join(dir, 'b.svg');
    const r = await fray('budget', ghzChain(tinyDevice()), '--plot', svg);
    expect(r.code).toBe(0);
    expect(r.out).toContain('remainder (interaction between sources)');
    expect(r.out).toContain('T1 on qubit 2');
    const text = readFileSync(svg, 'utf8');
    expect(XMLValidator.validate(text)).toBe(true);
    expect(text).toContain('loss of state fidelity (only this source on)');
  });
});

describe('fray budget with coherent noise', () => {
  it('detuning, always-on ZZ and coherent gate errors are sources of their own; the total is the plain run’s', async () => {
    const file = tempFile(
      'coherent.yaml',
      `qubits: 2
noise:
  qubits: { all: { t1: 50us, detuning: 30kHz } }
  couplings: { "0 1": { zz: 80kHz } }
  gates: { all: { duration: 40ns }, x: { coherent: { x: 0.05 } } }
steps:
  - h: 0
  - x: 1
  - idle: [0, 1]
    for: 1us
  - h: 0
`,
    );
    const r = noiseBudget(file);
    expect(r.sources.map((s) => s.id).sort()).toEqual(['coherent', 'detuning', 'relaxation', 'zz']);
    const single = JSON.parse((await fray('run', file, '--json')).out);
    expect(Math.abs(r.total - (1 - single.fidelity.state))).toBeLessThan(EXACT);
    for (const s of r.sources) expect(s.only_on).toBeGreaterThan(0);
  });
});
