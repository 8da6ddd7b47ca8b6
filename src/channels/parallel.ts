/**
 * Tensor product of channels side by side: parallel([E1, E2, …]) = E1 ⊗ E2 ⊗ ⋯, E1 on the
 * leftmost (most significant) qubits (src/engine/layout.ts). Built on the superoperators,
 * which works for any linear maps: with composite indices a = a1·d2 + a2 (first factor most
 * significant) the column-stacking superoperator of E1 ⊗ E2 is
 *   S[a + b·d][i + j·d] = S1[a1 + b1·d1][i1 + j1·d1] · S2[a2 + b2·d2][i2 + j2·d2],
 * since (E1 ⊗ E2)(|i⟩⟨j|) = E1(|i1⟩⟨j1|) ⊗ E2(|i2⟩⟨j2|).
 */
import { type CMatrix, zeros } from '../linalg/cmatrix.js';
import { Channel } from './channel.js';
import { MAX_CHANNEL_QUBITS } from './conventions.js';

function tensorSuperoperators(s1: CMatrix, d1: number, s2: CMatrix, d2: number): CMatrix {
  const d = d1 * d2;
  const D = d * d;
  const D1 = d1 * d1;
  const D2 = d2 * d2;
  const out = zeros(D, D);
  const A = s1.data;
  const B = s2.data;
  const O = out.data;
  for (let r1 = 0; r1 < D1; r1++) {
    const a1 = r1 % d1;
    const b1 = (r1 - a1) / d1;
    for (let c1 = 0; c1 < D1; c1++) {
      const ar = A[2 * (r1 * D1 + c1)]!;
      const ai = A[2 * (r1 * D1 + c1) + 1]!;
      if (ar === 0 && ai === 0) continue;
      const i1 = c1 % d1;
      const j1 = (c1 - i1) / d1;
      for (let r2 = 0; r2 < D2; r2++) {
        const a2 = r2 % d2;
        const b2 = (r2 - a2) / d2;
        const row = a1 * d2 + a2 + (b1 * d2 + b2) * d;
        for (let c2 = 0; c2 < D2; c2++) {
          const br = B[2 * (r2 * D2 + c2)]!;
          const bi = B[2 * (r2 * D2 + c2) + 1]!;
          const i2 = c2 % d2;
          const j2 = (c2 - i2) / d2;
          const col = i1 * d2 + i2 + (j1 * d2 + j2) * d;
          O[2 * (row * D + col)] = ar * br - ai * bi;
          O[2 * (row * D + col) + 1] = ar * bi + ai * br;
        }
      }
    }
  }
  return out;
}

/** E1 ⊗ E2 ⊗ ⋯ with E1 on the leftmost qubits; at most MAX_CHANNEL_QUBITS qubits in total. */
export function parallel(channels: readonly Channel[]): Channel {
  if (channels.length === 0) throw new RangeError('parallel: no channels');
  const total = channels.reduce((n, c) => n + c.qubits, 0);
  if (total > MAX_CHANNEL_QUBITS) throw new RangeError(`parallel: ${total} qubits in total, at most ${MAX_CHANNEL_QUBITS}`);
  if (channels.length === 1) return channels[0]!;
  let s = channels[0]!.superoperator();
  let d = channels[0]!.dim;
  for (let i = 1; i < channels.length; i++) {
    const c = channels[i]!;
    s = tensorSuperoperators(s, d, c.superoperator(), c.dim);
    d *= c.dim;
  }
  return Channel.fromSuperoperator(s);
}
