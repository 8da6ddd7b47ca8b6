import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { XMLParser } from 'fast-xml-parser';
import { fray, LOCATED, tempFile } from '../helpers/cli.js';
import { CHECK_CIRCUIT } from '../helpers/checkCircuit.js';

const DEMO = 'circuits/mitigation/ghz-line.yaml';

const SMALL = CHECK_CIRCUIT;

describe('fray check', () => {
  it('exit 0 when every expectation holds, 3 when one fails, with one table row each', async () => {
    const good = tempFile('good.yaml', SMALL('expect:\n  - state >= 0.98\n  - observable:Z <= 0.03\n'));
    const ok = await fray('check', good, '--no-color');
    expect(ok.code).toBe(0);
    expect(ok.out).toMatch(/state>=0\.98\s+0\.990000\s+pass/);
    const bad = tempFile('bad.yaml', SMALL('expect:\n  - state >= 0.995\n'));
    const fail = await fray('check', good, bad, '--no-color');
    expect(fail.code).toBe(3);
    expect(fail.out).toMatch(/state>=0\.995\s+0\.990000\s+FAIL/);
  });

  it('a file with no expect: is reported as such, not as a pass', async () => {
    const none = tempFile('none.yaml', SMALL(''));
    const r = await fray('check', none, '--json');
    expect(r.code).toBe(3);
    expect(JSON.parse(r.out).files[0].status).toBe('no-expectations');
  });

  it('JUnit XML parses and has one test case per expectation, failures marked', async () => {
    const bad = tempFile('bad.yaml', SMALL('expect:\n  - state >= 0.995\n  - tvd <= 0.5\n'));
    const xml = tempFile('out.xml', '');
    await fray('check', DEMO, bad, '--junit', xml);
    const doc = new XMLParser({ ignoreAttributes: false, isArray: (name) => name === 'testsuite' || name === 'testcase' }).parse(readFileSync(xml, 'utf8'));
    const suites = doc.testsuites.testsuite;
    expect(suites).toHaveLength(2);
    expect(suites[0].testcase).toHaveLength(5);
    expect(suites[1].testcase.map((c: { '@_name': string }) => c['@_name'])).toEqual(['state>=0.995', 'tvd<=0.5']);
    expect(suites[1].testcase[0].failure).toBeDefined();
    expect(suites[1].testcase[1].failure).toBeUndefined();
    expect(doc.testsuites['@_failures']).toBe('1');
  });

  it('a --junit or --write-baseline path that cannot be written is an input error (exit 2), not an internal one', async () => {
    const good = tempFile('good.yaml', SMALL('expect:\n  - state >= 0.9\n'));
    const nowhere = tempFile('x', '') + '.missing/out';
    for (const option of ['--junit', '--write-baseline']) {
      const r = await fray('check', good, option, nowhere);
      expect(r.code).toBe(2);
      expect(r.err).toContain(`${option} ${nowhere}: cannot write it: its folder does not exist`);
    }
  });

  it('a baseline regression is caught even when the absolute expectation still holds', async () => {
    const base = tempFile('base.json', '');
    const v1 = tempFile('c.yaml', SMALL('expect:\n  - state >= 0.9\n'));
    expect((await fray('check', v1, '--write-baseline', base)).code).toBe(0);
    expect(JSON.parse(readFileSync(base, 'utf8')).files[v1].state).toBeCloseTo(0.99, 14);
    expect((await fray('check', v1, '--baseline', base)).code).toBe(0);
    // the same file, a worse device: the expectation still holds, the baseline does not
    const worse = await fray('check', v1, '--baseline', base, '--set', 'gates.all.depolarizing=0.03', '--no-color');
    expect(worse.code).toBe(3);
    expect(worse.out).toMatch(/baseline state\s+0\.985000\s+FAIL \(was 0\.990000\)/);
    expect((await fray('check', v1, '--baseline', base, '--set', 'gates.all.depolarizing=0.03', '--tolerance', '0.02')).code).toBe(0);
  });

  it('bad expectations are located input errors (exit 2); a mitigated figure needs a mitigation: block', async () => {
    const cases: [string, RegExp][] = [
      ['expect:\n  - fidelity >= 0.9\n', /bad\.yaml:9:5: expect: 'fidelity >= 0\.9': unknown metric 'fidelity'/],
      ['expect:\n  - observable:ZZ <= 0.1\n', /bad\.yaml:9:5: expect: 'observable:ZZ <= 0\.1': /],
      ['expect:\n  - mitigated.tvd <= 0.1\n', /bad\.yaml:9:5: expect: 'mitigated\.tvd <= 0\.1' reads a mitigated figure, and the file has no 'mitigation:' block/],
      ['expect:\n  - mitigated.duration <= 10\n', /bad\.yaml:9:5: expect: 'mitigated\.duration <= 10': mitigation changes observable:P, tvd, classical, not duration/],
    ];
    for (const [block, says] of cases) {
      const file = tempFile('bad.yaml', SMALL(block));
      const r = await fray('check', file);
      expect(r.code, block).toBe(2);
      expect(r.err.split('\n')[0]).toMatch(LOCATED);
      expect(r.err).toMatch(says);
    }
    const notBaseline = tempFile('nb.json', '{"files": {}}');
    const r = await fray('check', DEMO, '--baseline', notBaseline);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/not a fray baseline/);
  });
});
