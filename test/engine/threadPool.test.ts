import { afterAll, describe, expect, it } from 'vitest';
import { CompiledPlanBuilder } from '../../src/engine/compiledPlan.js';
import { realFormOf } from '../../src/engine/realForm.js';
import { applyCompiled, createSharedDensityMatrix } from '../../src/engine/runCompiled.js';
import { krausToSuperoperator } from '../../src/linalg/superoperator.js';
import { closeSharedThreadPool, sharedThreadPool, ThreadPool } from '../../src/engine/threadPool.js';
import { executeCall, rowLocalCall } from '../../src/engine/kernelCall.js';
import { diagonalTable } from '../../src/plan/diagonalBatch.js';
import { diag } from '../../src/linalg/cmatrix.js';
import { openFloat64View, openInt32View, shareView, ViewLengthError } from '../../src/engine/sharedView.js';
import { mulberry32, randomKraus, sameBits } from './helpers.js';

afterAll(() => closeSharedThreadPool());

/** A compiled plan of random real1 / real2 / general calls on n qubits. */
function randomCompiled(n: number, seed: number) {
  const rng = mulberry32(seed);
  const b = new CompiledPlanBuilder(n);
  for (let i = 0; i < 12; i++) {
    const k = 1 + (i % 3);
    const qubits = [i % n, (i + 1) % n, (i + 3) % n].slice(0, k);
    const s = krausToSuperoperator(randomKraus(rng, 1 << k, 2));
    if (k === 3) b.addCall({ kernel: 'general', qubits, off: b.addNumbers(s.data) });
    else b.addCall({ kernel: k === 1 ? 'real1' : 'real2', qubits, off: b.addNumbers(realFormOf(s, k)!) });
  }
  return b.build();
}

