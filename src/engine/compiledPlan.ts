/**
 * A plan ready for the kernels: every kernel call encoded as integers (./kernelCall.ts) and all
 * numbers (real-form matrices, superoperators, diagonal tables) in one arena. Both live in
 * SharedArrayBuffers so worker threads read them without copies.
 */
import { callWords, encodeCall, type KernelCall } from './kernelCall.js';

/** Encoded kernel calls of an n-qubit run plus their numeric arena (both shared memory). */
export interface CompiledPlan {
  readonly n: number;
  readonly words: Int32Array;
  /** starts[i] = index in `words` of call i. */
  readonly starts: readonly number[];
  readonly arena: Float64Array;
}

/** Collects arena numbers and calls, then packs them into shared memory. */
export class CompiledPlanBuilder {
  private readonly chunks: Float64Array[] = [];
  private readonly offsets = new Map<Float64Array, number>();
  private size = 0;
  private readonly calls: KernelCall[] = [];

  constructor(readonly n: number) {}

  /**
   * Appends numbers to the arena and returns their offset; the same array (by identity, e.g. a
   * memoised diagonal table shared by several calls) is stored once. Arrays must not change
   * between here and build().
   */
  addNumbers(values: Float64Array): number {
    const known = this.offsets.get(values);
    if (known !== undefined) return known;
    const off = this.size;
    this.chunks.push(values);
    this.offsets.set(values, off);
    this.size += values.length;
    return off;
  }

  /** Appends a kernel call (its offsets from addNumbers). */
  addCall(call: KernelCall): void {
    this.calls.push(call);
  }

  /** The packed plan in SharedArrayBuffers. */
  build(): CompiledPlan {
    const arena = new Float64Array(new SharedArrayBuffer(8 * Math.max(1, this.size)));
    let at = 0;
    for (const c of this.chunks) {
      arena.set(c, at);
      at += c.length;
    }
    const total = this.calls.reduce((s, c) => s + callWords(c), 0);
    const words = new Int32Array(new SharedArrayBuffer(4 * Math.max(1, total)));
    const starts: number[] = [];
    let w = 0;
    for (const c of this.calls) {
      starts.push(w);
      w = encodeCall(c, words, w);
    }
    return { n: this.n, words, starts, arena };
  }
}
