/**
 * Coherent device noise through the whole run path (issue 7): detuning, always-on ZZ, coherent
 * gate errors, each against a closed form named beside it.
 */
import { describe, expect, it } from 'vitest';
import { simulateLoaded } from '../../src/api/simulate.js';
import { loadText } from '../helpers/load.js';

/** Agreement demanded of closed-form physics through the whole run path. */
const EXACT = 1e-12;

const sim = (text: string) => simulateLoaded(loadText(text));
const run = (text: string) => sim(text).result;

describe('detuning', () => {
  // The standard Ramsey fringe (common practice): h – idle τ – h on a qubit detuned by δ gives
  // P(0) = ½(1 + e^{−τ/T2}·cos(2πδτ)); T1 only moves populations, which the last h turns into ⟨X⟩.
  it.each([
    [20, 3],
    [-45, 7.5],
    [150, 11],
    [0.5, 2],
  ])('Ramsey fringe: δ = %s kHz, τ = %s µs gives ½(1 + e^{−τ/T2}·cos 2πδτ)', (kHz, tauUs) => {
    const r = run(`qubits: 1
noise:
  qubits: { all: { t1: 60us, t2: 35us, detuning: ${kHz}kHz } }
steps:
  - h: 0
  - idle: 0
    for: ${tauUs}us
  - h: 0
`);
    const expected = 0.5 * (1 + Math.exp(-tauUs / 35) * Math.cos(2 * Math.PI * kHz * 1e3 * tauUs * 1e-6));
    expect(Math.abs(r.probabilities.noisy['0']! - expected)).toBeLessThan(EXACT);
    expect(r.probabilities.ideal['0']).toBeCloseTo(1, 12); // the ideal run has no drift
  });

  // H = π·δ·Z turns |+⟩ by rz(2πδτ): Bloch vector (cos 2πδτ, sin 2πδτ, 0) (rz(φ) rotates about +z by φ,
  // Nielsen & Chuang eq. 4.6 and Exercise 4.6), so the sign of δ is the sense of rotation.
  it.each([30, -30])('the Bloch vector of |+⟩ turns by 2πδτ about +z (δ = %s kHz)', (kHz) => {
    const r = run(`qubits: 1
noise:
  qubits: { all: { detuning: ${kHz}kHz } }
steps:
  - h: 0
  - idle: 0
    for: 4us
`);
    const phi = 2 * Math.PI * kHz * 1e3 * 4e-6;
    const [x, y, z] = r.bloch.noisy[0]!;
    expect(Math.abs(x - Math.cos(phi))).toBeLessThan(EXACT);
    expect(Math.abs(y - Math.sin(phi))).toBeLessThan(EXACT);
    expect(Math.abs(z)).toBeLessThan(EXACT);
  });

  // Hahn echo (E. L. Hahn, Phys. Rev. 80, 580 (1950)): a π pulse halfway reverses the sense of the
  // phase, so a static detuning cancels exactly: h – τ/2 – x – τ/2 – h returns |0⟩; with pure
  // dephasing T2 (no T1) the contrast is e^{−τ/T2}. The x takes no time here: in the timing model a
  // gate is applied at its start, so drift during a gate of length D acts after it.
  it.each([5, -80, 333])('Hahn echo cancels a static detuning of %s kHz exactly', (kHz) => {
    const r = run(`qubits: 1
noise:
  qubits: { all: { t2: 40us, detuning: ${kHz}kHz } }
steps:
  - h: 0
  - idle: 0
    for: 6us
  - x: 0
  - idle: 0
    for: 6us
  - h: 0
`);
    expect(Math.abs(r.probabilities.noisy['0']! - 0.5 * (1 + Math.exp(-12 / 40)))).toBeLessThan(EXACT);
  });

  it('drift acts inside a gate too, and stops when the qubit is measured', () => {
    // h (0 ns), then a 2 µs gate i, then measure: the qubit turns by 2πδ·2µs.
    const base = (extra: string) => `qubits: 2
noise:
  qubits: { all: { detuning: 25kHz } }
  gates: { i: { duration: 2us }, measure: { duration: 5us } }
steps:
  - h: [0, 1]
  - i: 0
  ${extra}
`;
    const phi = 2 * Math.PI * 25e3 * 2e-6;
    const r = run(base('- measure: 0'));
    // qubit 0 measured at 2 µs: it keeps the 2 µs of drift; qubit 1, never measured, drifts until the end (7 µs)
    expect(Math.abs(r.bloch.noisy[0]![1] - Math.sin(phi))).toBeLessThan(EXACT);
    expect(Math.abs(r.bloch.noisy[1]![1] - Math.sin(2 * Math.PI * 25e3 * 7e-6))).toBeLessThan(EXACT);
  });
});

