/**
 * Regression tests of issue 13: one case per reproducer, each ending in a correct result or a
 * located input error (exit 2, every stderr line FILE:LINE:COL: message, nothing on stdout),
 * never an internal error (exit 1), a wrong answer or a hang. Bug 1 (the 4 GiB shared ρ) is
 * covered in test/engine/threadPool.test.ts; the seeded fuzz test is test/cli/fuzz.test.ts.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it, vi } from 'vitest';
import { Alias } from 'yaml';
import { MAX_DATA_FILE_BYTES, readBounded, readInputFile } from '../../src/api/readInput.js';
import { renderProblems } from '../../src/cli/problems.js';
import { makeStyle } from '../../src/cli/style.js';
import { thermalRelaxationChannel } from '../../src/channels/builtins.js';
import { readChannelDefinitions } from '../../src/format/channelDefinitions.js';
import { formatProblem, ProblemList } from '../../src/format/problem.js';
import { MAX_EXPANDED_NODES, MAX_INPUT_BYTES, MAX_NESTING, parseYamlTree } from '../../src/format/yamlTree.js';
import { MAX_THREADS } from '../../src/cli/main.js';
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
    // one problem: the refused gate stays known, so its step is not reported as naming an unknown gate
    const lines = expectInputError(r, ['3:17']);
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

describe('issue 13 bug 9: alias expansion cost', () => {
  it('aliases are resolved in one pass over the document, never by a whole-document walk per alias', () => {
    const resolve = vi.spyOn(Alias.prototype, 'resolve');
    try {
      const lines = ['qubits: 1', 'params:'];
      for (let i = 0; i < 300; i++) lines.push(`  p${i}: &a${i} ${i}`);
      // a later anchor of the same name wins for aliases after it (YAML 1.2, §7.1: the most recent anchor)
      lines.push('  q: &a0 1000', 'list:');
      for (let i = 0; i < 300; i++) lines.push(`  - *a${i}`);
      const problems = new ProblemList();
      const root = parseYamlTree(lines.join('\n') + '\n', 'c.yaml', problems);
      expect(problems.items).toEqual([]);
      expect(resolve).not.toHaveBeenCalled();
      const list = root!.kind === 'map' ? root!.entries.find((e) => e.key === 'list')!.value : root!;
      const values = list.kind === 'seq' ? list.items.map((n) => (n.kind === 'scalar' ? n.value : null)) : [];
      expect(values).toEqual([1000, ...Array.from({ length: 299 }, (_, i) => i + 1)]);
    } finally {
      resolve.mockRestore();
    }
  });

  it('an expansion bomb under a 150-deep map is refused by the node budget', () => {
    let text = 'qubits: 1\nsteps:\n  - h: 0\nx:\n';
    for (let d = 0; d < 150; d++) text += `${'  '.repeat(d + 1)}k${d}:\n`;
    const pad = '  '.repeat(151);
    text += `${pad}a0: &a0 [x, x, x, x, x, x, x, x, x, x]\n`;
    for (let i = 1; i < 12; i++) text += `${pad}a${i}: &a${i} [${Array(10).fill(`*a${i - 1}`).join(', ')}]\n`;
    const problems = new ProblemList();
    expect(parseYamlTree(text, 'c.yaml', problems)).toBeUndefined();
    expect(problems.items.map(formatProblem)).toEqual([`c.yaml:1:1: the document expands to more than ${MAX_EXPANDED_NODES} extra nodes through anchors and aliases; refusing to expand it`]);
  });
});

describe('issue 13 bug 10: unbounded reads', () => {
  it('a device, a FIFO or a folder is refused without reading it, as circuit, device or channel file', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'fray-fifo-'));
    const fifo = join(dir, 'pipe.yaml');
    execFileSync('mkfifo', [fifo]);
    const ok = tempFile('ok.yaml', 'qubits: 1\nsteps:\n  - h: 0\n');
    for (const args of [['run', ok, '--device', '/dev/zero'], ['run', fifo], ['run', ok, '--device', fifo], ['channel', '/dev/zero'], ['channel', dir]]) {
      const r = await fray(...args);
      const [line] = expectInputError(r, ['1:1']);
      expect(line).toMatch(/cannot read .*(not a regular file|it is a folder)/);
    }
    const dev = await fray('run', tempFile('c.yaml', 'qubits: 1\ndevice: /dev/zero\nsteps:\n  - h: 0\n'));
    expectInputError(dev, ['2:9']);
  });

  it('a file over the limit is refused after reading at most the limit plus one byte', () => {
    const problems = new ProblemList();
    const big = tempFile('big.yaml', '#'.repeat(MAX_INPUT_BYTES + 10));
    expect(readInputFile(big, { file: big, line: 1, col: 1 }, 'circuit file', problems)).toBeUndefined();
    expect(problems.items[0]!.code).toBe('file-too-large');
  });
});

describe('issue 13 bug 10: every user-named file goes through the bounded reader', () => {
  it('sweep circuit, sweep output for --resume, sweep parts, --baseline and transform input: a device or FIFO is a located exit-2 error, never a hang', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'fray-fifo-'));
    const fifo = (name: string) => {
      const p = join(dir, name);
      execFileSync('mkfifo', [p]);
      return p;
    };
    const ok = tempFile('ok.yaml', 'qubits: 1\nsteps:\n  - h: 0\n');
    const part = fifo('part.jsonl');
    const cases = [
      ['sweep', '/dev/zero', '--vary', 'noise-scale=0,1'],
      ['sweep', ok, '--vary', 'noise-scale=0,1', '--out', fifo('out.jsonl'), '--resume'],
      ['merge', part, '--out', join(dir, 'all.jsonl')],
      ['check', ok, '--baseline', '/dev/zero'],
      ['transform', fifo('t.yaml'), '--fold', '3'],
    ];
    for (const args of cases) {
      const r = await fray(...args);
      const [line] = expectInputError(r, ['1:1']);
      expect(line, args.join(' ')).toMatch(/cannot read .*not a regular file/);
    }
  });

  it('a data file over MAX_DATA_FILE_BYTES is refused after reading at most that plus one byte', () => {
    const big = tempFile('big.jsonl', '#'.repeat(2000));
    expect(readBounded(big, 1000)).toEqual({ error: 'it is larger than 0.9765625 KiB', tooLarge: true });
    expect(readBounded(big, 2000)).toEqual({ text: '#'.repeat(2000) });
    expect(MAX_DATA_FILE_BYTES).toBeGreaterThan(MAX_INPUT_BYTES);
  });

  it('the source excerpt of a problem at a device file does not read the device', () => {
    const text = renderProblems([{ file: '/dev/zero', line: 1, col: 1, severity: 'error', code: 'cannot-read', message: 'x' }], makeStyle(false), true);
    expect(text).toBe('/dev/zero:1:1: x\n');
  });
});

describe('issue 13 bug 11: many plain steps', () => {
  it('nodes written out in the file do not count towards the alias budget; nodes aliases add do', () => {
    // 100 000 plain steps (900 KB) were refused as an alias bomb; the same distinction at a budget of 50
    const plain = 'qubits: 1\nsteps:\n' + '  - x: 0\n'.repeat(200);
    const problems = new ProblemList();
    const root = parseYamlTree(plain, 'c.yaml', problems, 50);
    expect(problems.items).toEqual([]);
    const steps = root!.kind === 'map' ? root!.entries[1]!.value : root!;
    expect(steps.kind === 'seq' ? steps.items.length : 0).toBe(200);
    const aliased = 'qubits: 1\nsteps:\n  - &s { x: 0 }\n' + '  - *s\n'.repeat(30);
    const refused = new ProblemList();
    expect(parseYamlTree(aliased, 'c.yaml', refused, 50)).toBeUndefined();
    expect(refused.items.map((p) => p.code)).toEqual(['alias-bomb']);
    expect(parseYamlTree(aliased, 'c.yaml', new ProblemList(), 60)).toBeDefined();
  });
});

describe('issue 13 bug 12: syntax errors and deep nesting read as located input errors', () => {
  it('an error after a block scalar is placed inside its line', () => {
    const text = 'q #xubits: 1\nname: |\n  first line\n  second line\nsteps:\n  - h: 0\n';
    const problems = new ProblemList();
    parseYamlTree(text, 'c.yaml', problems);
    const lines = text.split('\n');
    expect(problems.items.length).toBeGreaterThan(0);
    for (const p of problems.items) {
      expect(p.line).toBeLessThanOrEqual(lines.length);
      expect(p.col).toBeLessThanOrEqual(lines[p.line - 1]!.length + 1);
    }
    expect(problems.items.map((p) => `${p.line}:${p.col}`)).toContain('5:1');
  });

  it('nesting 10 000 deep is refused in plain language where it passes the limit', async () => {
    const r = await fray('run', tempFile('c.yaml', `qubits: 1\nsteps: ${'['.repeat(10_000)}${']'.repeat(10_000)}\n`));
    const [line] = expectInputError(r, [`2:${8 + MAX_NESTING}`]);
    expect(line).toContain(`nests deeper than ${MAX_NESTING} levels`);
    const s = await fray('run', tempFile('c.yaml', `qubits: 1\nsteps: ${'['.repeat(300)}${']'.repeat(300)}\n`));
    expect(expectInputError(s, [`2:${8 + MAX_NESTING}`])[0]).toContain('nests deeper');
  });
});

describe('issue 13 papercuts', () => {
  it('a repeated warning is printed once with its count, and the JSON keeps it structured', async () => {
    const file = tempFile(
      'c.yaml',
      'qubits: 3\nnoise:\n  qubits: { all: { t1: 5us, t2: 3us } }\n  gates: { all: { duration: 200ns, error: 0.0001 } }\nsteps:\n  - h: 0\n  - h: 1\n  - h: 0\n  - h: 2\n',
    );
    const text = await fray('run', file);
    expect(text.code).toBe(0);
    const lines = text.out.split('\n').filter((l) => l.includes('coherence limit'));
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(/c\.yaml:4:43: 'h': calibrated error 0\.0001 .* \(4 times\)$/);
    const json = JSON.parse((await fray('run', file, '--json')).out);
    expect(json.warnings).toEqual([
      { code: 'error-below-coherence-limit', message: expect.stringContaining("'h': calibrated error 0.0001"), file, line: 4, col: 43, count: 4 },
    ]);
  });

  it('--json holds the schedule with --schedule and ρ with --state', async () => {
    const j = JSON.parse((await fray('run', 'circuits/ghz5.yaml', '--json', '--schedule', '--state')).out);
    expect(j.timeline.operations[1]).toEqual({ step: 2, operation: 'cx', qubits: [0, 1], start_ns: 30, end_ns: 290 });
    expect(j.timeline.idle_windows[0]).toEqual({ qubit: 1, start_ns: 0, end_ns: 30 });
    expect(j.density_matrix.re).toHaveLength(32);
    // ρ is Hermitian with unit trace (Nielsen & Chuang §2.4.1)
    let trace = 0;
    for (let i = 0; i < 32; i++) {
      trace += j.density_matrix.re[i][i];
      for (let k = 0; k < 32; k++) expect(j.density_matrix.im[i][k]).toBeCloseTo(-j.density_matrix.im[k][i], 14);
    }
    expect(trace).toBeCloseTo(1, 12);
    const plain = JSON.parse((await fray('run', 'circuits/ghz5.yaml', '--json')).out);
    expect(plain.timeline).toBeUndefined();
    expect(plain.density_matrix).toBeUndefined();
  });

  it('other names of a gate get a suggestion', async () => {
    for (const [typed, meant] of [['cnot', 'cx'], ['toffoli', 'ccx'], ['hadamard', 'h'], ['not', 'x'], ['cphase', 'cp']]) {
      const r = await fray('run', tempFile('c.yaml', `qubits: 3\nsteps:\n  - ${typed}: 0\n`));
      expect(expectInputError(r, ['3:5'])[0]).toContain(`did you mean '${meant}'?`);
    }
  });

  it('a literal angle above 2π without a unit gets a warning suggesting degrees', async () => {
    const r = await fray('run', tempFile('c.yaml', 'qubits: 1\nsteps:\n  - rx: 0\n    angle: 90\n  - rx: 0\n    angle: 6\n  - rx: 0\n    angle: 90deg\n'), '--json');
    expect(r.code).toBe(0);
    const w = JSON.parse(r.out).warnings;
    expect(w).toHaveLength(1);
    expect(w[0]).toMatchObject({ code: 'angle-above-full-turn', line: 4, col: 12 });
    expect(w[0].message).toContain('90deg');
  });

  it('run --help states each default once', async () => {
    const r = await fray('run', '--help');
    for (const line of r.out.split('\n')) expect((line.match(/\(default/g) ?? []).length).toBeLessThanOrEqual(1);
    expect(r.out).toContain('(default: 8)');
    expect(r.out).not.toContain('(default 8)');
  });
});

describe('found while hunting with the fuzz mutations: subnormal relaxation times', () => {
  it('t1 = 1e-320 ns under a 1 ns gate relaxes |+⟩ to |0⟩ (was fidelity null with exit 0: ∞ − ∞ in the dephasing rate)', async () => {
    const r = await fray('run', tempFile('c.yaml', 'qubits: 1\nnoise:\n  qubits: {all: {t1: 1e-320ns}}\n  gates: {all: {duration: 1ns}}\nsteps:\n  - h: 0\n'), '--json');
    expect(r.code, r.err).toBe(0);
    // full amplitude damping leaves |0⟩⟨0|, whose fidelity with |+⟩ is |⟨+|0⟩|² = 1/2
    expect(JSON.parse(r.out).fidelity.state).toBeCloseTo(0.5, 12);
  });

  it('times of 5e-324 ns act exactly like the same ratios at 5 ns', async () => {
    // |+⟩ idle for τ = T2 keeps ⟨+|ρ|+⟩ = (1 + e^{−τ/T2})/2 (definition of T2, common practice)
    for (const unit of ['5e-324ns', '5ns']) {
      const r = await fray('run', tempFile('c.yaml', `qubits: 1\nnoise:\n  qubits: {all: {t1: ${unit}, t2: ${unit}}}\nsteps:\n  - h: 0\n  - idle: 0\n    for: ${unit}\n`), '--json');
      expect(r.code, r.err).toBe(0);
      expect(JSON.parse(r.out).fidelity.state).toBeCloseTo((1 + Math.exp(-1)) / 2, 12);
    }
  });
});

describe('found by hand while hunting: command-line values that started a hang or an unlocated line', () => {
  it('--threads beyond MAX_THREADS is refused instead of starting that many workers', async () => {
    const r = await fray('run', 'circuits/ghz5.yaml', '--threads', '99999');
    expect(r.code).toBe(2);
    expect(r.err).toBe(`fray: --threads 99999: expected a whole number of threads from 1 to ${MAX_THREADS}\n`);
  });

  it("--device '' is a usage error, not a problem at an empty file name", async () => {
    const r = await fray('run', 'circuits/ghz5.yaml', '--device', '');
    expect(r.code).toBe(2);
    expect(r.err).toBe('fray: --device: expected the path of a noise profile file\n');
  });
});
