import { describe, expect, it } from 'vitest';
import { simulateLoaded, type SimulateOptions } from '../../src/api/simulate.js';
import { blochVectors } from '../../src/results/observables.js';
import { loadText } from '../helpers/load.js';

/**
 * Mid-circuit measurement and feed-forward (record mode) through the whole run path, against
 * closed forms named beside each check.
 */
const EXACT = 1e-12;

const sim = (text: string, options: SimulateOptions = {}) => simulateLoaded(loadText(text), options);

describe('teleportation (C. H. Bennett et al., Phys. Rev. Lett. 70, 1895 (1993))', () => {
  // Six input states, the ±1 eigenstates of Z, X and Y, prepared from |0⟩; Bloch vectors from the definitions.
  const inputs: { name: string; prep: string; bloch: [number, number, number] }[] = [
    { name: '|0⟩', prep: '', bloch: [0, 0, 1] },
    { name: '|1⟩', prep: '  - x: 0\n', bloch: [0, 0, -1] },
    { name: '|+⟩', prep: '  - h: 0\n', bloch: [1, 0, 0] },
    { name: '|−⟩', prep: '  - x: 0\n  - h: 0\n', bloch: [-1, 0, 0] },
    { name: '|+i⟩', prep: '  - h: 0\n  - s: 0\n', bloch: [0, 1, 0] },
    { name: '|−i⟩', prep: '  - h: 0\n  - sdg: 0\n', bloch: [0, -1, 0] },
  ];
  for (const { name, prep, bloch } of inputs) {
    for (const engine of ['fast', 'reference'] as const) {
      it(`${name} arrives on qubit 2 exactly in every one of the four records (${engine} engine)`, () => {
        const s = sim(
          `qubits: 3
steps:
${prep}  - h: 1
  - cx: [1, 2]
  - cx: [0, 1]
  - h: 0
  - measure: [0, 1]
    into: [a, b]
  - x: 2
    if: b
  - z: 2
    if: a
`,
          { engine },
        );
        expect(s.result.bits).toEqual(['a', 'b']);
        expect(s.result.measured).toEqual([]);
        // each record has probability ¼ (Bennett et al.: the four Bell outcomes are equally likely)
        for (const k of ['00', '01', '10', '11']) expect(Math.abs(s.result.probabilities.ideal[k]! - 0.25)).toBeLessThan(EXACT);
        expect(s.branches!.noisy.size).toBe(4);
        for (const rho of s.branches!.noisy.values()) {
          const b = blochVectors(rho)[2]!;
          for (let c = 0; c < 3; c++) expect(Math.abs(b[c]! - 0.25 * bloch[c]!)).toBeLessThan(EXACT);
        }
        for (let c = 0; c < 3; c++) expect(Math.abs(s.result.bloch.noisy[2]![c]! - bloch[c]!)).toBeLessThan(EXACT);
        expect(Math.abs(s.result.fidelity.state - 1)).toBeLessThan(EXACT);
      });
    }
  }
});

/** The bit-flip code: data 0–2, syndrome ancillas 3 (parity 0⊕1) and 4 (parity 1⊕2), correction fed forward. */
function repetition(flips: string, logicalOne = false): string {
  return `qubits: 5
steps:
${logicalOne ? '  - x: 0\n' : ''}  - cx: [0, 1]
  - cx: [0, 2]
${flips}  - cx: [0, 3]
  - cx: [1, 3]
  - cx: [1, 4]
  - cx: [2, 4]
  - measure: [3, 4]
    into: [s1, s2]
  - x: 0
    if: { s1: 1, s2: 0 }
  - x: 1
    if: { s1: 1, s2: 1 }
  - x: 2
    if: { s1: 0, s2: 1 }
  - measure: [0, 1, 2]
    into: [d0, d1, d2]
`;
}

describe('three-qubit bit-flip code (Nielsen & Chuang §10.1.1)', () => {
  it.each([
    ['no flip', ''],
    ['flip on qubit 0', '  - x: 0\n'],
    ['flip on qubit 1', '  - x: 1\n'],
    ['flip on qubit 2', '  - x: 2\n'],
  ])('corrects %s exactly, for logical 0 and logical 1', (_, flips) => {
    for (const one of [false, true]) {
      const r = sim(repetition(flips, one)).result;
      const want = one ? '111' : '000';
      const data = Object.entries(r.probabilities.measured).filter(([, p]) => p > EXACT);
      expect(data.every(([k]) => k.slice(2) === want)).toBe(true);
      expect(Math.abs(data.reduce((a, [, p]) => a + p, 0) - 1)).toBeLessThan(EXACT);
    }
  });

  it.each([0.01, 0.1, 0.3])('with independent flips of probability %s the logical failure is 3p² − 2p³ (derived: two or three flips)', (p) => {
    const r = sim(repetition(`  - noise: { bit_flip: ${p} }\n    on: [0, 1, 2]\n`)).result;
    let fail = 0;
    for (const [k, q] of Object.entries(r.probabilities.measured)) if (k.slice(2) === '111') fail += q;
    expect(Math.abs(fail - (3 * p * p - 2 * p * p * p))).toBeLessThan(EXACT);
    // the correction leaves only 000 and 111 on the data
    for (const [k, q] of Object.entries(r.probabilities.measured)) if (k.slice(2) !== '111' && k.slice(2) !== '000') expect(q).toBeLessThan(EXACT);
  });
});

