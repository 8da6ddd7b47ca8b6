/** Test helpers for test/circuit: a seeded PRNG and CMatrix ↔ mathjs conversions. */
import * as math from 'mathjs';
import { type CMatrix, fromRows } from '../../src/linalg/cmatrix.js';
import { mulberry32 } from '../helpers/random.js';
export { mulberry32 } from '../helpers/random.js';

/** Entrywise agreement demanded of exact constructions (double rounding only). */
export const TIGHT = 1e-12;


/** A random angle in [−2π, 2π). */
export function randomAngle(rng: () => number): number {
  return (rng() * 4 - 2) * Math.PI;
}

/** A d × d matrix with entries uniform in the square [−1, 1) + i[−1, 1) (not unitary). */
export function randomCMatrix(d: number, rng: () => number): CMatrix {
  const rows: [number, number][][] = [];
  for (let r = 0; r < d; r++) {
    const row: [number, number][] = [];
    for (let c = 0; c < d; c++) row.push([rng() * 2 - 1, rng() * 2 - 1]);
    rows.push(row);
  }
  return fromRows(rows);
}

/** A CMatrix as a mathjs matrix of complex numbers. */
export function toMath(m: CMatrix): math.Matrix {
  const rows: math.Complex[][] = [];
  for (let r = 0; r < m.rows; r++) {
    const row: math.Complex[] = [];
    for (let c = 0; c < m.cols; c++) row.push(math.complex(m.data[2 * (r * m.cols + c)]!, m.data[2 * (r * m.cols + c) + 1]!));
    rows.push(row);
  }
  return math.matrix(rows);
}

/** A mathjs matrix (real or complex entries) as a CMatrix. */
export function fromMath(m: math.Matrix): CMatrix {
  const arr = m.toArray() as unknown as (number | math.Complex)[][];
  return fromRows(arr.map((row) => row.map((v): [number, number] => (typeof v === 'number' ? [v, 0] : [v.re, v.im]))));
}
