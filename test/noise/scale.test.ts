import { describe, expect, it } from 'vitest';
import { parseCircuitText, type LoadOptions } from '../../src/api/loadCircuit.js';
import { simulateLoaded } from '../../src/api/simulate.js';
import { formatProblem, ProblemList } from '../../src/format/problem.js';

/** Agreement demanded of closed forms through the whole run path. */
const EXACT = 1e-12;

function run(text: string, options: LoadOptions = {}) {
  const problems = new ProblemList();
  const loaded = parseCircuitText(text, 's.yaml', problems, options);
  if (loaded === undefined) throw new Error(problems.items.map(formatProblem).join('\n'));
  return simulateLoaded(loaded).result;
}

function errors(text: string, options: LoadOptions): string[] {
  const problems = new ProblemList();
  parseCircuitText(text, 's.yaml', problems, options);
  return problems.errors.map(formatProblem);
}

const NOISY = `qubits: 2
noise:
  qubits: { all: { t1: 30us, t2: 25us, excited: 0.02, readout: { zero_as_one: 0.01, one_as_zero: 0.03 } } }
  gates:
    all: { duration: 40ns, pauli: { x: 0.001, z: 0.002 } }
    cx: { duration: 300ns, error: 0.02 }
steps:
  - h: 0
  - cx: [0, 1]
  - idle: 1
    for: 2us
  - rx: 0
    angle: 0.4
    noise: { amplitude_damping: 0.01 }
`;

describe('--noise-scale', () => {
  it('C = 0 gives the ideal run’s figures (derived: every strength zero is no noise)', () => {
    const r = run(NOISY, { noiseScale: 0 });
    expect(Math.abs(r.fidelity.state - 1)).toBeLessThan(EXACT);
    expect(Math.abs(r.fidelity.classical - 1)).toBeLessThan(EXACT);
    expect(r.tvd).toBeLessThan(EXACT);
    for (const k of Object.keys(r.probabilities.ideal)) expect(Math.abs(r.probabilities.measured[k]! - r.probabilities.ideal[k]!)).toBeLessThan(EXACT);
    expect(r.duration_ns).toBe(run(NOISY).duration_ns); // durations stay
  });

  it('C = 1 equals the plain run', () => {
    const a = run(NOISY, { noiseScale: 1 });
    const b = run(NOISY);
    expect(a.probabilities).toEqual(b.probabilities);
    expect(a.fidelity).toEqual(b.fidelity);
  });

  // Depolarizing definition ρ → (1 − p)ρ + p·I/2 (Nielsen & Chuang eq. 8.102): every Bloch
  // component shrinks by (1 − p) per application, so after N z gates (each commuting with
  // nothing that matters here) on |+⟩, ⟨X⟩ = ±(1 − Cp)^N under scale C (derived).
  it.each([0.5, 1, 2, 3.5])('pure depolarizing scaled by %s: ⟨X⟩ = (1 − Cp)^N after N gates', (c) => {
    const p = 0.04;
    const n = 6;
    const text = `qubits: 1
noise:
  gates: { z: { depolarizing: ${p} } }
observe: [X]
steps:
  - h: 0
${Array.from({ length: n }, () => '  - z: 0\n').join('')}`;
    const r = run(text, { noiseScale: c });
    // z flips X's sign each time: an even N leaves it positive
    expect(Math.abs(r.observables!['X']!.noisy - (1 - c * p) ** n)).toBeLessThan(EXACT);
  });

  // T1 → T1/C (common practice: scaling the rate 1/T1): |1⟩ idle τ keeps P(1) = e^{−Cτ/T1}.
  it('scales T1 as a rate', () => {
    const text = 'qubits: 1\nnoise:\n  qubits: { all: { t1: 20us } }\nsteps:\n  - x: 0\n  - idle: 0\n    for: 5us\n';
    expect(Math.abs(run(text, { noiseScale: 2.5 }).probabilities.noisy['1']! - Math.exp((-2.5 * 5) / 20))).toBeLessThan(EXACT);
  });

  it('a scaled probability above 1 is an input error naming the scale, at the value', () => {
    const at400 = errors(NOISY, { noiseScale: 400 });
    expect(at400).toContain(`s.yaml:5:35: --noise-scale 400: 'pauli' of the profile's entry for h on 0 would have x + y + z = ${0.001 * 400 + 0.002 * 400}, above 1`);
    expect(at400).toContain('s.yaml:1:9: --noise-scale 400: the readout error of qubit 0 would exceed 1');
    const e = errors(NOISY, { noiseScale: 110 });
    expect(e.some((m) => m.startsWith("s.yaml:14:33: --noise-scale 110: 'amplitude_damping' of step 4 is 0.01 and would become"))).toBe(true);
  });

  it('an error that would need p > 1 names the scale', () => {
    const e = errors('qubits: 2\nnoise:\n  gates: { cx: { error: 0.3 } }\nsteps:\n  - cx: [0, 1]\n', { noiseScale: 3 });
    expect(e).toHaveLength(0); // the load itself passes; the solve happens in the run
    const problems = new ProblemList();
    const loaded = parseCircuitText('qubits: 2\nnoise:\n  gates: { cx: { error: 0.3 } }\nsteps:\n  - cx: [0, 1]\n', 's.yaml', problems, { noiseScale: 3 });
    expect(() => simulateLoaded(loaded!)).toThrow(/s\.yaml:3:25: --noise-scale 3: step 1 \(cx on 0, 1\): error 0\.89+\d* needs a depolarizing probability/);
  });

  it('a custom channel is kept with a warning', () => {
    const text = 'qubits: 1\nchannels:\n  c: { kraus: [[[1, 0], [0, 1]]] }\nnoise:\n  gates: { x: { channel: c } }\nsteps:\n  - x: 0\n';
    const problems = new ProblemList();
    parseCircuitText(text, 's.yaml', problems, { noiseScale: 2 });
    expect(problems.warnings.map(formatProblem)).toEqual(["s.yaml:5:26: warning: --noise-scale 2: custom channel 'c' of the profile's entry for x on 0 has no strength to scale and is applied as it is"]);
  });
});

