/**
 * Runs a compiled plan (./compiledPlan.ts) on an n-qubit register starting in |0…0⟩, in place,
 * on one density matrix in a SharedArrayBuffer (no second copy of ρ), splitting each pass
 * over the threads of a pool when the register is large enough to pay for the hand-offs.
 */
import type { CompiledPlan } from './compiledPlan.js';
import { executeCall, rowLocalCall } from './kernelCall.js';
import type { DensityMatrix } from './layout.js';
import { checkQubitCount } from './targets.js';
import type { ThreadPool } from './threadPool.js';
import { awaitOptimisedKernels, WARM_MIN_QUBITS } from './warmKernels.js';
import { createWasmRegister, kernelFamilyFor, WASM_MAX_PARTS, wasmKernelModule, wasmRegisterOf, type KernelFamily } from './wasmKernels.js';

/**
 * Smallest register on which passes are split over threads. Measured on the 2-vCPU bench
 * machine (2 threads vs 1, per pass): 0.36–0.65× at 5–6 qubits, 0.9× at 8 (a pass of
 * 0.1–0.6 ms is comparable to the hand-off), 1.3–1.9× from 9 qubits on.
 */
export const THREADS_MIN_QUBITS = 9;

/**
 * The n-qubit |0…0⟩⟨0…0| in the layout of ./layout.ts, backed by a SharedArrayBuffer so worker
 * threads can share it: inside a WebAssembly.Memory when `kernels` is 'wasm' and the WebAssembly
 * kernels can run n qubits (kernelFamilyFor), so the passes applied to it run them; else a plain
 * SharedArrayBuffer for the JS kernels.
 */
export function createSharedDensityMatrix(n: number, kernels: KernelFamily = 'wasm'): DensityMatrix {
  checkQubitCount(n, 'createSharedDensityMatrix');
  const dim = 1 << n;
  if (kernelFamilyFor(n, kernels) === 'wasm') return { n, dim, data: createWasmRegister(n, wasmKernelModule()!).data };
  const data = new Float64Array(new SharedArrayBuffer(16 * dim * dim));
  data[0] = 1;
  return { n, dim, data };
}

/** The kernel family whose real-form kernels run the passes applied to `rho` ('wasm' when it lives in WebAssembly memory). */
export function kernelFamilyOf(rho: DensityMatrix): KernelFamily {
  return wasmRegisterOf(rho.data) !== undefined ? 'wasm' : 'js';
}

/**
 * Applies every call of `plan` in order to `rho` (in place), split over `pool` when
 * n ≥ minThreadQubits (THREADS_MIN_QUBITS by default; tests lower it to split small registers).
 * The real-form calls run the WebAssembly kernels when `rho` lives in WebAssembly memory
 * (createSharedDensityMatrix), else the JS kernels, which wait for the JIT on large registers.
 * Worker threads that are still starting do not hold the run up: the main thread applies the
 * first calls alone and the workers join at the first call after they are ready (each element
 * gets the same operations however a pass is split, so the result is the same bit for bit).
 * Returns the most threads that shared a pass.
 */
export function applyCompiled(rho: DensityMatrix, plan: CompiledPlan, pool?: ThreadPool, minThreadQubits = THREADS_MIN_QUBITS): number {
  if (plan.n !== rho.n) throw new RangeError(`applyCompiled: plan for ${plan.n} qubits, register of ${rho.n}`);
  const n = rho.n;
  const wantThreads = pool !== undefined && n >= minThreadQubits && rho.data.buffer instanceof SharedArrayBuffer;
  // (a pool beyond WASM_MAX_PARTS parts, which the scratch area cannot serve, runs the JS kernels on the same memory)
  const reg = wantThreads && pool.splitThreads > WASM_MAX_PARTS ? undefined : wasmRegisterOf(rho.data);
  reg?.loadArena(plan.arena);
  const wasm = reg?.bind();
  if (reg === undefined && n >= WARM_MIN_QUBITS) awaitOptimisedKernels();
  const { starts, words } = plan;
  let i = 0;
  if (wantThreads) {
    // the main thread alone until the workers are ready
    while (i < starts.length && !pool.tryReady()) executeCall(rho.data, n, words, starts[i++]!, plan.arena, 0, 1, wasm);
    if (i < starts.length && pool.parts > 1) {
      pool.attach(rho.data, plan.arena, words, reg?.handle());
      try {
        // runs of row-local calls go to the threads at once (one hand-off instead of one per call)
        while (i < starts.length) {
          let j = i + 1;
          if (rowLocalCall(words, starts[i]!, n, pool.parts)) while (j < starts.length && rowLocalCall(words, starts[j]!, n, pool.parts)) j++;
          pool.run(n, starts[i]!, j - i);
          i = j;
        }
      } finally {
        pool.detach();
      }
      return pool.parts;
    }
  }
  for (; i < starts.length; i++) executeCall(rho.data, n, words, starts[i]!, plan.arena, 0, 1, wasm);
  return 1;
}

/**
 * Final density matrix of `plan` applied to |0…0⟩⟨0…0| (one shared-memory ρ); threads as in
 * applyCompiled; `kernels` 'js' keeps the real-form passes on the JS kernels.
 */
export function runCompiled(plan: CompiledPlan, pool?: ThreadPool, minThreadQubits = THREADS_MIN_QUBITS, kernels: KernelFamily = 'wasm'): DensityMatrix {
  const rho = createSharedDensityMatrix(plan.n, kernels);
  applyCompiled(rho, plan, pool, minThreadQubits);
  return rho;
}
