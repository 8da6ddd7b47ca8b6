/**
 * "Did you mean …?" for misspelled names (expression identifiers, keys, gate names).
 *
 * Distance: optimal-string-alignment Damerau-Levenshtein (insert, delete, substitute,
 * swap two adjacent characters; each costs 1), compared case-insensitively.
 */

import { NEAR_MISS_NAMES } from './nearMisses.js';

/** Largest edit distance accepted for a word of the given length: max(1, ⌊len/3⌋). */
export function maxSuggestDistance(length: number): number {
  return Math.max(1, Math.floor(length / 3));
}

/** Optimal-string-alignment (restricted Damerau-Levenshtein) distance between a and b. */
export function editDistance(a: string, b: string): number {
  const n = a.length;
  const m = b.length;
  if (n === 0) return m;
  if (m === 0) return n;
  // Three rolling rows: two rows back (for the transposition), previous, current.
  let back = new Int32Array(m + 1);
  let prev = new Int32Array(m + 1);
  let cur = new Int32Array(m + 1);
  for (let j = 0; j <= m; j++) prev[j] = j;
  for (let i = 1; i <= n; i++) {
    cur[0] = i;
    const ai = a.charCodeAt(i - 1);
    for (let j = 1; j <= m; j++) {
      const bj = b.charCodeAt(j - 1);
      const cost = ai === bj ? 0 : 1;
      let d = Math.min(prev[j]! + 1, cur[j - 1]! + 1, prev[j - 1]! + cost);
      if (i > 1 && j > 1 && ai === b.charCodeAt(j - 2) && a.charCodeAt(i - 2) === bj) {
        d = Math.min(d, back[j - 2]! + 1);
      }
      cur[j] = d;
    }
    const t = back;
    back = prev;
    prev = cur;
    cur = t;
  }
  return prev[m]!;
}

/**
 * The candidate closest to `word`, or undefined when none is close enough.
 * A case-insensitive exact match wins, then another name of the same gate
 * (./nearMisses.ts) when it is a candidate; otherwise the smallest distance
 * ≤ maxSuggestDistance(word.length), ties going to the earlier candidate.
 */
export function suggest(word: string, candidates: readonly string[]): string | undefined {
  const w = word.toLowerCase();
  for (const c of candidates) if (c.toLowerCase() === w) return c;
  const other = NEAR_MISS_NAMES.get(w);
  if (other !== undefined && candidates.includes(other)) return other;
  const limit = maxSuggestDistance(word.length);
  let best: string | undefined;
  let bestDistance = limit + 1;
  for (const c of candidates) {
    const d = editDistance(w, c.toLowerCase());
    if (d < bestDistance) {
      best = c;
      bestDistance = d;
    }
  }
  return best;
}
