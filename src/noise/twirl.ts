/**
 * Pauli twirling of the noise after one gate application. With the noise N acting after the
 * gate G (docs/format.md, "What one gate application does"), running P_b before a Clifford G
 * and P_a = G P_b G† after it leaves G unchanged and conjugates N by the Pauli P_a; averaged
 * over all 4^k Paulis this is the twirl T(N)(ρ) = 4^{−k} Σ_P P N(P ρ P) P, a Pauli channel
 * whose Pauli transfer matrix is the diagonal of N's (J. J. Wallman, J. Emerson, Phys. Rev. A
 * 94, 052325 (2016)). Its Pauli probabilities follow from that diagonal λ_Q = R_QQ by
 * p_P = 4^{−k} Σ_Q s(P, Q)·λ_Q, s = +1 when P and Q commute and −1 when they anticommute
 * (derived: a Pauli channel has λ_Q = Σ_P s(P, Q)·p_P, and Σ_Q s(P, Q) s(P′, Q) = 4^k δ_PP′).
 */
import { superoperatorToPtm } from '../channels/ptm.js';
import { identity, kron, mul, scale, type CMatrix } from '../linalg/cmatrix.js';
import { krausToSuperoperator } from '../linalg/superoperator.js';
import { pauliLabels, pauliMatrix } from './channels.js';
import type { PlacedChannel } from './gateNoise.js';

/** How the noise of one gate application is framed: replaced by its exact twirl, or conjugated by one Pauli string (an instance). */
export type PauliFrame = { readonly kind: 'twirl' } | { readonly kind: 'pauli'; readonly label: string };

/** Pauli probabilities below this are dropped from the twirled channel's Kraus set (rounding of the PTM). */
export const TWIRL_PROBABILITY_FLOOR = 1e-15;

/** Whether two Pauli strings of one length commute (an even number of positions where both differ from I and from each other). */
export function paulisCommute(p: string, q: string): boolean {
  let anti = 0;
  for (let i = 0; i < p.length; i++) if (p[i] !== 'I' && q[i] !== 'I' && p[i] !== q[i]) anti++;
  return anti % 2 === 0;
}

/** The Pauli probabilities (in pauliLabels(k) order) of the twirl of the channel sequence on k qubits. */
export function twirlProbabilities(channels: readonly PlacedChannel[], k: number): Float64Array {
  const d = 1 << k;
  let s: CMatrix = identity(d * d);
  for (const c of channels) s = mul(krausToSuperoperator(c.kraus.map((K) => embed(K, c.targets, k))), s);
  const r = superoperatorToPtm(s);
  const labels = pauliLabels(k);
  const D = labels.length;
  const lambda = labels.map((_, q) => r.data[2 * (q * D + q)]!);
  return Float64Array.from(labels, (p) => labels.reduce((acc, q, j) => acc + (paulisCommute(p, q) ? 1 : -1) * lambda[j]!, 0) / D);
}

/** The noise after one application under a frame: the exact twirl as one Pauli channel, or P·N·P as [P, …N, P]. */
export function frameNoise(channels: readonly PlacedChannel[], k: number, frame: PauliFrame): PlacedChannel[] {
  const all = Array.from({ length: k }, (_, i) => i);
  if (frame.kind === 'pauli') {
    const p: PlacedChannel = { targets: all, kraus: [pauliMatrix(frame.label)], source: `twirl ${frame.label}` };
    return [p, ...channels, p];
  }
  if (channels.length === 0) return [];
  const probs = twirlProbabilities(channels, k);
  const kraus = pauliLabels(k).flatMap((label, i) => (probs[i]! > TWIRL_PROBABILITY_FLOOR ? [scale(pauliMatrix(label), Math.sqrt(probs[i]!))] : []));
  return [{ targets: all, kraus, source: 'pauli twirl' }];
}

/** A Kraus operator on `targets` (first = most significant) as a 2^k × 2^k matrix on qubits 0..k−1 (qubit 0 leftmost). */
function embed(K: CMatrix, targets: readonly number[], k: number): CMatrix {
  const t = targets.length;
  if (t === k && targets.every((q, i) => q === i)) return K;
  if (t === 1) {
    const q = targets[0]!;
    return kron(kron(identity(1 << q), K), identity(1 << (k - 1 - q)));
  }
  // general placement: ⟨out|E|in⟩ = ⟨out_T|K|in_T⟩ when the other bits agree
  const d = 1 << k;
  const data = new Float64Array(2 * d * d);
  const bitOf = (x: number, q: number): number => (x >> (k - 1 - q)) & 1;
  const sub = (x: number): number => targets.reduce((acc, q) => (acc << 1) | bitOf(x, q), 0);
  const mask = targets.reduce((acc, q) => acc | (1 << (k - 1 - q)), 0);
  for (let o = 0; o < d; o++) {
    for (let i = 0; i < d; i++) {
      if ((o & ~mask) !== (i & ~mask)) continue;
      const at = 2 * (sub(o) * K.cols + sub(i));
      data[2 * (o * d + i)] = K.data[at]!;
      data[2 * (o * d + i) + 1] = K.data[at + 1]!;
    }
  }
  return { rows: d, cols: d, data };
}
