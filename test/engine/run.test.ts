import { describe, expect, it } from 'vitest';
import type { Matrix } from 'mathjs';
import type { Instruction } from '../../src/engine/instruction.js';
import { referenceKernels, type Kernels } from '../../src/engine/kernels.js';
import { ensembleToDensityMatrix, runIdeal, runNoisy } from '../../src/engine/run.js';
import { stateToDensityMatrix } from '../../src/engine/stateVector.js';
import { fromRows, maxAbsDiff } from '../../src/linalg/cmatrix.js';
import type { DensityMatrix } from '../../src/engine/layout.js';
import { DENSE_AGREEMENT, denseChannel, denseReset, rhoDiff, rhoToMath } from './dense.js';
import { mulberry32, randInt, randomKraus, randomTargets, randomUnitary } from './helpers.js';
import { createDensityMatrix } from '../../src/engine/densityMatrix.js';

const H = fromRows([
  [Math.SQRT1_2, Math.SQRT1_2],
  [Math.SQRT1_2, -Math.SQRT1_2],
]);
const X = fromRows([
  [0, 1],
  [1, 0],
]);
const CNOT = fromRows([
  [1, 0, 0, 0],
  [0, 1, 0, 0],
  [0, 0, 0, 1],
  [0, 0, 1, 0],
]);

function rhoMaxDiff(a: DensityMatrix, b: DensityMatrix): number {
  return maxAbsDiff({ rows: a.dim, cols: a.dim, data: a.data }, { rows: b.dim, cols: b.dim, data: b.data });
}

function randomUnitaryProgram(rng: () => number, n: number, length: number): Instruction[] {
  const program: Instruction[] = [];
  for (let i = 0; i < length; i++) {
    const k = 1 + randInt(rng, Math.min(n, 3));
    program.push({ op: 'unitary', qubits: randomTargets(rng, n, k), matrix: randomUnitary(rng, 1 << k) });
  }
  return program;
}

describe('runNoisy', () => {
  it('matches a dense mathjs evaluation of a random program with unitaries, channels and resets', () => {
    // Source: independent dense computation with mathjs, instruction by instruction (./helpers.ts).
    const rng = mulberry32(99);
    for (const n of [1, 2, 3, 4]) {
      const program: Instruction[] = [];
      for (let i = 0; i < 12; i++) {
        const kind = randInt(rng, 3);
        if (kind === 2) program.push({ op: 'reset', qubit: randInt(rng, n) });
        else {
          const k = 1 + randInt(rng, Math.min(n, 2));
          const qubits = randomTargets(rng, n, k);
          if (kind === 0) program.push({ op: 'unitary', qubits, matrix: randomUnitary(rng, 1 << k) });
          else program.push({ op: 'channel', qubits, kraus: randomKraus(rng, 1 << k, 1 + randInt(rng, 3)) });
        }
      }
      let dense: Matrix = rhoToMath(createDensityMatrix(n));
      for (const ins of program) {
        if (ins.op === 'unitary') dense = denseChannel(n, ins.qubits, [ins.matrix], dense);
        else if (ins.op === 'channel') dense = denseChannel(n, ins.qubits, ins.kraus, dense);
        else dense = denseReset(n, ins.qubit, dense);
      }
      expect(rhoDiff(runNoisy(n, program), dense)).toBeLessThan(DENSE_AGREEMENT);
    }
  });

  it('uses the kernels it is given', () => {
    const calls: string[] = [];
    const spy: Kernels = {
      applyUnitary: (rho, q, u) => (calls.push('u'), referenceKernels.applyUnitary(rho, q, u)),
      applySuperoperator: (rho, q, s) => (calls.push('s'), referenceKernels.applySuperoperator(rho, q, s)),
      applyKraus: (rho, q, k) => (calls.push('k'), referenceKernels.applyKraus(rho, q, k)),
      reset: (rho, q) => (calls.push('r'), referenceKernels.reset(rho, q)),
    };
    runNoisy(2, [
      { op: 'unitary', qubits: [0], matrix: H },
      { op: 'channel', qubits: [1], kraus: [X] },
      { op: 'reset', qubit: 0 },
    ], spy);
    expect(calls).toEqual(['u', 'k', 'r']);
  });
});

