/**
 * One kernel call as plain integers, so the main thread and the worker threads execute the
 * same call from shared memory. Word layout of a call starting at `at`:
 *   [at]     kernel id (KERNEL_IDS)
 *   [at + 1] arena offset of the call's numbers (real-form matrix, superoperator or table A)
 *   [at + 2] arena offset of table B (diagonal kernel only, else 0)
 *   [at + 3] number of qubits kA (targets, or the qubits of table A)
 *   [at + 4] number of qubits kB of table B (diagonal kernel only, else 0)
 *   [at + 5 …] the kA + kB qubits (first listed = most significant local bit, ./layout.ts)
 */
import { applyDiagonal } from './kernelDiagonal.js';
import { applyGeneral } from './kernelGeneral.js';
import { applyReal1, applyReal1Tp } from './kernelReal1.js';
import { applyReal2, MIRROR_TILE } from './kernelReal2.js';
import { partStart, trianglePartStart } from './partition.js';
import { DIAGONAL_WASM_MAX_BIN, packQubitList, scratchAt, type WasmBinding } from './wasmKernels.js';
import { checkViewLength } from './sharedView.js';

/**
 * Numeric ids of the kernels: real-form 1-qubit, real-form mirrored 2-qubit, diagonal batch,
 * general k-qubit complex, and the real-form 1-qubit kernel for trace-preserving maps.
 */
export const KERNEL_IDS = { real1: 1, real2: 2, diagonal: 3, general: 4, real1tp: 5 } as const;

/** Name of a kernel of the fast engine. */
export type KernelName = keyof typeof KERNEL_IDS;

/** A kernel call before encoding: which kernel, its qubits, where its numbers are in the arena. */
export interface KernelCall {
  readonly kernel: KernelName;
  /** Targets (real1, real2, general) or the qubits of table A (diagonal). */
  readonly qubits: readonly number[];
  /** Qubits of table B (diagonal only; may be empty). */
  readonly qubitsB?: readonly number[];
  readonly off: number;
  readonly offB?: number;
}

/** Number of words of an encoded call. */
export function callWords(call: KernelCall): number {
  return 5 + call.qubits.length + (call.qubitsB?.length ?? 0);
}

/** Writes `call` into `words` at `at` (layout above); returns the index after it. */
export function encodeCall(call: KernelCall, words: Int32Array, at: number): number {
  const b = call.qubitsB ?? [];
  words[at] = KERNEL_IDS[call.kernel];
  words[at + 1] = call.off;
  words[at + 2] = call.offB ?? 0;
  words[at + 3] = call.qubits.length;
  words[at + 4] = b.length;
  let i = at + 5;
  for (const q of call.qubits) words[i++] = q;
  for (const q of b) words[i++] = q;
  return i;
}

/** Index in `words` of the call encoded right after the one at `at`. */
export function nextCallAt(words: Int32Array, at: number): number {
  return at + 5 + words[at + 3]! + words[at + 4]!;
}

/**
 * True when part p of `parts` of the call at `at` on n qubits reads and writes only the rows whose
 * top log₂(parts) bits are p (parts a power of two): a diagonal call (its rows split evenly), or a
 * real1 / real1tp call whose target is not among those top qubits (its rest rows split evenly, and
 * a rest row and its partner share those bits). A run of such calls needs no synchronisation
 * between them: each thread can go through the whole run on its rows. Every other call (real2
 * writes mirror blocks in other rows, general splits otherwise) stands alone.
 */
export function rowLocalCall(words: Int32Array, at: number, n: number, parts: number): boolean {
  const top = Math.log2(parts);
  if (!Number.isInteger(top) || top > n - 1) return false;
  const id = words[at]!;
  if (id === KERNEL_IDS.diagonal) return true;
  return (id === KERNEL_IDS.real1 || id === KERNEL_IDS.real1tp) && words[at + 5]! >= top;
}

