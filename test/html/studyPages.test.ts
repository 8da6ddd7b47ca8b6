import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { XMLValidator } from 'fast-xml-parser';
import { describe, expect, it } from 'vitest';
import { fray, tempFile } from '../helpers/cli.js';
import { CHECK_CIRCUIT } from '../helpers/checkCircuit.js';

/** A fresh path for a page. */
function pagePath(): string {
  return join(mkdtempSync(join(tmpdir(), 'fray-html-')), 'page.html');
}

/** The body rows of the page's table of class `cls`, as text cells. */
function tableRows(html: string, cls: string): string[][] {
  const body = new RegExp(`<table class="${cls}">.*?<tbody>(.*?)</tbody>`, 's').exec(html)?.[1];
  expect(body, `table ${cls}`).toBeDefined();
  return [...body!.matchAll(/<tr>(.*?)<\/tr>/g)].map((m) => [...m[1]!.matchAll(/<td[^>]*>(.*?)<\/td>/g)].map((c) => c[1]!));
}

/** Checks what every study page must be: well-formed, self-contained, one inline SVG picture at least (unless `svg` is false). */
function expectSelfContained(html: string, svg = true): void {
  expect(XMLValidator.validate(html)).toBe(true);
  expect(html.startsWith('<!DOCTYPE html>')).toBe(true);
  expect(html).not.toMatch(/<script/i);
  expect(html).not.toMatch(/\b(src|href)\s*=/i);
  if (svg) expect(html).toMatch(/<figure><svg [^>]*xmlns="http:\/\/www\.w3\.org\/2000\/svg"/);
}

const SMALL = CHECK_CIRCUIT;