describe('ThreadPool', () => {
  it('splits passes over 2 threads with bit-for-bit the same result as 1 thread, and is reusable', () => {
    const pool = sharedThreadPool(2);
    // wait for the worker, so every pass below is split (applyCompiled would not wait)
    pool.ready();
    for (const [n, seed] of [
      [5, 1],
      [7, 2],
    ] as const) {
      const plan = randomCompiled(n, seed);
      const one = createSharedDensityMatrix(n);
      const two = createSharedDensityMatrix(n);
      applyCompiled(one, plan);
      applyCompiled(two, plan, pool, 1);
      expect(pool.parts).toBe(2);
      // each element is computed by the same operations whichever thread owns its rows
      expect(sameBits(one.data, two.data)).toBe(true);
    }
    expect(sharedThreadPool(2)).toBe(pool);
  });

  /**
   * A plan with long runs of row-local calls (real1tp on every qubit, diagonal batches), broken
   * by a real1tp on qubit 0 and by real2 calls, as the plan of a circuit with drift has them.
   */
  function chainedCompiled(n: number, seed: number) {
    const rng = mulberry32(seed);
    const b = new CompiledPlanBuilder(n);
    const phases = () => diag(Array.from({ length: 4 }, () => [Math.cos(6 * rng()), Math.sin(6 * rng())] as [number, number]));
    for (let layer = 0; layer < 3; layer++) {
      for (let q = 0; q < n; q++) {
        const real = realFormOf(krausToSuperoperator(randomKraus(rng, 2, 2)), 1)!;
        b.addCall({ kernel: q % 3 === 0 ? 'real1' : 'real1tp', qubits: [(q + layer) % n], off: b.addNumbers(real) });
      }
      const members = [{ qubits: [1, 2], superop: krausToSuperoperator([phases()]) }, { qubits: [0, n - 1], superop: krausToSuperoperator([phases()]) }];
      const off = b.addNumbers(diagonalTable(members, [1, 2]));
      b.addCall({ kernel: 'diagonal', qubits: [1, 2], qubitsB: [0, n - 1], off, offB: b.addNumbers(diagonalTable(members, [0, n - 1])) });
      const two = realFormOf(krausToSuperoperator(randomKraus(rng, 4, 2)), 2)!;
      b.addCall({ kernel: 'real2', qubits: [layer % n, (layer + 2) % n], off: b.addNumbers(two) });
    }
    return b.build();
  }

  it('runs of row-local calls go to the threads at once with bit-for-bit the result of 1 thread (2 and 4 threads, both kernel families)', () => {
    for (const threads of [2, 4]) {
      const pool = new ThreadPool(threads, false);
      pool.ready();
      try {
        for (const [n, seed] of [
          [4, 11],
          [7, 12],
        ] as const) {
          const plan = chainedCompiled(n, seed);
          for (const family of ['wasm', 'js'] as const) {
            const one = createSharedDensityMatrix(n, family);
            const many = createSharedDensityMatrix(n, family);
            applyCompiled(one, plan);
            applyCompiled(many, plan, pool, 1);
            expect(pool.parts).toBe(threads);
            expect(sameBits(one.data, many.data)).toBe(true);
          }
        }
      } finally {
        pool.close();
      }
    }
  });

  it('rowLocalCall: diagonal calls and 1-qubit calls below the top log2(parts) qubits, for power-of-two parts only', () => {
    const b = new CompiledPlanBuilder(5);
    const off = b.addNumbers(new Float64Array(32));
    b.addCall({ kernel: 'real1tp', qubits: [0], off });
    b.addCall({ kernel: 'real1', qubits: [1], off });
    b.addCall({ kernel: 'diagonal', qubits: [0], qubitsB: [], off });
    b.addCall({ kernel: 'real2', qubits: [3, 4], off });
    const { words, starts } = b.build();
    const local = (i: number, parts: number) => rowLocalCall(words, starts[i]!, 5, parts);
    expect([0, 1, 2, 3].map((i) => local(i, 2))).toEqual([false, true, true, false]);
    expect([0, 1, 2, 3].map((i) => local(i, 4))).toEqual([false, false, true, false]);
    expect([0, 1, 2, 3].map((i) => local(i, 3))).toEqual([false, false, false, false]);
    // more parts than a 1-qubit pass has rest rows
    expect(local(2, 32)).toBe(false);
  });

  it('passes run on the main thread alone until the workers are ready, then split, with bit-for-bit the result of 1 thread', () => {
    /** A pool whose workers count as ready only from its `late`-th readiness check on (they have started: ready() waited). */
    class LatePool extends ThreadPool {
      checks = 0;
      constructor(private readonly late: number) {
        super(2, false);
        super.ready();
      }
      override tryReady(): boolean {
        return ++this.checks >= this.late && super.tryReady();
      }
    }
    const n = 7;
    const plan = chainedCompiled(n, 21);
    for (const late of [2, 5, plan.starts.length + 1]) {
      const pool = new LatePool(late);
      try {
        for (const family of ['wasm', 'js'] as const) {
          pool.checks = 0;
          const one = createSharedDensityMatrix(n, family);
          const mixed = createSharedDensityMatrix(n, family);
          applyCompiled(one, plan);
          const threads = applyCompiled(mixed, plan, pool, 1);
          // joined at call late − 1 (0-based) when the plan is that long, else never
          expect(threads).toBe(late <= plan.starts.length ? 2 : 1);
          expect(sameBits(one.data, mixed.data)).toBe(true);
        }
      } finally {
        pool.close();
      }
    }
  });

  it('a pool reports the threads it splits passes over, the same whether its workers have started yet or not', () => {
    const p = new ThreadPool(2);
    const before = p.splitThreads;
    p.ready();
    expect(before).toBe(2);
    expect(p.splitThreads).toBe(2);
    p.close();
    expect(p.splitThreads).toBe(1);
  });

  it('a pool of 1 thread starts no worker, and a closed pool runs single-threaded', () => {
    const single = new ThreadPool(1);
    single.ready();
    expect(single.parts).toBe(1);
    const p = new ThreadPool(2);
    p.close();
    const plan = randomCompiled(4, 3);
    const rho = createSharedDensityMatrix(4);
    applyCompiled(rho, plan, p, 1);
    expect(p.parts).toBe(1);
    expect(rho.data[0]).toBeGreaterThan(0);
  });
});

describe('views handed to the workers (issue 13, bug 1: a 4 GiB ρ reached the workers with length 0)', () => {
  it('a view rebuilt from its message has the posted length, and a short one is refused', () => {
    const data = new Float64Array(new SharedArrayBuffer(8 * 32), 8, 16);
    const back = openFloat64View(shareView(data), 'ρ');
    expect(back.length).toBe(16);
    expect(back.byteOffset).toBe(8);
    // a message claiming more elements than its buffer holds, as a truncated hand-off would
    expect(() => openFloat64View({ buffer: data.buffer as SharedArrayBuffer, byteOffset: 0, length: 64 }, 'ρ')).toThrow(ViewLengthError);
    expect(() => openInt32View({ buffer: new SharedArrayBuffer(12), byteOffset: 4, length: 3 }, 'words')).toThrow(ViewLengthError);
  });

  it('a kernel call on a register view of the wrong length throws instead of leaving rows unwritten', () => {
    const plan = randomCompiled(4, 5);
    const rho = createSharedDensityMatrix(4);
    const short = rho.data.subarray(0, rho.data.length / 2);
    expect(() => executeCall(short, 4, plan.words, plan.starts[0]!, plan.arena, 0, 1)).toThrow(ViewLengthError);
    // the same through the pool: both threads check their view, and the run fails loudly
    const pool = sharedThreadPool(2);
    pool.ready();
    expect(() => applyCompiled({ ...rho, data: short }, plan, pool, 1)).toThrow();
  });
});
