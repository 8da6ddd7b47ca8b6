import { spawn } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parse } from 'csv-parse/sync';
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import { describe, expect, it } from 'vitest';
import { toJsonLine } from '../../src/results/json.js';
import { mergeSweepFiles, parseVary } from '../../src/studies/index.js';
import { fray } from '../helpers/cli.js';
import { ghzChain, tinyDevice } from './fixtures.js';

/** fray sweep: ranges, rows equal single runs, jobs/shards/resume give the same bytes, plots and CSV parse. */
const dev = tinyDevice();
const chain = ghzChain(dev);
const dir = mkdtempSync(join(tmpdir(), 'fray-sweep-'));
const VARY = ['--vary', 'gates.cx.error=0.002..0.02:3', '--vary', 'wait=0,1'];

describe('ranges', () => {
  it('A..B:N is inclusive and evenly spaced; log ranges are evenly spaced in log; units go to base units', () => {
    expect(parseVary('x=0..1:5')).toMatchObject({ values: [0, 0.25, 0.5, 0.75, 1], unit: null, log: false });
    const t1 = parseVary('qubits.all.t1=20us..200us:log:3');
    expect(t1).toMatchObject({ key: 'qubits.all.t1', unit: 'ns', log: true });
    const v = (t1 as { values: readonly number[] }).values;
    expect(v[0]).toBe(20_000);
    expect(v[2]).toBe(200_000);
    expect(v[1]).toBeCloseTo(Math.sqrt(20_000 * 200_000), 9);
    expect(parseVary('gates.cx.error=0.001,0.01,0.1')).toMatchObject({ values: [0.001, 0.01, 0.1] });
    expect(parseVary('k=50kHz')).toMatchObject({ values: [50_000], unit: 'Hz' });
  });

  it('refuses a range without a count, mixed units, a log range through zero', () => {
    expect(parseVary('x=0..1')).toEqual({ error: "'x=0..1': a range needs its number of points, e.g. x=0..1:10 (or x=0..1:log:10)" });
    expect(parseVary('t=1us,5')).toMatchObject({ error: expect.stringContaining('mix units') });
    expect(parseVary('x=0..1:log:3')).toMatchObject({ error: expect.stringContaining('log range needs both ends above zero') });
  });
});

