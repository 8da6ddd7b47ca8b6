/**
 * Composition of channels one after another: sequence([E1, E2, …, En]) = En ∘ ⋯ ∘ E2 ∘ E1
 * (E1 acts first), on the superoperators S = S_n ⋯ S_2 S_1 (column-stacking vec,
 * ./conventions.ts), which works for any linear maps, CP or not.
 */
import { mul } from '../linalg/cmatrix.js';
import { Channel } from './channel.js';

/** En ∘ ⋯ ∘ E1 for channels listed in the order they act; all must act on the same number of qubits. */
export function sequence(channels: readonly Channel[]): Channel {
  if (channels.length === 0) throw new RangeError('sequence: no channels');
  const k = channels[0]!.qubits;
  let s = channels[0]!.superoperator();
  for (let i = 1; i < channels.length; i++) {
    const c = channels[i]!;
    if (c.qubits !== k) throw new RangeError(`sequence: channel ${i + 1} acts on ${c.qubits} qubits, the first on ${k}`);
    s = mul(c.superoperator(), s);
  }
  return channels.length === 1 ? channels[0]! : Channel.fromSuperoperator(s);
}
