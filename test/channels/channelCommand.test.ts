/**
 * `fray channel` end to end through main() with captured output: the demo files, every
 * option, the JSON shape, and located errors with exit status 2 (the foundation's contract).
 */
import { describe, expect, it } from 'vitest';
import { fray, tempFile, LOCATED } from '../helpers/cli.js';
import { readCircuit } from '../../src/format/circuitFile.js';
import { ProblemList } from '../../src/format/problem.js';

describe('fray channel on the demo files', () => {
  it('tomography fit: not completely positive, not even positive, with the nearest CPTP channel to paste', async () => {
    const r = await fray('channel', 'circuits/channels/tomography-fit.yaml', 'idle_fit');
    expect(r.code).toBe(0);
    expect(r.err).toBe('');
    expect(r.out).toMatch(/not a quantum channel: not completely positive/);
    expect(r.out).toMatch(/completely positive\s+no\s+smallest Choi eigenvalue -0\.00264/);
    expect(r.out).toMatch(/positive\s+no\s+an input state has output eigenvalue -0\.00/);
    expect(r.out).toContain('nearest CPTP channel');
    expect(r.out).toContain('      kraus:');
    expect(r.out).toContain('minimal Kraus operators  none: the map is not completely positive');
    expect(r.out).not.toContain('\u001b[');
  });

  it('the pasted Kraus block of the repaired fit is accepted by a circuit (CPTP to the format tolerance)', async () => {
    const r = await fray('channel', 'circuits/channels/tomography-fit.yaml', 'idle_fit');
    const lines = r.out.split('\n');
    const start = lines.findIndex((l) => l.trim() === 'kraus:');
    const block: string[] = [];
    for (let i = start + 1; i < lines.length && lines[i]!.trim().startsWith('- '); i++) block.push(lines[i]!.trim());
    expect(block.length).toBe(3);
    const text = `qubits: 1\nchannels:\n  fixed:\n    kraus:\n${block.map((b) => `      ${b}`).join('\n')}\nsteps:\n  - noise: { channel: fixed }\n    on: 0\n`;
    const problems = new ProblemList();
    const c = readCircuit(text, 'fixed.yaml', problems);
    expect(problems.errors).toEqual([]);
    expect(c!.channels.get('fixed')!.kraus.length).toBe(3);
  });

  it('partial swap: Stinespring form, Kraus rank 2, --as stinespring prints the 4×2 isometry', async () => {
    const r = await fray('channel', 'circuits/channels/swap-environment.yaml', 'partial_swap', '--as', 'stinespring');
    expect(r.code).toBe(0);
    expect(r.out).toContain('given as stinespring');
    expect(r.out).toMatch(/Kraus rank\s+2/);
    expect(r.out).toContain('Stinespring isometry V = Σ K_k ⊗ |k⟩ (environment last)');
    expect(r.out).toMatch(/\[ 0\.9689\+0\.2474i\s+0\s+\]/);
  });

  it('every demo file runs with exit status 0', async () => {
    for (const f of ['tomography-fit', 'swap-environment', 'long-gate']) {
      const r = await fray('channel', `circuits/channels/${f}.yaml`);
      expect(r.code, r.err).toBe(0);
      expect(r.out).toMatch(/diamond distance/);
    }
  });
});