describe('runIdeal', () => {
  it('state-vector run equals the density-matrix run of the same unitary program (ρ = |ψ⟩⟨ψ|)', () => {
    const rng = mulberry32(123);
    for (const n of [1, 2, 3, 4]) {
      const program = randomUnitaryProgram(rng, n, 15);
      const ideal = runIdeal(n, program);
      expect(ideal.kind).toBe('pure');
      if (ideal.kind !== 'pure') return;
      expect(rhoMaxDiff(stateToDensityMatrix(ideal.state), runNoisy(n, program))).toBeLessThan(DENSE_AGREEMENT);
    }
  });

  it('stays pure when a reset acts on a qubit in a product state', () => {
    const program: Instruction[] = [
      { op: 'unitary', qubits: [0], matrix: H },
      { op: 'unitary', qubits: [1], matrix: X },
      { op: 'reset', qubit: 1 },
      { op: 'unitary', qubits: [1], matrix: H },
      { op: 'reset', qubit: 0 },
    ];
    const ideal = runIdeal(2, program);
    expect(ideal.kind).toBe('pure');
    if (ideal.kind !== 'pure') return;
    expect(rhoMaxDiff(stateToDensityMatrix(ideal.state), runNoisy(2, program))).toBeLessThan(DENSE_AGREEMENT);
  });

  it('keeps pure branches when a reset hits half of a Bell pair, and continues on them', () => {
    // Resetting one half of (|00⟩ + |11⟩)/√2 leaves |0⟩⟨0| ⊗ I/2, a mixed state (Nielsen & Chuang §2.4.3, from memory).
    const rng = mulberry32(321);
    const program: Instruction[] = [
      { op: 'unitary', qubits: [0], matrix: H },
      { op: 'unitary', qubits: [0, 2], matrix: CNOT },
      { op: 'reset', qubit: 0 },
      { op: 'unitary', qubits: [2, 1], matrix: randomUnitary(rng, 4) },
      { op: 'reset', qubit: 1 },
    ];
    const ideal = runIdeal(3, program);
    expect(ideal.kind).toBe('ensemble');
    if (ideal.kind !== 'ensemble') return;
    // σ = Σ_i |ψ_i⟩⟨ψ_i| equals the density-matrix run of the same program.
    expect(rhoMaxDiff(ensembleToDensityMatrix(ideal.states), runNoisy(3, program))).toBeLessThan(DENSE_AGREEMENT);
    // The branches are orthogonal (one per eigenvector of σ): at most rank σ of them.
    expect(ideal.states.length).toBeLessThanOrEqual(2);
  });

  it('matches |0⟩⟨0| ⊗ I/2 for the reset Bell pair', () => {
    const ideal = runIdeal(2, [
      { op: 'unitary', qubits: [0], matrix: H },
      { op: 'unitary', qubits: [0, 1], matrix: CNOT },
      { op: 'reset', qubit: 0 },
    ]);
    expect(ideal.kind).toBe('ensemble');
    if (ideal.kind !== 'ensemble') return;
    const rho = ensembleToDensityMatrix(ideal.states);
    const expected = new Float64Array(32);
    expected[0] = 0.5;
    expected[2 * (1 * 4 + 1)] = 0.5;
    expect(maxAbsDiff({ rows: 4, cols: 4, data: rho.data }, { rows: 4, cols: 4, data: expected })).toBeLessThan(DENSE_AGREEMENT);
  });

  it('dependent branches collapse to the rank of σ: resetting every qubit of an entangled state leaves one pure branch', () => {
    const rng = mulberry32(99);
    const program: Instruction[] = [
      { op: 'unitary', qubits: [0, 1, 2], matrix: randomUnitary(rng, 8) },
      { op: 'reset', qubit: 0 },
      { op: 'reset', qubit: 1 },
      { op: 'reset', qubit: 2 },
    ];
    const ideal = runIdeal(3, program);
    expect(ideal.kind).toBe('pure');
    if (ideal.kind !== 'pure') return;
    expect(rhoMaxDiff(stateToDensityMatrix(ideal.state), runNoisy(3, program))).toBeLessThan(DENSE_AGREEMENT);
  });

  it('goes on as a density matrix past the branch limit', () => {
    // A scrambled 4-qubit state with qubits 0 and 1 reset has σ of rank 4 (the reduced state of
    // qubits 2, 3): past a limit of 2 branches the run continues on the density matrix.
    const rng = mulberry32(5);
    const program: Instruction[] = [
      { op: 'unitary', qubits: [0, 1, 2], matrix: randomUnitary(rng, 8) },
      { op: 'unitary', qubits: [1, 2, 3], matrix: randomUnitary(rng, 8) },
      { op: 'unitary', qubits: [0, 3], matrix: randomUnitary(rng, 4) },
      { op: 'reset', qubit: 0 },
      { op: 'reset', qubit: 1 },
      { op: 'unitary', qubits: [1, 3], matrix: randomUnitary(rng, 4) },
    ];
    const capped = runIdeal(4, program, referenceKernels, 2);
    expect(capped.kind).toBe('mixed');
    const free = runIdeal(4, program);
    expect(free.kind).toBe('ensemble');
    if (capped.kind !== 'mixed' || free.kind !== 'ensemble') return;
    expect(free.states.length).toBe(4);
    expect(rhoMaxDiff(capped.rho, runNoisy(4, program))).toBeLessThan(DENSE_AGREEMENT);
    expect(rhoMaxDiff(ensembleToDensityMatrix(free.states), capped.rho)).toBeLessThan(DENSE_AGREEMENT);
  });

  it("throws on a 'channel' instruction", () => {
    expect(() => runIdeal(1, [{ op: 'channel', qubits: [0], kraus: [X] }])).toThrow(TypeError);
  });
});