describe('always-on ZZ', () => {
  // Derived from H_ab = (π·ζ/2)·Z_a Z_b: with the partner in |0⟩ (Z_b = +1) the spectator feels
  // rz(πζτ), with the partner in |1⟩ rz(−πζτ): its Bloch vector turns by ±πζτ, 2πζτ apart, which is
  // the conditional phase of |11⟩.
  it.each([[80, 3], [-120, 5]])('ζ = %s kHz over %s µs: |+⟩|0⟩ and |+⟩|1⟩ turn in opposite senses, 2πζτ apart', (kHz, tauUs) => {
    const text = (partner: string) => `qubits: 2
noise:
  couplings:
    "0 1": { zz: ${kHz}kHz }
steps:
  - h: 0
  ${partner}
  - idle: [0, 1]
    for: ${tauUs}us
`;
    const half = Math.PI * kHz * 1e3 * tauUs * 1e-6;
    const off = run(text(''));
    const on = run(text('- x: 1'));
    const angle = (b: readonly number[]) => Math.atan2(b[1]!, b[0]!);
    expect(Math.abs(angle(off.bloch.noisy[0]!) - half)).toBeLessThan(EXACT);
    expect(Math.abs(angle(on.bloch.noisy[0]!) + half)).toBeLessThan(EXACT);
    expect(Math.abs(Math.hypot(...on.bloch.noisy[0]!) - 1)).toBeLessThan(EXACT);
  });

  it('a listed pair without zz adds nothing; labels and either order name the same pair', () => {
    const text = (pair: string) => `qubits: [a, b]
noise:
  couplings:
    ${pair}
steps:
  - h: a
  - x: b
  - idle: [a, b]
    for: 2us
`;
    const none = run(text('"a b": {}'));
    expect(Math.abs(none.bloch.noisy[0]![0] - 1)).toBeLessThan(EXACT);
    const ab = run(text('"a b": { zz: 50kHz }'));
    const ba = run(text('"b a": { zz: 50kHz }'));
    expect(ab.bloch.noisy).toEqual(ba.bloch.noisy);
    expect(Math.abs(ab.bloch.noisy[0]![1] + Math.sin(Math.PI * 50e3 * 2e-6))).toBeLessThan(EXACT);
  });
});

describe('coherent gate error', () => {
  // Derived: x followed by exp(−iεX/2) is rx(π + ε), so n repetitions give rx(n(π + ε)); against
  // the ideal rx(nπ) the state infidelity from |0⟩ is sin²(nε/2) (rotations about one axis add).
  // The depolarizing channel with the same average gate infidelity r = 2·sin²(ε/2)/3 (F_avg =
  // (d·F_e + 1)/(d + 1), F_e = |Tr U|²/d² = cos²(ε/2); Nielsen, Phys. Lett. A 303, 249 (2002)) is
  // p = 2r, and n of them leave infidelity (1 − (1 − p)^n)/2 ≈ n·r: linear, not quadratic.
  const eps = 0.02;
  const reps = (n: number, noise: string) => `qubits: 1
noise:
  gates: { x: { ${noise} } }
steps:
${'  - x: 0\n'.repeat(n)}`;
  it.each([1, 5, 20, 60])('n = %s over-rotated x gates: infidelity sin²(nε/2); depolarizing of equal r: (1 − (1 − 2r)^n)/2', (n) => {
    const coherent = run(reps(n, `coherent: { x: ${eps} }`));
    expect(Math.abs(1 - coherent.fidelity.state - Math.sin((n * eps) / 2) ** 2)).toBeLessThan(EXACT);
    const r = (2 * Math.sin(eps / 2) ** 2) / 3;
    const stochastic = run(reps(n, `depolarizing: ${2 * r}`));
    expect(Math.abs(1 - stochastic.fidelity.state - (1 - (1 - 2 * r) ** n) / 2)).toBeLessThan(EXACT);
    if (n >= 20) expect(1 - coherent.fidelity.state).toBeGreaterThan(5 * (1 - stochastic.fidelity.state));
  });

  it('zz of a 2-qubit gate entry is rzz(d) after the gate: cz plus zz = d gives the phases of rzz(d)·cz', () => {
    // On |++⟩, cz then rzz(d): ⟨XX⟩ etc. are those of the state (1/2)Σ phase_ab |ab⟩ with
    // phase = (−1)^{ab}·e^{∓id/2}; ⟨Z_0⟩ stays 0 and ⟨X_0⟩ = 0 for cz alone. Derived from the matrices.
    const d = 0.3;
    const s = sim(`qubits: 2
noise:
  gates: { cz: { coherent: { zz: ${d} } } }
observe: [XX, XI, YI]
steps:
  - h: [0, 1]
  - cz: [0, 1]
`);
    // ψ = ½(e^{−id/2}|00⟩ + e^{id/2}|01⟩ + e^{id/2}|10⟩ − e^{−id/2}|11⟩); ⟨X⊗I⟩ = Re Σ conj(ψ_{0b})ψ_{1b}·2
    //   = ½[Re(e^{id/2}e^{id/2}) + Re(e^{−id/2}·(−e^{−id/2}))] = ½[cos d − cos d] = 0,
    // ⟨Y⊗I⟩ = 2 Im Σ_b conj(ψ_{0b})ψ_{1b} = ½[sin d + sin d] = sin d.
    const o = s.result.observables!;
    expect(Math.abs(o['XI']!.noisy)).toBeLessThan(EXACT);
    expect(Math.abs(o['YI']!.noisy - Math.sin(d))).toBeLessThan(EXACT);
    expect(Math.abs(o['YI']!.ideal)).toBeLessThan(EXACT);
  });

  it('a step noise: none removes the coherent error, a step noise: replaces it', () => {
    const text = (step: string) => `qubits: 1
noise:
  gates: { x: { coherent: { x: 0.1 } } }
steps:
  - x: 0
    ${step}
`;
    expect(Math.abs(1 - run(text('noise: none')).fidelity.state)).toBeLessThan(EXACT);
    expect(Math.abs(1 - run(text('noise: { coherent: { x: "0.2" } }')).fidelity.state - Math.sin(0.1) ** 2)).toBeLessThan(EXACT);
  });
});
