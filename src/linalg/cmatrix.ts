/**
 * Dense complex matrices for the small operators of fray (gates, Kraus operators,
 * superoperators): never the 2^n × 2^n register, which lives in src/engine.
 *
 * Layout (the one convention for every CMatrix): row-major, interleaved real and
 * imaginary parts, entry (r, c) at data[2 * (r * cols + c)] (real) and
 * data[2 * (r * cols + c) + 1] (imaginary).
 */

/** A dense complex matrix, row-major with interleaved (re, im) entries. */
export interface CMatrix {
  readonly rows: number;
  readonly cols: number;
  readonly data: Float64Array;
}

/** A complex scalar as a [re, im] pair (used at the edges, never per element in hot loops). */
export type Complex = readonly [number, number];

/** The rows × cols zero matrix. */
export function zeros(rows: number, cols: number = rows): CMatrix {
  return { rows, cols, data: new Float64Array(2 * rows * cols) };
}

/** The d × d identity. */
export function identity(d: number): CMatrix {
  const m = zeros(d, d);
  for (let i = 0; i < d; i++) m.data[2 * (i * d + i)] = 1;
  return m;
}

/** Builds a matrix from rows of entries, each a real number or a [re, im] pair. */
export function fromRows(rows: ReadonlyArray<ReadonlyArray<number | Complex>>): CMatrix {
  const r = rows.length;
  const c = r === 0 ? 0 : rows[0]!.length;
  const m = zeros(r, c);
  for (let i = 0; i < r; i++) {
    const row = rows[i]!;
    if (row.length !== c) throw new RangeError(`fromRows: row ${i} has ${row.length} entries, expected ${c}`);
    for (let j = 0; j < c; j++) {
      const v = row[j]!;
      const k = 2 * (i * c + j);
      if (typeof v === 'number') m.data[k] = v;
      else {
        m.data[k] = v[0];
        m.data[k + 1] = v[1];
      }
    }
  }
  return m;
}

/** Diagonal matrix from complex diagonal entries. */
export function diag(entries: ReadonlyArray<number | Complex>): CMatrix {
  const d = entries.length;
  const m = zeros(d, d);
  for (let i = 0; i < d; i++) {
    const v = entries[i]!;
    const k = 2 * (i * d + i);
    if (typeof v === 'number') m.data[k] = v;
    else {
      m.data[k] = v[0];
      m.data[k + 1] = v[1];
    }
  }
  return m;
}

/** Entry (r, c) as a [re, im] pair. */
export function entry(m: CMatrix, r: number, c: number): Complex {
  const k = 2 * (r * m.cols + c);
  return [m.data[k]!, m.data[k + 1]!];
}

/** Matrix product a · b. */
export function mul(a: CMatrix, b: CMatrix): CMatrix {
  if (a.cols !== b.rows) throw new RangeError(`mul: ${a.rows}×${a.cols} · ${b.rows}×${b.cols}`);
  const out = zeros(a.rows, b.cols);
  const A = a.data;
  const B = b.data;
  const O = out.data;
  const n = a.cols;
  const bc = b.cols;
  for (let i = 0; i < a.rows; i++) {
    for (let k = 0; k < n; k++) {
      const ar = A[2 * (i * n + k)]!;
      const ai = A[2 * (i * n + k) + 1]!;
      if (ar === 0 && ai === 0) continue;
      for (let j = 0; j < bc; j++) {
        const br = B[2 * (k * bc + j)]!;
        const bi = B[2 * (k * bc + j) + 1]!;
        O[2 * (i * bc + j)] += ar * br - ai * bi;
        O[2 * (i * bc + j) + 1] += ar * bi + ai * br;
      }
    }
  }
  return out;
}

/** Conjugate transpose m†. */
export function adjoint(m: CMatrix): CMatrix {
  const out = zeros(m.cols, m.rows);
  for (let i = 0; i < m.rows; i++) {
    for (let j = 0; j < m.cols; j++) {
      out.data[2 * (j * m.rows + i)] = m.data[2 * (i * m.cols + j)]!;
      out.data[2 * (j * m.rows + i) + 1] = -m.data[2 * (i * m.cols + j) + 1]!;
    }
  }
  return out;
}

/** Transpose mᵀ (no conjugation). */
export function transpose(m: CMatrix): CMatrix {
  const out = zeros(m.cols, m.rows);
  for (let i = 0; i < m.rows; i++) {
    for (let j = 0; j < m.cols; j++) {
      out.data[2 * (j * m.rows + i)] = m.data[2 * (i * m.cols + j)]!;
      out.data[2 * (j * m.rows + i) + 1] = m.data[2 * (i * m.cols + j) + 1]!;
    }
  }
  return out;
}

