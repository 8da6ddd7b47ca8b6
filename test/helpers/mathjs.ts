/** Conversions between fray's CMatrix and mathjs matrices, for the independent dense references. */
import * as math from 'mathjs';
import { fromRows, type CMatrix } from '../../src/linalg/cmatrix.js';

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
