import { describe, expect, it } from 'vitest';
import { applyReal1, applyReal1Tp } from '../../src/engine/kernelReal1.js';
import { isTracePreservingRealForm, realFormOf } from '../../src/engine/realForm.js';
import { krausToSuperoperator } from '../../src/linalg/superoperator.js';
import { referenceKernels } from '../../src/engine/kernels.js';
import { cloneDensityMatrix } from '../../src/engine/densityMatrix.js';
import { add, conj, kron, scale, type CMatrix } from '../../src/linalg/cmatrix.js';
import { mulberry32, randomDensityMatrix, randomGaussianMatrix, randomKraus } from './helpers.js';

describe('realFormOf', () => {
  it('identity map: M = I, so M\' = diag(2^−w(J)) (w = factors with j ∈ {2, 3})', () => {
    const id = krausToSuperoperator([{ rows: 2, cols: 2, data: new Float64Array([1, 0, 0, 0, 0, 0, 1, 0]) }]);
    expect(Array.from(realFormOf(id, 1)!)).toEqual([1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 0.5, 0, 0, 0, 0, 0.5]);
  });

  it('is real for every CPTP map (Hermiticity-preserving) on 1 and 2 qubits', () => {
    const rng = mulberry32(12);
    for (const k of [1, 2]) expect(realFormOf(krausToSuperoperator(randomKraus(rng, 1 << k, 3)), k)).toBeDefined();
  });

  it('is undefined for a map that is not Hermiticity-preserving (ρ → AρB† with A ≠ B)', () => {
    const rng = mulberry32(13);
    const a = randomGaussianMatrix(rng, 2, 2);
    const b = randomGaussianMatrix(rng, 2, 2);
    // superoperator of ρ → A ρ B† is conj(B) ⊗ A (column-stacking vec, src/linalg/superoperator.ts)
    const s: CMatrix = kron(conj(b), a);
    expect(realFormOf(s, 1)).toBeUndefined();
    // while the Hermitian-preserving sum AρB† + BρA† is accepted
    expect(realFormOf(add(s, kron(conj(a), b)), 1)).toBeDefined();
  });

  it('the 1-qubit kernel with M\' reproduces the superoperator on random (non-Hermitian) blocks', () => {
    const rng = mulberry32(14);
    const kraus = randomKraus(rng, 2, 2);
    const m = realFormOf(krausToSuperoperator(kraus), 1)!;
    const rho = randomDensityMatrix(rng, 3);
    // a non-Hermitian input: the real form needs no Hermiticity of the block (X = P + iQ)
    for (let i = 0; i < rho.data.length; i++) rho.data[i] += 0.1 * Math.sin(i);
    const ref = cloneDensityMatrix(rho);
    applyReal1(rho.data, 3, 1, m, 0, 0, 1);
    referenceKernels.applyKraus(ref, [1], kraus);
    let w = 0;
    for (let i = 0; i < rho.data.length; i++) w = Math.max(w, Math.abs(rho.data[i]! - ref.data[i]!));
    expect(w).toBeLessThan(1e-12);
  });
});

describe('trace-preserving variant of the 1-qubit kernel', () => {
  it('isTracePreservingRealForm holds for CPTP maps and fails for a trace-decreasing one', () => {
    const rng = mulberry32(15);
    const kraus = randomKraus(rng, 2, 3);
    expect(isTracePreservingRealForm(realFormOf(krausToSuperoperator(kraus), 1)!)).toBe(true);
    // Kraus operators scaled by √0.9: Σ K†K = 0.9·I, a trace-decreasing operation (N&C §8.2.4: Σ K†K ≤ I; from memory)
    const lossy = kraus.map((k) => scale(k, Math.sqrt(0.9)));
    expect(isTracePreservingRealForm(realFormOf(krausToSuperoperator(lossy), 1)!)).toBe(false);
  });

  it('applyReal1Tp equals applyReal1 (to rounding) on a CPTP map', () => {
    const rng = mulberry32(16);
    const m = realFormOf(krausToSuperoperator(randomKraus(rng, 2, 2)), 1)!;
    const a = randomDensityMatrix(rng, 4);
    const b = cloneDensityMatrix(a);
    for (let q = 0; q < 4; q++) {
      applyReal1(a.data, 4, q, m, 0, 0, 1);
      applyReal1Tp(b.data, 4, q, m, 0, 0, 1);
    }
    let w = 0;
    for (let i = 0; i < a.data.length; i++) w = Math.max(w, Math.abs(a.data[i]! - b.data[i]!));
    expect(w).toBeLessThan(1e-14);
  });
});