describe('fray sweep', () => {
  it('each row equals `fray run FILE --set KEY=VALUE … --json` for that point, in grid order (first key outermost)', async () => {
    const out = join(dir, 'rows.jsonl');
    expect((await fray('sweep', chain, ...VARY, '--out', out, '--jobs', '1', '--quiet')).code).toBe(0);
    const lines = readFileSync(out, 'utf8').trim().split('\n');
    expect(JSON.parse(lines[0]!).fray_sweep.points).toBe(6);
    const rows = lines.slice(1).map((l) => JSON.parse(l));
    expect(rows.map((r) => r.point.wait)).toEqual([0, 1, 0, 1, 0, 1]);
    const errs = rows.map((r) => r.point['gates.cx.error'] as number);
    expect([errs[0], errs[1], errs[4], errs[5]]).toEqual([0.002, 0.002, 0.02, 0.02]);
    expect(errs[2]).toBe(errs[3]);
    expect(errs[2]).toBeCloseTo(0.011, 15);
    for (const r of [rows[1], rows[4]]) {
      const single = await fray('run', chain, '--set', `gates.cx.error=${r.point['gates.cx.error']}`, '--set', `wait=${r.point.wait}`, '--json');
      expect(toJsonLine(r.result)).toBe(toJsonLine(JSON.parse(single.out)));
    }
  });

  it('--jobs 1 and --jobs 2 write byte-identical files; the CSV has the documented columns', async () => {
    const a = join(dir, 'j1.csv');
    const b = join(dir, 'j2.csv');
    await fray('sweep', chain, ...VARY, '--out', a, '--jobs', '1', '--quiet');
    await fray('sweep', chain, ...VARY, '--out', b, '--jobs', '2', '--quiet');
    expect(readFileSync(b, 'utf8')).toBe(readFileSync(a, 'utf8'));
    const records = parse(readFileSync(a, 'utf8'), { comment: '#', columns: true }) as Record<string, string>[];
    expect(Object.keys(records[0]!)).toEqual(['point', 'gates.cx.error', 'wait', 'duration_ns', 'fidelity_state', 'fidelity_classical', 'tvd', 'purity', 'observable_ZZI_noisy', 'observable_ZZI_ideal']);
    expect(records).toHaveLength(6);
    // the idle of `wait us` on qubit 2: 1 µs longer at wait = 1 (base units: ns in duration_ns)
    expect(Number(records[1]!['duration_ns']) - Number(records[0]!['duration_ns'])).toBe(1000);
  });

  it('2 shard processes (the documented array-job script) merged equal the unsharded sweep; merge refuses other sweeps, doubled and missing points', async () => {
    const vary = 'gates.cx.error=0.002..0.02:6';
    const whole = join(dir, 'whole.csv');
    await fray('sweep', chain, '--vary', vary, '--out', whole, '--jobs', '1', '--quiet');
    const parts = [0, 1].map((i) => join(dir, `part-${i}.csv`));
    // two separate processes, as two array tasks of a batch scheduler would be (docs/examples/sweep-array-task.sh)
    await Promise.all(
      [{ SLURM_ARRAY_TASK_ID: '0' }, { I: '1' }].map(
        (index, i) =>
          new Promise<void>((resolve, reject) => {
            const env = { ...process.env, ...index, N: '2', OUT_DIR: dir, CIRCUIT: chain, VARY: vary, FRAY: `${process.execPath} bin/fray.js` };
            const child = spawn('sh', ['docs/examples/sweep-array-task.sh'], { stdio: 'inherit', env });
            child.on('exit', (code) => (code === 0 ? resolve() : reject(new Error(`array task ${i} exited ${code}`))));
          }),
      ),
    );
    const merged = join(dir, 'merged.csv');
    expect((await fray('merge', ...parts, '--out', merged, '--quiet')).code).toBe(0);
    expect(readFileSync(merged, 'utf8')).toBe(readFileSync(whole, 'utf8'));
    const texts = parts.map((p) => ({ path: p, text: readFileSync(p, 'utf8') }));
    expect(mergeSweepFiles(texts.slice(0, 1), 'csv')).toEqual({ error: 'the parts lack points 1, 3, 5 of 6' });
    expect(mergeSweepFiles([...texts, texts[0]!], 'csv')).toMatchObject({ error: expect.stringContaining('point 0 is in both') });
    const other = join(dir, 'other.csv');
    await fray('sweep', chain, '--vary', 'gates.cx.error=0.002..0.03:6', '--out', other, '--shard', '1/2', '--quiet');
    const r = await fray('merge', parts[0]!, other, '--out', join(dir, 'bad.csv'));
    expect(r.code).toBe(2);
    expect(r.err).toContain('is from a different sweep');
  });

  it('a killed sweep resumed with --resume equals an uninterrupted one (the cut-off line is dropped)', async () => {
    for (const ext of ['csv', 'jsonl']) {
      const whole = join(dir, `full.${ext}`);
      await fray('sweep', chain, ...VARY, '--out', whole, '--quiet');
      const text = readFileSync(whole, 'utf8');
      // what a kill leaves: the header, two finished rows, and half of the third
      const lines = text.split('\n');
      const keep = (ext === 'csv' ? 4 : 3) + 0;
      const cut = lines.slice(0, keep).join('\n') + '\n' + lines[keep]!.slice(0, 20);
      const partial = join(dir, `partial.${ext}`);
      writeFileSync(partial, cut);
      expect((await fray('sweep', chain, ...VARY, '--out', partial, '--resume', '--quiet')).code).toBe(0);
      expect(readFileSync(partial, 'utf8')).toBe(text);
    }
  });

  it('--resume cuts a file at the right byte when the header holds non-ASCII text (a circuit named in UTF-8)', async () => {
    // The header names the circuit file; "é" and "µ" are two bytes each in UTF-8 but one UTF-16
    // unit in a JS string, so a cut at the string length would land inside the last kept row.
    const named = join(dir, 'étude-µs.yaml');
    writeFileSync(named, readFileSync(chain, 'utf8'));
    for (const ext of ['csv', 'jsonl']) {
      const whole = join(dir, `utf8-full.${ext}`);
      await fray('sweep', named, ...VARY, '--out', whole, '--quiet');
      const text = readFileSync(whole, 'utf8');
      expect(text).toContain('étude-µs.yaml');
      const lines = text.split('\n');
      const keep = ext === 'csv' ? 4 : 3;
      const partial = join(dir, `utf8-partial.${ext}`);
      writeFileSync(partial, lines.slice(0, keep).join('\n') + '\n' + lines[keep]!.slice(0, 20));
      expect((await fray('sweep', named, ...VARY, '--out', partial, '--resume', '--quiet')).code).toBe(0);
      expect(readFileSync(partial, 'utf8')).toBe(text);
    }
  });

  it('an output path that cannot be written is an input error naming the option', async () => {
    const r = await fray('sweep', chain, '--vary', 'wait=0,1', '--out', join(dir, 'no-such-folder', 'x.csv'));
    expect(r.code).toBe(2);
    expect(r.err).toBe(`fray: --out ${join(dir, 'no-such-folder', 'x.csv')}: cannot write it: its folder does not exist\n`);
  });

  it('--resume refuses a file of another sweep', async () => {
    const f = join(dir, 'mine.csv');
    await fray('sweep', chain, '--vary', 'wait=0,1', '--out', f, '--quiet');
    const r = await fray('sweep', chain, '--vary', 'wait=0,2', '--out', f, '--resume');
    expect(r.code).toBe(2);
    expect(r.err).toContain('holds another sweep');
  });

  it('a point out of range is refused before anything runs, naming the point', async () => {
    const f = join(dir, 'never.csv');
    const r = await fray('sweep', chain, '--vary', 'gates.cx.error=0.5..1.5:3', '--out', f);
    expect(r.code).toBe(2);
    expect(r.err).toBe("(command line):1:16: --vary gates.cx.error=0.5..1.5:3 at gates.cx.error=1.5: 'error' in gate entry 'cx' must be a probability between 0 and 1, not 1.5\n");
    expect(() => readFileSync(f)).toThrow();
    const unknown = await fray('sweep', chain, '--vary', 'qubit.all.t1=20us..50us:3');
    expect(unknown.err).toBe("(command line):1:1: --vary qubit.all.t1=20us..50us:3 at qubit.all.t1=20000ns: 'qubit' is neither a parameter nor a profile key; did you mean 'qubits'?\n");
  });

  it('--plot writes SVG that parses as XML, with axis titles (units) and a title naming circuit and device', async () => {
    const one = join(dir, 'one.svg');
    const two = join(dir, 'two.svg');
    await fray('sweep', chain, '--vary', 'qubits.2.t1=5us..40us:log:3', '--metric', 'state', '--metric', 'classical', '--target', 'state>=0.9', '--plot', one, '--quiet');
    await fray('sweep', chain, ...VARY, '--plot', two, '--quiet');
    for (const [file, texts] of [
      [one, ['qubits.2.t1 (ns)', 'state fidelity', 'classical fidelity', 'ghz chain on tiny test line (invented)', 'target state&gt;=0.9']],
      [two, ['gates.cx.error', 'wait', 'ghz chain on tiny test line (invented)']],
    ] as const) {
      const svg = readFileSync(file, 'utf8');
      expect(XMLValidator.validate(svg)).toBe(true);
      expect(new XMLParser().parse(svg)).toHaveProperty('svg');
      for (const t of texts) expect(svg).toContain(t);
    }
  });

  it('without --out prints a table of the points', async () => {
    const r = await fray('sweep', chain, '--vary', 'noise-scale=0,1', '--metric', 'state', '--quiet');
    expect(r.out.split('\n')[0]).toMatch(/noise-scale\s+state/);
    expect(r.out).toMatch(/\n\s+0\s+1\.000000\n/);
  });
});

