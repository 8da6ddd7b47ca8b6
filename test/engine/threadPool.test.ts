import { afterAll, describe, expect, it } from 'vitest';
import { CompiledPlanBuilder } from '../../src/engine/compiledPlan.js';
import { realFormOf } from '../../src/engine/realForm.js';
import { applyCompiled, createSharedDensityMatrix } from '../../src/engine/runCompiled.js';
import { krausToSuperoperator } from '../../src/linalg/superoperator.js';
import { closeSharedThreadPool, sharedThreadPool, ThreadPool } from '../../src/engine/threadPool.js';
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
