/**
 * Regression tests of issue 13: one case per reproducer, each ending in a correct result or a
 * located input error (exit 2, every stderr line FILE:LINE:COL: message, nothing on stdout),
 * never an internal error (exit 1), a wrong answer or a hang. Bug 1 (the 4 GiB shared ρ) is
 * covered in test/engine/threadPool.test.ts; the seeded fuzz test is test/cli/fuzz.test.ts.
 */
import { describe, expect, it } from 'vitest';
import { thermalRelaxationChannel } from '../../src/channels/builtins.js';
import { readChannelDefinitions } from '../../src/format/channelDefinitions.js';
import { formatProblem, ProblemList } from '../../src/format/problem.js';
import { parseYamlTree } from '../../src/format/yamlTree.js';
import { fray, LOCATED, tempFile } from '../helpers/cli.js';

/** Asserts the input-error contract and that the problems are at exactly `where` (FILE-relative LINE:COL each). */
function expectInputError(r: { code: number; out: string; err: string }, where: readonly string[]): string[] {
  expect(r.code, r.err).toBe(2);
  expect(r.out).toBe('');
  const lines = r.err.trimEnd().split('\n');
  for (const l of lines) expect(l).toMatch(LOCATED);
  expect(lines.map((l) => /:(\d+:\d+): /.exec(l)![1])).toEqual(where);
  return lines;
}

/** Channels of a `channels:` body, failing the test on problems. */
function channels(body: string) {
  const problems = new ProblemList();
  const root = parseYamlTree(`channels:\n${body}`, 'c.yaml', problems)!;
  const defs = readChannelDefinitions(root.kind === 'map' ? root.entries[0]!.value : root, {}, problems);
  expect(problems.items.map(formatProblem)).toEqual([]);
  return defs;
}

const maxDiff = (a: Float64Array, b: Float64Array) => a.reduce((m, x, i) => Math.max(m, Math.abs(x - b[i]!)), 0);

describe('issue 13 bug 2: t2 = 2·t1 after unit conversion', () => {
  const circuit = (t2: string) => `qubits: 1\nnoise:\n  qubits:\n    all: { t1: 2015ns, t2: ${t2} }\n  gates:\n    all: { duration: 100ns }\nsteps:\n  - h: 0\n`;

  it('a profile with t2 = 4.03us and t1 = 2015ns runs, exactly as with t2 = 4030ns', async () => {
    const a = await fray('run', tempFile('a.yaml', circuit('4.03us')), '--json');
    const b = await fray('run', tempFile('b.yaml', circuit('4030ns')), '--json');
    expect(a.code, a.err).toBe(0);
    expect(b.code, b.err).toBe(0);
    const fa = JSON.parse(a.out).fidelity.state as number;
    const fb = JSON.parse(b.out).fidelity.state as number;
    expect(Math.abs(fa - fb)).toBeLessThan(1e-12);
  });

  it('a thermal channel with the same numbers is accepted, and one clearly above 2·t1 is still refused', async () => {
    const defs = channels('  a: { thermal: { t1: 2015ns, t2: 4.03us, time: 1us } }\n  b: { thermal: { t1: 1us, t2: 2.0000000000001us, time: 1us } }\n');
    const ref = thermalRelaxationChannel({ t1: 2015, t2: 4030, excited: 0, time: 1000 }).choi().data;
    expect(maxDiff(defs.get('a')!.channel.choi().data, ref)).toBeLessThan(1e-12);
    expect(defs.has('b')).toBe(true);
    const r = await fray('channel', tempFile('c.yaml', 'channels:\n  hot: { thermal: { t1: 1us, t2: 2.001us, time: 1us } }\n'));
    expectInputError(r, ['2:34']);
  });
});

describe('issue 13 bug 3: a thermal channel without t2', () => {
  it('means t2 = 2·t1 (no dephasing beyond T1, as in a profile), in fray channel and in circuits', async () => {
    const defs = channels('  relax: { thermal: { t1: 45us, time: 1us } }\n');
    // definition of the default: the profile's t2 = 2·t1 (docs/format.md)
    const ref = thermalRelaxationChannel({ t1: 45_000, t2: 90_000, excited: 0, time: 1000 }).choi().data;
    expect(maxDiff(defs.get('relax')!.channel.choi().data, ref)).toBeLessThan(1e-15);
    const file = 'channels:\n  relax: { thermal: { t1: 45us, time: 1us } }\n';
    const c = await fray('channel', tempFile('c.yaml', file));
    expect(c.code, c.err).toBe(0);
    const r = await fray('run', tempFile('r.yaml', `qubits: 1\n${file}steps:\n  - x: 0\n  - noise: { channel: relax }\n    on: 0\n`), '--json');
    expect(r.code, r.err).toBe(0);
    // ⟨1|ρ|1⟩ after time τ of relaxation from |1⟩ is e^{−τ/T1} (common practice: definition of T1)
    expect(JSON.parse(r.out).probabilities.noisy['1']).toBeCloseTo(Math.exp(-1 / 45), 12);
  });
});

