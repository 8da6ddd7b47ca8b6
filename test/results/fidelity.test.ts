import { describe, it, expect } from 'vitest';
import * as math from 'mathjs';
import {
  classicalFidelity,
  purity,
  stateFidelity,
  totalVariationDistance,
} from '../../src/results/fidelity.js';
import type { DensityMatrix } from '../../src/engine/layout.js';
import { ensembleToDensityMatrix } from '../../src/engine/run.js';
import { fromRows, kron, mul, adjoint, type CMatrix } from '../../src/linalg/cmatrix.js';
import {
  diagonalDensity,
  mulberry32,
  projector,
  randomDensity,
  randomState,
  re,
  toMath,
} from './helpers.js';

const TOL = 1e-9;

const mixed = (rho: DensityMatrix) => ({ kind: 'mixed' as const, rho });

describe('stateFidelity', () => {
  it('an ensemble of unnormalised branches gives the same F as its density matrix Σ|ψ_i⟩⟨ψ_i|', () => {
    // Same definition (Jozsa 1994) through two routes: the r × r matrix Ψ†ρΨ, and the eigen-
    // decomposition of the full σ. Branches may be non-orthogonal and even linearly dependent.
    const rand = mulberry32(17);
    for (let n = 1; n <= 3; n++) {
      for (const r of [2, 3, 5]) {
        const rho = randomDensity(n, rand, t(n, r));
        const weights = Array.from({ length: r }, () => rand() + 0.1);
        const total = weights.reduce((a, b) => a + b, 0);
        const states = weights.map((w) => {
          const psi = randomState(n, rand);
          for (let i = 0; i < psi.data.length; i++) psi.data[i]! *= Math.sqrt(w / total);
          return psi;
        });
        const fe = stateFidelity(rho, { kind: 'ensemble', states });
        const fm = stateFidelity(rho, mixed(ensembleToDensityMatrix(states)));
        expect(Math.abs(fe - fm)).toBeLessThan(TOL);
      }
    }
    function t(n: number, r: number): number {
      return r % 2 === 0 ? 1 << n : 1;
    }
  });

  it('pure and mixed paths agree when σ = |ψ⟩⟨ψ| (both are the Jozsa 1994 definition)', () => {
    const rand = mulberry32(11);
    for (let n = 1; n <= 3; n++) {
      for (let t = 0; t < 4; t++) {
        const rho = randomDensity(n, rand, t % 2 === 0 ? 1 << n : 2);
        const psi = randomState(n, rand);
        const fp = stateFidelity(rho, { kind: 'pure', state: psi });
        const fm = stateFidelity(rho, mixed(projector(psi)));
        expect(Math.abs(fp - fm)).toBeLessThan(TOL);
        expect(fp).toBeGreaterThan(0);
        expect(fp).toBeLessThan(1);
      }
    }
  });

  it('is symmetric, F(ρ, σ) = F(σ, ρ) (Jozsa 1994, property of the definition)', () => {
    const rand = mulberry32(12);
    for (let n = 1; n <= 3; n++) {
      for (let t = 0; t < 3; t++) {
        const rho = randomDensity(n, rand, t === 0 ? 1 : 1 << n);
        const sigma = randomDensity(n, rand, t === 2 ? 2 : 1 << n);
        const a = stateFidelity(rho, mixed(sigma));
        const b = stateFidelity(sigma, mixed(rho));
        expect(Math.abs(a - b)).toBeLessThan(TOL);
      }
    }
  });

  it('equals 1 for equal states and is below 1 for different ones (Jozsa 1994)', () => {
    const rand = mulberry32(13);
    for (let n = 1; n <= 3; n++) {
      const rho = randomDensity(n, rand);
      const low = randomDensity(n, rand, 2);
      expect(Math.abs(stateFidelity(rho, mixed(rho)) - 1)).toBeLessThan(TOL);
      expect(Math.abs(stateFidelity(low, mixed(low)) - 1)).toBeLessThan(TOL);
      const other = randomDensity(n, rand);
      expect(stateFidelity(rho, mixed(other))).toBeLessThan(1 - 1e-3);
      // A small step away from ρ already lowers F.
      const near: DensityMatrix = { n, dim: rho.dim, data: rho.data.map((x, k) => 0.99 * x + 0.01 * other.data[k]!) };
      const f = stateFidelity(near, mixed(rho));
      expect(f).toBeLessThan(1 - 1e-7);
      expect(f).toBeGreaterThan(0.99);
    }
  });

  it('for commuting states equals the classical fidelity of their eigenvalues (Nielsen & Chuang §9.2.2, from memory)', () => {
    const p = [0.1, 0.2, 0.3, 0.4];
    const q = [0.4, 0.05, 0.25, 0.3];
    const expected = classicalFidelity(Float64Array.from(p), Float64Array.from(q));
    expect(stateFidelity(diagonalDensity(p), mixed(diagonalDensity(q)))).toBeCloseTo(expected, 12);
    // Same eigenbasis rotated by H ⊗ H: still commuting, same fidelity (unitary invariance).
    const s = Math.SQRT1_2;
    const h = fromRows([
      [s, s],
      [s, -s],
    ]);
    const hh = kron(h, h);
    const rotate = (d: DensityMatrix): DensityMatrix => {
      const m: CMatrix = { rows: d.dim, cols: d.dim, data: d.data };
      return { n: d.n, dim: d.dim, data: mul(mul(hh, m), adjoint(hh)).data };
    };
    expect(stateFidelity(rotate(diagonalDensity(p)), mixed(rotate(diagonalDensity(q))))).toBeCloseTo(expected, 10);
    // A hand value: (√(0.1·0.4) + √(0.2·0.05) + √(0.3·0.25) + √(0.4·0.3))².
    const hand = (Math.sqrt(0.04) + Math.sqrt(0.01) + Math.sqrt(0.075) + Math.sqrt(0.12)) ** 2;
    expect(expected).toBeCloseTo(hand, 14);
  });

  it('for one qubit equals Tr(ρσ) + 2√(det ρ · det σ) (Jozsa 1994; Hübner, Phys. Lett. A 163, 239 (1992); from memory)', () => {
    const rand = mulberry32(14);
    for (let t = 0; t < 20; t++) {
      const rho = randomDensity(1, rand);
      const sigma = randomDensity(1, rand);
      const R = toMath(rho.data, 2);
      const S = toMath(sigma.data, 2);
      const tr = re(math.trace(math.multiply(R, S) as math.Matrix));
      const dr = re(math.det(R));
      const ds = re(math.det(S));
      const expected = tr + 2 * Math.sqrt(dr * ds);
      expect(Math.abs(stateFidelity(rho, mixed(sigma)) - expected)).toBeLessThan(TOL);
    }
  });

  it('matches a dense mathjs computation (Tr sqrtm(√σ ρ √σ))² on random two-qubit states', () => {
    const rand = mulberry32(15);
    for (let t = 0; t < 6; t++) {
      const rho = randomDensity(2, rand);
      const sigma = randomDensity(2, rand);
      const R = toMath(rho.data, 4);
      const S = toMath(sigma.data, 4);
      const rs = math.sqrtm(S);
      const inner = math.multiply(math.multiply(rs, R), rs) as math.Matrix;
      const trSqrt = re(math.trace(math.sqrtm(inner)));
      const expected = trSqrt * trSqrt;
      expect(Math.abs(stateFidelity(rho, mixed(sigma)) - expected)).toBeLessThan(TOL);
    }
  });

  it('GHZ_n under independent phase flips p: F = (1 + (1 − 2p)^n)/2 (derived: each Z flip scales the |0…0⟩⟨1…1| coherence by 1 − 2p)', () => {
    for (let n = 1; n <= 5; n++) {
      const d = 1 << n;
      const last = d - 1;
      const ghz = new Float64Array(2 * d);
      ghz[0] = Math.SQRT1_2;
      ghz[2 * last] = Math.SQRT1_2;
      const ideal = { n, dim: d, data: ghz };
      for (const p of [0, 0.01, 0.1, 0.25, 0.5]) {
        const c = (1 - 2 * p) ** n;
        const data = new Float64Array(2 * d * d);
        data[0] = 0.5;
        data[2 * (last * d + last)] = 0.5;
        data[2 * last] = 0.5 * c;
        data[2 * (last * d)] = 0.5 * c;
        const rho = { n, dim: d, data };
        const expected = (1 + c) / 2;
        expect(Math.abs(stateFidelity(rho, { kind: 'pure', state: ideal }) - expected)).toBeLessThan(TOL);
        expect(Math.abs(stateFidelity(rho, mixed(projector(ideal))) - expected)).toBeLessThan(TOL);
      }
    }
  });

  it('rejects an ideal σ that is not positive semidefinite, and mismatched sizes', () => {
    const rho = diagonalDensity([0.5, 0.5]);
    expect(() => stateFidelity(rho, mixed(diagonalDensity([1.5, -0.5])))).toThrow(RangeError);
    expect(() => stateFidelity(rho, mixed(diagonalDensity([0.25, 0.25, 0.25, 0.25])))).toThrow(RangeError);
  });
});