describe('active reset (measure, then x where the bit reads 1)', () => {
  // Derived for this protocol: a qubit with P(1) = p before the measurement. True 0 (prob 1 − p)
  // is recorded as 1 with e0 and then flipped to |1⟩; true 1 (prob p) is recorded as 0 with e1
  // and left in |1⟩ — but in that time it relaxes: during a measurement of duration τ the
  // excited population decays to γ = e^{−τ/T1} (amplitude damping, N&C §8.3.5) before the x.
  // So P(1) = (1 − p)·e0 + p·[e1·γ + (1 − e1)·(1 − γ)]; with τ = 0 (γ = 1): (1 − p)e0 + p·e1.
  const text = (theta: number, e0: number, e1: number, tau: string, t1: string | null) => `qubits: 1
noise:
  qubits: { all: { readout: { zero_as_one: ${e0}, one_as_zero: ${e1} }${t1 !== null ? `, t1: ${t1}` : ''} } }
  gates:
    all: { duration: 0ns }
    measure: { duration: ${tau} }
steps:
  - ry: 0
    angle: ${theta}
  - measure: 0
    into: m
  - x: 0
    if: m
observe: [Z]
`;
  it.each([
    [0.7, 0, 0.05],
    [2.1, 0, 0.2],
    [1.2, 0.03, 0.08],
  ])('ry(%s), e0 = %s, e1 = %s, instantaneous measurement: P(1) = (1 − p)e0 + p·e1', (theta, e0, e1) => {
    const r = sim(text(theta, e0, e1, '0ns', null)).result;
    const p = Math.sin(theta / 2) ** 2;
    const p1 = (1 - r.observables!['Z']!.noisy) / 2;
    expect(Math.abs(p1 - ((1 - p) * e0 + p * e1))).toBeLessThan(EXACT);
    // the ideal run resets exactly
    expect(Math.abs(r.observables!['Z']!.ideal - 1)).toBeLessThan(EXACT);
  });

  it('with T1 during a 2 µs measurement: P(1) = (1 − p)e0 + p·[e1·γ + (1 − e1)(1 − γ)], γ = e^{−τ/T1}', () => {
    const theta = 1.9;
    const [e0, e1] = [0.02, 0.1];
    const r = sim(text(theta, e0, e1, '2us', '20us')).result;
    const p = Math.sin(theta / 2) ** 2;
    const g = Math.exp(-2 / 20);
    const p1 = (1 - r.observables!['Z']!.noisy) / 2;
    expect(Math.abs(p1 - ((1 - p) * e0 + p * (e1 * g + (1 - e1) * (1 - g))))).toBeLessThan(EXACT);
  });
});

describe('record mode with every measurement at the end equals version 1', () => {
  // Nothing reads the bits, so recording changes no state before the readout (the issue's
  // contract: "a circuit without into behaves exactly as version 1" and record keys follow
  // the bit order, here the qubit order).
  const device = (measureSteps: string) => `qubits: 3
noise:
  qubits:
    all: { t1: 30us, t2: 20us, readout: { zero_as_one: 0.02, one_as_zero: 0.05 } }
    1: { readout: 0.07 }
  gates:
    all: { duration: 40ns, depolarizing: 0.01 }
    cx: { duration: 300ns, error: 0.02 }
    measure: { duration: 1us }
  schedule: alap
steps:
  - h: 0
  - cx: [0, 1]
  - ry: 2
    angle: 0.8
  - cx: [1, 2]
  - rz: 0
    angle: 0.3
${measureSteps}`;
  it('probabilities ideal/noisy/measured, classical fidelity and tvd agree to 1e-12', () => {
    const v1 = sim(device('  - measure: [0, 1, 2]\n')).result;
    const v2 = sim(device('  - measure: [0, 1, 2]\n    into: [c0, c1, c2]\n')).result;
    expect(v2.bits).toEqual(['c0', 'c1', 'c2']);
    for (const which of ['ideal', 'noisy', 'measured'] as const) {
      const keys = new Set([...Object.keys(v1.probabilities[which]), ...Object.keys(v2.probabilities[which])]);
      for (const k of keys) expect(Math.abs((v1.probabilities[which][k] ?? 0) - (v2.probabilities[which][k] ?? 0))).toBeLessThan(EXACT);
    }
    expect(Math.abs(v1.fidelity.classical - v2.fidelity.classical)).toBeLessThan(1e-9);
    expect(Math.abs(v1.tvd - v2.tvd)).toBeLessThan(EXACT);
    expect(v2.duration_ns).toBe(v1.duration_ns);
  });
});

