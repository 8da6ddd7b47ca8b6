/**
 * Superoperators on a subset of a group's qubits, lifted to the whole group. Convention:
 * column-stacking vec of src/linalg/superoperator.ts; local index a of a k-qubit group has the
 * group's first qubit as its most significant bit (src/engine/layout.ts).
 */
import type { CMatrix } from '../linalg/cmatrix.js';

/**
 * Bit maps between a k-qubit group index and the m-bit index of the qubits at `positions`
 * (positions[0] most significant): deposit[x] puts the bits of x at `positions` (zero
 * elsewhere), extract[g] reads them back out of a group index g; mask marks those bits.
 */
interface PositionMaps {
  readonly mask: number;
  readonly deposit: Int32Array;
  readonly extract: Int32Array;
}

function positionMaps(positions: readonly number[], k: number): PositionMaps {
  const m = positions.length;
  let mask = 0;
  for (const p of positions) mask |= 1 << (k - 1 - p);
  const deposit = new Int32Array(1 << m);
  for (let x = 0; x < 1 << m; x++) {
    let g = 0;
    for (let j = 0; j < m; j++) if ((x >> (m - 1 - j)) & 1) g |= 1 << (k - 1 - positions[j]!);
    deposit[x] = g;
  }
  const extract = new Int32Array(1 << k);
  for (let g = 0; g < 1 << k; g++) {
    let x = 0;
    for (let j = 0; j < m; j++) x = (x << 1) | ((g >> (k - 1 - positions[j]!)) & 1);
    extract[g] = x;
  }
  return { mask, deposit, extract };
}

/**
 * The superoperator on a k-qubit group that acts as `s` on the group positions `positions`
 * (positions[0] = the most significant factor of s) and as the identity on the others:
 * S_G[(a + b·d), (a' + b'·d)] = s[(a_s + b_s·d_s), (a'_s + b'_s·d_s)] when a, a' agree outside
 * `positions` and so do b, b'; zero otherwise.
 */
export function embedSuperoperator(s: CMatrix, positions: readonly number[], k: number): CMatrix {
  const m = positions.length;
  const ds = 1 << m;
  const ds2 = ds * ds;
  if (s.rows !== ds2 || s.cols !== ds2) throw new RangeError(`embedSuperoperator: superoperator is ${s.rows}×${s.cols}, expected ${ds2}×${ds2}`);
  const d = 1 << k;
  const d2 = d * d;
  let identityOrder = m === k;
  for (let j = 0; j < m; j++) {
    if (positions[j]! < 0 || positions[j]! >= k) throw new RangeError(`embedSuperoperator: position ${positions[j]} outside a ${k}-qubit group`);
    if (positions[j] !== j) identityOrder = false;
  }
  if (identityOrder) return s;
  const { mask, deposit, extract } = positionMaps(positions, k);
  const out = new Float64Array(2 * d2 * d2);
  const S = s.data;
  for (let a = 0; a < d; a++) {
    const as = extract[a]!;
    const aRest = a & ~mask;
    for (let b = 0; b < d; b++) {
      const bs = extract[b]!;
      const bRest = b & ~mask;
      const row = a + b * d;
      const srow = as + bs * ds;
      for (let a2 = 0; a2 < ds; a2++) {
        const ga = aRest | deposit[a2]!;
        for (let b2 = 0; b2 < ds; b2++) {
          const gb = bRest | deposit[b2]!;
          const col = ga + gb * d;
          const scol = a2 + b2 * ds;
          out[2 * (row * d2 + col)] = S[2 * (srow * ds2 + scol)]!;
          out[2 * (row * d2 + col) + 1] = S[2 * (srow * ds2 + scol) + 1]!;
        }
      }
    }
  }
  return { rows: d2, cols: d2, data: out };
}

/**
 * embedSuperoperator(s, positions, k) · g without forming the embedding: the map `s` on the
 * group positions applied after the k-qubit superoperator g (both column-stacking vec).
 */
