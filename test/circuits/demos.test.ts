import { readdirSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { simulate } from '../../src/api/simulate.js';
import { denseProgramRun, rhoDiff } from '../engine/dense.js';

/**
 * The demo circuits run, and their headline numbers are recomputed by independent routes:
 * the final noisy state by a dense mathjs computation of the same instruction list (full
 * 2^n × 2^n matrices, independent of fray's kernels), and the ideal answers from textbook
 * results named beside each check.
 */
const DEMOS = readdirSync('circuits').filter((f) => f.endsWith('.yaml'));


describe('demo circuits', () => {
  it('there are at least four demos', () => {
    expect(DEMOS.length).toBeGreaterThanOrEqual(4);
  });

  for (const file of DEMOS) {
    const recordMode = /^\s*into:/m.test(readFileSync(`circuits/${file}`, 'utf8'));
    const what = recordMode ? 'its record probabilities sum to 1 (branch engine: test/engine/branches.test.ts)' : 'its noisy state matches an independent dense computation';
    it(`${file} runs, and ${what}`, () => {
      const sim = simulate(`circuits/${file}`);
      const r = sim.result;
      expect(r.fidelity.state).toBeGreaterThan(0.5);
      expect(r.fidelity.state).toBeLessThan(1);
      expect(Object.values(r.probabilities.ideal).reduce((a, b) => a + b, 0)).toBeCloseTo(1, 12);
      if (recordMode) expect(Object.values(r.probabilities.measured).reduce((a, b) => a + b, 0)).toBeCloseTo(1, 12);
      else if (sim.program.n <= 5) expect(rhoDiff(sim.rho, denseProgramRun(sim.program.n, sim.program.noisy))).toBeLessThan(1e-12);
    });
  }

  it('ghz5: the ideal outcomes are 00000 and 11111 with ½ each (GHZ state, common practice)', () => {
    const r = simulate('circuits/ghz5.yaml').result;
    const nonzero = Object.entries(r.probabilities.ideal).filter(([, p]) => p > 1e-12);
    expect(nonzero.map(([k]) => k).sort()).toEqual(['00000', '11111']);
    for (const [, p] of nonzero) expect(p).toBeCloseTo(0.5, 14);
    expect(r.observables!['XXXXX']!.ideal).toBeCloseTo(1, 12);
  });

  it('qpe3: the ideal answer is 011 with probability 1, and ALAP holds up better than ASAP', () => {
    // Phase estimation of an exactly representable phase φ = 0.011₂ returns its binary digits
    // with certainty (Nielsen & Chuang §5.2.1).
    const asap = simulate('circuits/qpe3-asap.yaml').result;
    const alap = simulate('circuits/qpe3-alap.yaml').result;
    for (const r of [asap, alap]) expect(r.probabilities.ideal['011']).toBeCloseTo(1, 12);
    expect(asap.duration_ns).toBe(alap.duration_ns);
    expect(alap.fidelity.state).toBeGreaterThan(asap.fidelity.state);
  });

  it('ramsey-echo: the echo refocuses the deliberate phase, the Ramsey qubit keeps a quarter turn', () => {
    // A quarter turn of phase between two Hadamards gives P(0) = ½ ideally; the echo qubit returns
    // to |0⟩ (spin echo, common practice). With noise, both lose contrast towards ½.
    const r = simulate('circuits/ramsey-echo.yaml').result;
    expect(r.observables!['ZI']!.ideal).toBeCloseTo(0, 12);
    expect(r.observables!['IZ']!.ideal).toBeCloseTo(1, 12);
    expect(r.observables!['IZ']!.noisy).toBeLessThan(1);
    expect(r.observables!['IZ']!.noisy).toBeGreaterThan(0.3);
  });

  it('coupler-swap: the ideal half swap leaves (|01⟩ − i|10⟩)/√2 on q0 q1', () => {
    const r = simulate('circuits/coupler-swap.yaml').result;
    // For (|01⟩ − i|10⟩)/√2: ⟨XY⟩ = 1, ⟨YX⟩ = −1, ⟨ZZ⟩ = −1 (direct computation, common practice).
    expect(r.observables!['XYI']!.ideal).toBeCloseTo(1, 12);
    expect(r.observables!['YXI']!.ideal).toBeCloseTo(-1, 12);
    expect(r.observables!['ZZI']!.ideal).toBeCloseTo(-1, 12);
    expect(r.observables!['XYI']!.noisy).toBeLessThan(r.observables!['XYI']!.ideal);
  });

  it('detuned-ramsey-echo: the echo leaves only the T2 envelope, the Ramsey qubit sits on the detuned fringe', () => {
    // Ramsey fringe ½(1 + e^{−τ/T2}cos 2πδτ) (common practice) and Hahn echo (Hahn, Phys. Rev. 80, 580
    // (1950)); the demo's gates take 30 ns, inside which drift and relaxation also act, hence 2e-2.
    const r = simulate('circuits/detuned-ramsey-echo.yaml').result;
    const env = Math.exp(-3.5 / 70);
    expect(Math.abs(r.observables!['ZI']!.noisy - env * Math.cos(2 * Math.PI * 45e3 * 3.5e-6))).toBeLessThan(2e-2);
    expect(Math.abs(r.observables!['IZ']!.noisy - env)).toBeLessThan(2e-2);
  });

  it('zz-spectator: the placement next to the strong coupler loses the spectator, the other keeps it', () => {
    // ⟨Z⟩ of the spectator after h – wait t – h with a ZZ partner in |1⟩ is ≈ cos(πζt) (derived from
    // H = (πζ/2)Z⊗Z); ζ = 260 kHz against 30 kHz, t ≈ 1.6 µs.
    const a = simulate('circuits/zz-spectator-a.yaml');
    const b = simulate('circuits/zz-spectator-b.yaml');
    expect(a.result.observables!['IIZI']!.noisy).toBeLessThan(0.6);
    expect(b.result.observables!['ZIII']!.noisy).toBeGreaterThan(0.95);
    expect(a.result.warnings).toEqual([]);
    expect(b.result.warnings).toEqual([]);
  });

  it('coherent-overrotation: 1 − 2 sin²(nε/2) against 1 − (1 − (1 − p)^n) for the same r, n = 40', () => {
    // Derived: x·exp(−iεX/2) = rx(π + ε), n of them rx(n(π + ε)); depolarizing p = 2r with
    // r = 2 sin²(ε/2)/3 (Nielsen, Phys. Lett. A 303, 249 (2002)).
    const r = simulate('circuits/coherent-overrotation.yaml').result;
    expect(Math.abs(r.observables!['ZI']!.noisy - (1 - 2 * Math.sin(0.4) ** 2))).toBeLessThan(1e-12);
    const p = (4 * Math.sin(0.01) ** 2) / 3;
    expect(Math.abs(r.observables!['IZ']!.noisy - (1 - (1 - (1 - p) ** 40)))).toBeLessThan(1e-12);
  });

  it('active-reset: both resets leave |0⟩ ideally; the record m reads 1 with sin²(miss/2) (rx rotation, common practice)', () => {
    const r = simulate('circuits/active-reset.yaml').result;
    expect(r.bits).toEqual(['m', 'after_fed', 'after_plain']);
    expect(r.observables!['ZI']!.ideal).toBeCloseTo(1, 12);
    expect(r.observables!['IZ']!.ideal).toBeCloseTo(1, 12);
    const m1 = Object.entries(r.probabilities.ideal).filter(([k]) => k[0] === '1').reduce((a, [, p]) => a + p, 0);
    expect(m1).toBeCloseTo(Math.sin(0.45) ** 2, 12);
    // readout error leaves some excitation behind the feedback reset
    expect(r.observables!['ZI']!.noisy).toBeLessThan(1);
  });

  it('teleport: the ideal records are equally likely and dst carries ry(theta) rz(phi)|0⟩ (Bennett et al. 1993)', () => {
    const r = simulate('circuits/teleport.yaml').result;
    for (const k of ['00', '01', '10', '11']) expect(r.probabilities.ideal[k]).toBeCloseTo(0.25, 12);
    // Bloch vector of ry(θ) then rz(φ) on |0⟩: (sin θ cos φ, sin θ sin φ, cos θ) (direct computation)
    const [theta, phi] = [1.1, 0.6];
    expect(r.observables!['IIX']!.ideal).toBeCloseTo(Math.sin(theta) * Math.cos(phi), 12);
    expect(r.observables!['IIY']!.ideal).toBeCloseTo(Math.sin(theta) * Math.sin(phi), 12);
    expect(r.observables!['IIZ']!.ideal).toBeCloseTo(Math.cos(theta), 12);
  });

  it('repetition-code: correction turns ~3p of failures into ~3p² (Nielsen & Chuang §10.1.1)', () => {
    const r = simulate('circuits/repetition-code.yaml').result;
    expect(r.probabilities.ideal['00000000']).toBeCloseTo(1, 12);
    let uncorrected = 0;
    let corrected = 0;
    for (const [k, p] of Object.entries(r.probabilities.measured)) {
      if (k.slice(2, 5) !== '000') uncorrected += p;
      if (k.slice(5) === '111') corrected += p;
    }
    const p = 0.05;
    // flips alone: 1 − (1 − p)³ without correction; gate noise and readout only add to it
    expect(uncorrected).toBeGreaterThan(1 - (1 - p) ** 3);
    // with correction the flips alone give 3p² − 2p³ = 0.00725 (readout error on c0..c2 moves some of it to
    // other records, gate noise adds some); either way far below the uncorrected failure
    expect(corrected).toBeGreaterThan(0.5 * (3 * p * p - 2 * p ** 3));
    expect(corrected).toBeLessThan(uncorrected / 5);
  });
});