describe('issue 13 bug 4: non-finite, huge or zero matrix entries in channels', () => {
  const cases: [string, string, string[]][] = [
    ['an infinite Kraus entry', '  a: {kraus: [[[.inf,0],[0,1]]]}\n', ['2:17']],
    ['a huge Kraus entry', '  a: {kraus: [[[1e200,0],[0,1]]]}\n', ['2:17']],
    ['a NaN Kraus entry', '  a: {kraus: [[[1,0],[0,.nan]]]}\n', ['2:25']],
    ['an infinite PTM entry', '  p: {ptm: [[1,0,0,0],[0,1,0,0],[0,0,.inf,0],[0,0,0,1]]}\n', ['2:38']],
    ['a NaN Stinespring entry', '  s: {stinespring: [[1,0],[0,.nan]]}\n', ['2:30']],
    ['an expression that overflows', '  e: {kraus: [[["exp(1000)",0],[0,1]]]}\n', ['2:18']],
    ['the zero map', '  a: {kraus: [[[0,0],[0,0]]]}\n', ['2:14']],
  ];
  for (const [name, body, where] of cases) {
    it(`${name} is a located input error`, async () => {
      expectInputError(await fray('channel', tempFile('c.yaml', `channels:\n${body}`)), where);
    });
  }
});

describe('issue 13 bug 5: NaN in a custom gate matrix', () => {
  it('is a located input error, not a run with null fidelity', async () => {
    const r = await fray('run', tempFile('c.yaml', 'qubits: 1\ngates:\n  g: {matrix: [[.nan,0],[0,1]]}\nsteps:\n  - g: 0\n'));
    const lines = expectInputError(r, ['3:17', '5:5']);
    expect(lines[0]).toContain('is not a number');
  });
});

describe('issue 13 bug 6: time overflow', () => {
  it('a duration beyond the limit is refused where it is written', async () => {
    const r = await fray('run', tempFile('c.yaml', 'qubits: 1\nsteps:\n  - idle: 0\n    for: 1e299s\n  - idle: 0\n    for: 1e299s\n'));
    expectInputError(r, ['4:10', '6:10']);
    const g = await fray('run', tempFile('c.yaml', 'qubits: 1\nnoise:\n  gates:\n    all: {duration: 1e302ms}\nsteps:\n  - h: 0\n  - h: 0\n'));
    expectInputError(g, ['4:21']);
  });

  it('a schedule whose total passes the limit is refused at the step that passes it', async () => {
    const r = await fray('run', tempFile('c.yaml', 'qubits: 1\nsteps:\n  - idle: 0\n    for: 900000s\n  - idle: 0\n    for: 900000s\n'));
    expectInputError(r, ['5:5']);
  });
});

describe('issue 13 bug 7: values with newlines', () => {
  it('a quoted value with a newline stays on its problem line', async () => {
    const r = await fray('run', tempFile('c.yaml', 'qubits: 2\nsteps:\n  - h: "0\\n1"\n'));
    const [line] = expectInputError(r, ['3:8']);
    expect(line).toContain("'0\\n1'");
  });

  it('a block scalar as schedule: stays on one line', async () => {
    const r = await fray('run', tempFile('c.yaml', 'qubits: 1\nnoise:\n  schedule: |\n    as\n    ap\nsteps:\n  - h: 0\n'));
    expectInputError(r, ['3:13']);
  });
});

describe('issue 13 bug 8: parameters named like object properties', () => {
  for (const name of ['constructor', 'toString', 'hasOwnProperty', '__proto__']) {
    it(`a parameter named '${name}' is a parameter like any other, also under --set`, async () => {
      const file = tempFile('c.yaml', `qubits: 1\nparams: {${name}: 0.5}\nsteps:\n  - rx: 0\n    angle: ${name}\n`);
      const r = await fray('run', file, '--json');
      expect(r.code, r.err).toBe(0);
      // ⟨0|rx(θ)|0⟩ gives P(0) = cos²(θ/2) (Nielsen & Chuang §4.2, eq. 4.4)
      expect(JSON.parse(r.out).probabilities.noisy['0']).toBeCloseTo(Math.cos(0.25) ** 2, 12);
      const s = await fray('run', file, '--json', '--set', `${name}=1`);
      expect(s.code, s.err).toBe(0);
      expect(JSON.parse(s.out).probabilities.noisy['0']).toBeCloseTo(Math.cos(0.5) ** 2, 12);
    });
  }

  it('--set __proto__=1 on a circuit without that parameter is refused, not ignored', async () => {
    const r = await fray('run', tempFile('c.yaml', 'qubits: 1\nparams: {a: 0.5}\nsteps:\n  - rx: 0\n    angle: a\n'), '--set', '__proto__=1');
    const [line] = expectInputError(r, ['2:9']);
    expect(line).toContain("no parameter '__proto__'");
  });
});
