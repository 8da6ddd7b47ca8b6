/** Seeded randomness shared by the property tests, so every failure reproduces from its seed. */

/** mulberry32 (Tommy Ettinger, public domain; from memory): a tiny seeded PRNG with uniforms in [0, 1). */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Standard normal sample by the Box–Muller transform (common practice). */
export function gaussian(rng: () => number): number {
  const u = 1 - rng(); // in (0, 1], so the logarithm is finite
  const v = rng();
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
}
