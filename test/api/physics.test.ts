import { describe, expect, it } from 'vitest';
import { simulateLoaded } from '../../src/api/simulate.js';
import { loadText } from '../helpers/load.js';

/** Agreement demanded of closed-form physics through the whole run path. */
const EXACT = 1e-12;

const run = (text: string, devices: Record<string, string> = {}) => simulateLoaded(loadText(text, devices)).result;

describe('relaxation through the whole run path', () => {
  // Definition of T1 (common practice): an excited qubit left alone for τ stays excited
  // with probability e^{−τ/T1} (excited-state population 0).
  it.each([0.5, 10, 37.5])('T1: |1⟩ idle for %s µs keeps P(1) = e^{−τ/T1}', (tauUs) => {
    const r = run(`qubits: 1
noise:
  qubits: { all: { t1: 25us, t2: 30us } }
  gates: { all: { duration: 0ns } }
steps:
  - x: 0
  - idle: 0
    for: ${tauUs}us
`);
    expect(r.probabilities.noisy['1']).toBeCloseTo(Math.exp(-tauUs / 25), 12);
  });

  // Definition of T2 (common practice): Ramsey h – idle τ – h gives P(0) = (1 + e^{−τ/T2})/2,
  // whatever T1 does to the populations (H maps the population difference to ⟨X⟩).
  it.each([1, 8, 20])('T2: Ramsey with idle %s µs gives P(0) = (1 + e^{−τ/T2})/2', (tauUs) => {
    const r = run(`qubits: 1
noise:
  qubits: { all: { t1: 40us, t2: 15us } }
  gates: { all: { duration: 0ns } }
steps:
  - h: 0
  - idle: 0
    for: ${tauUs}us
  - h: 0
`);
    expect(Math.abs(r.probabilities.noisy['0']! - (1 + Math.exp(-tauUs / 15)) / 2)).toBeLessThan(EXACT);
  });

  // The excited-state population p_e is the fixed point of thermal relaxation (contract definition):
  // p1(τ) = p1·e^{−τ/T1} + p_e(1 − e^{−τ/T1}).
  it('relaxes towards the excited-state population', () => {
    const r = run(`qubits: 1
noise:
  qubits: { all: { t1: 10us, excited: 0.1 } }
  gates: { all: { duration: 0ns } }
steps:
  - idle: 0
    for: 7us
`);
    const e = Math.exp(-0.7);
    expect(Math.abs(r.probabilities.noisy['1']! - 0.1 * (1 - e))).toBeLessThan(EXACT);
  });

  it('missing t2 means 2·t1 (the contract), so Ramsey decays with e^{−τ/(2 T1)}', () => {
    const r = run(`qubits: 1
noise:
  qubits: { all: { t1: 10us } }
  gates: { all: { duration: 0ns } }
steps:
  - h: 0
  - idle: 0
    for: 6us
  - h: 0
`);
    expect(Math.abs(r.probabilities.noisy['0']! - (1 + Math.exp(-6 / 20)) / 2)).toBeLessThan(EXACT);
  });
});

/** The six Pauli eigenstates (a state 2-design for one qubit), each as preparation steps from |0⟩. */
const PAULI_EIGENSTATE_PREPS: readonly (readonly string[])[] = [[], ['x'], ['h'], ['x', 'h'], ['h', 's'], ['h', 'sdg']];

/** Preparation steps as YAML lines, each without noise of its own (zero duration is set by the profiles below). */
function prepSteps(gates: readonly string[]): string {
  return gates.map((g) => `  - ${g}: 0\n    noise: none\n`).join('');
}

/**
 * Average gate fidelity by the exact average of ⟨ψ|E(ψ)|ψ⟩ over the six Pauli eigenstates, a
 * state 2-design (e.g. Dankert, Cleve, Emerson, Livine, PRA 80, 012304 (2009), from memory), computed
 * through the run path: the state fidelity of each run against its ideal run is ⟨ψ_ideal|ρ|ψ_ideal⟩.
 */
function averageOverPauliEigenstates(body: (prep: readonly string[]) => string): number {
  let sum = 0;
  for (const prep of PAULI_EIGENSTATE_PREPS) sum += run(body(prep)).fidelity.state;
  return sum / PAULI_EIGENSTATE_PREPS.length;
}