describe('timing in record mode (the issue\'s "what happens")', () => {
  // Amplitude damping of an excited qubit for τ leaves P(1) = e^{−τ/T1} (definition of T1, common practice).
  const failing = (idle: 'thermal' | 'none') => `qubits: 2
noise:
  qubits:
    1: { t1: 20us, t2: 30us }
  gates:
    all: { duration: 0ns }
    x 1: { duration: 2us, thermal: false }
  idle: ${idle}
steps:
  - x: 1
  - measure: 0
    into: m
  - x: 1
    if: m
observe: [IZ]
`;
  it('where the condition fails, the step is replaced by relaxation for its duration under idle: thermal', () => {
    // m reads 0 in every branch, so the x (2 µs, no relaxation of its own) never acts; qubit 1 relaxes for 2 µs
    const r = sim(failing('thermal')).result;
    expect(Math.abs((1 - r.observables!['IZ']!.noisy) / 2 - Math.exp(-2 / 20))).toBeLessThan(EXACT);
  });

  it('… and by nothing under idle: none', () => {
    const r = sim(failing('none')).result;
    expect(Math.abs(r.observables!['IZ']!.noisy - -1)).toBeLessThan(EXACT);
  });

  it('a measured qubit is not frozen: it relaxes until the circuit ends', () => {
    // qubit 0 excited and measured at t = 0 (measurement of 0 ns); qubit 1 idles 10 µs, so the circuit
    // lasts 10 µs and qubit 0 decays for all of it: P(1) = e^{−10/25} in the record-1 branch.
    const r = sim(`qubits: 2
noise:
  qubits: { all: { t1: 25us, t2: 40us } }
  gates: { all: { duration: 0ns } }
steps:
  - x: 0
  - measure: 0
    into: m
  - idle: 1
    for: 10us
  - measure: 1
    into: late
observe: [ZI]
`).result;
    expect(r.duration_ns).toBe(10_000);
    expect(Math.abs((1 - r.observables!['ZI']!.noisy) / 2 - Math.exp(-10 / 25))).toBeLessThan(EXACT);
    expect(Math.abs(r.probabilities.measured['10']! - 1)).toBeLessThan(EXACT);
  });
});

describe('record order', () => {
  const text = (bits: string) => `qubits: 2
${bits}steps:
  - x: 0
  - measure: [0, 1]
    into: [one, zero]
`;
  it('follows the first writes without bits:, and bits: when given (character i = bit i)', () => {
    const plain = sim(text('')).result;
    expect(plain.bits).toEqual(['one', 'zero']);
    expect(Math.abs(plain.probabilities.ideal['10']! - 1)).toBeLessThan(EXACT);
    const declared = sim(text('bits: [zero, one]\n')).result;
    expect(declared.bits).toEqual(['zero', 'one']);
    expect(Math.abs(declared.probabilities.ideal['01']! - 1)).toBeLessThan(EXACT);
  });
});

describe('record mode on the event timeline (issue 7 drift)', () => {
  // H = (π·ζ/2)·Z0 Z1 (docs/format.md); with qubit 0 in |1⟩ qubit 1 precesses by π·ζ·τ about Z, so
  // ⟨X1⟩ = cos(π·ζ·τ) after τ (derived). A mid-circuit measurement of qubit 0 does not stop the
  // coupling; a terminal one (version 1) does, from its start on.
  const text = (measure: string) => `qubits: 2
noise:
  couplings: { "0 1": { zz: 100kHz } }
  gates: { all: { duration: 0ns } }
steps:
  - x: 0
  - h: 1
${measure}  - idle: 1
    for: 2us
observe: [IX]
`;
  it('drift goes on after a mid-circuit measurement: ⟨X1⟩ = cos(π·ζ·2 µs)', () => {
    const r = sim(text('  - measure: 0\n    into: m\n')).result;
    expect(Math.abs(r.observables!['IX']!.noisy - Math.cos(Math.PI * 100e3 * 2e-6))).toBeLessThan(EXACT);
    expect(Math.abs(r.probabilities.measured['1']! - 1)).toBeLessThan(EXACT);
  });

  it('… while a terminal measurement (version 1) stops it: ⟨X1⟩ = 1', () => {
    const r = sim(text('  - measure: 0\n')).result;
    expect(Math.abs(r.observables!['IX']!.noisy - 1)).toBeLessThan(EXACT);
  });

  it('a conditioned step on a split composite keeps its condition on every part', () => {
    const r = sim(`qubits: 2
gates:
  flip2:
    qubits: 1
    steps:
      - x: 0
      - z: 0
noise:
  gates:
    flip2: { split: true }
steps:
  - measure: 0
    into: m
  - flip2: 1
    if: m
observe: [IZ]
`).result;
    // m reads 0, so neither part acts
    expect(Math.abs(r.observables!['IZ']!.noisy - 1)).toBeLessThan(EXACT);
  });
});
