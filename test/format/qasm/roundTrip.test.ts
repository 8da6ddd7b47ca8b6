/**
 * Export → import round trips: every demo circuit (YAML and OpenQASM) written as OpenQASM 2.0
 * and 3 and read back gives the same ideal and noisy figures to 1e-12 with the same profile;
 * an OpenQASM program converted to YAML reads back to the same figures; every fray built-in
 * survives export to both versions (the definitions written for gates a header lacks are
 * read back as the built-in).
 */
import { describe, expect, it } from 'vitest';
import { simulateLoaded } from '../../../src/api/simulate.js';
import { BUILTIN_GATES } from '../../../src/circuit/gates.js';
import { ProblemList, formatProblem } from '../../../src/format/problem.js';
import { writeQasm } from '../../../src/format/qasm/write.js';
import { writeCircuitYaml } from '../../../src/format/writeCircuit.js';
import { maxAbsDiff } from '../../../src/linalg/cmatrix.js';
import type { GateOperation } from '../../../src/circuit/circuit.js';
import { figureDistance, loadProgram, repoFile } from './helpers.js';

/** Agreement of two routes to the same figure (double rounding only). */
const TWIN = 1e-12;

const DEMOS: { circuit: string; device: string; refused?: string }[] = [
  { circuit: 'circuits/ghz5.yaml', device: 'circuits/devices/bench-line5.yaml' },
  { circuit: 'circuits/ramsey-echo.yaml', device: 'circuits/devices/bench-line5.yaml' },
  { circuit: 'circuits/qpe3-asap.yaml', device: 'circuits/devices/quad-square.yaml' },
  { circuit: 'circuits/qpe3-alap.yaml', device: 'circuits/devices/quad-square.yaml' },
  { circuit: 'circuits/coupler-swap.yaml', device: 'circuits/devices/quad-square.yaml', refused: "custom matrix gate 'half_swap' acts on 2 qubits" },
  { circuit: 'circuits/qasm/qft4.qasm', device: 'circuits/devices/ring4-qasm.yaml' },
  { circuit: 'circuits/qasm/ghz-wait.qasm', device: 'circuits/devices/ring4-qasm.yaml' },
  { circuit: 'circuits/qasm/teleport.qasm', device: 'circuits/devices/ring4-qasm.yaml' },
  { circuit: 'circuits/teleport.yaml', device: 'circuits/devices/ring4-qasm.yaml' },
  { circuit: 'circuits/active-reset.yaml', device: 'circuits/devices/ring4-qasm.yaml' },
];

/** The largest difference between two results' ideal figures (probabilities and Bloch vectors). */
function idealDistance(a: ReturnType<typeof run>, b: ReturnType<typeof run>): number {
  let worst = 0;
  const keys = new Set([...Object.keys(a.probabilities.ideal), ...Object.keys(b.probabilities.ideal)]);
  for (const k of keys) worst = Math.max(worst, Math.abs((a.probabilities.ideal[k] ?? 0) - (b.probabilities.ideal[k] ?? 0)));
  a.bloch.ideal.forEach((v, i) => v.forEach((x, j) => (worst = Math.max(worst, Math.abs(x - b.bloch.ideal[i]![j]!)))));
  return worst;
}

describe('record mode through OpenQASM', () => {
  it('a condition on two one-bit registers cannot be stated in OpenQASM 2.0 but reads back from 3 with the same figures', () => {
    const text = repoFile('circuits/repetition-code.yaml');
    const dev = repoFile('circuits/devices/ring4-qasm.yaml');
    expect(() => exported(text, 'rep.yaml', dev, 2)).toThrow('OpenQASM 2.0 can only compare a whole bit register with an integer');
    const c = loadProgram(text, 'rep.yaml', dev).circuit;
    const { qasm } = exported(text, 'rep.yaml', dev, 3);
    const back = loadProgram(qasm, 'back.qasm', dev).circuit;
    expect(back.bits).toEqual(c.bits);
    expect(back.operations.filter((o) => o.kind === 'gate' && o.condition !== undefined).length).toBe(c.operations.filter((o) => o.kind === 'gate' && o.condition !== undefined).length);
  });
});

