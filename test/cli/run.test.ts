import { execFileSync, spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { fray, tempFile, LOCATED } from '../helpers/cli.js';

describe('fray run', () => {
  it('prints the report with header, fidelity block and outcome table', async () => {
    const r = await fray('run', 'circuits/ghz5.yaml', '--top', '3');
    expect(r.code).toBe(0);
    expect(r.out).toContain('ghz-5 along the bench line');
    expect(r.out).toMatch(/device\s+bench line/);
    expect(r.out).toMatch(/state fidelity\s+0\.9\d{5}/);
    expect(r.out).toMatch(/Most likely outcomes \(3 of 32/);
    expect(r.out).not.toContain('\u001b[');
    expect(r.err).toBe('');
  });

  it('--json prints the contract object, outcome maps in ascending bitstring order', async () => {
    const r = await fray('run', 'circuits/ghz5.yaml', '--json');
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    for (const key of ['name', 'qubits', 'measured', 'duration_ns', 'probabilities', 'fidelity', 'tvd', 'purity']) expect(j).toHaveProperty(key);
    expect(Object.keys(j.probabilities)).toEqual(['ideal', 'noisy', 'measured']);
    expect(Object.keys(j.fidelity)).toEqual(['state', 'classical']);
    const keys = [...r.out.matchAll(/"([01]{5})":/g)].map((m) => m[1]!).slice(0, 32);
    expect(keys).toEqual([...keys].sort());
    expect(j.observables.ZZIII).toHaveProperty('ideal');
  });

  it('--shots with a seed gives the same counts every time, summing to the shots', async () => {
    const a = JSON.parse((await fray('run', 'circuits/ghz5.yaml', '--json', '--shots', '500', '--seed', '7')).out);
    const b = JSON.parse((await fray('run', 'circuits/ghz5.yaml', '--json', '--shots', '500', '--seed', '7')).out);
    const c = JSON.parse((await fray('run', 'circuits/ghz5.yaml', '--json', '--shots', '500', '--seed', '8')).out);
    expect(a.counts).toEqual(b.counts);
    expect(a.counts).not.toEqual(c.counts);
    expect(Object.values(a.counts as Record<string, number>).reduce((x, y) => x + y, 0)).toBe(500);
    expect(a.seed).toBe(7);
  });

  it('--shots takes any integer notation of JSON or YAML up to 2^53, and the counts sum to it exactly', async () => {
    for (const [text, value] of [
      ['1e6', 1e6],
      ['2.5e3', 2500],
      ['0x100', 256],
      ['0o17', 15],
      ['+40', 40],
      ['9007199254740992', 2 ** 53],
    ] as const) {
      const r = await fray('run', 'circuits/ghz5.yaml', '--json', '--shots', text);
      expect(r.code, text).toBe(0);
      const j = JSON.parse(r.out);
      expect(j.shots).toBe(value);
      expect(Object.values(j.counts as Record<string, number>).reduce((x, y) => x + y, 0)).toBe(value);
    }
  });

  it('--set overrides a parameter and --observe adds Pauli strings', async () => {
    const base = JSON.parse((await fray('run', 'circuits/ramsey-echo.yaml', '--json')).out);
    const other = JSON.parse((await fray('run', 'circuits/ramsey-echo.yaml', '--json', '--set', 'detune=0', '--observe', 'XX,ZZ')).out);
    expect(base.observables.ZI.ideal).toBeCloseTo(0, 12);
    expect(other.observables.ZI.ideal).toBeCloseTo(1, 12);
    expect(Object.keys(other.observables)).toEqual(['ZI', 'IZ', 'XX', 'ZZ']);
  });

  it('--device replaces the circuit’s device', async () => {
    const dev = tempFile('quiet.yaml', 'name: quiet device\nqubits:\n  all: { t1: 1s }\n');
    const j = JSON.parse((await fray('run', 'circuits/ghz5.yaml', '--json', '--device', dev)).out);
    expect(j.device).toBe('quiet device');
    expect(j.fidelity.state).toBeGreaterThan(0.9999);
  });

  it('--schedule and --state add their sections', async () => {
    const r = await fray('run', 'circuits/coupler-swap.yaml', '--schedule', '--state');
    expect(r.code).toBe(0);
    expect(r.out).toContain('Schedule (ASAP, times in ns)');
    expect(r.out).toContain('Idle windows');
    expect(r.out).toContain('Bloch vector');
    expect(r.out).toContain('Noisy density matrix');
  });

  it('input errors: exit 2, one located line per problem, no stack trace', async () => {
    const bad = tempFile('bad.yaml', 'qubits: 2\nsteps:\n  - hh: 0\n  - cx: [0, 0]\n');
    const r = await fray('run', bad);
    expect(r.code).toBe(2);
    const lines = r.err.trim().split('\n');
    expect(lines).toHaveLength(2);
    for (const l of lines) expect(l).toMatch(LOCATED);
    expect(lines[0]).toContain(`${bad}:3:5: step 1: unknown gate or key 'hh'; did you mean 'h'?`);
    expect(r.err).not.toMatch(/\n\s+at /);
    expect(r.out).toBe('');
  });

  it('a missing circuit file is an input error', async () => {
    const r = await fray('run', 'no/such/file.yaml');
    expect(r.code).toBe(2);
    expect(r.err).toBe("no/such/file.yaml:1:1: cannot read circuit file 'no/such/file.yaml': no such file\n");
  });

  it('a missing device file is located at the device key', async () => {
    const c = tempFile('c.yaml', 'qubits: 1\ndevice: nowhere.yaml\nsteps:\n  - h: 0\n');
    const r = await fray('run', c);
    expect(r.code).toBe(2);
    expect(r.err).toContain(`${c}:2:9: cannot read device profile`);
  });

  it('refuses a run above --max-memory before allocating', async () => {
    const r = await fray('run', 'circuits/ghz5.yaml', '--max-memory', '1MiB');
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/circuits\/ghz5\.yaml:8:9: 5 qubits need about .* but the limit is 1 MiB/);
  });

  it('bad option values are input errors', async () => {
    for (const args of [['--shots', 'many'], ['--shots', '1.5'], ['--shots', '0'], ['--shots', '9007199254740993'], ['--shots', '1e300'], ['--max-memory', 'lots'], ['--observe', 'ZZ'], ['--set', 'nonsense'], ['--bogus']]) {
      const r = await fray('run', 'circuits/ghz5.yaml', ...args);
      expect(r.code, args.join(' ')).toBe(2);
      expect(r.out).toBe('');
    }
  });

  it('bin/fray.js starts the CLI bundle from the code cache built at install (V8 accepts it)', () => {
    const probe = "import('./bin/loadCli.js').then((m) => console.log(JSON.stringify({ rejected: m.loadCli().cacheRejected, main: typeof m.loadCli().main })))";
    const r = spawnSync(process.execPath, ['--input-type=module', '-e', probe], { encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    expect(JSON.parse(r.stdout)).toEqual({ rejected: false, main: 'function' });
  });

  it('a bundled run of a small circuit loads none of the Node modules the bundle defers (scripts/bundle.mjs LAZY)', () => {
    // what the whole process loaded, by Node's own list
    const probe =
      "const { loadCli } = require('./bin/loadCli.js'); const cli = loadCli(); const sink = { write: () => true };" +
      "cli.main(['run', 'circuits/bench/one-qubit.yaml', '--json'], { stdout: sink, stderr: sink }).then((code) => console.log(JSON.stringify({ code, loaded: process.moduleLoadList })))";
    const r = spawnSync(process.execPath, ['-e', probe], { encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    const { code, loaded } = JSON.parse(r.stdout) as { code: number; loaded: string[] };
    expect(code).toBe(0);
    for (const id of ['child_process', 'crypto', 'worker_threads', 'v8', 'readline']) expect(loaded, id).not.toContain(`NativeModule ${id}`);
    // a run opens the worker-thread module only for threads (9+ qubits): the same run on 10 qubits does
    const threaded = spawnSync(process.execPath, ['-e', probe.replace('circuits/bench/one-qubit.yaml', 'circuits/bench/layers10x20.yaml')], { encoding: 'utf8' });
    expect(threaded.status, threaded.stderr).toBe(0);
    expect(JSON.parse(threaded.stdout).loaded).toContain('NativeModule worker_threads');
  });

  it('the bundled command (bin/fray.js) runs sweep workers, plots and OpenQASM, whose packages load from outside the bundle', () => {
    const qasm = spawnSync(process.execPath, ['bin/fray.js', 'run', 'circuits/qasm/ghz-wait.qasm', '--json'], { encoding: 'utf8' });
    expect(qasm.status, qasm.stderr).toBe(0);
    const sweep = spawnSync(process.execPath, ['bin/fray.js', 'sweep', 'circuits/ghz5.yaml', '--vary', 'noise-scale=0..1:3', '--jobs', '2'], { encoding: 'utf8' });
    expect(sweep.status, sweep.stderr).toBe(0);
    const svg = tempFile('cmp.svg', '');
    const plot = spawnSync(process.execPath, ['bin/fray.js', 'compare', 'circuits/variants/ghz5-left.yaml', 'circuits/variants/ghz5-right.yaml', '--plot', svg], { encoding: 'utf8' });
    expect(plot.status, plot.stderr).toBe(0);
    expect(readFileSync(svg, 'utf8')).toMatch(/^<svg/);
  });

  it('--help explains every option with an example', async () => {
    const top = await fray('--help');
    expect(top.code).toBe(0);
    expect(top.out).toContain('Examples:');
    const run = await fray('run', '--help');
    expect(run.code).toBe(0);
    for (const opt of ['--json', '--device', '--set', '--shots', '--seed', '--observe', '--top', '--state', '--schedule', '--max-memory', '--html', '--no-color']) {
      expect(run.out).toContain(opt);
    }
    expect(run.out).toContain('Examples:');
  });
});

describe('the installed command', () => {
  // Runs the compiled bin as a user would (npm test compiles first).
  it('exits 2 on bad input with located messages and no stack trace', () => {
    const bad = tempFile('bad.yaml', 'qubits: 1\nsteps:\n  - rz: 0\n');
    const res = spawnSync(process.execPath, ['bin/fray.js', 'run', bad], { encoding: 'utf8' });
    expect(res.status).toBe(2);
    expect(res.stderr).toMatch(new RegExp(`^${bad.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}:3:5: `));
    expect(res.stderr).not.toMatch(/\n\s+at /);
  });

  it('a reader that closes the pipe early ends the run quietly: no EPIPE stack trace, exit 0', () => {
    // `head -c 1` stands for any reader that stops before the end of a long report
    const r = spawnSync('sh', ['-c', `"${process.execPath}" bin/fray.js run circuits/bench/layers10x20.yaml --json --threads 1 | head -c 1 >/dev/null`], { encoding: 'utf8' });
    expect(r.stderr).not.toMatch(/EPIPE|\n\s+at /);
  });

  it('prints JSON for a demo and respects NO_COLOR', () => {
    const out = execFileSync(process.execPath, ['bin/fray.js', 'run', 'circuits/coupler-swap.yaml', '--json'], { encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' } });
    expect(JSON.parse(out).qubits).toBe(3);
  });
});
