/**
 * Test helpers for the results stage: a tiny seeded PRNG and random states, plus conversion
 * to mathjs matrices for the independent dense computations.
 */
import * as math from 'mathjs';
import { adjoint, mul, type CMatrix } from '../../src/linalg/cmatrix.js';
import type { DensityMatrix, StateVector } from '../../src/engine/layout.js';
export { mulberry32 } from '../helpers/random.js';


/** A random D × k complex matrix with entries uniform in [−1, 1]² . */
function randomComplex(rows: number, cols: number, rand: () => number): CMatrix {
  const data = new Float64Array(2 * rows * cols);
  for (let k = 0; k < data.length; k++) data[k] = 2 * rand() - 1;
  return { rows, cols, data };
}

/** A random n-qubit density matrix G G† / Tr(G G†) of the given rank (default full). */
export function randomDensity(n: number, rand: () => number, rank: number = 1 << n): DensityMatrix {
  const d = 1 << n;
  const g = randomComplex(d, rank, rand);
  const m = mul(g, adjoint(g));
  let tr = 0;
  for (let i = 0; i < d; i++) tr += m.data[2 * (i * d + i)]!;
  for (let k = 0; k < m.data.length; k++) m.data[k] /= tr;
  return { n, dim: d, data: m.data };
}

/** A random normalised n-qubit state vector. */
export function randomState(n: number, rand: () => number): StateVector {
  const d = 1 << n;
  const data = new Float64Array(2 * d);
  let norm = 0;
  for (let k = 0; k < data.length; k++) {
    data[k] = 2 * rand() - 1;
    norm += data[k]! * data[k]!;
  }
  const s = 1 / Math.sqrt(norm);
  for (let k = 0; k < data.length; k++) data[k] *= s;
  return { n, dim: d, data };
}

/** |ψ⟩⟨ψ| in the density-matrix layout. */
export function projector(psi: StateVector): DensityMatrix {
  const d = psi.dim;
  const data = new Float64Array(2 * d * d);
  const v = psi.data;
  for (let i = 0; i < d; i++) {
    for (let j = 0; j < d; j++) {
      // ψ_i conj(ψ_j)
      data[2 * (i * d + j)] = v[2 * i]! * v[2 * j]! + v[2 * i + 1]! * v[2 * j + 1]!;
      data[2 * (i * d + j) + 1] = v[2 * i + 1]! * v[2 * j]! - v[2 * i]! * v[2 * j + 1]!;
    }
  }
  return { n: psi.n, dim: d, data };
}

/** A state vector from [re, im] amplitudes (or reals). */
export function stateFrom(amps: ReadonlyArray<number | readonly [number, number]>): StateVector {
  const d = amps.length;
  const n = Math.round(Math.log2(d));
  const data = new Float64Array(2 * d);
  amps.forEach((a, i) => {
    if (typeof a === 'number') data[2 * i] = a;
    else {
      data[2 * i] = a[0];
      data[2 * i + 1] = a[1];
    }
  });
  return { n, dim: d, data };
}

/** Diagonal density matrix diag(p). */
export function diagonalDensity(p: readonly number[]): DensityMatrix {
  const d = p.length;
  const data = new Float64Array(2 * d * d);
  for (let i = 0; i < d; i++) data[2 * (i * d + i)] = p[i]!;
  return { n: Math.round(Math.log2(d)), dim: d, data };
}

/** The interleaved d × d matrix as a mathjs complex matrix. */
export function toMath(data: Float64Array, rows: number, cols: number = rows): math.Matrix {
  const out: math.Complex[][] = [];
  for (let i = 0; i < rows; i++) {
    const row: math.Complex[] = [];
    for (let j = 0; j < cols; j++) row.push(math.complex(data[2 * (i * cols + j)]!, data[2 * (i * cols + j) + 1]!));
    out.push(row);
  }
  return math.matrix(out);
}

/** Real part of a mathjs scalar result (number or Complex). */
export function re(x: unknown): number {
  if (typeof x === 'number') return x;
  return (x as math.Complex).re;
}
