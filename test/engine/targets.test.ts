import { describe, expect, it } from 'vitest';
import { checkTargets, nextRest, targetMask, targetOffsets } from '../../src/engine/targets.js';

// Expected values follow the bit convention of src/engine/layout.ts (qubit 0 = most significant bit).
describe('targetOffsets', () => {
  it('first target is the most significant local bit', () => {
    // n = 3: masks q0 = 4, q1 = 2, q2 = 1; targets [2, 0] → local a = (b_q2 b_q0)
    expect(Array.from(targetOffsets(3, [2, 0]))).toEqual([0, 4, 1, 5]);
    expect(Array.from(targetOffsets(3, [0, 2]))).toEqual([0, 1, 4, 5]);
    expect(Array.from(targetOffsets(3, [1]))).toEqual([0, 2]);
  });
});

describe('nextRest', () => {
  it('visits exactly the indices with all target bits zero, in order', () => {
    const tm = targetMask(4, [1, 3]); // masks 4 and 1
    expect(tm).toBe(5);
    const seen: number[] = [];
    for (let r = 0; r < 16; r = nextRest(r, tm)) seen.push(r);
    expect(seen).toEqual([0, 2, 8, 10]);
  });
});

describe('checkTargets', () => {
  it('accepts distinct in-range qubits in any order and rejects the rest', () => {
    expect(() => checkTargets(3, [2, 0], 'test')).not.toThrow();
    expect(() => checkTargets(3, [], 'test')).toThrow(RangeError);
    expect(() => checkTargets(3, [3], 'test')).toThrow(/outside/);
    expect(() => checkTargets(3, [1, 1], 'test')).toThrow(/twice/);
    expect(() => checkTargets(3, [0.5], 'test')).toThrow(RangeError);
  });
});
