/**
 * Reading OpenQASM: one small program per construct of each grammar, with ideal results
 * against textbook answers, and programs against their YAML twins (every figure to 1e-12,
 * with the same profile).
 */
import { describe, expect, it } from 'vitest';
import { figureDistance, loadProgram, repoFile, runProgram } from './helpers.js';
import type { GateOperation } from '../../../src/circuit/circuit.js';

/** Agreement of two routes to the same figure (double rounding only). */
const TWIN = 1e-12;

const DEVICE = `name: test device
qubits:
  all: { t1: 40us, t2: 30us, readout: { zero_as_one: 0.02, one_as_zero: 0.05 } }
gates:
  all: { duration: 50ns, error: 0.002 }
  cx: { duration: 300ns, error: 0.015 }
  u1: { duration: 0ns, thermal: false }
  measure: { duration: 700ns }
  reset: { duration: 500ns }
`;

const amplitudes = (sim: ReturnType<typeof runProgram>): Float64Array => {
  if (sim.ideal.kind !== 'pure') throw new Error('expected a pure ideal state');
  return sim.ideal.state.data;
};

describe('OpenQASM 2.0 constructs', () => {
  it('qreg/creg, h, cx, measure q -> c: a Bell pair gives 00 and 11 with ½ each (N&C §1.3.6)', () => {
    const r = runProgram('OPENQASM 2.0;\ninclude "qelib1.inc";\nqreg q[2];\ncreg c[2];\nh q[0];\ncx q[0], q[1];\nmeasure q -> c;\n').result;
    expect(r.probabilities.ideal).toEqual({ '00': expect.closeTo(0.5, 15), '11': expect.closeTo(0.5, 15) });
    expect(r.labels).toEqual(['q[0]', 'q[1]']);
  });

  it('several registers lay out in declaration order and keep their names as labels', () => {
    const sim = runProgram('OPENQASM 2.0;\ninclude "qelib1.inc";\nqreg a[1];\nqreg anc[2];\ncreg c[3];\nx anc[1];\nmeasure a[0] -> c[0];\nmeasure anc[0] -> c[1];\nmeasure anc[1] -> c[2];\n');
    expect(sim.circuit.register.labels).toEqual(['a[0]', 'anc[0]', 'anc[1]']);
    expect(sim.result.probabilities.ideal).toEqual({ '001': 1 });
  });

  it('a register operand broadcasts: h q; applies h to every qubit (uniform over 2^3, common practice)', () => {
    const r = runProgram('OPENQASM 2.0;\ninclude "qelib1.inc";\nqreg q[3];\nh q;\n').result;
    for (let k = 0; k < 8; k++) expect(r.probabilities.ideal[k.toString(2).padStart(3, '0')]).toBeCloseTo(1 / 8, 14);
  });

  it('cx q, r; pairs register elements (q[i] controls r[i])', () => {
    const r = runProgram('OPENQASM 2.0;\ninclude "qelib1.inc";\nqreg q[2];\nqreg r[2];\nx q[1];\ncx q, r;\n').result;
    expect(r.probabilities.ideal).toEqual({ '0101': 1 });
  });

  it('the four-qubit QFT of |0101⟩ (demo qft4.qasm) has amplitudes e^{2πi·5k/16}/4 (N&C §5.1, Eq. 5.2)', () => {
    const sim = runProgram(repoFile('circuits/qasm/qft4.qasm'), 'qft4.qasm');
    const a = amplitudes(sim);
    for (let k = 0; k < 16; k++) {
      const phase = (2 * Math.PI * 5 * k) / 16;
      expect(a[2 * k]).toBeCloseTo(Math.cos(phase) / 4, 13);
      expect(a[2 * k + 1]).toBeCloseTo(Math.sin(phase) / 4, 13);
    }
  });

  it('a gate definition with parameters is one composite gate with its own profile entry', () => {
    const text = 'OPENQASM 2.0;\ninclude "qelib1.inc";\ngate rot(a, b) x, y { rz(a/2) x; cx x, y; ry(b^2 - pi) y; }\nqreg q[2];\nrot(0.3, 1.2) q[0], q[1];\n';
    const loaded = loadProgram(text, 'p.qasm', DEVICE + '  rot: { duration: 400ns, error: 0.03 }\n');
    const ops = loaded.circuit.operations as GateOperation[];
    expect(ops.map((o) => o.name)).toEqual(['rot']);
    expect(ops[0]!.angles).toEqual([0.3, 1.2]);
    expect(loaded.profile.gateEntry('rot', [0, 1]).duration).toBe(400);
  });

  it('a defined gate split into its parts by the profile (split: true) equals its YAML twin to 1e-12', () => {
    const qasm = 'OPENQASM 2.0;\ninclude "qelib1.inc";\ngate inner(a) x { rz(a) x; h x; }\ngate rot(a) x, y { inner(a/2) x; cx x, y; }\nqreg q[2];\nh q[1];\nrot(0.3) q[0], q[1];\n';
    const yaml = 'qubits: ["q[0]", "q[1]"]\ngates:\n  inner:\n    qubits: 1\n    params: [a]\n    steps: [ {rz: 0, angle: a}, {h: 0} ]\n  rot:\n    qubits: 2\n    params: [a]\n    steps: [ {inner: 0, angle: a/2}, {cx: [0, 1]} ]\nsteps:\n  - h: "q[1]"\n  - rot: ["q[0]", "q[1]"]\n    angle: 0.3\n';
    const device = DEVICE + '  rot: { split: true }\n  inner: { split: true }\n';
    const a = runProgram(qasm, 'p.qasm', device);
    const b = runProgram(yaml, 'p.yaml', device);
    expect(figureDistance(a.result, b.result)).toBeLessThan(TWIN);
    expect(a.result.duration_ns).toBe(2 * 50 + 300); // rz and h on q[0] (beside h on q[1]), then cx: the parts' own durations
  });

  it('a program equals its YAML twin, every figure to 1e-12 with the same profile', () => {
    const qasm = `OPENQASM 2.0;
include "qelib1.inc";
gate rot(a, b) x, y { rz(a/2) x; cx x, y; ry(b^2 - pi) y; }
qreg q[3];
creg c[3];
u3(0.4, -0.2, 1.1) q[0];
u2(0, pi) q[1];
u1(pi/8) q[2];
rot(0.3, 1.2) q[0], q[1];
barrier q;
reset q[2];
cu1(0.7) q[1], q[2];
measure q -> c;
`;
    const yaml = `qubits: ["q[0]", "q[1]", "q[2]"]
gates:
  rot:
    qubits: 2
    params: [a, b]
    steps: [ {rz: 0, angle: a/2}, {cx: [0, 1]}, {ry: 1, angle: "b^2 - pi"} ]
steps:
  - u3: "q[0]"
    angles: [0.4, -0.2, 1.1]
  - u2: "q[1]"
    angles: [0, pi]
  - u1: "q[2]"
    angle: pi/8
  - rot: ["q[0]", "q[1]"]
    angles: [0.3, 1.2]
  - barrier: all
  - reset: "q[2]"
  - cu1: ["q[1]", "q[2]"]
    angle: 0.7
  - measure: all
`;
    const a = runProgram(qasm, 'p.qasm', DEVICE).result;
    const b = runProgram(yaml, 'p.yaml', DEVICE).result;
    expect(figureDistance(a, b)).toBeLessThan(TWIN);
    expect(a.fidelity.state).toBeLessThan(0.999); // the profile really acted
  });

  it('bits assigned out of qubit order: outcomes stay in qubit order and a located warning says so', () => {
    const sim = runProgram('OPENQASM 2.0;\ninclude "qelib1.inc";\nqreg q[2];\ncreg c[2];\nx q[0];\nmeasure q[1] -> c[0];\nmeasure q[0] -> c[1];\n');
    expect(sim.result.probabilities.ideal).toEqual({ '10': 1 });
    expect(sim.result.warnings[0]).toMatch(/^p\.qasm:7:1: c\[1\] holds q\[0\] but an earlier bit holds q\[1\]/);
  });

  it('U and CX need no header', () => {
    const r = runProgram('OPENQASM 2.0;\nqreg q[1];\nqreg r[1];\nU(pi, 0, pi) q[0];\nCX q[0], r[0];\n').result;
    expect(r.probabilities.ideal).toEqual({ '11': 1 });
  });
});