describe('options', () => {
  it('--against a gate: rx(π) then relaxation against rx(pi), average gate fidelity and Pauli errors', async () => {
    const r = await fray('channel', 'circuits/channels/long-gate.yaml', 'slow_x', '--against', 'rx(pi)');
    expect(r.code).toBe(0);
    expect(r.out).toContain('against gate rx(pi)');
    expect(r.out).toMatch(/average gate fidelity\s+0\.98/);
  });

  it('--against another channel of the file uses the Choi-state fidelity', async () => {
    const r = await fray('channel', 'circuits/channels/tomography-fit.yaml', 'idle_fit', '--against', 'idle_model');
    expect(r.code).toBe(0);
    expect(r.out).toContain("against channel 'idle_model'");
    expect(r.out).toContain('process fidelity (Choi states)');
    expect(r.out).not.toContain('average gate fidelity');
  });

  it('--against a target of another size reports no metrics for that channel', async () => {
    const r = await fray('channel', 'circuits/channels/long-gate.yaml', 'relax_q0', '--against', 'cx');
    expect(r.code).toBe(0);
    expect(r.out).toContain("metrics     none: the target 'gate cx' acts on 2 qubit(s), this channel on 1");
  });

  it('--as each form; --as kraus of a map that is not CP says there is none', async () => {
    for (const form of ['kraus', 'choi', 'superoperator', 'ptm']) {
      const r = await fray('channel', 'circuits/channels/swap-environment.yaml', 'damping_only', '--as', form);
      expect(r.code).toBe(0);
    }
    const ptm = await fray('channel', 'circuits/channels/swap-environment.yaml', 'damping_only', '--as', 'ptm');
    expect(ptm.out).toMatch(/\[ 0\.06121\s+0\s+0\s+0\.9388\s*\]/); // row Z: (γ, 0, 0, 1 − γ) with γ = sin²(0.25)
    const none = await fray('channel', 'circuits/channels/tomography-fit.yaml', 'idle_fit', '--as', 'kraus');
    expect(none.out).toContain('no such form: the map is not completely positive');
  });

  it('--json: one object with every figure', async () => {
    const r = await fray('channel', 'circuits/channels/swap-environment.yaml', '--json');
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.channels.map((c: { name: string }) => c.name)).toEqual(['partial_swap', 'damping_only', 'two_slots']);
    const c = j.channels[1];
    expect(c.physicality.cptp).toBe(true);
    expect(c.physicality.norm).toBe('spectral');
    expect(c.krausRank).toBe(2);
    expect(c.minimalKraus[1].re[0][1]).toBeCloseTo(Math.sin(0.25), 12);
    expect(c.metrics.pauliErrors.I + c.metrics.pauliErrors.X + c.metrics.pauliErrors.Y + c.metrics.pauliErrors.Z).toBeCloseTo(1, 12);
    expect(c.metrics.diamondDistance).toHaveProperty('lower');
    expect(c.metrics.diamondDistance.lower).toBeLessThanOrEqual(c.metrics.diamondDistance.upper);
  });

  it('works on a circuit file too (its channels: map)', async () => {
    const r = await fray('channel', 'circuits/coupler-swap.yaml');
    expect(r.code).toBe(0);
    expect(r.out).toContain('shared_dephasing');
    expect(r.out).toMatch(/diamond distance\s+0\.04\s+\(exact: Pauli-diagonal difference\)/); // 2(1 − p_I), p_I = 0.98
  });
});

describe('errors and exit status', () => {
  it('bad definitions: one FILE:LINE:COL line each, exit 2, nothing on stdout', async () => {
    const path = tempFile('bad.yaml', 'channels:\n  a: { depolarizing: 2 }\n  b: { sequence: [a, c] }\n  d: { choi: [[1, 0], [0, 1]] }\n');
    const r = await fray('channel', path);
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    const lines = r.err.trim().split('\n');
    expect(lines.length).toBe(3);
    for (const l of lines) expect(l).toMatch(LOCATED);
    expect(lines[0]).toContain(`${path}:2:22:`);
    expect(r.err).toContain("unknown channel 'c'");
  });

  it('a file without channels:', async () => {
    const r = await fray('channel', tempFile('none.yaml', 'name: nothing\n'));
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/:1:1: the file has no 'channels:' map/);
  });

  it('a missing file, an unknown channel name, a bad --as and a bad --against are input errors', async () => {
    const missing = await fray('channel', 'circuits/channels/nope.yaml');
    expect(missing.code).toBe(2);
    expect(missing.err).toMatch(/nope\.yaml:1:1: cannot read channel file/);
    const name = await fray('channel', 'circuits/channels/long-gate.yaml', 'relax_q3');
    expect(name.code).toBe(2);
    expect(name.err).toContain("has no channel 'relax_q3'; did you mean 'relax_q0'?");
    const as = await fray('channel', 'circuits/channels/long-gate.yaml', '--as', 'chio');
    expect(as.code).toBe(2);
    expect(as.err).toContain("did you mean 'choi'?");
    const against = await fray('channel', 'circuits/channels/long-gate.yaml', '--against', 'relax_q');
    expect(against.code).toBe(2);
    expect(against.err).toContain("not a channel of circuits/channels/long-gate.yaml nor a built-in gate");
  });
});
