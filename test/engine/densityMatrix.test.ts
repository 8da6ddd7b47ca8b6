import { describe, expect, it } from 'vitest';
import {
  cloneDensityMatrix,
  createDensityMatrix,
  hermiticityResidual,
  MIN_EIGENVALUE_MAX_QUBITS,
  minEigenvalue,
  traceOf,
} from '../../src/engine/densityMatrix.js';
import type { DensityMatrix } from '../../src/engine/layout.js';
import { stateToDensityMatrix } from '../../src/engine/stateVector.js';
import { MAX_REGISTER_QUBITS } from '../../src/engine/targets.js';
import { mulberry32, randomState } from './helpers.js';

/** Tolerance for eigenvalues computed by ml-matrix against closed forms. */
const EIGEN_TOLERANCE = 1e-12;

/** A 1-qubit "density matrix" with the given 2×2 entries as [re, im] pairs. */
function twoByTwo(entries: Array<[number, number]>): DensityMatrix {
  return { n: 1, dim: 2, data: Float64Array.from(entries.flat()) };
}

describe('createDensityMatrix', () => {
  it('is |0…0⟩⟨0…0| of the right size', () => {
    const rho = createDensityMatrix(3);
    expect(rho.dim).toBe(8);
    expect(rho.data.length).toBe(2 * 64);
    expect(rho.data[0]).toBe(1);
    expect(rho.data.reduce((a, b) => a + Math.abs(b), 0)).toBe(1);
  });

  it('clone is independent', () => {
    const rho = createDensityMatrix(1);
    const c = cloneDensityMatrix(rho);
    c.data[0] = 0;
    expect(rho.data[0]).toBe(1);
  });
});

describe('traceOf and hermiticityResidual', () => {
  it('trace is the real sum of the diagonal', () => {
    expect(traceOf(twoByTwo([[0.25, 0.5], [1, 2], [3, 4], [0.5, -7]]))).toBe(0.75);
  });

  it('hermiticity residual is max |ρ_ij − conj(ρ_ji)|', () => {
    // ρ01 = 1 + 2i, ρ10 = 1 − 2i would be Hermitian; ρ10 = 1 + 2i differs by |4i| = 4
    expect(hermiticityResidual(twoByTwo([[0.5, 0], [1, 2], [1, -2], [0.5, 0]]))).toBe(0);
    expect(hermiticityResidual(twoByTwo([[0.5, 0], [1, 2], [1, 2], [0.5, 0]]))).toBe(4);
    // an imaginary diagonal entry is also non-Hermitian: |i·0.1 − (−i·0.1)| = 0.2
    expect(hermiticityResidual(twoByTwo([[0.5, 0.1], [0, 0], [0, 0], [0.5, 0]]))).toBeCloseTo(0.2, 15);
  });
});

describe('minEigenvalue (real symmetric embedding)', () => {
  // Closed form for a 2×2 Hermitian matrix [[a, z], [z̄, c]]: eigenvalues (a+c)/2 ± sqrt(((a−c)/2)² + |z|²) (common practice).
  it('matches the 2×2 closed form with a complex off-diagonal entry', () => {
    // [[1, 2−i], [2+i, 1]]: 1 ± √5
    expect(minEigenvalue(twoByTwo([[1, 0], [2, -1], [2, 1], [1, 0]]))).toBeCloseTo(1 - Math.sqrt(5), 12);
    // σ_y = [[0, −i], [i, 0]]: ±1; a real-only embedding that dropped B would give 0
    expect(Math.abs(minEigenvalue(twoByTwo([[0, 0], [0, -1], [0, 1], [0, 0]])) + 1)).toBeLessThan(EIGEN_TOLERANCE);
  });

  it('is 0 for a pure state of 3 qubits (rank one; Nielsen & Chuang §2.4.1, from memory)', () => {
    const rho = stateToDensityMatrix(randomState(mulberry32(2), 3));
    expect(Math.abs(minEigenvalue(rho))).toBeLessThan(EIGEN_TOLERANCE);
  });

  it('is 1/8 for the maximally mixed state of 3 qubits', () => {
    const rho = createDensityMatrix(3);
    rho.data[0] = 0;
    for (let i = 0; i < 8; i++) rho.data[2 * (i * 8 + i)] = 1 / 8;
    expect(Math.abs(minEigenvalue(rho) - 1 / 8)).toBeLessThan(EIGEN_TOLERANCE);
  });

  it('refuses registers above the limit', () => {
    expect(() => minEigenvalue({ n: MIN_EIGENVALUE_MAX_QUBITS + 1, dim: 0, data: new Float64Array(0) })).toThrow(RangeError);
  });
});

describe('register size checks', () => {
  it('rejects negative, fractional and oversized qubit counts', () => {
    expect(() => createDensityMatrix(-1)).toThrow(RangeError);
    expect(() => createDensityMatrix(1.5)).toThrow(RangeError);
    expect(() => createDensityMatrix(MAX_REGISTER_QUBITS + 1)).toThrow(RangeError);
  });
});
