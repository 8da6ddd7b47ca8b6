/**
 * How one pass over ρ is split between threads: every kernel's work is a sequence of items
 * (rest rows, i.e. block rows; or tiles of them for the mirrored kernel), and part p of P gets
 * one contiguous range of items of about 1/P of the work. Every kernel writes only inside the
 * blocks of the items it owns (and, for the mirrored kernel, their mirror images, which no
 * other part touches), so parts never write the same element and need no locking. Contiguous
 * ranges keep each thread on its own pages and cache lines.
 */

/** First item of part `part` of `parts` over `count` items of equal cost (part = parts gives count). */
export function partStart(count: number, part: number, parts: number): number {
  return Math.floor((count * part) / parts);
}

/**
 * First item of part `part` of `parts` over `count` items whose cost falls linearly to zero
 * (item i costs ∝ count − i, as the tiles of the mirrored kernel, which compute only the
 * blocks right of the diagonal): the work up to item t is ∝ 1 − (1 − t/count)², so the
 * boundaries are at t = count·(1 − √(1 − part/parts)).
 */
export function trianglePartStart(count: number, part: number, parts: number): number {
  if (part >= parts) return count;
  return Math.round(count * (1 - Math.sqrt(1 - part / parts)));
}