describe('sweep progress and keys', () => {
  it('off a terminal, progress is one line per 10% on stderr; --quiet prints nothing', async () => {
    const r = await fray('sweep', chain, '--vary', 'noise-scale=0..1:4', '--out', join(dir, 'p.csv'), '--jobs', '1');
    const lines = r.err.trim().split('\n');
    const progress = lines.filter((l) => /^sweep: \d+\/4 points/.test(l));
    expect(progress.map((l) => /\((\d+)%\)/.exec(l)?.[1])).toEqual(['20', '50', '70', '100']);
    expect(lines.slice(0, 4)).toEqual(progress);
    expect(lines.at(-1)).toBe(`sweep: 4 points written to ${join(dir, 'p.csv')}`);
    expect((await fray('sweep', chain, '--vary', 'noise-scale=0..1:4', '--out', join(dir, 'q.csv'), '--quiet')).err).toBe('');
  });

  it('noise-scale=0 rows are the ideal figures; a duration key is passed in ns', async () => {
    const f = join(dir, 'keys.jsonl');
    await fray('sweep', chain, '--vary', 'noise-scale=0,1', '--vary', 'qubits.2.t1=5us,20us', '--out', f, '--quiet');
    const rows = readFileSync(f, 'utf8').trim().split('\n').slice(1).map((l) => JSON.parse(l));
    expect(rows[0].point).toEqual({ 'noise-scale': 0, 'qubits.2.t1': 5000 });
    expect(rows[0].result.fidelity.state).toBeCloseTo(1, 12);
    expect(rows[2].result.fidelity.state).toBeLessThan(rows[3].result.fidelity.state); // shorter T1 on qubit 2, lower fidelity
    const single = JSON.parse((await fray('run', chain, '--set', 'qubits.2.t1=5us', '--json')).out);
    expect(rows[2].result.fidelity).toEqual(single.fidelity);
  });
});
