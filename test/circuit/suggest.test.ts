import { describe, it, expect } from 'vitest';
import { editDistance, maxSuggestDistance, suggest } from '../../src/circuit/suggest.js';
import { mulberry32 } from './helpers.js';

describe('editDistance (optimal string alignment)', () => {
  it('kitten → sitting is 3 (the classic Levenshtein example, common practice (from memory))', () => {
    expect(editDistance('kitten', 'sitting')).toBe(3);
  });

  it('an adjacent swap costs 1; ca → abc is 3 under OSA (no edits of a swapped pair) (common practice (from memory))', () => {
    expect(editDistance('ab', 'ba')).toBe(1);
    expect(editDistance('theta', 'tehta')).toBe(1);
    expect(editDistance('ca', 'abc')).toBe(3);
  });

  it('empty strings cost their length', () => {
    expect(editDistance('', 'abc')).toBe(3);
    expect(editDistance('ab', '')).toBe(2);
    expect(editDistance('', '')).toBe(0);
  });

  it('is zero exactly on equal strings, symmetric, and between |Δlength| and max length (seeded property)', () => {
    const rng = mulberry32(42);
    const word = (): string => Array.from({ length: Math.floor(rng() * 7) }, () => 'abcd'[Math.floor(rng() * 4)]).join('');
    for (let trial = 0; trial < 300; trial++) {
      const a = word();
      const b = word();
      const d = editDistance(a, b);
      expect(d === 0).toBe(a === b);
      expect(editDistance(b, a)).toBe(d);
      expect(d).toBeGreaterThanOrEqual(Math.abs(a.length - b.length));
      expect(d).toBeLessThanOrEqual(Math.max(a.length, b.length));
    }
  });
});

describe('suggest', () => {
  it('finds the nearest name within max(1, ⌊len/3⌋)', () => {
    expect(suggest('thta', ['phi', 'theta'])).toBe('theta');
    expect(suggest('tehta', ['phi', 'theta'])).toBe('theta');
    expect(suggest('swpa', ['swap', 'iswap'])).toBe('swap');
    expect(suggest('cxx', ['cx', 'ccx'])).toBe('cx'); // tie at 1: the earlier candidate
    expect(maxSuggestDistance(2)).toBe(1);
    expect(maxSuggestDistance(6)).toBe(2);
  });

  it('prefers a case-insensitive match over a closer-looking one', () => {
    expect(suggest('PHI', ['pi', 'phi'])).toBe('phi');
    expect(suggest('Pi', ['pi'])).toBe('pi');
  });

  it('returns undefined when nothing is close enough', () => {
    expect(suggest('alpha', ['theta', 'phi'])).toBeUndefined();
    expect(suggest('abcdef', ['abcxyz'])).toBeUndefined(); // distance 3 > 2
    expect(suggest('abcdef', ['abcdxy'])).toBe('abcdxy'); // distance 2
    expect(suggest('x', [])).toBeUndefined();
  });
});
