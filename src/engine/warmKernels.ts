/**
 * JIT warm-up: runs every fast kernel a few hundred times on a tiny register so that V8 has
 * optimised them before the first large pass (a large unrolled kernel's first call would
 * otherwise run in the interpreter). Uses small fractional matrices on a register reset
 * before every call, so nothing can overflow or underflow; once per thread.
 */
import { CompiledPlanBuilder } from './compiledPlan.js';
import { executeCall } from './kernelCall.js';
import { applyReal1, applyReal1Tp } from './kernelReal1.js';
import { applyReal2 } from './kernelReal2.js';

/** Qubits of the warm-up register. */
export const WARM_QUBITS = 4;
/** Rounds of the warm-up (each round calls every kernel on several target sets). */
export const WARM_ROUNDS = 4;

let warmed = false;

/**
 * Fractional numbers in [−0.25, 0.25) from a fixed linear congruential sequence. Warm-up values
 * must not be small integers: V8 would then specialise the arithmetic on integers and throw
 * the optimised code away at the first real (fractional) matrix.
 */
function fractions(count: number, seed: number): Float64Array {
  const out = new Float64Array(count);
  let x = seed >>> 0;
  for (let i = 0; i < count; i++) {
    x = (Math.imul(x, 1664525) + 1013904223) >>> 0;
    out[i] = (x / 4294967296 - 0.5) * 0.5 + 1e-3;
  }
  return out;
}

/** Warms the kernels of this thread once (later calls return at once). */
export function warmKernels(): void {
  if (warmed) return;
  warmed = true;
  const n = WARM_QUBITS;
  const D = 1 << n;
  const data = new Float64Array(new SharedArrayBuffer(16 * D * D));
  const start = fractions(2 * D * D, 7);
  const b = new CompiledPlanBuilder(n);
  const real1 = b.addNumbers(fractions(16, 1));
  const real2 = b.addNumbers(fractions(256, 2));
  const general = b.addNumbers(fractions(2 * 256, 3));
  const tab = b.addNumbers(fractions(2 * 256, 4));
  for (let q = 0; q < n; q++) {
    b.addCall({ kernel: 'real1', qubits: [q], off: real1 });
    b.addCall({ kernel: 'real1tp', qubits: [q], off: real1 });
  }
  for (let q = 0; q + 1 < n; q++) {
    b.addCall({ kernel: 'real2', qubits: [q, q + 1], off: real2 });
    b.addCall({ kernel: 'real2', qubits: [q + 1, q], off: real2 });
  }
  b.addCall({ kernel: 'general', qubits: [0, 2], off: general });
  b.addCall({ kernel: 'diagonal', qubits: [0, 1], qubitsB: [], off: tab });
  b.addCall({ kernel: 'diagonal', qubits: [0, 3], qubitsB: [1, 2], off: tab, offB: tab });
  const plan = b.build();
  for (let round = 0; round < WARM_ROUNDS; round++) {
    for (const at of plan.starts) {
      data.set(start);
      executeCall(data, n, plan.words, at, plan.arena, 0, 1);
      executeCall(data, n, plan.words, at, plan.arena, round & 1, 2);
    }
  }
}

/**
 * Registers from this size on wait for optimised kernels before their first pass (smaller
 * ones run so briefly that the interpreter is fine).
 */
export const WARM_MIN_QUBITS = 8;
/** Longest wait (ms) for the optimising compiler in awaitOptimisedKernels. */
export const WARM_WAIT_MS = 1500;
/**
 * A 5-qubit pass of the 2-qubit kernel (36 block pairs) takes about 10 µs optimised and
 * 150–400 µs before (measured on the 2-vCPU bench machine); below this many microseconds the
 * optimised code is taken to be installed.
 */
export const OPTIMISED_REAL2_MICROS = 60;

let optimised = false;

/**
 * Blocks (sleeping, not spinning) until the large unrolled kernels run optimised code, or
 * WARM_WAIT_MS passed. V8 compiles them on a background thread after warmKernels (about
 * 0.15–0.3 s for the 2-qubit kernel); a first large pass started before that would run
 * unoptimised and trigger a second, on-stack compile. Returns whether they are optimised.
 */
export function awaitOptimisedKernels(): boolean {
  if (optimised) return true;
  warmKernels();
  const n = 5;
  const D = 1 << n;
  const data = new Float64Array(new SharedArrayBuffer(16 * D * D));
  const m = fractions(256, 11);
  const sleeper = new Int32Array(new SharedArrayBuffer(4));
  const deadline = performance.now() + WARM_WAIT_MS;
  for (;;) {
    data.fill(0.125);
    const t = performance.now();
    applyReal2(data, n, 1, 3, m, 0, 0, 1);
    const micros = (performance.now() - t) * 1000;
    applyReal1(data, n, 2, m, 0, 0, 1);
    applyReal1Tp(data, n, 3, m, 0, 0, 1);
    if (micros < OPTIMISED_REAL2_MICROS) {
      optimised = true;
      return true;
    }
    if (performance.now() > deadline) return false;
    Atomics.wait(sleeper, 0, 0, 4);
  }
}