describe('mid-circuit measurement and conditions (record mode)', () => {
  it('teleportation (demo teleport.qasm) delivers the sent state u3(1.1, 0.6, 0)|0⟩ to dst[0] (Bennett et al., Phys. Rev. Lett. 70, 1895 (1993))', () => {
    const sim = runProgram(repoFile('circuits/qasm/teleport.qasm'), 'teleport.qasm');
    expect(sim.circuit.bits).toEqual(['a[0]', 'b[0]']);
    // Bloch vector of u3(θ, φ, 0)|0⟩ = (sin θ cos φ, sin θ sin φ, cos θ) (N&C §1.2, Eq. 1.4)
    const [x, y, z] = sim.result.bloch.ideal[2]!;
    expect(x).toBeCloseTo(Math.sin(1.1) * Math.cos(0.6), 12);
    expect(y).toBeCloseTo(Math.sin(1.1) * Math.sin(0.6), 12);
    expect(z).toBeCloseTo(Math.cos(1.1), 12);
    for (const k of ['00', '01', '10', '11']) expect(sim.result.probabilities.ideal[k]).toBeCloseTo(0.25, 12);
  });

  it('if (c == n) conditions every bit of c on bit i of n (c[0] least significant), and the record keeps declaration order', () => {
    const text = 'OPENQASM 2.0;\ninclude "qelib1.inc";\nqreg q[3];\ncreg c[2];\ncreg d[1];\nx q[1];\nmeasure q[0] -> c[0];\nmeasure q[1] -> c[1];\nif (c == 2) x q[2];\nmeasure q[2] -> d[0];\n';
    const sim = runProgram(text);
    const x = sim.circuit.operations.find((o) => o.kind === 'gate' && o.qubits[0] === 2);
    expect(x?.kind === 'gate' ? x.condition?.terms : undefined).toEqual([{ bit: 0, value: 0 }, { bit: 1, value: 1 }]);
    expect(sim.circuit.bits).toEqual(['c[0]', 'c[1]', 'd[0]']);
    expect(sim.result.probabilities.ideal).toEqual({ '011': 1 });
  });

  it('OpenQASM 3: if (c[i]), if (!c[i]), nested ifs and a qubit reused after its measurement', () => {
    const text = 'OPENQASM 3;\ninclude "stdgates.inc";\nqubit[2] q;\nbit[3] c;\nx q[0];\nc[0] = measure q[0];\nif (c[0]) { x q[0]; }\nc[1] = measure q[0];\nif (!c[1]) { if (c[0] == 1) { x q[1]; } }\nc[2] = measure q[1];\n';
    const sim = runProgram(text);
    expect(sim.result.probabilities.ideal).toEqual({ '101': 1 });
  });

  it('active reset: measure, then x where the bit reads 1, leaves |0⟩ (common practice)', () => {
    const sim = runProgram('OPENQASM 2.0;\ninclude "qelib1.inc";\nqreg q[1];\ncreg m[1];\ncreg f[1];\nh q[0];\nmeasure q[0] -> m[0];\nif (m == 1) x q[0];\nmeasure q[0] -> f[0];\n');
    expect(sim.result.probabilities.ideal['00']).toBeCloseTo(0.5, 14);
    expect(sim.result.probabilities.ideal['10']).toBeCloseTo(0.5, 14);
  });

  it('a program with record mode equals its YAML twin, every figure to 1e-12', () => {
    const qasm = repoFile('circuits/qasm/teleport.qasm');
    const yaml = `qubits: ["src[0]", "link[0]", "dst[0]"]
bits: ["a[0]", "b[0]"]
steps:
  - u3: "src[0]"
    angles: [1.1, 0.6, 0]
  - h: "link[0]"
  - cx: ["link[0]", "dst[0]"]
  - barrier: all
  - cx: ["src[0]", "link[0]"]
  - h: "src[0]"
  - measure: "src[0]"
    into: "a[0]"
  - measure: "link[0]"
    into: "b[0]"
  - x: "dst[0]"
    if: "b[0]"
  - z: "dst[0]"
    if: "a[0]"
`;
    const device = repoFile('circuits/devices/ring4-qasm.yaml');
    expect(figureDistance(runProgram(qasm, 'p.qasm', device).result, runProgram(yaml, 'p.yaml', device).result)).toBeLessThan(TWIN);
  });
});

