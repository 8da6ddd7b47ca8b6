import { describe, expect, it } from 'vitest';
import { mitigate } from '../../src/mitigation/mitigate.js';
import { simulateLoaded } from '../../src/api/simulate.js';
import { InputError } from '../../src/format/problem.js';
import { loadText } from '../helpers/load.js';

const EXACT = 1e-12;

// m = 5 x gates on one qubit, each followed by depolarizing p: ⟨Z⟩ = (−1)^m (1 − p)^m, and folded
// to scale λ the run has λ·m noisy gates, so ⟨Z⟩(λ) = (−1)^m (1 − p)^(mλ) (derived from the
// depolarizing definition ρ → (1−p)ρ + p·I/2, which multiplies ⟨Z⟩ by 1 − p).
const P = 0.01;
const M = 5;
const DEPOLARIZED = `
qubits: 1
noise:
  gates:
    all: { duration: 20ns, depolarizing: ${P} }
observe: [Z]
steps:
${'  - x: 0\n'.repeat(M)}`;

describe('mitigate', () => {
  const loaded = loadText(DEPOLARIZED);
  const r = (lambda: number) => -((1 - P) ** (M * lambda));

  it('ZNE by folding: every point is the closed form, the exponential fit returns the ideal value to 1e-12', () => {
    const out = mitigate(loaded, { zne: { scales: [1, 3, 5], fit: 'exponential', amplify: 'fold' } });
    const z = out.observables['Z']!;
    expect(z.ideal).toBeCloseTo(-1, 15);
    for (const pt of z.points) expect(Math.abs(pt.value - r(pt.scale))).toBeLessThan(EXACT);
    expect(Math.abs(z.mitigated - -1)).toBeLessThan(EXACT);
  });

  it("linear extrapolation's bias through λ = 1, 3 is the closed form −1 − (3r(1) − r(3))/2 (derived)", () => {
    const out = mitigate(loaded, { zne: { scales: [1, 3], fit: 'linear', amplify: 'fold' } });
    const z = out.observables['Z']!;
    const bias = z.mitigated - z.ideal;
    expect(Math.abs(bias - ((3 * r(1) - r(3)) / 2 - -1))).toBeLessThan(EXACT);
    expect(Math.abs(bias)).toBeLessThan(Math.abs(z.noisy - z.ideal));
  });

  it('scales that fold to the same circuit are an input error, not a fit through a repeated point', () => {
    expect(() => mitigate(loaded, { zne: { scales: [1, 1.1], fit: 'linear', amplify: 'fold' } })).toThrow(InputError);
  });

  it('ZNE by noise scale: ⟨Z⟩(C) = −(1 − C·p)^m is a polynomial of degree m in C, so Richardson through m + 1 scales returns the ideal value to 1e-12 (derived from the depolarizing definition)', () => {
    const out = mitigate(loaded, { zne: { scales: [1, 2, 3, 4, 5, 6], fit: 'richardson' } });
    const z = out.observables['Z']!;
    expect(out.amplify).toBe('scale');
    for (const pt of z.points) expect(Math.abs(pt.value - -((1 - pt.scale * P) ** M))).toBeLessThan(EXACT);
    expect(Math.abs(z.mitigated - -1)).toBeLessThan(EXACT);
  });

  it("linear extrapolation by noise scale through C = 1, 2 has the closed-form bias 2y(1) − y(2) + 1 (derived)", () => {
    const y = (c: number) => -((1 - c * P) ** M);
    const z = mitigate(loaded, { zne: { scales: [1, 2], fit: 'linear' } }).observables['Z']!;
    expect(Math.abs(z.mitigated - z.ideal - (2 * y(1) - y(2) + 1))).toBeLessThan(EXACT);
  });

  it('readout correction with the exact confusion returns the pre-readout distribution to 1e-12 (derived)', () => {
    const text = `
qubits: 2
noise:
  qubits:
    all: { t1: 30us, readout: { zero_as_one: 0.03, one_as_zero: 0.08 } }
  gates:
    all: { duration: 40ns, error: 0.003 }
    cx: { duration: 300ns, error: 0.02 }
steps:
  - h: 0
  - cx: [0, 1]
  - measure: all
`;
    const two = loadText(text);
    const sim = simulateLoaded(two);
    for (const method of ['inverse', 'bounded'] as const) {
      const ro = mitigate(two, { readout: method }).readout!;
      expect(ro.method).toBe(method);
      for (const [k, v] of Object.entries(sim.result.probabilities.noisy)) expect(Math.abs((ro.mitigated[k] ?? 0) - v)).toBeLessThan(EXACT);
      expect(ro.tvd_before).toBeCloseTo(sim.result.tvd, 14);
      expect(ro.tvd_after).toBeLessThan(ro.tvd_before);
      expect(ro.classical_after).toBeGreaterThan(ro.classical_before);
    }
  });
});
