/**
 * Test helpers for the engine: a seeded PRNG and random unitaries / CPTP channels / states.
 * The independent dense mathjs reference lives in ./dense.ts (kept apart so tests that do not
 * need it do not load mathjs).
 */
import type { CMatrix } from '../../src/linalg/cmatrix.js';
import type { DensityMatrix, StateVector } from '../../src/engine/layout.js';
import { gaussian } from '../helpers/random.js';
export { mulberry32, gaussian } from '../helpers/random.js';



/** Random integer in [0, m). */
export function randInt(rng: () => number, m: number): number {
  return Math.floor(rng() * m);
}

/** k distinct qubits of an n-qubit register in random order. */
export function randomTargets(rng: () => number, n: number, k: number): number[] {
  const all = Array.from({ length: n }, (_, i) => i);
  for (let i = n - 1; i > 0; i--) {
    const j = randInt(rng, i + 1);
    [all[i], all[j]] = [all[j]!, all[i]!];
  }
  return all.slice(0, k);
}

/** rows × cols matrix of independent complex Gaussian entries. */
export function randomGaussianMatrix(rng: () => number, rows: number, cols: number): CMatrix {
  const data = new Float64Array(2 * rows * cols);
  for (let i = 0; i < data.length; i++) data[i] = gaussian(rng);
  return { rows, cols, data };
}

/** Orthonormalises the columns of m (modified Gram–Schmidt), giving an isometry V with V†V = I. */
export function orthonormaliseColumns(m: CMatrix): CMatrix {
  const { rows, cols } = m;
  const x = Float64Array.from(m.data);
  for (let j = 0; j < cols; j++) {
    for (let i = 0; i < j; i++) {
      let pr = 0;
      let pi = 0;
      for (let r = 0; r < rows; r++) {
        const ar = x[2 * (r * cols + i)]!;
        const ai = x[2 * (r * cols + i) + 1]!;
        const br = x[2 * (r * cols + j)]!;
        const bi = x[2 * (r * cols + j) + 1]!;
        pr += ar * br + ai * bi;
        pi += ar * bi - ai * br;
      }
      for (let r = 0; r < rows; r++) {
        const ar = x[2 * (r * cols + i)]!;
        const ai = x[2 * (r * cols + i) + 1]!;
        x[2 * (r * cols + j)] -= pr * ar - pi * ai;
        x[2 * (r * cols + j) + 1] -= pr * ai + pi * ar;
      }
    }
    let norm = 0;
    for (let r = 0; r < rows; r++) norm += x[2 * (r * cols + j)]! ** 2 + x[2 * (r * cols + j) + 1]! ** 2;
    norm = Math.sqrt(norm);
    for (let r = 0; r < rows; r++) {
      x[2 * (r * cols + j)] /= norm;
      x[2 * (r * cols + j) + 1] /= norm;
    }
  }
  return { rows, cols, data: x };
}

/** Random d × d unitary: orthonormalised complex Gaussian matrix. */
export function randomUnitary(rng: () => number, d: number): CMatrix {
  return orthonormaliseColumns(randomGaussianMatrix(rng, d, d));
}

/** Random CPTP channel on d dimensions with r Kraus operators: the r d × d blocks of a random (d·r) × d isometry. */
export function randomKraus(rng: () => number, d: number, r: number): CMatrix[] {
  const v = orthonormaliseColumns(randomGaussianMatrix(rng, d * r, d));
  const out: CMatrix[] = [];
  for (let k = 0; k < r; k++) {
    out.push({ rows: d, cols: d, data: v.data.slice(2 * k * d * d, 2 * (k + 1) * d * d) });
  }
  return out;
}

/** Random normalised pure state of n qubits. */
export function randomState(rng: () => number, n: number): StateVector {
  const dim = 1 << n;
  const data = new Float64Array(2 * dim);
  let norm = 0;
  for (let i = 0; i < data.length; i++) {
    data[i] = gaussian(rng);
    norm += data[i]! ** 2;
  }
  for (let i = 0; i < data.length; i++) data[i] /= Math.sqrt(norm);
  return { n, dim, data };
}

/** Random full-rank density matrix G G† / Tr(G G†) of n qubits (G complex Gaussian). */
export function randomDensityMatrix(rng: () => number, n: number): DensityMatrix {
  const dim = 1 << n;
  const g = randomGaussianMatrix(rng, dim, dim);
  const data = new Float64Array(2 * dim * dim);
  let tr = 0;
  for (let r = 0; r < dim; r++) {
    for (let c = 0; c < dim; c++) {
      let sr = 0;
      let si = 0;
      for (let m = 0; m < dim; m++) {
        const ar = g.data[2 * (r * dim + m)]!;
        const ai = g.data[2 * (r * dim + m) + 1]!;
        const br = g.data[2 * (c * dim + m)]!;
        const bi = -g.data[2 * (c * dim + m) + 1]!;
        sr += ar * br - ai * bi;
        si += ar * bi + ai * br;
      }
      data[2 * (r * dim + c)] = sr;
      data[2 * (r * dim + c) + 1] = si;
      if (r === c) tr += sr;
    }
  }
  for (let i = 0; i < data.length; i++) data[i] /= tr;
  return { n, dim, data };
}

/** True when a and b hold the same doubles bit for bit (−0 ≠ +0; ρ views into larger buffers compare only their own bytes). */
export function sameBits(a: Float64Array, b: Float64Array): boolean {
  if (a.length !== b.length) return false;
  return Buffer.compare(Buffer.from(a.buffer, a.byteOffset, a.byteLength), Buffer.from(b.buffer, b.byteOffset, b.byteLength)) === 0;
}
