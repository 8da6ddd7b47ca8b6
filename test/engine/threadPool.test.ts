import { afterAll, describe, expect, it } from 'vitest';
import { CompiledPlanBuilder } from '../../src/engine/compiledPlan.js';
import { realFormOf } from '../../src/engine/realForm.js';
import { applyCompiled, createSharedDensityMatrix } from '../../src/engine/runCompiled.js';
import { krausToSuperoperator } from '../../src/linalg/superoperator.js';
import { closeSharedThreadPool, sharedThreadPool, ThreadPool } from '../../src/engine/threadPool.js';
import { executeCall } from '../../src/engine/kernelCall.js';
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
    expect(() => applyCompiled({ ...rho, data: short }, plan, pool, 1)).toThrow();
  });
});
