import { describe, expect, it } from 'vitest';
import { conj, kron, type Matrix, multiply, ctranspose, transpose, add, matrix } from 'mathjs';
import { krausToSuperoperator, superoperatorOf } from '../../src/linalg/superoperator.js';
import { maxAbsDiff } from '../../src/linalg/cmatrix.js';
import { DENSE_AGREEMENT, maxDiffToMath, toMath } from '../engine/dense.js';
import { mulberry32, randomGaussianMatrix, randomKraus, randomUnitary } from '../engine/helpers.js';

/** Column-stacking vec of a mathjs matrix: vec(M)[i + j·rows] = M[i][j], as a column. */
function vec(m: Matrix): Matrix {
  const [rows, cols] = m.size() as [number, number];
  const out: unknown[][] = [];
  for (let j = 0; j < cols; j++) for (let i = 0; i < rows; i++) out.push([m.get([i, j])]);
  return matrix(out as never);
}

describe('column-stacking identity vec(AρB) = (Bᵀ ⊗ A) vec(ρ)', () => {
  // Source: Horn & Johnson, Topics in Matrix Analysis, Lemma 4.3.1 (from memory); checked here
  // numerically with mathjs for random complex A, B, ρ, including non-square shapes.
  const shapes: Array<[number, number, number, number]> = [
    [2, 2, 2, 2],
    [4, 4, 4, 4],
    [3, 2, 4, 5],
  ];
  it.each(shapes)('A %i×%i, ρ %i×%i', (ar, ac, rc, bc) => {
    const rng = mulberry32(ar * 1000 + ac * 100 + rc * 10 + bc);
    const a = toMath(randomGaussianMatrix(rng, ar, ac));
    const rho = toMath(randomGaussianMatrix(rng, ac, rc));
    const b = toMath(randomGaussianMatrix(rng, rc, bc));
    const left = vec(multiply(multiply(a, rho), b) as Matrix);
    const right = multiply(kron(transpose(b), a), vec(rho)) as Matrix;
    const [rows] = left.size() as [number];
    expect(maxDiffToMath(flatten(left), rows, 1, right)).toBeLessThan(DENSE_AGREEMENT);
  });
});

describe('krausToSuperoperator', () => {
  // Source: independent mathjs computation of Σ_k conj(K_k) ⊗ K_k and of vec(Σ K ρ K†).
  for (const d of [2, 4]) {
    it(`equals Σ conj(K) ⊗ K and maps vec(ρ) to vec(Σ K ρ K†) (d = ${d})`, () => {
      const rng = mulberry32(31 + d);
      const kraus = randomKraus(rng, d, 3);
      const s = krausToSuperoperator(kraus);
      let expected: Matrix | undefined;
      for (const k of kraus) {
        const term = kron(conj(toMath(k)), toMath(k)) as Matrix;
        expected = expected ? (add(expected, term) as Matrix) : term;
      }
      expect(maxDiffToMath(s.data, d * d, d * d, expected!)).toBeLessThan(DENSE_AGREEMENT);

      const rho = toMath(randomGaussianMatrix(rng, d, d));
      let mapped: Matrix | undefined;
      for (const k of kraus) {
        const km = toMath(k);
        const term = multiply(multiply(km, rho), ctranspose(km)) as Matrix;
        mapped = mapped ? (add(mapped, term) as Matrix) : term;
      }
      const sv = multiply(toMath(s), vec(rho)) as Matrix;
      expect(maxDiffToMath(flatten(sv), d * d, 1, vec(mapped!))).toBeLessThan(DENSE_AGREEMENT);
    });
  }

  it('superoperatorOf(U) is the one-operator Kraus superoperator', () => {
    const u = randomUnitary(mulberry32(5), 4);
    expect(maxAbsDiff(superoperatorOf(u), krausToSuperoperator([u]))).toBe(0);
  });

  it('rejects an empty or mismatched Kraus set', () => {
    const rng = mulberry32(6);
    expect(() => krausToSuperoperator([])).toThrow(RangeError);
    expect(() => krausToSuperoperator([randomUnitary(rng, 2), randomUnitary(rng, 4)])).toThrow(RangeError);
  });
});

/** Interleaved data of a mathjs column matrix. */
function flatten(m: Matrix): Float64Array {
  const [rows] = m.size() as [number];
  const out = new Float64Array(2 * rows);
  for (let i = 0; i < rows; i++) {
    const v = m.get([i, 0]) as { re: number; im: number } | number;
    out[2 * i] = typeof v === 'number' ? v : v.re;
    out[2 * i + 1] = typeof v === 'number' ? 0 : v.im;
  }
  return out;
}
