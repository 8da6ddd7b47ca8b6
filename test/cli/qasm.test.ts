import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { fray, tempFile, LOCATED } from '../helpers/cli.js';

describe('fray run, convert and export with OpenQASM', () => {
  it('runs a .qasm program without a device as an ideal run and says so', async () => {
    const r = await fray('run', 'circuits/qasm/qft4.qasm');
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/device\s+none: an ideal run \(give a noise profile with --device\)/);
    expect(r.out).toMatch(/qubits\s+4 \(q\[0\] q\[1\] q\[2\] q\[3\]\), measured: q\[0\] q\[1\] q\[2\] q\[3\]/);
  });

  it('runs a .qasm program against a device profile', async () => {
    const r = await fray('run', 'circuits/qasm/qft4.qasm', '--device', 'circuits/devices/ring4-qasm.yaml', '--json');
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.device).toBe('ring of four, OpenQASM demo device (invented)');
    expect(j.fidelity.state).toBeLessThan(0.99);
  });

  it('a malformed program exits 2 with FILE:LINE:COL and nothing on standard output', async () => {
    const path = tempFile('bad.qasm', 'OPENQASM 2.0;\ninclude "qelib1.inc";\nqreg q[2];\ncx q[0] q[1];\n');
    const r = await fray('run', path);
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    expect(r.err).toMatch(LOCATED);
    expect(r.err).toContain(`${path}:4:9: expected ',' between operands or ';' at the end of the statement, but found 'q'`);
  });

  it('convert writes readable YAML with a header naming the source, which runs to the same figures', async () => {
    const out = tempFile('qft4.yaml', '');
    const c = await fray('convert', 'circuits/qasm/qft4.qasm', '--out', out, '--force');
    expect(c.code).toBe(0);
    const yaml = readFileSync(out, 'utf8');
    expect(yaml.split('\n')[0]).toBe('# converted by fray from circuits/qasm/qft4.qasm');
    expect(yaml).toContain('  - cu1: ["q[1]", "q[0]"]\n    angle: "pi/2"');
    const a = JSON.parse((await fray('run', 'circuits/qasm/qft4.qasm', '--device', 'circuits/devices/ring4-qasm.yaml', '--json')).out);
    const b = JSON.parse((await fray('run', out, '--device', 'circuits/devices/ring4-qasm.yaml', '--json')).out);
    expect(b.fidelity.state).toBeCloseTo(a.fidelity.state, 12);
  });

  it('convert refuses to overwrite without --force (exit 2)', async () => {
    const out = tempFile('exists.yaml', 'x');
    const r = await fray('convert', 'circuits/qasm/qft4.qasm', '--out', out);
    expect(r.code).toBe(2);
    expect(readFileSync(out, 'utf8')).toBe('x');
  });

  it('export --qasm 3 names the profile in its header; --qasm 4 is a usage error', async () => {
    const r = await fray('export', 'circuits/ghz5.yaml', '--qasm', '3');
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/^OPENQASM 3\.0;\ninclude "stdgates\.inc";\n\/\/ written by fray from circuits\/ghz5\.yaml\n\/\/ simulated with the noise profile 'bench line, five transmon-like qubits \(invented\)'/);
    expect((await fray('export', 'circuits/ghz5.yaml', '--qasm', '4')).code).toBe(2);
  });

  it('export of what OpenQASM cannot state exits 2 with the position of the step', async () => {
    const r = await fray('export', 'circuits/coupler-swap.yaml', '--qasm', '2');
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    expect(r.err).toMatch(/^circuits\/coupler-swap\.yaml:\d+:\d+: custom matrix gate 'half_swap' acts on 2 qubits/);
  });

  it('--set changes profile fields of a program run, and refuses parameters (a program has none)', async () => {
    const base = JSON.parse((await fray('run', 'circuits/qasm/qft4.qasm', '--device', 'circuits/devices/ring4-qasm.yaml', '--json')).out);
    const worse = JSON.parse((await fray('run', 'circuits/qasm/qft4.qasm', '--device', 'circuits/devices/ring4-qasm.yaml', '--set', 'gates.cu1.error=0.05', '--json')).out);
    expect(worse.fidelity.state).toBeLessThan(base.fidelity.state);
    const r = await fray('run', 'circuits/qasm/qft4.qasm', '--set', 'theta=1');
    expect(r.code).toBe(2);
    expect(r.err).toContain('--set theta: an OpenQASM program has no parameters to set');
  });

  it('compare takes OpenQASM programs as variants', async () => {
    const r = await fray('compare', 'circuits/qasm/qft4.qasm', 'circuits/qasm/ghz-wait.qasm', '--device', 'circuits/devices/ring4-qasm.yaml', '--json');
    expect(r.code).toBe(0);
    expect(r.out).toContain('circuits/qasm/ghz-wait.qasm');
  });
});
