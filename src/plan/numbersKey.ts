/**
 * Exact keys of lists of doubles, for the plan's memos (identical instructions and diagonal
 * batches recur in every layer of a circuit): two lists get the same key exactly when they hold
 * the same bits, so −0 and 0 (which compare equal) stay apart and a memoised result is the one
 * the computation would give.
 */
import { Buffer } from 'node:buffer';

/** The bytes of `values` as text, one character per byte (latin1 maps each byte to its own code point). */
export function numbersKey(values: Float64Array): string {
  return Buffer.from(values.buffer, values.byteOffset, values.byteLength).toString('latin1');
}
