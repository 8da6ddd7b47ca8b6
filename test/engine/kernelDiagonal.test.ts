import { describe, expect, it } from 'vitest';
import { CompiledPlanBuilder } from '../../src/engine/compiledPlan.js';
import { cloneDensityMatrix } from '../../src/engine/densityMatrix.js';
import { executeCall } from '../../src/engine/kernelCall.js';
import { referenceKernels } from '../../src/engine/kernels.js';
import { krausToSuperoperator } from '../../src/linalg/superoperator.js';
import { diag, type CMatrix } from '../../src/linalg/cmatrix.js';
import { diagonalBins, diagonalTable, type DiagonalMember } from '../../src/plan/diagonalBatch.js';
import { mulberry32, randomDensityMatrix } from './helpers.js';

/** A random diagonal unitary on k qubits (phases e^{iφ}). */
function randomDiagonal(rng: () => number, k: number): CMatrix {
  return diag(Array.from({ length: 1 << k }, () => [Math.cos(6 * rng()), Math.sin(6 * rng())] as [number, number]));
}

describe('diagonal kernel', () => {
  it('two tables over bins A = {0, 2}, B = {1, 3} equal the maps applied one by one (reference kernels)', () => {
    const rng = mulberry32(21);
    const n = 4;
    const members: DiagonalMember[] = [];
    const ops: Array<{ qubits: number[]; kraus: CMatrix[] }> = [
      { qubits: [2, 0], kraus: [randomDiagonal(rng, 2)] },
      { qubits: [1], kraus: [diag([1, Math.sqrt(0.7)]), diag([0, Math.sqrt(0.3)])] }, // phase damping λ = 0.3 (N&C eq. 8.127–8.128)
      { qubits: [3, 1], kraus: [randomDiagonal(rng, 2)] },
      { qubits: [0], kraus: [randomDiagonal(rng, 1)] },
    ];
    for (const o of ops) members.push({ qubits: o.qubits, superop: krausToSuperoperator(o.kraus) });
    const b = new CompiledPlanBuilder(n);
    const offA = b.addNumbers(diagonalTable(members, [0, 2]));
    const offB = b.addNumbers(diagonalTable(members, [1, 3]));
    b.addCall({ kernel: 'diagonal', qubits: [0, 2], qubitsB: [1, 3], off: offA, offB });
    const plan = b.build();
    const rho = randomDensityMatrix(rng, n);
    const ref = cloneDensityMatrix(rho);
    executeCall(rho.data, n, plan.words, plan.starts[0]!, plan.arena, 0, 1);
    for (const o of ops) referenceKernels.applyKraus(ref, o.qubits, o.kraus);
    let w = 0;
    for (let i = 0; i < rho.data.length; i++) w = Math.max(w, Math.abs(rho.data[i]! - ref.data[i]!));
    expect(w).toBeLessThan(1e-12);
  });

  it('diagonalBins keeps members sharing a qubit in one bin and refuses what does not fit', () => {
    const s1 = krausToSuperoperator([diag([1, 1])]);
    const s2 = krausToSuperoperator([diag([1, 1, 1, 1])]);
    const chain: DiagonalMember[] = [0, 1, 2, 3, 4, 5, 6].map((q) => ({ qubits: [q, q + 1], superop: s2 }));
    // a chain over 8 qubits is one component larger than a bin (7)
    expect(diagonalBins(chain)).toBeUndefined();
    const bins = diagonalBins([...chain.slice(0, 3), { qubits: [9], superop: s1 }, { qubits: [10, 12], superop: s2 }]);
    expect(bins).toEqual([[0, 1, 2, 3, 9, 10, 12], []]);
  });
});
