import { describe, expect, it } from 'vitest';
import { fray, LOCATED, tempFile } from '../helpers/cli.js';

const DEMO = 'circuits/mitigation/ghz-line.yaml';

describe('fray mitigate', () => {
  it('--json has the issue\'s shape: observables with ideal, noisy, mitigated, stderr, points; readout with both distances', async () => {
    const { code, out, err } = await fray('mitigate', DEMO, '--zne', '1,3,5', '--fold', '--fit', 'linear', '--readout', 'bounded', '--observe', 'ZIIZ', '--json');
    expect(err).toBe('');
    expect(code).toBe(0);
    const j = JSON.parse(out);
    expect(Object.keys(j.observables)).toEqual(['ZZII', 'IIZZ', 'XXXX', 'ZIIZ']);
    const o = j.observables.ZZII;
    expect(Object.keys(o)).toEqual(['ideal', 'noisy', 'mitigated', 'stderr', 'points']);
    expect(o.points.map((p: { scale: number }) => p.scale)).toEqual([1, 3, 5]);
    expect(typeof o.stderr).toBe('number');
    expect(Math.abs(o.mitigated - o.ideal)).toBeLessThan(Math.abs(o.noisy - o.ideal));
    expect(j.readout.method).toBe('bounded');
    for (const k of ['mitigated', 'tvd_before', 'tvd_after', 'classical_before', 'classical_after']) expect(j.readout).toHaveProperty(k);
    expect(j.readout.tvd_after).toBeLessThan(j.readout.tvd_before);
  });

  it('the table lists each observable with its errors and the value at each scale', async () => {
    const { code, out } = await fray('mitigate', DEMO, '--zne', '1,2,3', '--no-color');
    expect(code).toBe(0);
    expect(out).toMatch(/noise scale, richardson fit/);
    expect(out).toMatch(/observable\s+ideal\s+noisy\s+mitigated\s+err before\s+err after\s+std err\s+λ=1\s+λ=2\s+λ=3/);
    expect(out).toMatch(/^ {2}XXXX\s+1\.000000/m);
  });

  it('bad options and unfittable requests exit 2 with a message, no stack trace', async () => {
    for (const args of [
      ['--zne', '1'],
      ['--zne', '1,0.5'],
      ['--zne', '1,x'],
      ['--zne', '1,3,3'],
      ['--zne', '1,3', '--fit', 'cubic'],
      ['--zne', '1,3', '--fold', 'middle'],
      ['--readout', 'exact'],
      ['--fit', 'linear'],
    ]) {
      const { code, err } = await fray('mitigate', DEMO, ...args);
      expect(code, args.join(' ')).toBe(2);
      expect(err).toMatch(/^fray: /);
      expect(err).not.toMatch(/\n\s+at /);
    }
    // what the circuit file lacks is a located input error (found by the fuzz test, seed 507011)
    const noObs = tempFile('plain.yaml', 'qubits: 1\nsteps:\n  - x: 0\n');
    const zne = await fray('mitigate', noObs, '--zne', '1,3');
    expect(zne.code).toBe(2);
    expect(zne.err).toMatch(/^.*plain\.yaml:1:1: zero-noise extrapolation extrapolates Pauli observables: give --observe P/);
    const nothing = await fray('mitigate', noObs);
    expect(nothing.code).toBe(2);
    expect(nothing.err).toMatch(/^.*plain\.yaml:1:1: nothing to mitigate/);
    const block = tempFile('block.yaml', 'qubits: 1\nsteps:\n  - x: 0\nmitigation:\n  twirl: true\n');
    const twirled = await fray('mitigate', block);
    expect(twirled.code).toBe(2);
    expect(twirled.err).toMatch(/^.*block\.yaml:5:3: decoupling and twirling \(the file's 'mitigation:' block\) are judged by Pauli observables/);
  });

  it('scales that fold to the same circuit are a located input error', async () => {
    const file = tempFile('two.yaml', 'qubits: 1\nobserve: [Z]\nsteps:\n  - x: 0\n  - x: 0\n');
    const { code, err } = await fray('mitigate', file, '--zne', '1,1.2,3', '--fold');
    expect(code).toBe(2);
    expect(err.split('\n')[0]).toMatch(LOCATED); // at the steps: key, line 3
    expect(err).toMatch(/two\.yaml:3:1: --zne scales 1 and 1\.2 both fold to 1 with 2 gate applications; choose scales at least 1\.00 apart/);
  });
});

describe('fray mitigate --dd', () => {
  it('lists where it inserted what, and reports the observables of the decoupled run', async () => {
    const { code, out } = await fray('mitigate', DEMO, '--dd', 'xy4', '--min-idle', '200ns', '--no-color');
    expect(code).toBe(0);
    expect(out).toMatch(/Dynamical decoupling \(xy4, windows of at least 200 ns\)/);
    expect(out).toMatch(/qubit 0 {3}310 ns → 870 ns {11}inserted x y x y/);
    const j = JSON.parse((await fray('mitigate', DEMO, '--dd', 'xy4', '--min-idle', '200ns', '--json')).out);
    expect(j.decoupling.inserted.every((i: { end: number; start: number }) => i.end - i.start >= 200)).toBe(true);
    expect(j.observables.XXXX.points).toHaveLength(1);
    expect(j.observables.XXXX.stderr).toBeNull();
  });

  it('bad --dd and --min-idle values exit 2', async () => {
    for (const args of [['--dd', 'xy8'], ['--dd', 'xx', '--min-idle', '200'], ['--min-idle', '200ns', '--readout', 'inverse']]) {
      const { code, err } = await fray('mitigate', DEMO, ...args);
      expect(code, args.join(' ')).toBe(2);
      expect(err).toMatch(/^fray: /);
    }
  });
});

describe('fray mitigate --twirl', () => {
  it('twirls exactly, or averages seeded instances, and says how many gates it twirled', async () => {
    const exact = JSON.parse((await fray('mitigate', DEMO, '--twirl', '--json')).out);
    expect(exact.twirl).toEqual({ mode: 'exact', gates: 3 });
    const sampled = JSON.parse((await fray('mitigate', DEMO, '--twirl', '3', '--seed', '2', '--json')).out);
    expect(sampled.twirl).toEqual({ mode: 'sampled', instances: 3, seed: 2, gates: 3 });
    const { code, err } = await fray('mitigate', DEMO, '--twirl', '0');
    expect(code).toBe(2);
    expect(err).toMatch(/--twirl 0: expected a whole number of instances/);
  });
});

describe("fray mitigate with the file's mitigation: block", () => {
  it('applies the recipe when no method is given, and the command line replaces it', async () => {
    const recipe = JSON.parse((await fray('mitigate', DEMO, '--json')).out);
    expect(recipe.twirl.mode).toBe('exact');
    expect(recipe.fit).toBe('richardson');
    expect(recipe.readout.method).toBe('inverse');
    const given = JSON.parse((await fray('mitigate', DEMO, '--readout', 'bounded', '--json')).out);
    expect(given.twirl).toBeUndefined();
    expect(given.readout.method).toBe('bounded');
  });
});