/** Entrywise complex conjugate m̄. */
export function conj(m: CMatrix): CMatrix {
  const out = zeros(m.rows, m.cols);
  for (let k = 0; k < m.data.length; k += 2) {
    out.data[k] = m.data[k]!;
    out.data[k + 1] = -m.data[k + 1]!;
  }
  return out;
}

/** Kronecker (tensor) product a ⊗ b; a is the leftmost (most significant) factor. */
export function kron(a: CMatrix, b: CMatrix): CMatrix {
  const rows = a.rows * b.rows;
  const cols = a.cols * b.cols;
  const out = zeros(rows, cols);
  for (let i = 0; i < a.rows; i++) {
    for (let j = 0; j < a.cols; j++) {
      const ar = a.data[2 * (i * a.cols + j)]!;
      const ai = a.data[2 * (i * a.cols + j) + 1]!;
      if (ar === 0 && ai === 0) continue;
      for (let k = 0; k < b.rows; k++) {
        for (let l = 0; l < b.cols; l++) {
          const br = b.data[2 * (k * b.cols + l)]!;
          const bi = b.data[2 * (k * b.cols + l) + 1]!;
          const r = i * b.rows + k;
          const c = j * b.cols + l;
          out.data[2 * (r * cols + c)] = ar * br - ai * bi;
          out.data[2 * (r * cols + c) + 1] = ar * bi + ai * br;
        }
      }
    }
  }
  return out;
}

/** a + b. */
export function add(a: CMatrix, b: CMatrix): CMatrix {
  if (a.rows !== b.rows || a.cols !== b.cols) throw new RangeError('add: shape mismatch');
  const out = zeros(a.rows, a.cols);
  for (let k = 0; k < a.data.length; k++) out.data[k] = a.data[k]! + b.data[k]!;
  return out;
}

/** a − b. */
export function sub(a: CMatrix, b: CMatrix): CMatrix {
  if (a.rows !== b.rows || a.cols !== b.cols) throw new RangeError('sub: shape mismatch');
  const out = zeros(a.rows, a.cols);
  for (let k = 0; k < a.data.length; k++) out.data[k] = a.data[k]! - b.data[k]!;
  return out;
}

/** (re + i·im) · m. */
export function scale(m: CMatrix, re: number, im = 0): CMatrix {
  const out = zeros(m.rows, m.cols);
  for (let k = 0; k < m.data.length; k += 2) {
    const xr = m.data[k]!;
    const xi = m.data[k + 1]!;
    out.data[k] = re * xr - im * xi;
    out.data[k + 1] = re * xi + im * xr;
  }
  return out;
}

/** Trace Σ_i m_ii as [re, im]. */
export function trace(m: CMatrix): Complex {
  let re = 0;
  let im = 0;
  const d = Math.min(m.rows, m.cols);
  for (let i = 0; i < d; i++) {
    re += m.data[2 * (i * m.cols + i)]!;
    im += m.data[2 * (i * m.cols + i) + 1]!;
  }
  return [re, im];
}

/** Largest absolute value |a_ij − b_ij| over all entries (the entrywise max norm of a − b). */
export function maxAbsDiff(a: CMatrix, b: CMatrix): number {
  if (a.rows !== b.rows || a.cols !== b.cols) return Infinity;
  let worst = 0;
  for (let k = 0; k < a.data.length; k += 2) {
    const d = Math.hypot(a.data[k]! - b.data[k]!, a.data[k + 1]! - b.data[k + 1]!);
    if (Number.isNaN(d)) return NaN; // a NaN entry is no small residual
    if (d > worst) worst = d;
  }
  return worst;
}

/** Unitarity residual: the largest absolute entry of U†U − I (the contract's "unitary to 1e-9" measure). */
export function unitarityResidual(u: CMatrix): number {
  if (u.rows !== u.cols) return Infinity;
  return maxAbsDiff(mul(adjoint(u), u), identity(u.rows));
}

/** Trace-preservation residual of a Kraus set: the largest absolute entry of Σ_k K_k†K_k − I. */
export function krausResidual(ops: readonly CMatrix[]): number {
  if (ops.length === 0) return Infinity;
  const d = ops[0]!.cols;
  let sum = zeros(d, d);
  for (const k of ops) sum = add(sum, mul(adjoint(k), k));
  return maxAbsDiff(sum, identity(d));
}

/** True when every off-diagonal entry is exactly zero. */
export function isDiagonal(m: CMatrix): boolean {
  for (let i = 0; i < m.rows; i++) {
    for (let j = 0; j < m.cols; j++) {
      if (i === j) continue;
      if (m.data[2 * (i * m.cols + j)] !== 0 || m.data[2 * (i * m.cols + j) + 1] !== 0) return false;
    }
  }
  return true;
}
