import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { fray, LOCATED, tempFile } from '../helpers/cli.js';
import { loadCircuit } from '../../src/api/loadCircuit.js';
import { simulateLoaded } from '../../src/api/simulate.js';
import { insertDecoupling } from '../../src/transforms/decouple.js';
import { foldCircuit } from '../../src/transforms/fold.js';
import { maxDiff } from '../helpers/arrays.js';

const DEMO = 'circuits/mitigation/ghz-line.yaml';
const SAME_RUN = 1e-12;


describe('fray transform', () => {
  it('transforms an OpenQASM program into a circuit file that runs exactly as the transform run directly, and exports back to OpenQASM', async () => {
    const program = 'circuits/qasm/ghz-wait.qasm';
    const device = 'circuits/devices/ring4-qasm.yaml';
    const out = tempFile('ghz-wait-dd.yaml', '');
    const r = await fray('transform', program, '--device', device, '--dd', 'xy4', '--out', out);
    expect(r.code, r.err).toBe(0);
    expect(readFileSync(out, 'utf8')).toMatch(/^# transformed by fray from circuits\/qasm\/ghz-wait\.qasm$/m);
    const loaded = loadCircuit(program, { device });
    const direct = insertDecoupling(loaded.circuit, loaded.profile, { sequence: 'xy4', minIdle: 0 }).circuit;
    const a = simulateLoaded({ ...loaded, circuit: direct });
    const b = simulateLoaded(loadCircuit(out, { device }));
    expect(b.schedule.duration).toBe(a.schedule.duration);
    expect(maxDiff(a.rho.data, b.rho.data)).toBeLessThan(SAME_RUN);
    const back = await fray('export', out, '--qasm', '3');
    expect(back.code, back.err).toBe(0);
    expect(back.out).toMatch(/^OPENQASM 3/m);
  });

  it('writes a circuit file that runs exactly as the transform run directly, with a header saying what was inserted', async () => {
    const out = tempFile('dd.yaml', '');
    const r = await fray('transform', DEMO, '--dd', 'xy4', '--min-idle', '200ns', '--fold', '2', '--out', out);
    expect(r.code).toBe(0);
    const text = readFileSync(out, 'utf8');
    expect(text.split('\n')[2]).toBe('#   qubit 0, 310 ns to 870 ns: inserted x y x y');
    expect(text).toMatch(/^# unitary folding to scale 2 /m);
    expect(text).toMatch(/^mitigation:/m);
    const loaded = loadCircuit(DEMO);
    const direct = foldCircuit(insertDecoupling(loaded.circuit, loaded.profile, { sequence: 'xy4', minIdle: 200 }).circuit, { scale: 2 }).circuit;
    const a = simulateLoaded({ ...loaded, circuit: direct });
    const b = simulateLoaded(loadCircuit(out));
    expect(b.schedule.duration).toBe(a.schedule.duration);
    expect(maxDiff(a.rho.data, b.rho.data)).toBeLessThan(SAME_RUN);
  });

  it('refuses steps with their own noise (located), and bad options (exit 2)', async () => {
    const file = tempFile('n.yaml', 'qubits: 1\nsteps:\n  - x: 0\n    noise: { bit_flip: 0.1 }\n');
    const r = await fray('transform', file, '--fold', '3');
    expect(r.code).toBe(2);
    expect(r.err.split('\n')[0]).toMatch(LOCATED);
    expect(r.err).toMatch(/n\.yaml:3:5: step 1: a transformed circuit cannot be written with a step's own noise yet/);
    for (const args of [[], ['--fold', '0.5'], ['--dd', 'xy8'], ['--min-idle', '20ns', '--fold', '3']]) expect((await fray('transform', DEMO, ...args)).code, args.join(' ')).toBe(2);
  });
});
