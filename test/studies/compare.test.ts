import { describe, expect, it } from 'vitest';
import { fray, tempFile } from '../helpers/cli.js';
import { compareVariants } from '../../src/studies/index.js';
import { parseCondition } from '../../src/studies/conditions.js';
import { ghzChain, ghzFan, tinyDevice } from './fixtures.js';

/** fray compare: the figures equal single runs, the ranking, --require and exit status 3. */
describe('fray compare', () => {
  const dev = tinyDevice();
  const chain = ghzChain(dev);
  const fan = ghzFan(dev);

  it('every figure equals `fray run FILE --json` for that variant, best first', async () => {
    const r = JSON.parse((await fray('compare', chain, fan, '--json')).out);
    expect(r.by).toBe('state');
    expect(r.variants.map((v: { rank: number }) => v.rank)).toEqual([1, 2]);
    for (const v of r.variants) {
      const single = JSON.parse((await fray('run', v.file, '--json')).out);
      expect(v.fidelity).toEqual(single.fidelity);
      expect(v.tvd).toBe(single.tvd);
      expect(v.purity).toBe(single.purity);
      expect(v.duration_ns).toBe(single.duration_ns);
      expect(v.device).toBe(single.device);
      expect(v.failed).toEqual([]);
    }
    expect(r.variants[0].fidelity.state).toBeGreaterThan(r.variants[1].fidelity.state);
    expect(r.variants[0].operations).toEqual({ one_qubit_gates: 1, two_qubit_gates: 2, measurements: 3, resets: 0 });
  });

  it('lower is better for tvd and duration; --by observable:P ranks by |⟨P⟩noisy − ⟨P⟩ideal|', () => {
    const byTvd = compareVariants([chain, fan], { by: { kind: 'tvd' } });
    expect(byTvd.variants[0]!.tvd).toBeLessThanOrEqual(byTvd.variants[1]!.tvd);
    const byObs = compareVariants([chain, fan], { by: { kind: 'observable', pauli: 'ZIZ' } });
    for (const v of byObs.variants) expect(v.value).toBe(Math.abs(v.observables!['ZIZ']!.noisy - v.observables!['ZIZ']!.ideal));
    expect(byObs.variants[0]!.value).toBeLessThanOrEqual(byObs.variants[1]!.value);
  });

  it('--require marks failing variants and exits 3; passing requirements exit 0', async () => {
    const all = compareVariants([chain, fan]);
    const between = (all.variants[0]!.fidelity.state + all.variants[1]!.fidelity.state) / 2;
    const r = await fray('compare', chain, fan, '--require', `state>=${between}`, '--require', 'tvd<=1');
    expect(r.code).toBe(3);
    expect(r.out).toMatch(/FAILS state>=/);
    expect(r.out).toContain('1 of 2 variants fails a requirement (exit status 3).');
    expect(r.out).toMatch(/wins on state fidelity: \d\.\d+ against \d\.\d+ for .* \(\+\d/);
    expect((await fray('compare', chain, fan, '--require', 'state>=0.1')).code).toBe(0);
    const j = JSON.parse((await fray('compare', chain, fan, '--require', `state>=${between}`, '--json')).out);
    expect(j.variants[1].failed).toEqual([`state>=${between}`]);
  });

  it('devices and layouts make a cross product of variants', () => {
    const other = tempFile('quiet.yaml', 'name: quiet\nqubits:\n  all: { t1: 1s }\n');
    const r = compareVariants([chain], { devices: [dev, other], layouts: [[0, 1, 2], [2, 1, 0]] });
    expect(r.variants).toHaveLength(4);
    expect(r.variants[0]!.device).toBe('quiet');
    expect(new Set(r.variants.map((v) => `${v.device_file} ${v.layout?.join(',')}`)).size).toBe(4);
  });

  it('says when variants are compared on what is comparable only', async () => {
    const two = tempFile('bell.yaml', `qubits: 2\ndevice: ${dev}\nsteps:\n  - h: 0\n  - cx: [0, 1]\n`);
    const r = await fray('compare', chain, two);
    expect(r.code).toBe(0);
    expect(r.out).toContain('differ in qubit count or measured qubits');
  });

  it('refuses an unknown metric, a malformed condition and an observable of the wrong length', async () => {
    expect((await fray('compare', chain, '--by', 'fidelty')).err).toContain("fray: --by fidelty: unknown metric 'fidelty'");
    expect((await fray('compare', chain, '--require', 'state=>0.9')).err).toContain("is not a condition; expected METRIC OP NUMBER");
    const r = await fray('compare', chain, '--by', 'observable:ZZ');
    expect(r.code).toBe(2);
    expect(r.err).toContain('observable:ZZ:');
  });
});

describe('the condition language', () => {
  it('parses METRIC OP NUMBER with spaces and every operator', () => {
    expect(parseCondition(' tvd <= 0.05 ')).toMatchObject({ op: '<=', value: 0.05, text: 'tvd<=0.05' });
    expect(parseCondition('observable:ZZI<2e-2')).toMatchObject({ metric: { kind: 'observable', pauli: 'ZZI' }, op: '<', value: 0.02 });
    expect(parseCondition('state>0.9')).toMatchObject({ op: '>' });
    expect('error' in parseCondition('state >= high')).toBe(true);
  });
});

describe('fray compare outputs', () => {
  it('--csv writes one parsable row per variant, best first; --plot writes SVG; --layout shows in the JSON', async () => {
    const { mkdtempSync, readFileSync } = await import('node:fs');
    const { join } = await import('node:path');
    const { tmpdir } = await import('node:os');
    const { parse } = await import('csv-parse/sync');
    const { XMLValidator } = await import('fast-xml-parser');
    const dir = mkdtempSync(join(tmpdir(), 'fray-compare-'));
    const dev = tinyDevice();
    const r = await fray('compare', ghzChain(dev), '--layout', '0,1,2', '--layout', '2,1,0', '--csv', join(dir, 'c.csv'), '--plot', join(dir, 'c.svg'), '--json');
    const j = JSON.parse(r.out);
    const rows = parse(readFileSync(join(dir, 'c.csv'), 'utf8'), { columns: true }) as Record<string, string>[];
    expect(rows.map((x) => Number(x['fidelity_state']))).toEqual(j.variants.map((v: { fidelity: { state: number } }) => v.fidelity.state));
    expect(rows.map((x) => x['layout'])).toEqual(j.variants.map((v: { layout: number[] }) => v.layout.join(' ')));
    expect(Object.keys(rows[0]!).slice(0, 6)).toEqual(['rank', 'file', 'device', 'layout', 'name', 'duration_ns']);
    const svg = readFileSync(join(dir, 'c.svg'), 'utf8');
    expect(XMLValidator.validate(svg)).toBe(true);
    expect(svg).toContain('state fidelity');
    // placed backwards, the weak device qubit 2 holds circuit qubit 0, which waits for both cx
    const run = JSON.parse((await fray('run', ghzChain(dev), '--layout', '2,1,0', '--json')).out);
    expect(run.layout).toEqual([2, 1, 0]);
    expect(j.variants.find((v: { layout: number[] }) => v.layout[0] === 2).fidelity).toEqual(run.fidelity);
  });
});
