/**
 * The Stinespring isometry V = Σ_k K_k ⊗ |k⟩ ((d·r) × d, environment factor last, so
 * V[a·r + k][i] = K_k[a][i]; see ./conventions.ts) and its exchange with the Kraus form.
 * E(ρ) = Tr_env(V ρ V†), and V†V = Σ_k K_k†K_k.
 */
import { type CMatrix, zeros } from '../linalg/cmatrix.js';

/** V = Σ_k K_k ⊗ |k⟩ for the Kraus set (r = kraus.length environment levels, environment last). */
export function krausToStinespring(kraus: readonly CMatrix[]): CMatrix {
  if (kraus.length === 0) throw new RangeError('krausToStinespring: empty Kraus set');
  const d = kraus[0]!.rows;
  const r = kraus.length;
  const v = zeros(d * r, d);
  kraus.forEach((k, kk) => {
    if (k.rows !== d || k.cols !== d) throw new RangeError(`krausToStinespring: Kraus operator is ${k.rows}×${k.cols}, expected ${d}×${d}`);
    for (let a = 0; a < d; a++) {
      for (let i = 0; i < d; i++) {
        v.data[2 * ((a * r + kk) * d + i)] = k.data[2 * (a * d + i)]!;
        v.data[2 * ((a * r + kk) * d + i) + 1] = k.data[2 * (a * d + i) + 1]!;
      }
    }
  });
  return v;
}

/** The Kraus operators K_k[a][i] = V[a·r + k][i] of the isometry `v` ((d·r) × d, environment last). */
export function stinespringToKraus(v: CMatrix): CMatrix[] {
  const d = v.cols;
  if (d === 0 || v.rows % d !== 0 || v.rows === 0) throw new RangeError(`stinespringToKraus: ${v.rows}×${v.cols} is not (d·r) × d`);
  const r = v.rows / d;
  const out: CMatrix[] = [];
  for (let kk = 0; kk < r; kk++) {
    const k = zeros(d, d);
    for (let a = 0; a < d; a++) {
      for (let i = 0; i < d; i++) {
        k.data[2 * (a * d + i)] = v.data[2 * ((a * r + kk) * d + i)]!;
        k.data[2 * (a * d + i) + 1] = v.data[2 * ((a * r + kk) * d + i) + 1]!;
      }
    }
    out.push(k);
  }
  return out;
}