describe('labels of the form name[index]', () => {
  it('name qubits in YAML steps, per-qubit profile entries and gate tuple keys', () => {
    const yaml = 'qubits: ["q[0]", "anc[1]"]\nsteps:\n  - cx: ["q[0]", "anc[1]"]\n  - measure: "anc[1]"\n';
    const device = 'name: d\nqubits:\n  all: { t1: 50us }\n  "anc[1]": { t1: 10us }\ngates:\n  "cx q[0] anc[1]": { duration: 100ns, error: 0.05 }\n';
    const loaded = loadProgram(yaml, 'p.yaml', device);
    expect(loaded.profile.qubits[1]!.t1).toBe(10000);
    expect(loaded.profile.gateEntry('cx', [0, 1]).duration).toBe(100);
    expect(loaded.circuit.operations[1]!.qubits).toEqual([1]);
  });
});

describe('OpenQASM 3 constructs', () => {
  it('qubit[n] / bit[n] declarations and c[i] = measure q[j]; GHZ on three qubits (Greenberger–Horne–Zeilinger state, ½ on 000 and 111)', () => {
    const r = runProgram('OPENQASM 3.0;\ninclude "stdgates.inc";\nqubit[3] q;\nbit[3] c;\nh q[0];\ncx q[0], q[1];\ncx q[1], q[2];\nc[0] = measure q[0];\nc[1] = measure q[1];\nc[2] = measure q[2];\n').result;
    expect(r.probabilities.ideal['000']).toBeCloseTo(0.5, 15);
    expect(r.probabilities.ideal['111']).toBeCloseTo(0.5, 15);
  });

  it('register measurement c = measure q; and single qubits declared as qubit a;', () => {
    const sim = runProgram('OPENQASM 3;\ninclude "stdgates.inc";\nqubit a;\nqubit[2] q;\nbit[2] c;\nx a;\ncx a, q[1];\nc = measure q;\n');
    expect(sim.circuit.register.labels).toEqual(['a', 'q[0]', 'q[1]']);
    expect(sim.result.probabilities.ideal).toEqual({ '01': 1 });
  });

  it('stdgates names p, sx, cp, crx, phase, cphase, cu run as their fray gates', () => {
    const text = 'OPENQASM 3;\ninclude "stdgates.inc";\nqubit[2] q;\nsx q[0];\nsx q[0];\np(pi/3) q[0];\nphase(pi/3) q[0];\ncp(0.4) q[0], q[1];\ncphase(-0.4) q[0], q[1];\ncrx(pi) q[0], q[1];\ncu(pi, 0, pi, 0) q[1], q[0];\n';
    const sim = runProgram(text);
    expect((sim.circuit.operations as GateOperation[]).map((o) => o.name)).toEqual(['sx', 'sx', 'p', 'p', 'cp', 'cp', 'crx', 'cu']);
    // sx² = x; crx(π) flips q[1] (up to a phase on it); cu(π,0,π,0) = cx with q[1] controlling q[0] flips q[0] back
    expect(sim.result.probabilities.ideal['01']).toBeCloseTo(1, 14);
  });

  it('ctrl @, negctrl @, inv @ and pow(k) @ become built-ins: ctrl @ x = cx, ctrl(2) @ x = ccx, inv @ s = sdg, pow(2) @ h = h h', () => {
    const text = 'OPENQASM 3;\ninclude "stdgates.inc";\nqubit[3] q;\nx q[0];\nctrl @ x q[0], q[1];\nctrl(2) @ x q[0], q[1], q[2];\ninv @ s q[0];\npow(2) @ h q[1];\nnegctrl @ x q[2], q[1];\ninv @ rz(0.5) q[2];\n';
    const sim = runProgram(text);
    const ops = sim.circuit.operations as GateOperation[];
    expect(ops.map((o) => o.name)).toEqual(['x', 'cx', 'ccx', 'sdg', 'h', 'h', 'x', 'cx', 'x', 'rz']);
    expect(ops[9]!.angles).toEqual([-0.5]);
    // x q0 → 100; cx → 110; ccx → 111; sdg, h h change nothing measurable; negctrl on q2 = 1 does nothing
    expect(sim.result.probabilities.ideal).toEqual({ '111': expect.closeTo(1, 14) });
  });

  it('inv @ on a defined gate is the composite g_inv (steps reversed and inverted): g then inv @ g is the identity', () => {
    const text = 'OPENQASM 3;\ninclude "stdgates.inc";\ngate w(a) x, y { rx(a) x; cx x, y; t y; u3(a, 2*a, -a) y; }\nqubit[2] q;\nh q[1];\nw(0.8) q[0], q[1];\ninv @ w(0.8) q[0], q[1];\nh q[1];\n';
    const sim = runProgram(text);
    expect((sim.circuit.operations as GateOperation[]).map((o) => o.name)).toEqual(['h', 'w', 'w_inv', 'h']);
    expect(sim.result.probabilities.ideal['00']).toBeCloseTo(1, 13);
  });

  it('delay[…] becomes an idle of that length on each qubit (ns, us, µs, ms, s) and costs T2 on a superposition', () => {
    const sim = runProgram('OPENQASM 3;\ninclude "stdgates.inc";\nqubit[1] q;\nh q[0];\ndelay[1.5us] q[0];\ndelay[500ns] q;\ndelay[0.001ms] q;\nh q[0];\n', 'p.qasm', DEVICE);
    const idles = sim.circuit.operations.filter((o) => o.kind === 'idle').map((o) => (o.kind === 'idle' ? o.duration : 0));
    expect(idles).toEqual([1500, 500, 1000]);
    // Ramsey with a 3 µs wait plus two 50 ns gates … the idle alone: P(0) = (1 + e^{−τ/T2})/2 is at most the ideal 1 (definition of T2, common practice)
    expect(sim.result.probabilities.noisy['0']!).toBeLessThan(1);
    expect(sim.result.duration_ns).toBeCloseTo(3100, 9);
  });

  it('π, τ and euler constants, ** powers and gphase (a global phase, dropped)', () => {
    const sim = runProgram('OPENQASM 3;\ninclude "stdgates.inc";\nqubit[1] q;\ngphase(0.3);\nrz(τ/4 - π/2 + 2**-1 - euler**0 / 2) q[0];\n');
    expect((sim.circuit.operations[0] as GateOperation).angles![0]).toBeCloseTo(0, 15);
  });

  it('physical qubits $k need no declaration and become qubits in ascending number, labelled $k', () => {
    const sim = runProgram('OPENQASM 3;\ninclude "stdgates.inc";\nbit[2] c;\nx $3;\ncx $3, $1;\nc[0] = measure $1;\nc[1] = measure $3;\n');
    expect(sim.circuit.register.labels).toEqual(['$1', '$3']);
    expect(sim.result.probabilities.ideal).toEqual({ '11': 1 });
  });

  it('the GHZ-and-wait demo (ghz-wait.qasm) ideally returns to 0000, and loads with its device', () => {
    const sim = runProgram(repoFile('circuits/qasm/ghz-wait.qasm'), 'ghz-wait.qasm', repoFile('circuits/devices/ring4-qasm.yaml'));
    expect(sim.result.probabilities.ideal['0000']).toBeCloseTo(1, 13);
    expect(sim.result.fidelity.state).toBeLessThan(0.95);
  });
});
