import { describe, expect, it } from 'vitest';
import { clampRounding, REPORT_ROUNDING_TOLERANCE } from '../../src/results/clamp.js';
import { computeFigures } from '../../src/results/report.js';
import { computeRecordFigures } from '../../src/results/recordFigures.js';
import { distributionDistances } from '../../src/mitigation/mitigate.js';

/** A one-qubit ρ = diag(a, b) in the layout of src/engine/layout.ts. */
function diag(a: number, b: number) {
  const data = new Float64Array(8);
  data[0] = a;
  data[6] = b;
  return { n: 1, dim: 2, data };
}

const pureZero = { kind: 'pure' as const, state: { n: 1, dim: 2, data: Float64Array.from([1, 0, 0, 0]) } };
const input = { n: 1, measured: [0], readout: [{ zeroAsOne: 0, oneAsZero: 0 }], observe: ['Z'] };

describe('reported figures are clamped into their ranges within the rounding tolerance, and only then (issue 13)', () => {
  it('clampRounding moves a value by at most REPORT_ROUNDING_TOLERANCE', () => {
    expect(clampRounding(-3.6e-15, 0, 1)).toBe(0);
    expect(clampRounding(1 + 4e-15, 0, 1)).toBe(1);
    expect(clampRounding(1 + REPORT_ROUNDING_TOLERANCE, 0, 1)).toBe(1);
    expect(clampRounding(1 + 2 * REPORT_ROUNDING_TOLERANCE, 0, 1)).toBe(1 + 2 * REPORT_ROUNDING_TOLERANCE);
    expect(clampRounding(-1e-9, 0, 1)).toBe(-1e-9);
    expect(clampRounding(0.5, 0, 1)).toBe(0.5);
  });

  it('a state whose trace rounds to 1 + 4e-15 reports fidelity 1, probabilities in [0, 1] and ⟨Z⟩ = 1', () => {
    // ⟨0|ρ|0⟩ is the fidelity with a pure |0⟩ (Nielsen & Chuang §9.2.2); here exactly 1 + 4e-15
    const f = computeFigures(diag(1 + 4e-15, -3.6e-15), pureZero, input);
    expect(f.fidelity.state).toBe(1);
    expect(f.probabilities.noisy['0']).toBe(1);
    expect(f.probabilities.noisy['1'] ?? 0).toBe(0);
    expect(f.observables!['Z']!.noisy).toBe(1);
    expect(f.bloch.noisy[0]![2]).toBe(1);
  });

  it('an excess beyond the tolerance is reported as computed (a real error stays visible)', () => {
    const f = computeFigures(diag(1 + 1e-9, 0), pureZero, input);
    expect(f.fidelity.state).toBeGreaterThan(1);
  });
});

describe('record-mode and mitigation figures use the same clamp (issue 13)', () => {
  it('a record-mode run whose branch trace rounds to 1 + 4e-15 reports probability, fidelity, purity and ⟨Z⟩ as 1', () => {
    // one record bit, one branch '0' holding ρ = diag(1 + 4e-15, 0); the ideal branch is |0⟩.
    // Fidelity with a pure state is ⟨0|ρ|0⟩ (Nielsen & Chuang §9.2.2), purity Tr ρ² (N&C §2.4.1): both 1 + O(1e-15) here
    const { figures: f } = computeRecordFigures(
      new Map([['0', diag(1 + 4e-15, 0)]]),
      new Map([['0', 1 + 4e-15]]),
      new Map([['0', pureZero]]),
      { n: 1, bits: 1, observe: ['Z'] },
    );
    expect(f.probabilities.measured['0']).toBe(1);
    expect(f.probabilities.noisy['0']).toBe(1);
    expect(f.fidelity.state).toBe(1);
    expect(f.fidelity.classical).toBe(1);
    expect(f.purity).toBe(1);
    expect(f.observables!['Z']!.noisy).toBe(1);
    expect(f.bloch.noisy[0]![2]).toBe(1);
  });

  it('mitigation distances are clamped, except after inverse readout correction (a quasi-distribution may leave [0, 1])', () => {
    const ideal = Float64Array.from([1, 0]);
    const rounded = Float64Array.from([1 + 4e-15, 0]);
    const d = distributionDistances(ideal, rounded, rounded, 'bounded');
    expect(d.classical_before).toBe(1);
    expect(d.classical_after).toBe(1);
    // the inverse may give (1.2, −0.2): TVD ½(0.2 + 0.2) = 0.2, classical fidelity (√1.2)² = 1.2 > 1, reported as computed
    const quasi = Float64Array.from([1.2, -0.2]);
    const inv = distributionDistances(ideal, rounded, quasi, 'inverse');
    expect(inv.classical_before).toBe(1);
    expect(inv.classical_after).toBeCloseTo(1.2, 14);
    expect(inv.tvd_after).toBeCloseTo(0.2, 14);
  });
});