describe('--html on the study commands', () => {
  it('compare: the ranked table holds the --json figures, and the ranking chart', async () => {
    const out = pagePath();
    const r = await fray('compare', 'circuits/qpe3-asap.yaml', 'circuits/qpe3-alap.yaml', '--json', '--html', out);
    expect(r.code).toBe(0);
    expect(r.err).toContain(`wrote the HTML report to ${out}`);
    const json = JSON.parse(r.out);
    const html = readFileSync(out, 'utf8');
    expectSelfContained(html);
    expect(html).toContain('Variants ranked by state fidelity');
    const rows = tableRows(html, 'compare');
    expect(rows).toHaveLength(json.variants.length);
    json.variants.forEach((v: any, i: number) => {
      expect(rows[i]![0]).toBe(String(v.rank));
      expect(rows[i]![1]).toBe(v.file);
      expect(rows[i]!.slice(7, 10)).toEqual([v.fidelity.state.toFixed(6), v.fidelity.classical.toFixed(6), v.tvd.toFixed(6)]);
    });
    expect(html).toContain(json.verdict.replace(/&/g, '&amp;'));
  });

  it('compare: a variant failing --require is marked in the table (exit status 3 as without --html)', async () => {
    const out = pagePath();
    const r = await fray('compare', 'circuits/qpe3-asap.yaml', 'circuits/qpe3-alap.yaml', '--require', 'state>=0.78', '--html', out);
    expect(r.code).toBe(3);
    expect(tableRows(readFileSync(out, 'utf8'), 'compare').map((row) => row.at(-1))).toEqual(['', 'FAILS state&gt;=0.78']);
  });

  it('sweep: every point of --out FILE.jsonl is a table row with its figure, and the plot has the target line', async () => {
    const out = pagePath();
    const jsonl = join(mkdtempSync(join(tmpdir(), 'fray-sweep-')), 'rows.jsonl');
    const r = await fray('sweep', 'circuits/ghz5.yaml', '--vary', 'noise-scale=0..2:5', '--target', 'state>=0.9', '--out', jsonl, '--quiet', '--jobs', '1', '--html', out);
    expect(r.code).toBe(0);
    const points = readFileSync(jsonl, 'utf8').split('\n').filter((l) => l.startsWith('{') && l.includes('"result"')).map((l) => JSON.parse(l));
    expect(points).toHaveLength(5);
    const html = readFileSync(out, 'utf8');
    expectSelfContained(html);
    const rows = tableRows(html, 'sweep');
    expect(rows).toEqual(points.map((p) => [String(Number(p.point['noise-scale'].toPrecision(6))), p.result.fidelity.state.toFixed(6)]));
    expect(html).toContain('target state&gt;=0.9');
  });

  it('sweep: two varied keys draw a heat map whose cells print their value, white on the dark end of the scale', async () => {
    const out = pagePath();
    const r = await fray('sweep', 'circuits/ghz5.yaml', '--vary', 'noise-scale=0,3', '--vary', 'gates.cx.error=0.002,0.01', '--quiet', '--jobs', '1', '--html', out);
    expect(r.code).toBe(0);
    const html = readFileSync(out, 'utf8');
    expectSelfContained(html);
    const states = tableRows(html, 'sweep').map((row) => Number(row[2]));
    const fill = (v: number) => new RegExp(`<text aria-label="[^"]*value: ${v.toFixed(3)}"[^>]*fill="([^"]+)"`).exec(html)?.[1];
    expect(fill(Math.min(...states))).toBe('#ffffff');
    expect(fill(Math.max(...states))).toBe('#222222');
  });

  it('sweep: three varied keys get the table and a note instead of a picture', async () => {
    const out = pagePath();
    const r = await fray('sweep', 'circuits/ghz5.yaml', '--vary', 'noise-scale=1,2', '--vary', 'gates.cx.error=0.01,0.02', '--vary', 'qubits.all.t1=50us,100us', '--quiet', '--jobs', '1', '--html', out);
    expect(r.code).toBe(0);
    const html = readFileSync(out, 'utf8');
    expectSelfContained(html, false);
    expect(html).toContain('This sweep varies 3 keys');
    expect(tableRows(html, 'sweep')).toHaveLength(8);
  });

  it('budget: the source tables hold the --json figures, and the bars', async () => {
    const out = pagePath();
    const r = await fray('budget', 'circuits/ghz5.yaml', '--json', '--html', out);
    expect(r.code).toBe(0);
    const json = JSON.parse(r.out);
    const html = readFileSync(out, 'utf8');
    expectSelfContained(html);
    const loss = (x: number) => (Math.abs(x) < 1e-12 ? 0 : x).toFixed(6);
    expect(tableRows(html, 'budget-sources')).toEqual(json.sources.map((s: any) => [s.label, loss(s.only_on), loss(s.removed_when_off), `${(100 * (Math.abs(s.share) < 1e-12 ? 0 : s.share)).toFixed(1)}%`]));
    expect(tableRows(html, 'budget-qubits').map((row) => row[0])).toEqual(json.qubits.map((s: any) => s.label));
    expect(html).toContain(`Total loss ${loss(json.total)}`);
    expect(html).toContain('Noise budget: loss of state fidelity');
  });

  it('check: every expectation is a row with the --json value and verdict; the bars name pass and FAIL', async () => {
    const good = tempFile('good.yaml', SMALL('expect:\n  - state >= 0.98\n'));
    const bad = tempFile('bad.yaml', SMALL('expect:\n  - state >= 0.995\n'));
    const out = pagePath();
    const r = await fray('check', good, bad, '--json', '--html', out);
    expect(r.code).toBe(3);
    const json = JSON.parse(r.out);
    const html = readFileSync(out, 'utf8');
    expectSelfContained(html);
    const rows = tableRows(html, 'check');
    expect(rows.map((row) => row.slice(0, 4))).toEqual(
      json.files.flatMap((f: any) => f.expectations.map((e: any) => [f.file, e.expectation.replace(/>/g, '&gt;'), e.value.toPrecision(6), e.pass ? 'pass' : 'FAIL'])),
    );
    expect(rows.map((row) => row[3])).toEqual(['pass', 'FAIL']);
    expect(html).toContain('1 of 2 files did not pass.');
    expect(html).toMatch(/>pass · good\.yaml · state&gt;=0\.98</);
    expect(html).toMatch(/>FAIL · bad\.yaml · state&gt;=0\.995</);
  });

  it('mitigate: the observable and readout tables hold the --json figures; bars ideal / noisy / mitigated', async () => {
    const out = pagePath();
    const r = await fray('mitigate', 'circuits/mitigation/ghz-line.yaml', '--zne', '1,3,5', '--fold', '--readout', 'bounded', '--json', '--html', out);
    expect(r.code).toBe(0);
    const json = JSON.parse(r.out);
    const html = readFileSync(out, 'utf8');
    expectSelfContained(html);
    const v = (x: number) => (Math.abs(x) < 5e-7 ? 0 : x).toFixed(6);
    const names = Object.keys(json.observables);
    expect(names.length).toBeGreaterThan(0);
    expect(tableRows(html, 'observables')).toEqual(
      names.map((k) => {
        const o = json.observables[k];
        return [k, v(o.ideal), v(o.noisy), v(o.mitigated), v(Math.abs(o.noisy - o.ideal)), v(Math.abs(o.mitigated - o.ideal)), o.stderr === null ? '—' : v(o.stderr), ...o.points.map((p: any) => v(p.value))];
      }),
    );
    const readout = tableRows(html, 'readout');
    expect(readout.map((row) => row[0])).toEqual(Object.keys(json.readout.ideal).concat(Object.keys(json.readout.measured)).filter((k, i, a) => a.indexOf(k) === i).sort());
    for (const row of readout) expect(row.slice(1)).toEqual([json.readout.ideal, json.readout.measured, json.readout.mitigated].map((d) => v(d[row[0]!] ?? 0)));
    expect(tableRows(html, 'distribution')).toEqual([
      ['total variation distance', v(json.distribution.tvd_before), v(json.distribution.tvd_after)],
      ['classical fidelity', v(json.distribution.classical_before), v(json.distribution.classical_after)],
    ]);
    // the legends of both charts name the mitigated series
    expect(html.match(/>mitigated<\/text>/g)?.length).toBe(2);
  });

  it('an --html path that cannot be written is an input error (exit 2) naming the option, on every study command', async () => {
    const nowhere = join(mkdtempSync(join(tmpdir(), 'fray-html-')), 'missing', 'page.html');
    const good = tempFile('good.yaml', SMALL('expect:\n  - state >= 0.98\n'));
    const runs = [
      ['compare', 'circuits/qpe3-asap.yaml'],
      ['sweep', 'circuits/ghz5.yaml', '--vary', 'noise-scale=0,1', '--quiet', '--jobs', '1'],
      ['budget', good],
      ['check', good],
      ['mitigate', 'circuits/mitigation/ghz-line.yaml', '--readout', 'bounded'],
    ];
    for (const args of runs) {
      const r = await fray(...args, '--html', nowhere);
      expect(r.code, args[0]).toBe(2);
      expect(r.err).toContain(`--html ${nowhere}: cannot write it: its folder does not exist`);
      expect(r.err).not.toMatch(/\n\s+at /);
    }
  });
});
