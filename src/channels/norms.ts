/**
 * Matrix norms and functions of small complex matrices used by the channel checks and
 * metrics, all through src/channels/hermitianEigen.ts. Singular values come from the
 * Hermitian dilation [[0, A], [A†, 0]], whose eigenvalues are ±σ_i (plus zeros), which keeps
 * small singular values accurate (eigenvalues of A†A would square the rounding error).
 */
import { adjoint, type CMatrix, zeros } from '../linalg/cmatrix.js';
import { hermitianEigen } from '../linalg/hermitianEigen.js';

/**
 * Relative size of the anti-Hermitian part under which a matrix counts as Hermitian for the
 * choice of algorithm (Hermitian: eigenvalues; otherwise: the dilation).
 */
export const HERMITIAN_SHORTCUT_TOLERANCE = 1e-14;

/** Largest |m_ij − conj(m_ji)| (the entrywise max norm of m − m†). */
export function antiHermitianDeviation(m: CMatrix): number {
  const n = m.rows;
  let worst = 0;
  for (let i = 0; i < n; i++) {
    for (let j = i; j < n; j++) {
      const dr = m.data[2 * (i * n + j)]! - m.data[2 * (j * n + i)]!;
      const di = m.data[2 * (i * n + j) + 1]! + m.data[2 * (j * n + i) + 1]!;
      const d = Math.hypot(dr, di);
      if (d > worst) worst = d;
    }
  }
  return worst;
}

/** Largest |m_ij + conj(m_ji)| (the entrywise max norm of m + m†; zero for anti-Hermitian m). */
function hermitianDeviation(m: CMatrix): number {
  const n = m.rows;
  let worst = 0;
  for (let i = 0; i < n; i++) {
    for (let j = i; j < n; j++) {
      const dr = m.data[2 * (i * n + j)]! + m.data[2 * (j * n + i)]!;
      const di = m.data[2 * (i * n + j) + 1]! - m.data[2 * (j * n + i) + 1]!;
      worst = Math.max(worst, Math.hypot(dr, di));
    }
  }
  return worst;
}

/** Largest |m_ij| (the entrywise max norm). */
export function maxAbs(m: CMatrix): number {
  let worst = 0;
  for (let k = 0; k < m.data.length; k += 2) {
    const d = Math.hypot(m.data[k]!, m.data[k + 1]!);
    if (d > worst) worst = d;
  }
  return worst;
}

function isNumericallyHermitian(m: CMatrix): boolean {
  return m.rows === m.cols && antiHermitianDeviation(m) <= HERMITIAN_SHORTCUT_TOLERANCE * Math.max(1, maxAbs(m));
}

/** Singular values of any complex matrix, descending (via the Hermitian dilation; |eigenvalues| for Hermitian input). */
export function singularValues(m: CMatrix): Float64Array {
  const scaleM = maxAbs(m);
  if (scaleM === 0) return new Float64Array(Math.min(m.rows, m.cols));
  if (isNumericallyHermitian(m)) {
    return Float64Array.from(hermitianEigen(m).values, Math.abs).sort().reverse();
  }
  if (m.rows === m.cols && hermitianDeviation(m) <= HERMITIAN_SHORTCUT_TOLERANCE * Math.max(1, scaleM)) {
    // anti-Hermitian: i·m is Hermitian with the same singular values
    const im: CMatrix = { rows: m.rows, cols: m.cols, data: new Float64Array(m.data.length) };
    for (let k = 0; k < m.data.length; k += 2) {
      im.data[k] = -m.data[k + 1]!;
      im.data[k + 1] = m.data[k]!;
    }
    return Float64Array.from(hermitianEigen(im).values, Math.abs).sort().reverse();
  }
  const r = m.rows;
  const c = m.cols;
  const n = r + c;
  const dil = zeros(n, n);
  const a = m.data;
  const ad = adjoint(m).data;
  for (let i = 0; i < r; i++) {
    for (let j = 0; j < c; j++) {
      dil.data[2 * (i * n + r + j)] = a[2 * (i * c + j)]!;
      dil.data[2 * (i * n + r + j) + 1] = a[2 * (i * c + j) + 1]!;
    }
  }
  for (let i = 0; i < c; i++) {
    for (let j = 0; j < r; j++) {
      dil.data[2 * ((r + i) * n + j)] = ad[2 * (i * r + j)]!;
      dil.data[2 * ((r + i) * n + j) + 1] = ad[2 * (i * r + j) + 1]!;
    }
  }
  const ev = hermitianEigen(dil).values; // σ_1 … σ_min(r,c), zeros, −σ_min … −σ_1
  const k = Math.min(r, c);
  const out = new Float64Array(k);
  for (let i = 0; i < k; i++) out[i] = Math.max(0, ev[i]!);
  return out;
}

/** Trace norm ‖m‖₁ = Σ_i σ_i (sum of singular values). */
export function traceNorm(m: CMatrix): number {
  let s = 0;
  for (const x of singularValues(m)) s += x;
  return s;
}

/** Spectral (operator) norm ‖m‖_∞ = σ_max. */
export function spectralNorm(m: CMatrix): number {
  return singularValues(m)[0] ?? 0;
}

/** Frobenius norm ‖m‖_F = √(Σ |m_ij|²). */
export function frobeniusNorm(m: CMatrix): number {
  let s = 0;
  for (let k = 0; k < m.data.length; k++) s += m.data[k]! ** 2;
  return Math.sqrt(s);
}

/** f(H) = Σ_k f(λ_k) q_k q_k† for the Hermitian part H of `m` (a spectral function). */
export function hermitianFunction(m: CMatrix, f: (lambda: number) => number): CMatrix {
  const { values, vectors } = hermitianEigen(m);
  const n = m.rows;
  const out = zeros(n, n);
  const V = vectors.data;
  for (let k = 0; k < n; k++) {
    const w = f(values[k]!);
    if (w === 0) continue;
    for (let i = 0; i < n; i++) {
      const xr = V[2 * (i * n + k)]!;
      const xi = V[2 * (i * n + k) + 1]!;
      for (let j = 0; j < n; j++) {
        const yr = V[2 * (j * n + k)]!;
        const yi = -V[2 * (j * n + k) + 1]!;
        out.data[2 * (i * n + j)] += w * (xr * yr - xi * yi);
        out.data[2 * (i * n + j) + 1] += w * (xr * yi + xi * yr);
      }
    }
  }
  return out;
}
