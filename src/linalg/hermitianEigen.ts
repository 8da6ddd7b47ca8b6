/**
 * Eigen-decomposition of a complex Hermitian matrix with ml-matrix, which only solves real
 * symmetric problems, through the real symmetric embedding.
 *
 * For H = A + iB (A real symmetric, B real antisymmetric) the 2n × 2n real matrix
 *   M = [[A, −B], [B, A]]
 * is symmetric, and H z = λ z with z = x + iy holds iff M [x; y] = λ [x; y]. Multiplying z by
 * i gives the eigenvector iz = −y + ix of H for the same λ, whose embedding [−y; x] is
 * orthogonal to [x; y] in R^{2n}. So every eigenvalue of H appears TWICE in M, and the real
 * eigenspace of M for λ is the complex eigenspace of H for λ seen as a real space of twice the
 * dimension. ml-matrix returns 2n real orthonormal eigenvectors; read as complex vectors they
 * span each complex eigenspace twice over (Σ z z† = 2·P_λ on each eigenspace). We keep one
 * vector per pair by a complex Gram–Schmidt with pivoting: repeatedly accept the candidate
 * with the largest component orthogonal (in the complex inner product) to those accepted so
 * far, until n are accepted. Since Σ z z† = 2·I over all 2n candidates, after t acceptances
 * the squared residuals add up to 2(n − t), so the pivot's residual is at least √(2/(n + 1))
 * (a partner of an accepted vector has residual ≈ 0 and is never taken), and eigenvectors of different
 * eigenvalues are orthogonal already, so the process never mixes eigenspaces. Each
 * eigenvalue is then the Rayleigh quotient q†Hq of its accepted vector q.
 */
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import type { CMatrix } from './cmatrix.js';

/** Eigenvalues (descending) and orthonormal eigenvectors (column k belongs to values[k]) of a Hermitian matrix. */
export interface HermitianEigen {
  readonly values: Float64Array;
  /** n × n unitary whose columns are the eigenvectors. */
  readonly vectors: CMatrix;
}

/**
 * The real symmetric 2n × 2n embedding M = [[A, −B], [B, A]] of the Hermitian part
 * A + iB = (H + H†)/2 of the n × n complex matrix held interleaved in `data` (row-major, as
 * CMatrix and the density matrix of src/engine/layout.ts). Taking the Hermitian part keeps
 * rounding asymmetry out of the symmetric solver; M maps products to products and X† to Xᵀ.
 */
export function hermitianEmbedding(data: Float64Array, n: number): Matrix {
  const m = new Matrix(2 * n, 2 * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const a = 0.5 * (data[2 * (i * n + j)]! + data[2 * (j * n + i)]!);
      const b = 0.5 * (data[2 * (i * n + j) + 1]! - data[2 * (j * n + i) + 1]!);
      m.set(i, j, a);
      m.set(i, n + j, -b);
      m.set(n + i, j, b);
      m.set(n + i, n + j, a);
    }
  }
  return m;
}

/**
 * Eigen-decomposition of the Hermitian part (H + H†)/2 of the square matrix `h`
 * (ml-matrix on the real symmetric embedding; see the file comment for the pairing).
 */