describe('classicalFidelity and totalVariationDistance (hand-checkable, common practice)', () => {
  const f = (a: number[], b: number[]) => classicalFidelity(Float64Array.from(a), Float64Array.from(b));
  const t = (a: number[], b: number[]) => totalVariationDistance(Float64Array.from(a), Float64Array.from(b));

  it('identical distributions: F = 1, tvd = 0', () => {
    expect(f([0.2, 0.3, 0.5, 0], [0.2, 0.3, 0.5, 0])).toBeCloseTo(1, 14);
    expect(t([0.2, 0.3, 0.5, 0], [0.2, 0.3, 0.5, 0])).toBe(0);
  });

  it('disjoint supports: F = 0, tvd = 1', () => {
    expect(f([1, 0], [0, 1])).toBe(0);
    expect(t([0.5, 0.5, 0, 0], [0, 0, 0.5, 0.5])).toBe(1);
  });

  it('hand values', () => {
    // (√(½·1))² = ½; ½(½ + ½) = ½.
    expect(f([0.5, 0.5], [1, 0])).toBeCloseTo(0.5, 14);
    expect(t([0.5, 0.5], [1, 0])).toBeCloseTo(0.5, 14);
    // (√0.09 + √0.09)² = 0.36; ½(0.8 + 0.8) = 0.8.
    expect(f([0.9, 0.1], [0.1, 0.9])).toBeCloseTo(0.36, 14);
    expect(t([0.9, 0.1], [0.1, 0.9])).toBeCloseTo(0.8, 14);
    // uniform vs (½, 0, ½, 0): (2·√⅛)² = ½; tvd = ½.
    expect(f([0.25, 0.25, 0.25, 0.25], [0.5, 0, 0.5, 0])).toBeCloseTo(0.5, 14);
    expect(t([0.25, 0.25, 0.25, 0.25], [0.5, 0, 0.5, 0])).toBeCloseTo(0.5, 14);
  });

  it('is symmetric and rejects different lengths', () => {
    expect(f([0.7, 0.2, 0.1], [0.1, 0.6, 0.3])).toBeCloseTo(f([0.1, 0.6, 0.3], [0.7, 0.2, 0.1]), 15);
    expect(() => f([1], [0.5, 0.5])).toThrow(RangeError);
    expect(() => t([1], [0.5, 0.5])).toThrow(RangeError);
  });
});

describe('purity', () => {
  it('is 1 for pure states and 1/D for the maximally mixed state (Nielsen & Chuang Exercise 2.71, from memory)', () => {
    const rand = mulberry32(16);
    for (let n = 1; n <= 3; n++) {
      expect(purity(projector(randomState(n, rand)))).toBeCloseTo(1, 12);
      const d = 1 << n;
      expect(purity(diagonalDensity(new Array(d).fill(1 / d)))).toBeCloseTo(1 / d, 14);
    }
  });

  it('equals Tr ρ² from a dense mathjs product on random states', () => {
    const rand = mulberry32(17);
    for (let n = 1; n <= 3; n++) {
      const rho = randomDensity(n, rand);
      const R = toMath(rho.data, rho.dim);
      const expected = re(math.trace(math.multiply(R, R) as math.Matrix));
      expect(Math.abs(purity(rho) - expected)).toBeLessThan(1e-12);
      expect(purity(rho)).toBeLessThan(1);
    }
  });
});