describe('gate-error calibration', () => {
  // The `error:` solve must reproduce the calibrated average gate infidelity r of the whole
  // gate channel (relaxation during the gate included), checked independently on the 2-design.
  // (r is chosen above the coherence limit of this 60 ns gate, ≈ 0.0013, so a depolarizing part is solved.)
  it.each([0.002, 0.004, 0.02])('error: %s gives average gate infidelity exactly r', (r) => {
    const fAvg = averageOverPauliEigenstates(
      (prep) => `qubits: 1
noise:
  qubits: { all: { t1: 30us, t2: 20us, excited: 0.02 } }
  gates:
    all: { duration: 0ns }
    sx: { duration: 60ns, error: ${r} }
  idle: none
steps:
${prepSteps(prep)}  - sx: 0
`,
    );
    expect(Math.abs(1 - fAvg - r)).toBeLessThan(EXACT);
  });

  // Coherence-limited average gate fidelity of an idle of length t:
  // F = (3 + e^{−t/T1} + 2e^{−t/T2})/6 — derived from Nielsen, Phys. Lett. A 303, 249 (2002),
  // F_avg = (d F_e + 1)/(d + 1) with F_e = Tr(PTM)/d² and the thermal-relaxation PTM diagonal
  // (1, e^{−t/T2}, e^{−t/T2}, e^{−t/T1}) (excited population 0).
  it.each([0.2, 3, 12])('idle of %s µs has F_avg = (3 + e^{−t/T1} + 2e^{−t/T2})/6', (tUs) => {
    const fAvg = averageOverPauliEigenstates(
      (prep) => `qubits: 1
noise:
  qubits: { all: { t1: 25us, t2: 18us } }
  gates: { all: { duration: 0ns } }
steps:
${prepSteps(prep)}  - idle: 0
    for: ${tUs}us
`,
    );
    const expected = (3 + Math.exp(-tUs / 25) + 2 * Math.exp(-tUs / 18)) / 6;
    expect(Math.abs(fAvg - expected)).toBeLessThan(EXACT);
  });

  it('warns when the calibrated error is below the coherence limit, and adds no depolarizing', () => {
    const r = run(`qubits: 1
noise:
  qubits: { all: { t1: 5us, t2: 3us } }
  gates: { x: { duration: 200ns, error: 0.0001 } }
steps:
  - x: 0
`);
    expect(r.warnings.map((w) => w.message).join('\n')).toMatch(/error 0\.0001 is below/);
  });
});

describe('multi-qubit noise', () => {
  // GHZ_n under independent phase flips p on every qubit: the coherence |0…0⟩⟨1…1| is scaled by
  // (1 − 2p)^n, so F = (1 + (1 − 2p)^n)/2 (derived from the phase-flip action, Nielsen & Chuang §8.3.3).
  it.each([
    [3, 0.05],
    [5, 0.1],
    [6, 0.02],
  ])('GHZ_%i under phase flips p = %s has F = (1 + (1 − 2p)^n)/2', (n, p) => {
    const chain = Array.from({ length: n - 1 }, (_, i) => `  - cx: [${i}, ${i + 1}]`).join('\n');
    const r = run(`qubits: ${n}\nsteps:\n  - h: 0\n${chain}\n  - noise: { phase_flip: ${p} }\n    on: all\n`);
    expect(Math.abs(r.fidelity.state - (1 + Math.pow(1 - 2 * p, n)) / 2)).toBeLessThan(EXACT);
  });

  // Readout confusion (contract definition): P(read 0 | 1) = one_as_zero, per qubit independently.
  it('applies readout confusion per measured qubit', () => {
    const r = run(`qubits: 2
noise:
  qubits:
    0: { readout: { zero_as_one: 0.1, one_as_zero: 0.2 } }
    1: { readout: 0.05 }
steps:
  - x: 0
  - measure: all
`);
    expect(r.probabilities.measured['10']).toBeCloseTo(0.8 * 0.95, 14);
    expect(r.probabilities.measured['00']).toBeCloseTo(0.2 * 0.95, 14);
    expect(r.probabilities.measured['11']).toBeCloseTo(0.8 * 0.05, 14);
    expect(r.tvd).toBeCloseTo(1 - 0.8 * 0.95, 14);
  });

  it('marginalises onto measured qubits, qubit order ascending, labels reported', () => {
    const r = run(`qubits: [a, b, c]
steps:
  - x: c
  - measure: [c, a]
`);
    expect(r.measured).toEqual([0, 2]);
    expect(r.measured_labels).toEqual(['a', 'c']);
    expect(r.probabilities.ideal).toEqual({ '01': 1 });
  });

  it('reset returns a qubit to |0⟩ in both runs; the ideal run goes mixed when it must', () => {
    const r = run(`qubits: 2
steps:
  - h: 0
  - cx: [0, 1]
  - reset: 0
`);
    // After resetting half of a Bell pair: |0⟩⟨0| ⊗ I/2 in both runs, so fidelity 1 and purity ½.
    expect(r.fidelity.state).toBeCloseTo(1, 12);
    expect(r.purity).toBeCloseTo(0.5, 14);
    expect(r.probabilities.ideal['00']).toBeCloseTo(0.5, 14);
  });

  it('standalone noise steps are skipped in the ideal run', () => {
    const r = run(`qubits: 1\nsteps:\n  - noise: { bit_flip: 0.25 }\n    on: 0\n`);
    expect(r.probabilities.ideal).toEqual({ '0': 1, '1': 0 });
    expect(r.probabilities.noisy['1']).toBeCloseTo(0.25, 15);
  });
});
