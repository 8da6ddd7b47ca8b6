/**
 * src/engine/run.ts applies a channel with r Kraus operators on k qubits (d = 2^k) through its
 * superoperator when r > d/2 and through its Kraus operators otherwise (cost model r·2·d³ vs
 * d⁴ per block, stated there); both routes must give the same state.
 */
import { describe, expect, it } from 'vitest';
import type { CMatrix } from '../../src/linalg/cmatrix.js';
import { referenceKernels, type Kernels } from '../../src/engine/kernels.js';
import { runNoisy } from '../../src/engine/run.js';
import type { Instruction } from '../../src/engine/instruction.js';
import { krausToSuperoperator } from '../../src/linalg/superoperator.js';
import { builtinGate } from '../../src/circuit/gates.js';
import { amplitudeDampingChannel, depolarizingChannel } from '../../src/channels/builtins.js';
import { mulberry32, randomKraus } from './helpers.js';

function spy(): { kernels: Kernels; calls: string[] } {
  const calls: string[] = [];
  const kernels: Kernels = {
    applyUnitary: (rho, q, u) => referenceKernels.applyUnitary(rho, q, u),
    applySuperoperator: (rho, q, s) => {
      calls.push('superoperator');
      referenceKernels.applySuperoperator(rho, q, s);
    },
    applyKraus: (rho, q, k) => {
      calls.push('kraus');
      referenceKernels.applyKraus(rho, q, k);
    },
    reset: (rho, q) => referenceKernels.reset(rho, q),
  };
  return { kernels, calls };
}

describe('engine: superoperator or Kraus form, whichever is cheaper', () => {
  it('picks Kraus for r ≤ d/2 and the superoperator for r > d/2', () => {
    const h = builtinGate('h')!.matrix([]);
    const cases: Array<[readonly number[], readonly CMatrix[], string]> = [
      [[0], [builtinGate('x')!.matrix([])], 'kraus'], // r = 1 = d/2
      [[1], amplitudeDampingChannel(0.2).minimalKraus(), 'superoperator'], // r = 2 > 1
      [[0, 2], randomKraus(mulberry32(3), 4, 2), 'kraus'], // r = 2 = d/2
      [[2, 1], depolarizingChannel(2, 0.1).minimalKraus(), 'superoperator'], // r = 16 > 2
    ];
    const { kernels, calls } = spy();
    const program: Instruction[] = [{ op: 'unitary', qubits: [0], matrix: h }];
    for (const [qubits, kraus] of cases) program.push({ op: 'channel', qubits, kraus });
    runNoisy(3, program, kernels);
    expect(calls).toEqual(cases.map((c) => c[2]));
  });

  it('both routes give the same density matrix (random channels on random targets)', () => {
    const rng = mulberry32(8);
    const prog: Instruction[] = [
      { op: 'unitary', qubits: [0], matrix: builtinGate('h')!.matrix([]) },
      { op: 'unitary', qubits: [0, 1], matrix: builtinGate('cx')!.matrix([]) },
      { op: 'channel', qubits: [1, 0], kraus: randomKraus(rng, 4, 5) },
      { op: 'channel', qubits: [2], kraus: randomKraus(rng, 2, 3) },
    ];
    const viaChoice = runNoisy(3, prog);
    // reference: every channel through its superoperator
    const forced: Kernels = { ...referenceKernels, applyKraus: (rho, q, k) => referenceKernels.applySuperoperator(rho, q, krausToSuperoperator(k)) };
    const viaSuper = runNoisy(3, prog, forced);
    let worst = 0;
    for (let i = 0; i < viaChoice.data.length; i++) worst = Math.max(worst, Math.abs(viaChoice.data[i]! - viaSuper.data[i]!));
    expect(worst).toBeLessThan(1e-14);
  });
});