const run = (text: string, file: string, device: string) => simulateLoaded(loadProgram(text, file, device), { engine: 'reference' }).result;

function exported(text: string, file: string, device: string, version: 2 | 3): { qasm: string; problems: ProblemList } {
  const problems = new ProblemList();
  const qasm = writeQasm(loadProgram(text, file, device).circuit, { version, source: file, profile: 'p' }, problems);
  if (qasm === undefined) throw new Error(problems.errors.map(formatProblem).join('\n'));
  return { qasm, problems };
}


describe('export → import round trips of the demos', () => {
  for (const { circuit, device, refused } of DEMOS) {
    for (const version of [2, 3] as const) {
      it(`${circuit} through OpenQASM ${version}`, () => {
        const text = repoFile(circuit);
        const dev = repoFile(device);
        if (refused !== undefined) {
          expect(() => exported(text, circuit, dev, version)).toThrow(refused);
          return;
        }
        const { qasm, problems } = exported(text, circuit, dev, version);
        // Noise written in the circuit is not part of OpenQASM, and OpenQASM 2.0 has no timing: those cannot match.
        const c = loadProgram(text, circuit, dev).circuit;
        const noiseInCircuit = c.inlineNoise !== null || c.operations.some((o) => o.kind === 'channel' || ('noise' in o && o.noise !== undefined));
        const hasIdle = c.operations.some((o) => o.kind === 'idle');
        if (noiseInCircuit || (version === 2 && hasIdle)) {
          expect(problems.warnings.length).toBeGreaterThan(0); // what was dropped is said
          // the ideal figures do not depend on what was dropped
          const a = run(text, circuit, dev);
          const b = run(qasm, 'back.qasm', dev);
          expect(idealDistance(a, b)).toBeLessThan(TWIN);
          return;
        }
        const a = run(text, circuit, dev);
        const b = run(qasm, 'back.qasm', dev);
        expect(figureDistance(a, b)).toBeLessThan(TWIN);
      });
    }
  }

  it('an OpenQASM demo converted to YAML reads back to the same figures', () => {
    for (const file of ['circuits/qasm/qft4.qasm', 'circuits/qasm/ghz-wait.qasm']) {
      const dev = repoFile('circuits/devices/ring4-qasm.yaml');
      const loaded = loadProgram(repoFile(file), file, dev);
      const yaml = writeCircuitYaml(loaded.circuit, { header: ['test'], name: 'x' });
      expect(figureDistance(run(repoFile(file), file, dev), run(yaml, 'back.yaml', dev))).toBeLessThan(TWIN);
    }
  });
});

describe('every fray built-in survives export to both versions', () => {
  const rng = (() => {
    let s = 7;
    return () => ((s = (s * 16807) % 2147483647) / 2147483647) * 6 - 3;
  })();
  for (const [name, g] of BUILTIN_GATES) {
    if (name !== g.name) continue; // aliases
    for (const version of [2, 3] as const) {
      it(`${name} (OpenQASM ${version})`, () => {
        const qs = Array.from({ length: g.qubits }, (_, i) => i);
        const angles = g.params.map(() => rng());
        const yaml = `qubits: ${g.qubits}\nsteps:\n  - ${name}: [${qs.join(', ')}]\n${angles.length > 0 ? `    angles: [${angles.join(', ')}]\n` : ''}`;
        const { qasm } = exported(yaml, 'g.yaml', 'name: none\n', version);
        const back = loadProgram(qasm, 'g.qasm').circuit.operations as GateOperation[];
        expect(back.map((o) => o.name)).toEqual([name]);
        expect(maxAbsDiff(back[0]!.unitary, g.matrix(angles))).toBeLessThan(TWIN);
      });
    }
  }
});

