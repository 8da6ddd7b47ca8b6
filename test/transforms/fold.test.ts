import { describe, expect, it } from 'vitest';
import { foldCircuit } from '../../src/transforms/fold.js';
import { simulateLoaded } from '../../src/api/simulate.js';
import { loadText } from '../helpers/load.js';
import { maxDiff } from '../helpers/arrays.js';

/** Rounding of a few hundred kernel operations on a small density matrix. */
const SAME_RUN = 1e-12;


// gates of several kinds, a composite with split parts, a matrix gate; no noise at all
const IDEAL = `
qubits: 3
gates:
  pair:
    qubits: 2
    steps: [ {h: 0}, {cx: [0, 1]}, {rz: 1, angle: 0.3} ]
  phase_mat:
    matrix: [[1, 0], [0, "exp(i*pi/5)"]]
noise:
  gates:
    pair: { split: true }
steps:
  - h: 0
  - u: 1
    angles: [0.4, 0.2, -0.7]
  - pair: [0, 2]
  - phase_mat: 1
  - crx: [2, 1]
    angle: 0.9
  - t: 0
`;

describe('unitary folding', () => {
  it('with ideal operations every figure is unchanged (G G† G = G; Giurgica-Tiron et al. 2020, from memory)', () => {
    const loaded = loadText(IDEAL);
    const base = simulateLoaded(loaded, { observe: ['XYZ', 'ZZI'] });
    for (const [scale, order] of [[3, 'end'], [2.2, 'random'], [5, 'end']] as const) {
      const folded = foldCircuit(loaded.circuit, { scale, order, seed: 3 });
      const run = simulateLoaded({ ...loaded, circuit: folded.circuit }, { observe: ['XYZ', 'ZZI'] });
      expect(maxDiff(run.rho.data, base.rho.data)).toBeLessThan(SAME_RUN);
      expect(Math.abs(run.result.fidelity.state - 1)).toBeLessThan(SAME_RUN);
      for (const p of ['XYZ', 'ZZI']) expect(Math.abs(run.result.observables![p]!.noisy - base.result.observables![p]!.ideal)).toBeLessThan(SAME_RUN);
    }
  });

  it('folding by 3 gives the noise of three gates in the schedule: the same as writing G, G†, G out (derived)', () => {
    const noise = `
noise:
  qubits:
    all: { t1: 20us, t2: 15us, detuning: 30kHz }
  couplings:
    "0 1": { zz: 100kHz }
  gates:
    all: { duration: 40ns, error: 0.002, coherent: { x: 0.02 } }
    cx: { duration: 300ns, error: 0.01, coherent: { zz: 0.05 } }
`;
    const one = loadText(`qubits: 2\n${noise}\nsteps:\n  - rx: 0\n    angle: 0.7\n  - cx: [0, 1]\n`);
    const three = loadText(
      `qubits: 2\n${noise}\nsteps:\n  - rx: 0\n    angle: 0.7\n  - rx: 0\n    angle: -0.7\n  - rx: 0\n    angle: 0.7\n  - cx: [0, 1]\n  - cx: [0, 1]\n  - cx: [0, 1]\n`,
    );
    const folded = foldCircuit(one.circuit, { scale: 3 });
    expect(folded.scale).toBe(3);
    expect(folded.folds).toEqual([1, 1]);
    const a = simulateLoaded({ ...one, circuit: folded.circuit });
    const b = simulateLoaded(three);
    expect(a.schedule.duration).toBe(3 * 40 + 3 * 300);
    expect(a.schedule.duration).toBe(b.schedule.duration);
    expect(maxDiff(a.rho.data, b.rho.data)).toBeLessThan(SAME_RUN);
    // and the noise really grew
    expect(a.result.fidelity.state).toBeLessThan(simulateLoaded(one).result.fidelity.state);
  });

  it('fractional scales: n = round((λ−1)·d/2) extra pairs, the last ones from the end, a seeded choice at random', () => {
    const loaded = loadText('qubits: 1\nsteps:\n  - x: 0\n  - y: 0\n  - z: 0\n  - h: 0\n  - measure: 0\n');
    const end = foldCircuit(loaded.circuit, { scale: 2 });
    expect(end.folds).toEqual([0, 0, 1, 1]);
    expect(end.scale).toBe(2);
    expect(end.circuit.operations.map((op) => (op.kind === 'gate' ? op.name : op.kind))).toEqual(['x', 'y', 'z', 'z', 'z', 'h', 'h', 'h', 'measure']);
    const r1 = foldCircuit(loaded.circuit, { scale: 4.5, order: 'random', seed: 9 });
    const r2 = foldCircuit(loaded.circuit, { scale: 4.5, order: 'random', seed: 9 });
    expect(r1.folds).toEqual(r2.folds);
    expect(r1.folds.reduce((a, b) => a + b, 0)).toBe(7);
    expect(r1.folds.every((k) => k === 1 || k === 2)).toBe(true);
    expect(r1.scale).toBe(4.5);
    expect(foldCircuit(loaded.circuit, { scale: 1.1 }).scale).toBe(1);
    expect(() => foldCircuit(loaded.circuit, { scale: 0.5 })).toThrow(RangeError);
  });
});