export function hermitianEigen(h: CMatrix): HermitianEigen {
  const n = h.rows;
  if (h.cols !== n) throw new RangeError(`hermitianEigen: matrix is ${h.rows}×${h.cols}, expected square`);
  const m = hermitianEmbedding(h.data, n);
  // Hermitian part, as real part A (symmetric) and imaginary part B (antisymmetric), read back from M.
  const A = new Float64Array(n * n);
  const B = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      A[i * n + j] = m.get(i, j);
      B[i * n + j] = m.get(n + i, j);
    }
  }
  const eig = new EigenvalueDecomposition(m, { assumeSymmetric: true });
  const V = eig.eigenvectorMatrix;
  const n2 = 2 * n;
  // Candidates z_c = x + iy as interleaved complex vectors (residuals, updated in place).
  const cand = new Float64Array(2 * n * n2);
  for (let c = 0; c < n2; c++) {
    for (let r = 0; r < n; r++) {
      cand[2 * (c * n + r)] = V.get(r, c);
      cand[2 * (c * n + r) + 1] = V.get(n + r, c);
    }
  }
  const used = new Uint8Array(n2);
  // Squared residual norms, updated as ‖z − p q‖² = ‖z‖² − |p|² after each projection.
  const norm2 = new Float64Array(n2).fill(1);
  const q = new Float64Array(2 * n * n); // accepted vectors, vector t at q[2·t·n …]
  for (let t = 0; t < n; t++) {
    let best = -1;
    let bestNorm = -1;
    for (let c = 0; c < n2; c++) {
      if (!used[c] && norm2[c]! > bestNorm) {
        bestNorm = norm2[c]!;
        best = c;
      }
    }
    used[best] = 1;
    // recompute the pivot's norm exactly (the running update loses digits)
    let exact = 0;
    for (let r = 0; r < n; r++) exact += cand[2 * (best * n + r)]! ** 2 + cand[2 * (best * n + r) + 1]! ** 2;
    const inv = 1 / Math.sqrt(exact);
    for (let r = 0; r < n; r++) {
      q[2 * (t * n + r)] = cand[2 * (best * n + r)]! * inv;
      q[2 * (t * n + r) + 1] = cand[2 * (best * n + r) + 1]! * inv;
    }
    // Remove the new direction from every remaining candidate: z ← z − (q†z) q.
    for (let c = 0; c < n2; c++) {
      if (used[c]) continue;
      let pr = 0;
      let pi = 0;
      for (let r = 0; r < n; r++) {
        const qr = q[2 * (t * n + r)]!;
        const qi = q[2 * (t * n + r) + 1]!;
        const zr = cand[2 * (c * n + r)]!;
        const zi = cand[2 * (c * n + r) + 1]!;
        pr += qr * zr + qi * zi;
        pi += qr * zi - qi * zr;
      }
      for (let r = 0; r < n; r++) {
        const qr = q[2 * (t * n + r)]!;
        const qi = q[2 * (t * n + r) + 1]!;
        cand[2 * (c * n + r)] -= pr * qr - pi * qi;
        cand[2 * (c * n + r) + 1] -= pr * qi + pi * qr;
      }
      norm2[c] = norm2[c]! - (pr * pr + pi * pi);
    }
  }
  // Rayleigh quotients λ_t = q_t† H q_t = Σ_ij conj(q_i) (A + iB)_ij q_j (real part).
  const lambda = new Float64Array(n);
  for (let t = 0; t < n; t++) {
    let s = 0;
    for (let i = 0; i < n; i++) {
      const xr = q[2 * (t * n + i)]!;
      const xi = q[2 * (t * n + i) + 1]!;
      let hr = 0;
      let hi = 0;
      for (let j = 0; j < n; j++) {
        const a = A[i * n + j]!;
        const b = B[i * n + j]!;
        const yr = q[2 * (t * n + j)]!;
        const yi = q[2 * (t * n + j) + 1]!;
        hr += a * yr - b * yi;
        hi += a * yi + b * yr;
      }
      s += xr * hr + xi * hi;
    }
    lambda[t] = s;
  }
  const order = Array.from({ length: n }, (_, t) => t).sort((a, b) => lambda[b]! - lambda[a]!);
  const values = new Float64Array(n);
  const vectors = new Float64Array(2 * n * n);
  order.forEach((t, k) => {
    values[k] = lambda[t]!;
    for (let r = 0; r < n; r++) {
      vectors[2 * (r * n + k)] = q[2 * (t * n + r)]!;
      vectors[2 * (r * n + k) + 1] = q[2 * (t * n + r) + 1]!;
    }
  });
  return { values, vectors: { rows: n, cols: n, data: vectors } };
}

/** Eigenvalues (descending) of the Hermitian part of `h`. */
export function hermitianEigenvalues(h: CMatrix): Float64Array {
  return hermitianEigen(h).values;
}
