import { describe, expect, it } from 'vitest';
import { fray, tempFile } from '../helpers/cli.js';
import { findThreshold, parseCondition, parseInterval, type Condition, type Interval } from '../../src/studies/index.js';
import { ghzChain, tinyDevice } from './fixtures.js';

const cond = (t: string) => parseCondition(t) as Condition;
const interval = (t: string) => parseInterval(t) as Interval;

/** A GHZ_n preparation followed by a phase flip of probability p on every qubit (a parameter). */
function ghzPhaseFlip(n: number): string {
  const cx = Array.from({ length: n - 1 }, (_, i) => `  - cx: [${i}, ${i + 1}]\n`).join('');
  return tempFile(`ghz${n}-flip.yaml`, `qubits: ${n}\nparams: { p: 0 }\nsteps:\n  - h: 0\n${cx}  - noise: { phase_flip: p }\n    on: all\n`);
}

describe('fray threshold', () => {
  // Derived from the phase-flip channel ρ → (1 − p)ρ + pZρZ (Nielsen & Chuang §8.3.3): a Z on
  // any qubit maps (|0…0⟩ + |1…1⟩)/√2 to the orthogonal (|0…0⟩ − |1…1⟩)/√2, so the fidelity
  // is the probability of an even number of flips, F = (1 + (1 − 2p)^n)/2, and F ≥ T holds
  // up to p* = (1 − (2T − 1)^(1/n))/2.
  it.each([3, 4])('GHZ_%s under phase flips: the bisection brackets the exact p* to the tolerance', (n) => {
    const file = ghzPhaseFlip(n);
    const target = 0.9;
    const exact = (1 - (2 * target - 1) ** (1 / n)) / 2;
    const tol = 1e-7;
    const r = findThreshold({ file, target: cond(`state>=${target}`), vary: interval('p=0..0.5'), tol });
    expect(r.status).toBe('crossed');
    expect(r.monotone).toBe(true);
    expect(r.bracket!.lo.value).toBeLessThanOrEqual(exact);
    expect(r.bracket!.hi.value).toBeGreaterThanOrEqual(exact);
    expect(r.bracket!.hi.value - r.bracket!.lo.value).toBeLessThanOrEqual(tol);
    expect(r.threshold).toBe(r.bracket!.lo.value);
    for (const s of r.samples) expect(s.metric).toBeCloseTo((1 + (1 - 2 * s.value) ** n) / 2, 12);
  });

  it('the end points equal the corresponding single runs', async () => {
    const dev = tinyDevice();
    const file = ghzChain(dev);
    const r = JSON.parse((await fray('threshold', file, '--target', 'state>=0.95', '--vary', 'gates.cx.error=0.0001..0.05', '--tol', '0.001', '--json')).out);
    for (const end of [r.bracket.lo, r.bracket.hi, r.ends.lo, r.ends.hi]) {
      const single = JSON.parse((await fray('run', file, '--set', `gates.cx.error=${end.value}`, '--json')).out);
      expect(end.metric).toBe(single.fidelity.state);
    }
  });

  it('says plainly when the target is met everywhere or nowhere (exit 3 when nowhere)', async () => {
    const file = ghzPhaseFlip(3);
    const nowhere = await fray('threshold', file, '--target', 'state>=0.99', '--vary', 'p=0.1..0.4');
    expect(nowhere.code).toBe(3);
    expect(nowhere.out).toMatch(/^state>=0\.99 is met nowhere on p from 0\.1 to 0\.4/);
    const everywhere = await fray('threshold', file, '--target', 'state>=0.1', '--vary', 'noise-scale=0..2');
    expect(everywhere.code).toBe(0);
    expect(everywhere.out).toMatch(/is met everywhere on noise-scale from 0 to 2/);
  });

  it('reports a metric that is not monotone on its samples', () => {
    // F = (1 + (1 − 2p)^2)/2 for n = 2 falls to 1/2 at p = 1/2 and rises again: not monotone on 0..1
    const r = findThreshold({ file: ghzPhaseFlip(2), target: cond('state>=0.75'), vary: interval('p=0..1'), tol: 1e-3 });
    expect(r.monotone).toBe(false);
    expect(r.verdict).toContain('not monotone');
  });

  it('refuses a bad interval', async () => {
    const r = await fray('threshold', ghzPhaseFlip(2), '--target', 'state>=0.9', '--vary', 'p=0.5..0.1');
    expect(r.code).toBe(2);
    expect(r.err).toContain('the interval must go from a smaller to a larger value');
    const key = await fray('threshold', ghzPhaseFlip(2), '--target', 'state>=0.9', '--vary', 'pp=0..0.5');
    expect(key.code).toBe(2);
    expect(key.err).toContain("--vary pp=0..0.5 at pp=0: the circuit has no parameter 'pp'; did you mean 'p'?");
  });
});
