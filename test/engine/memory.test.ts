import { totalmem } from 'node:os';
import { describe, expect, it } from 'vitest';
import {
  checkMemory,
  defaultMemoryLimit,
  estimateRunBytes,
  formatBytes,
  MemoryLimitError,
  parseByteSize,
  RUN_OVERHEAD_BYTES,
} from '../../src/engine/memory.js';

describe('estimateRunBytes (formula documented in src/engine/memory.ts)', () => {
  // 16 bytes per complex double: density matrix 16·4^n, state vector 16·2^n (common practice).
  it('n = 10', () => {
    expect(estimateRunBytes(10, true)).toBe(16_777_216 + 16_384 + RUN_OVERHEAD_BYTES);
    expect(estimateRunBytes(10, false)).toBe(2 * 16_777_216 + RUN_OVERHEAD_BYTES);
  });
  it('n = 12', () => {
    expect(estimateRunBytes(12, true)).toBe(268_435_456 + 65_536 + RUN_OVERHEAD_BYTES);
    expect(estimateRunBytes(12, false)).toBe(2 * 268_435_456 + RUN_OVERHEAD_BYTES);
  });
  it('overhead is a small constant', () => {
    expect(RUN_OVERHEAD_BYTES).toBeGreaterThan(0);
    expect(RUN_OVERHEAD_BYTES).toBeLessThanOrEqual(64 * 1024 * 1024);
  });
});

describe('defaultMemoryLimit', () => {
  it('is half of the total memory', () => {
    expect(defaultMemoryLimit()).toBe(Math.floor(totalmem() / 2));
  });
});

describe('checkMemory', () => {
  it('throws MemoryLimitError above the limit with the amounts and a hint', () => {
    const limit = 100 * 1024 * 1024;
    let caught: unknown;
    try {
      checkMemory(12, true, limit);
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(MemoryLimitError);
    const err = caught as MemoryLimitError;
    expect(err.neededBytes).toBe(estimateRunBytes(12, true));
    expect(err.limitBytes).toBe(limit);
    expect(err.message).toContain('12 qubits');
    expect(err.message).toContain('noisy density matrix 256 MiB');
    expect(err.message).toContain('ideal state vector 64 KiB');
    expect(err.message).toContain('limit is 100 MiB');
    expect(err.message).toContain('--max-memory');
  });

  it('names the ideal density matrix when the ideal run is mixed', () => {
    expect(() => checkMemory(12, false, 512 * 1024 * 1024)).toThrow(/ideal density matrix 256 MiB/);
  });

  it('passes at and below the limit', () => {
    expect(() => checkMemory(10, true, estimateRunBytes(10, true))).not.toThrow();
    expect(() => checkMemory(10, true, estimateRunBytes(10, true) - 1)).toThrow(MemoryLimitError);
  });
});

describe('formatBytes', () => {
  it('uses binary units', () => {
    expect(formatBytes(512)).toBe('512 B');
    expect(formatBytes(1536)).toBe('1.5 KiB');
    expect(formatBytes(268_435_456)).toBe('256 MiB');
    expect(formatBytes(3 * 1024 ** 3)).toBe('3 GiB');
  });
});

describe('parseByteSize', () => {
  // Binary prefixes KiB = 1024 etc. and decimal KB = 1000 etc. (IEC 80000-13, from memory).
  it.each([
    ['512MiB', 512 * 1024 ** 2],
    ['2GiB', 2 * 1024 ** 3],
    ['1.5GB', 1.5e9],
    ['800MB', 800e6],
    ['1000000', 1_000_000],
    ['4kib', 4096],
    ['3 KB', 3000],
    ['1TiB', 1024 ** 4],
    ['2tb', 2e12],
    ['64B', 64],
    [' 7 GiB ', 7 * 1024 ** 3],
    ['0.5KiB', 512],
  ])('%s → %i bytes', (text, bytes) => {
    expect(parseByteSize(text)).toBe(bytes);
  });

  it.each(['', 'MiB', '-1GiB', '1e9', '12 qubits', '1.2.3MB', '5 XB', '10M', '1,000', 'constructor', '5constructor'])(
    'rejects %j',
    (text) => {
      expect(parseByteSize(text)).toBeUndefined();
    },
  );
});