describe('what OpenQASM cannot state is refused with the reason', () => {
  it('a custom matrix gate on two qubits', () => {
    const yaml = 'qubits: 2\ngates:\n  m2:\n    matrix: [[1,0,0,0],[0,0,1,0],[0,1,0,0],[0,0,0,1]]\nsteps:\n  - m2: [0, 1]\n';
    const problems = new ProblemList();
    expect(writeQasm(loadProgram(yaml, 'c.yaml').circuit, { version: 3, source: 'c.yaml', profile: null }, problems)).toBeUndefined();
    expect(problems.errors.map(formatProblem)[0]).toMatch(/^c\.yaml:6:5: custom matrix gate 'm2' acts on 2 qubits; OpenQASM has no matrix gates/);
  });

  it('a one-qubit matrix gate becomes U with its ZYZ angles and reads back equal up to a global phase', () => {
    const yaml = 'qubits: 1\ngates:\n  w:\n    matrix: [["exp(i*0.3)*cos(0.4)", "-sin(0.4)"], ["exp(i*0.3)*sin(0.4)", "cos(0.4)"]]\nsteps:\n  - w: 0\n  - h: 0\n';
    const a = run(yaml, 'w.yaml', 'name: none\n');
    const { qasm } = exported(yaml, 'w.yaml', 'name: none\n', 2);
    expect(qasm).toMatch(/gate w a \{ U\(/);
    expect(figureDistance(a, run(qasm, 'w.qasm', 'name: none\n'))).toBeLessThan(TWIN);
  });

  it("a circuit's own gate named like an OpenQASM built-in (u1) shadows it, and export asks to rename it", () => {
    const yaml = 'qubits: 1\ngates:\n  u1:\n    qubits: 1\n    steps: [ {x: 0} ]\nsteps:\n  - u1: 0\n';
    const loaded = loadProgram(yaml, 'u.yaml');
    expect(run(yaml, 'u.yaml', 'name: none\n').probabilities.ideal).toEqual({ '1': 1 }); // x, not the built-in u1 (which takes an angle)
    const problems = new ProblemList();
    expect(writeQasm(loaded.circuit, { version: 2, source: 'u.yaml', profile: null }, problems)).toBeUndefined();
    expect(problems.errors.map(formatProblem)[0]).toContain("custom gate 'u1' has the name of a standard OpenQASM gate");
  });

  it('idles are dropped from OpenQASM 2.0 with a warning and kept as delay in 3', () => {
    const yaml = 'qubits: 1\nsteps:\n  - h: 0\n  - idle: 0\n    for: 2us\n';
    expect(exported(yaml, 'i.yaml', 'name: none\n', 3).qasm).toContain('delay[2000ns] q[0];');
    const v2 = exported(yaml, 'i.yaml', 'name: none\n', 2);
    expect(v2.qasm).toContain('// idle of 2 µs on q[0] dropped');
    expect(v2.problems.warnings.map(formatProblem)[0]).toMatch(/^i\.yaml:4:5: warning: the idle on q\[0\] is dropped/);
  });
});

describe('composite gates with angle expressions survive export', () => {
  it('a YAML composite using its parameters, a circuit parameter, e and powers reads back with the same unitary (OpenQASM 2.0 and 3)', () => {
    const yaml = `qubits: 2
params: { k: -0.25 }
gates:
  tw:
    qubits: 2
    params: [a, b]
    steps: [ {rz: 0, angle: "-a^2/2 + k"}, {cx: [0, 1]}, {ry: 1, angle: "(b - a)*e - sin(a)^-1"}, {u: 0, angles: [a, "2*b", "-(a+b)/3"]} ]
steps:
  - h: 0
  - tw: [0, 1]
    angles: [0.7, "pi/5"]
`;
    for (const version of [2, 3] as const) {
      const a = loadProgram(yaml, 'c.yaml').circuit.operations[1] as GateOperation;
      const { qasm } = exported(yaml, 'c.yaml', 'name: none\n', version);
      const b = loadProgram(qasm, 'c.qasm').circuit.operations[1] as GateOperation;
      expect(b.name).toBe('tw');
      expect(maxAbsDiff(a.unitary, b.unitary)).toBeLessThan(TWIN);
    }
  });
});
