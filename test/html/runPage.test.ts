import { existsSync, mkdtempSync, readdirSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { XMLValidator } from 'fast-xml-parser';
import { describe, expect, it } from 'vitest';
import { fray, tempFile } from '../helpers/cli.js';

/** Writes the HTML report of a demo with `fray run --json --html` and returns the page and the JSON. */
async function report(demo: string, ...extra: string[]): Promise<{ html: string; json: Record<string, any>; err: string }> {
  const out = join(mkdtempSync(join(tmpdir(), 'fray-html-')), 'report.html');
  const r = await fray('run', demo, '--json', '--html', out, ...extra);
  expect(r.code).toBe(0);
  return { html: readFileSync(out, 'utf8'), json: JSON.parse(r.out), err: r.err };
}

describe('fray run --html', () => {
  it('writes one well-formed, self-contained page: no scripts, nothing fetched', async () => {
    const { html, err } = await report('circuits/qpe3-asap.yaml');
    expect(err).toMatch(/^fray: wrote the HTML report to .*report\.html\n$/);
    expect(XMLValidator.validate(html)).toBe(true);
    expect(html.startsWith('<!DOCTYPE html>')).toBe(true);
    expect(html).not.toMatch(/<script/i);
    expect(html).not.toMatch(/\b(src|href)\s*=/i);
    expect(html).not.toMatch(/url\((?!#)/i); // only references to the page itself (gradients)
    // the only absolute URLs are XML namespace names, which are never fetched
    const urls = [...html.matchAll(/https?:\/\/[^"'\s<)]+/g)].map((m) => m[0]);
    expect(new Set(urls)).toEqual(new Set(['http://www.w3.org/1999/xhtml', 'http://www.w3.org/2000/svg', 'http://www.w3.org/1999/xlink']));
  });

  it('shows the JSON figures: header, fidelity block, outcomes with the bit order, Bloch lengths, observables, counts', async () => {
    const { html, json } = await report('circuits/ghz5.yaml', '--shots', '200', '--top', '4');
    const shown = (key: string) => Number(new RegExp(`data-figure="${key}" title="([^"]+)">([0-9.]+)<`).exec(html)?.[1]);
    expect(shown('state-fidelity')).toBe(json.fidelity.state);
    expect(shown('classical-fidelity')).toBe(json.fidelity.classical);
    expect(shown('tvd')).toBe(json.tvd);
    expect(shown('purity')).toBe(json.purity);
    expect(html).toContain(`>${json.fidelity.state.toFixed(6)}</div>`);
    expect(html).toContain('<dt>measured</dt><dd>0 1 2 3 4 (bit order of every outcome, left to right)</dd>');
    expect(html).toContain('Most likely outcomes (4 of 32)');
    expect(html).toContain('<th>outcome (0 1 2 3 4)</th>');
    expect(html).toContain(`<td>11111</td><td class="num">${json.probabilities.ideal['11111'].toFixed(6)}</td><td class="num">${json.probabilities.noisy['11111'].toFixed(6)}</td><td class="num">${json.probabilities.measured['11111'].toFixed(6)}</td>`);
    expect(html).toContain('id="state"');
    expect(html).toContain('id="observables"');
    expect(html).toContain('Sampled counts (200 shots, seed 1)');
    for (const id of ['run', 'fidelity', 'timeline', 'outcomes']) expect(html).toContain(`<section id="${id}">`);
  });

  it('names the coupling map and the drift of a version-2 device in the header, as the text report does', async () => {
    const { html } = await report('circuits/zz-spectator-a.yaml');
    const text = (await fray('run', 'circuits/zz-spectator-a.yaml')).out;
    const couplings = /couplings (.*)\n/.exec(text)![1]!;
    expect(html).toContain(`<dt>couplings</dt><dd>${couplings}</dd>`);
    expect(html).toContain('<dt>drift</dt><dd>detuning on 0 qubits, zz on 3 pairs; the ideal run has none (not in the idle shading, which is relaxation only)</dd>');
  });

  it('draws drift: a detuned qubit’s lane names its detuning, the caption lists the always-on zz', async () => {
    const detuned = (await report('circuits/detuned-ramsey-echo.yaml')).html;
    expect(detuned).toMatch(/>ramsey \(δ 45 kHz\)<\/text>/);
    const zz = (await report('circuits/zz-spectator-a.yaml')).html;
    expect(zz).toContain('Always-on zz: 0–1 30 kHz, 1–2 260 kHz, 2–3 35 kHz.');
  });

  it('record mode: outcomes are records, conditioned steps and the bits that feed them are marked', async () => {
    const { html, json } = await report('circuits/teleport.yaml');
    expect(json.bits).toBeDefined();
    expect(html).toContain(`Most likely records`);
    expect(html).toContain(`<dt>record</dt><dd>${json.bits.join(' ')} (bit order of every outcome, left to right)</dd>`);
    expect(html).toMatch(/<title>step 8: x on dst · 1840 ns → 1870 ns \(30 ns\)[^<]* · only if b = 1<\/title>/);
    expect((/<g class="mark-rule role-mark feeds_marks"[^>]*>(.*?)<\/g>/.exec(html)?.[1]?.match(/<line /g) ?? []).length).toBe(2);
  });

  it('lists the costliest idle windows with their 1 − F_avg', async () => {
    const { html } = await report('circuits/ghz5.yaml');
    // qubit 3 waits longest before its cx (ghz5 builds the chain from qubit 0)
    expect(html).toMatch(/<table class="idle-windows">.*?<tbody><tr><td>3<\/td>/);
  });

  it('escapes names, labels and qubit labels from the file everywhere, in HTML and SVG', async () => {
    const circuit = tempFile(
      'odd.yaml',
      'name: "<b>odd & \\"quoted\\"</b>"\nqubits: ["a<1>", b]\nnoise:\n  qubits: { all: { t1: 20us } }\n  gates: { all: { duration: 50ns } }\nsteps:\n  - h: "a<1>"\n    label: "x < y & z"\n  - cx: ["a<1>", b]\n',
    );
    const { html } = await report(circuit);
    expect(XMLValidator.validate(html)).toBe(true);
    expect(html).not.toContain('<b>');
    expect(html).toContain('<h1>&lt;b&gt;odd &amp; &quot;quoted&quot;&lt;/b&gt;</h1>');
    expect(html).toContain('<title>step 1: h on a&lt;1&gt; (x &lt; y &amp; z) · 0 ns → 50 ns (50 ns)</title>');
  });

  it('is an input error with --plan, or when the file cannot be written; nothing is left behind', async () => {
    const withPlan = await fray('run', 'circuits/ghz5.yaml', '--plan', '--html', 'x.html');
    expect(withPlan.code).toBe(2);
    expect(withPlan.err).toBe('fray: --html draws a run; --plan does not run the circuit: give one of them\n');
    const dir = mkdtempSync(join(tmpdir(), 'fray-html-'));
    const missing = join(dir, 'no-such-folder', 'r.html');
    const r = await fray('run', 'circuits/ghz5.yaml', '--html', missing);
    expect(r.code).toBe(2);
    expect(r.err).toBe(`fray: --html ${missing}: cannot write it: its folder does not exist\n`);
    expect(existsSync(missing)).toBe(false);
    const asFolder = await fray('run', 'circuits/ghz5.yaml', '--html', dir);
    expect(asFolder.code).toBe(2);
    expect(readdirSync(dir)).toEqual([]);
  });
});
