/**
 * Exact text keys of doubles, for the memos that let a run do its work once per distinct gate,
 * noise entry or diagonal batch instead of once per application (src/format/gateLibrary.ts,
 * src/program/program.ts, src/plan/): two values get the same key exactly when they hold the
 * same bits — −0 and 0, which compare equal, stay apart — so a memoised result is the one the
 * computation would give.
 */
import { Buffer } from 'node:buffer';

/** The bytes of `values` as text, one character per byte (latin1 maps each byte to its own code point). */
export function numbersKey(values: Float64Array): string {
  return Buffer.from(values.buffer, values.byteOffset, values.byteLength).toString('latin1');
}

/** A double as exact text: String(x) names every double exactly (NaN and the infinities too) but writes −0 as 0. */
export function exactNumberText(x: number): string {
  return Object.is(x, -0) ? '-0' : String(x);
}

/** The value of `key` in `memo`, computed by `compute` and kept the first time it is asked for. */
export function memoised<K, V>(memo: Map<K, V>, key: K, compute: () => V): V {
  let v = memo.get(key);
  if (v === undefined) {
    v = compute();
    memo.set(key, v);
  }
  return v;
}