export function composeEmbedded(s: CMatrix, positions: readonly number[], k: number, g: CMatrix): CMatrix {
  const m = positions.length;
  const ds = 1 << m;
  const ds2 = ds * ds;
  const d = 1 << k;
  const d2 = d * d;
  if (s.rows !== ds2 || s.cols !== ds2) throw new RangeError(`composeEmbedded: superoperator is ${s.rows}×${s.cols}, expected ${ds2}×${ds2}`);
  if (g.rows !== d2 || g.cols !== d2) throw new RangeError(`composeEmbedded: group superoperator is ${g.rows}×${g.cols}, expected ${d2}×${d2}`);
  const { mask, deposit, extract } = positionMaps(positions, k);
  const S = s.data;
  const G = g.data;
  const out = new Float64Array(2 * d2 * d2);
  for (let a = 0; a < d; a++) {
    const as = extract[a]!;
    const aRest = a & ~mask;
    for (let b = 0; b < d; b++) {
      const srow = as + extract[b]! * ds;
      const bRest = b & ~mask;
      const o = 2 * (a + b * d) * d2;
      for (let a2 = 0; a2 < ds; a2++) {
        for (let b2 = 0; b2 < ds; b2++) {
          const e = 2 * (srow * ds2 + a2 + b2 * ds);
          const cr = S[e]!;
          const ci = S[e + 1]!;
          if (cr === 0 && ci === 0) continue;
          const src = 2 * ((aRest | deposit[a2]!) + (bRest | deposit[b2]!) * d) * d2;
          for (let c = 0; c < 2 * d2; c += 2) {
            const gr = G[src + c]!;
            const gi = G[src + c + 1]!;
            out[o + c] = out[o + c]! + cr * gr - ci * gi;
            out[o + c + 1] = out[o + c + 1]! + cr * gi + ci * gr;
          }
        }
      }
    }
  }
  return { rows: d2, cols: d2, data: out };
}

/**
 * g · embedSuperoperator(s, positions, k) without forming the embedding: the map `s` on the
 * group positions applied before the k-qubit superoperator g (both column-stacking vec).
 */
export function composeEmbeddedBefore(g: CMatrix, s: CMatrix, positions: readonly number[], k: number): CMatrix {
  const m = positions.length;
  const ds = 1 << m;
  const ds2 = ds * ds;
  const d = 1 << k;
  const d2 = d * d;
  if (s.rows !== ds2 || s.cols !== ds2) throw new RangeError(`composeEmbeddedBefore: superoperator is ${s.rows}×${s.cols}, expected ${ds2}×${ds2}`);
  if (g.rows !== d2 || g.cols !== d2) throw new RangeError(`composeEmbeddedBefore: group superoperator is ${g.rows}×${g.cols}, expected ${d2}×${d2}`);
  const { mask, deposit, extract } = positionMaps(positions, k);
  const S = s.data;
  const G = g.data;
  const out = new Float64Array(2 * d2 * d2);
  // (g · E)[row, col] = Σ_x g[row, x] · E[x, col], E[x, col] = s[(x_s), (col_s)] when x, col agree outside `positions`
  for (let a = 0; a < d; a++) {
    const as = extract[a]!;
    const aRest = a & ~mask;
    for (let b = 0; b < d; b++) {
      const scol = as + extract[b]! * ds;
      const bRest = b & ~mask;
      const col = 2 * (a + b * d);
      for (let a2 = 0; a2 < ds; a2++) {
        for (let b2 = 0; b2 < ds; b2++) {
          const e = 2 * ((a2 + b2 * ds) * ds2 + scol);
          const cr = S[e]!;
          const ci = S[e + 1]!;
          if (cr === 0 && ci === 0) continue;
          const x = 2 * ((aRest | deposit[a2]!) + (bRest | deposit[b2]!) * d);
          for (let row = 0; row < d2; row++) {
            const gi = 2 * row * d2;
            const gr = G[gi + x]!;
            const gim = G[gi + x + 1]!;
            out[gi + col] = out[gi + col]! + gr * cr - gim * ci;
            out[gi + col + 1] = out[gi + col + 1]! + gr * ci + gim * cr;
          }
        }
      }
    }
  }
  return { rows: d2, cols: d2, data: out };
}
