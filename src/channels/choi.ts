/**
 * The Choi matrix J(E) = Σ_ij |i⟩⟨j| ⊗ E(|i⟩⟨j|) (input factor first, unnormalised; see
 * ./conventions.ts) and its exchanges with the Kraus form and the superoperator, plus the two
 * partial traces the physicality checks use.
 */
import { type CMatrix, zeros } from '../linalg/cmatrix.js';

/** J = Σ_k vec(K_k) vec(K_k)† (column-stacked vec), the Choi matrix of ρ → Σ_k K_k ρ K_k†. */
export function krausToChoi(kraus: readonly CMatrix[]): CMatrix {
  if (kraus.length === 0) throw new RangeError('krausToChoi: empty Kraus set');
  const d = kraus[0]!.rows;
  const D = d * d;
  const j = zeros(D, D);
  const J = j.data;
  const v = new Float64Array(2 * D);
  for (const k of kraus) {
    if (k.rows !== d || k.cols !== d) throw new RangeError(`krausToChoi: Kraus operator is ${k.rows}×${k.cols}, expected ${d}×${d}`);
    // v = vec(K): v[a + i·d] = K[a][i]
    for (let a = 0; a < d; a++) {
      for (let i = 0; i < d; i++) {
        v[2 * (a + i * d)] = k.data[2 * (a * d + i)]!;
        v[2 * (a + i * d) + 1] = k.data[2 * (a * d + i) + 1]!;
      }
    }
    for (let r = 0; r < D; r++) {
      const xr = v[2 * r]!;
      const xi = v[2 * r + 1]!;
      if (xr === 0 && xi === 0) continue;
      for (let c = 0; c < D; c++) {
        const yr = v[2 * c]!;
        const yi = -v[2 * c + 1]!;
        J[2 * (r * D + c)] += xr * yr - xi * yi;
        J[2 * (r * D + c) + 1] += xr * yi + xi * yr;
      }
    }
  }
  return j;
}

/**
 * The reshuffle between Choi matrix and superoperator, S[a + b·d][i + j·d] = J[i·d + a][j·d + b].
 * It is its own inverse up to relabelling, so one loop serves both directions.
 */
function reshuffle(m: CMatrix, toSuperoperator: boolean, what: string): CMatrix {
  const D = m.rows;
  const d = Math.round(Math.sqrt(D));
  if (m.cols !== D || d * d !== D) throw new RangeError(`${what}: matrix is ${m.rows}×${m.cols}, expected d²×d²`);
  const out = zeros(D, D);
  for (let i = 0; i < d; i++) {
    for (let j = 0; j < d; j++) {
      for (let a = 0; a < d; a++) {
        for (let b = 0; b < d; b++) {
          const jIdx = 2 * ((i * d + a) * D + (j * d + b));
          const sIdx = 2 * ((a + b * d) * D + (i + j * d));
          const src = toSuperoperator ? jIdx : sIdx;
          const dst = toSuperoperator ? sIdx : jIdx;
          out.data[dst] = m.data[src]!;
          out.data[dst + 1] = m.data[src + 1]!;
        }
      }
    }
  }
  return out;
}

/** The superoperator (column-stacking vec) of the map whose Choi matrix is `j`. */
export function choiToSuperoperator(j: CMatrix): CMatrix {
  return reshuffle(j, true, 'choiToSuperoperator');
}

/** The Choi matrix (input first, unnormalised) of the map whose superoperator is `s`. */
export function superoperatorToChoi(s: CMatrix): CMatrix {
  return reshuffle(s, false, 'superoperatorToChoi');
}

/** Tr_out J: (Tr_out J)[i][j] = Σ_a J[i·d + a][j·d + a] = Tr E(|i⟩⟨j|); equals (Σ_k K_k†K_k)ᵀ, and I iff E is trace preserving. */
export function traceOutput(j: CMatrix): CMatrix {
  const D = j.rows;
  const d = Math.round(Math.sqrt(D));
  const out = zeros(d, d);
  for (let i = 0; i < d; i++) {
    for (let c = 0; c < d; c++) {
      let re = 0;
      let im = 0;
      for (let a = 0; a < d; a++) {
        const idx = 2 * ((i * d + a) * D + (c * d + a));
        re += j.data[idx]!;
        im += j.data[idx + 1]!;
      }
      out.data[2 * (i * d + c)] = re;
      out.data[2 * (i * d + c) + 1] = im;
    }
  }
  return out;
}

/** Tr_in J: (Tr_in J)[a][b] = Σ_i J[i·d + a][i·d + b], which is E(I); I iff E is unital. */
export function traceInput(j: CMatrix): CMatrix {
  const D = j.rows;
  const d = Math.round(Math.sqrt(D));
  const out = zeros(d, d);
  for (let a = 0; a < d; a++) {
    for (let b = 0; b < d; b++) {
      let re = 0;
      let im = 0;
      for (let i = 0; i < d; i++) {
        const idx = 2 * ((i * d + a) * D + (i * d + b));
        re += j.data[idx]!;
        im += j.data[idx + 1]!;
      }
      out.data[2 * (a * d + b)] = re;
      out.data[2 * (a * d + b) + 1] = im;
    }
  }
  return out;
}

/** The d × d operator whose column-stacked vec is the length-d² vector `v` (entry [a][i] = v[a + i·d]). */
export function unvec(v: Float64Array, d: number, scale = 1): CMatrix {
  const m = zeros(d, d);
  for (let a = 0; a < d; a++) {
    for (let i = 0; i < d; i++) {
      m.data[2 * (a * d + i)] = scale * v[2 * (a + i * d)]!;
      m.data[2 * (a * d + i) + 1] = scale * v[2 * (a + i * d) + 1]!;
    }
  }
  return m;
}

/** vec(m), column-stacked: entry a + i·d holds m[a][i] (interleaved complex, length 2·d²). */
export function vec(m: CMatrix): Float64Array {
  const d = m.rows;
  const c = m.cols;
  const v = new Float64Array(2 * d * c);
  for (let a = 0; a < d; a++) {
    for (let i = 0; i < c; i++) {
      v[2 * (a + i * d)] = m.data[2 * (a * c + i)]!;
      v[2 * (a + i * d) + 1] = m.data[2 * (a * c + i) + 1]!;
    }
  }
  return v;
}
