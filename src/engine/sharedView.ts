/**
 * Typed arrays over shared memory as they travel to a worker thread. A typed array posted
 * with postMessage is serialised with a 32-bit byte length, so a view over 4 GiB or more
 * (ρ of 14 qubits is exactly 2³² bytes) arrives with its length taken modulo 2³² (0 at 14
 * qubits): the worker would then silently skip its rows. The SharedArrayBuffer itself
 * arrives whole, so fray posts the buffer with the view's offset and length and rebuilds the
 * view on the other side, checking that it has the length it should.
 */

/** A Float64Array or Int32Array over a SharedArrayBuffer, described by plain numbers. */
export interface SharedViewMessage {
  readonly buffer: SharedArrayBuffer;
  readonly byteOffset: number;
  /** Number of elements of the view. */
  readonly length: number;
}

/** Thrown when a view does not have the number of elements it should (a hand-off lost part of it). */
export class ViewLengthError extends Error {
  constructor(what: string, actual: number, expected: number) {
    super(`${what} has ${actual} elements, expected ${expected}`);
    this.name = 'ViewLengthError';
  }
}

/** Throws ViewLengthError unless `view` has exactly `expected` elements. */
export function checkViewLength(view: { readonly length: number }, expected: number, what: string): void {
  if (view.length !== expected) throw new ViewLengthError(what, view.length, expected);
}

/** The message form of a view over a SharedArrayBuffer (throws TypeError for other memory). */
export function shareView(view: Float64Array | Int32Array): SharedViewMessage {
  if (!(view.buffer instanceof SharedArrayBuffer)) throw new TypeError('shareView: the view is not backed by a SharedArrayBuffer');
  return { buffer: view.buffer, byteOffset: view.byteOffset, length: view.length };
}

/** The Float64Array a SharedViewMessage describes; throws ViewLengthError when it arrived shorter. */
export function openFloat64View(m: SharedViewMessage, what: string): Float64Array {
  const bytesLeft = Math.max(0, m.buffer.byteLength - m.byteOffset);
  const view = new Float64Array(m.buffer, m.byteOffset, Math.min(m.length, Math.floor(bytesLeft / 8)));
  checkViewLength(view, m.length, what);
  return view;
}

/** The Int32Array a SharedViewMessage describes; throws ViewLengthError when it arrived shorter. */
export function openInt32View(m: SharedViewMessage, what: string): Int32Array {
  const bytesLeft = Math.max(0, m.buffer.byteLength - m.byteOffset);
  const view = new Int32Array(m.buffer, m.byteOffset, Math.min(m.length, Math.floor(bytesLeft / 4)));
  checkViewLength(view, m.length, what);
  return view;
}
