/**
 * The seeded pseudo-random generator behind shot sampling: the same stream of numbers for
 * the same seed on every machine, because every step is 32-bit integer arithmetic
 * (Math.imul, shifts, xor) and the final conversion to a double is exact.
 *
 * Generator: xoshiro128** by D. Blackman and S. Vigna, "Scrambled linear pseudorandom number
 * generators", ACM Trans. Math. Softw. 47(4), 2021 (from memory): 128 bits of state, 32-bit
 * outputs.
 * Seeding: the 4 state words are the low then high halves of the first two outputs of
 * SplitMix64 (G. L. Steele, D. Lea, C. H. Flood, "Fast splittable pseudorandom number
 * generators", OOPSLA 2014, from memory; the seeding the xoshiro authors recommend) started
 * at the seed read as a 64-bit two's-complement integer. SplitMix64 is done here on 32-bit
 * halves so that no BigInt is needed.
 * Doubles: 53 random bits, (a·2^26 + b) / 2^53 from a = first output >>> 5 and b = second
 * output >>> 6 (the construction of genrand_res53 in M. Matsumoto and T. Nishimura's MT19937
 * code, ACM TOMACS 8, 1998, from memory), so each double consumes two 32-bit outputs and
 * lies in [0, 1).
 */

/** 2^32. */
const TWO_POW_32 = 4294967296;
/** 2^26, weight of the high 27 bits of a 53-bit double. */
const TWO_POW_26 = 67108864;
/** 2^−53, the spacing of the 53-bit doubles produced. */
const TWO_POW_MINUS_53 = 1 / 9007199254740992;

/** High 32 bits of the 64-bit product of two unsigned 32-bit integers (16-bit limbs, all exact). */
function mulHiU32(a: number, b: number): number {
  const a0 = a & 0xffff;
  const a1 = a >>> 16;
  const b0 = b & 0xffff;
  const b1 = b >>> 16;
  const p00 = a0 * b0;
  const p01 = a0 * b1;
  const p10 = a1 * b0;
  const p11 = a1 * b1;
  const mid = (p00 >>> 16) + (p01 & 0xffff) + (p10 & 0xffff);
  return (p11 + (p01 >>> 16) + (p10 >>> 16) + (mid >>> 16)) >>> 0;
}

/** (hi, lo) ← (hi, lo) · (bh, bl) mod 2^64 on unsigned 32-bit halves, written into `z`. */
function mul64(z: Uint32Array, bh: number, bl: number): void {
  const hi = z[0]!;
  const lo = z[1]!;
  z[0] = (mulHiU32(lo, bl) + Math.imul(hi, bl) + Math.imul(lo, bh)) >>> 0;
  z[1] = Math.imul(lo, bl) >>> 0;
}

/** (hi, lo) ← (hi, lo) xor ((hi, lo) >>> s) on 64 bits, for 0 < s < 32. */
function xorShiftRight64(z: Uint32Array, s: number): void {
  const hi = z[0]!;
  const lo = z[1]!;
  z[1] = lo ^ ((lo >>> s) | (hi << (32 - s)));
  z[0] = hi ^ (hi >>> s);
}

/**
 * One SplitMix64 step on the 64-bit counter `x` = (x[0] high, x[1] low): advances it by the
 * golden gamma 0x9e3779b97f4a7c15 and writes the mixed output into `out` (high, low).
 */
export function splitMix64Next(x: Uint32Array, out: Uint32Array): void {
  const lo = (x[1]! + 0x7f4a7c15) >>> 0;
  const carry = lo < x[1]! ? 1 : 0;
  x[0] = (x[0]! + 0x9e3779b9 + carry) >>> 0;
  x[1] = lo;
  out[0] = x[0];
  out[1] = x[1];
  xorShiftRight64(out, 30);
  mul64(out, 0xbf58476d, 0x1ce4e5b9);
  xorShiftRight64(out, 27);
  mul64(out, 0x94d049bb, 0x133111eb);
  xorShiftRight64(out, 31);
}

/** A reproducible stream of pseudo-random numbers (xoshiro128**, seeded through SplitMix64). */
export interface SeededRandom {
  /** Next 32-bit output as an unsigned integer in [0, 2^32). */
  nextUint32(): number;
  /** Next double in [0, 1) with 53 random bits (consumes two 32-bit outputs). */
  nextDouble(): number;
}

class Xoshiro128StarStar implements SeededRandom {
  private readonly s: Uint32Array;

  constructor(state: Uint32Array) {
    this.s = state;
  }

  nextUint32(): number {
    const s = this.s;
    const s1 = s[1]!;
    const x = Math.imul(s1, 5);
    const result = Math.imul((x << 7) | (x >>> 25), 9) >>> 0;
    const t = s1 << 9;
    s[2] ^= s[0]!;
    s[3] ^= s[1]!;
    s[1] ^= s[2]!;
    s[0] ^= s[3]!;
    s[2] ^= t;
    const s3 = s[3]!;
    s[3] = (s3 << 11) | (s3 >>> 21);
    return result;
  }

  nextDouble(): number {
    const a = this.nextUint32() >>> 5;
    const b = this.nextUint32() >>> 6;
    return (a * TWO_POW_26 + b) * TWO_POW_MINUS_53;
  }
}

/** The xoshiro128** state words [s0, s1, s2, s3] for a seed (any safe integer, read as 64-bit two's complement). */
export function seedState(seed: number): Uint32Array {
  if (!Number.isSafeInteger(seed)) throw new RangeError(`seed must be a safe integer, got ${seed}`);
  const x = new Uint32Array([Math.floor(seed / TWO_POW_32) >>> 0, seed >>> 0]);
  const z = new Uint32Array(2);
  const state = new Uint32Array(4);
  splitMix64Next(x, z);
  state[0] = z[1]!;
  state[1] = z[0]!;
  splitMix64Next(x, z);
  state[2] = z[1]!;
  state[3] = z[0]!;
  return state;
}

/** A generator started from explicit xoshiro128** state words [s0, s1, s2, s3] (not all zero); copies them. */
export function createRandomFromState(state: ArrayLike<number>): SeededRandom {
  if (state.length !== 4) throw new RangeError('xoshiro128** state has 4 words');
  const s = Uint32Array.from(state);
  if ((s[0]! | s[1]! | s[2]! | s[3]!) === 0) throw new RangeError('xoshiro128** state must not be all zero');
  return new Xoshiro128StarStar(s);
}

/** A new reproducible generator for `seed` (a safe integer). */
export function createRandom(seed: number): SeededRandom {
  return new Xoshiro128StarStar(seedState(seed));
}