describe('--noise-scale on coherent noise (detuning, always-on ZZ, coherent gate errors)', () => {
  // Derived: each of these enters the Hamiltonian or the error unitary linearly in its strength
  // (H_q = π·δ·Z, H_ab = (π·ζ/2)·Z_a Z_b, exp(−i(x·X + …)/2)), so scaling the strength by C is
  // the same run as writing C times the strength; T1/T2 are left out so only these act.
  const ramsey = (delta: string, zz: string, angle: string) => `qubits: 2
noise:
  qubits: { all: { detuning: ${delta} } }
  couplings: { "0 1": { zz: ${zz} } }
  gates: { all: { duration: 20ns }, x: { coherent: { x: ${angle} } } }
observe: [XI, IX, ZZ]
steps:
  - h: [0, 1]
  - x: 1
  - idle: [0, 1]
    for: 2us
  - h: [0, 1]
`;
  it.each([0, 0.5, 2])('C = %s equals writing C·δ, C·ζ and C·angle', (c) => {
    const scaled = run(ramsey('40kHz', '120kHz', '0.03'), { noiseScale: c });
    const written = run(ramsey(`${40 * c}kHz`, `${120 * c}kHz`, String(0.03 * c)));
    for (const p of ['XI', 'IX', 'ZZ']) expect(Math.abs(scaled.observables![p]!.noisy - written.observables![p]!.noisy)).toBeLessThan(EXACT);
    expect(Math.abs(scaled.fidelity.state - written.fidelity.state)).toBeLessThan(EXACT);
  });

  it('the new keys are --set keys, read as in a file', () => {
    const a = run(ramsey('0kHz', '0kHz', '0'), { set: { 'qubits.all.detuning': '40kHz', 'couplings.0 1.zz': '120kHz', 'gates.x.coherent.x': '0.03' } });
    const b = run(ramsey('40kHz', '120kHz', '0.03'));
    expect(a.probabilities).toEqual(b.probabilities);
  });
});