/**
 * Executes the call encoded at words[at …] on the n-qubit ρ (`data`, 2·4^n numbers), for part
 * `part` of `parts` (./partition.ts). With `wasm` (this thread's instance over the WebAssembly
 * memory holding `data`, and `arena` loaded there too) the real-form and diagonal calls run the
 * WebAssembly kernels, the general ones the JS kernel; both families give the same bits. Throws ViewLengthError
 * when `data` is not the size of an n-qubit ρ, so a thread whose view lost its length
 * (./sharedView.ts) fails loudly instead of leaving its rows unwritten.
 */
export function executeCall(data: Float64Array, n: number, words: Int32Array, at: number, arena: Float64Array, part: number, parts: number, wasm?: WasmBinding): void {
  checkViewLength(data, 2 * 4 ** n, `the ${n}-qubit density matrix of part ${part}`);
  const id = words[at]!;
  const off = words[at + 1]!;
  const kA = words[at + 3]!;
  if (wasm !== undefined && (id === KERNEL_IDS.real1 || id === KERNEL_IDS.real1tp || id === KERNEL_IDS.real2)) {
    const mat = wasm.arenaAt + 8 * off;
    if (id === KERNEL_IDS.real2) {
      const tiles = Math.ceil((1 << n) / 4 / MIRROR_TILE);
      const t0 = trianglePartStart(tiles, part, parts);
      const t1 = trianglePartStart(tiles, part + 1, parts);
      wasm.kernels.real2(wasm.rhoAt, n, words[at + 5]!, words[at + 6]!, mat, scratchAt(part), MIRROR_TILE, t0, t1);
    } else {
      const rows = (1 << n) >> 1;
      const k = id === KERNEL_IDS.real1 ? wasm.kernels.real1 : wasm.kernels.real1tp;
      k(wasm.rhoAt, n, words[at + 5]!, mat, scratchAt(part), partStart(rows, part, parts), partStart(rows, part + 1, parts));
    }
    return;
  }
  if (wasm !== undefined && id === KERNEL_IDS.diagonal) {
    const kB = words[at + 4]!;
    if (kA <= DIAGONAL_WASM_MAX_BIN && kB <= DIAGONAL_WASM_MAX_BIN) {
      const D = 1 << n;
      const qa = packQubitList(words, at + 5, kA);
      const qb = packQubitList(words, at + 5 + kA, kB);
      const tabB = wasm.arenaAt + 8 * words[at + 2]!;
      wasm.kernels.diagonal(wasm.rhoAt, n, wasm.arenaAt + 8 * off, kA, qa, tabB, kB, qb, scratchAt(part), partStart(D, part, parts), partStart(D, part + 1, parts));
      return;
    }
  }
  switch (id) {
    case KERNEL_IDS.real1:
      applyReal1(data, n, words[at + 5]!, arena, off, part, parts);
      return;
    case KERNEL_IDS.real1tp:
      applyReal1Tp(data, n, words[at + 5]!, arena, off, part, parts);
      return;
    case KERNEL_IDS.real2:
      applyReal2(data, n, words[at + 5]!, words[at + 6]!, arena, off, part, parts);
      return;
    case KERNEL_IDS.diagonal: {
      const kB = words[at + 4]!;
      const a = words.subarray(at + 5, at + 5 + kA);
      const b = words.subarray(at + 5 + kA, at + 5 + kA + kB);
      applyDiagonal(data, n, a, b, arena, off, words[at + 2]!, part, parts);
      return;
    }
    case KERNEL_IDS.general:
      applyGeneral(data, n, words.subarray(at + 5, at + 5 + kA), arena, off, part, parts);
      return;
    default:
      throw new RangeError(`executeCall: unknown kernel id ${id}`);
  }
}

/** Part `part` of `parts` of the `count` consecutive calls from words[at] (executeCall, one after the other). */
export function runCalls(data: Float64Array, n: number, words: Int32Array, at: number, count: number, arena: Float64Array, part: number, parts: number, wasm?: WasmBinding): void {
  for (let i = 0, call = at; i < count; i++, call = nextCallAt(words, call)) executeCall(data, n, words, call, arena, part, parts, wasm);
}
