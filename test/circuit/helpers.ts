/** Test helpers for test/circuit: a seeded PRNG and CMatrix ↔ mathjs conversions. */
import { type CMatrix, fromRows } from '../../src/linalg/cmatrix.js';
export { toMath, fromMath } from '../helpers/mathjs.js';
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

