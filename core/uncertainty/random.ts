/**
 * Seeded pseudorandom numbers for the uncertainty runs: the same seed gives the same numbers
 * in Node and in every browser, since only 32-bit integer arithmetic is used (`Math.imul`,
 * shifts, `>>> 0`); no `Math.random`, no clock.
 *
 * The generator is xoshiro128** (128-bit state, 32-bit output, period 2^128 − 1). Every draw
 * of every home gets its own stream: the state is rebuilt from (seed, stream, draw) by the
 * MurmurHash3 32-bit finalizer, so a draw's numbers depend on nothing but those three keys,
 * neither on how many workers share the work nor on the order they do it in.
 *
 * References: D. Blackman and S. Vigna, "Scrambled linear pseudorandom number generators",
 * ACM Transactions on Mathematical Software 47(4), 2021, and their reference code
 * xoshiro128starstar.c (prng.di.unimi.it); A. Appleby, MurmurHash3 (public domain), `fmix32`.
 */

/** 2^32, to turn a 32-bit output into a fraction in [0, 1). */
const TWO_TO_32 = 4_294_967_296;

/** Odd constants of the 32-bit golden ratio and MurmurHash3's finalizer. */
const GOLDEN_32 = 0x9e3779b9;
const FMIX_MULTIPLIER_1 = 0x85ebca6b;
const FMIX_MULTIPLIER_2 = 0xc2b2ae35;
/** The state words' offsets: GOLDEN_32 times 2, 3 and 4 in 32-bit arithmetic. */
const GOLDEN_32_TIMES_2 = Math.imul(GOLDEN_32, 2);
const GOLDEN_32_TIMES_3 = Math.imul(GOLDEN_32, 3);
const GOLDEN_32_TIMES_4 = Math.imul(GOLDEN_32, 4);

/**
 * MurmurHash3's 32-bit finalizer: a bijection on 32-bit words in which each input bit
 * affects every output bit.
 *
 * @param word - any number; its low 32 bits are used
 * @returns an unsigned 32-bit integer
 */
export function mix32(word: number): number {
  let h = word >>> 0;
  h ^= h >>> 16;
  h = Math.imul(h, FMIX_MULTIPLIER_1);
  h ^= h >>> 13;
  h = Math.imul(h, FMIX_MULTIPLIER_2);
  h ^= h >>> 16;
  return h >>> 0;
}

/**
 * The part of a draw's state that depends on the seed and stream alone, for
 * `Xoshiro128StarStar.reseedInStream`.
 *
 * @param seed - an integer (its low 32 bits are used)
 * @param stream - which stream
 * @returns an unsigned 32-bit integer
 */
export function streamKeyOf(seed: number, stream: number): number {
  return mix32(mix32(seed) ^ stream);
}

function rotateLeft(word: number, bits: number): number {
  return (word << bits) | (word >>> (32 - bits));
}

/**
 * One xoshiro128** generator. Mutable on purpose: `reseed` and `nextUint32` allocate nothing,
 * so a run of millions of draws creates no garbage.
 */
export class Xoshiro128StarStar {
  private s0 = 1;
  private s1 = 0;
  private s2 = 0;
  private s3 = 0;

  /**
   * @param seed - an integer (its low 32 bits are used)
   * @param stream - which stream: a home's position in a portfolio, say
   * @param draw - which draw of that stream
   */
  constructor(seed = 0, stream = 0, draw = 0) {
    this.reseed(seed, stream, draw);
  }

  /** Sets the raw 128-bit state (four 32-bit words, not all zero), as the reference code takes it. */
  setState(words: readonly [number, number, number, number]): void {
    const [a, b, c, d] = words;
    if ((a | b | c | d) >>> 0 === 0) {
      throw new RangeError('xoshiro128** state: expected four words not all zero');
    }
    this.s0 = a >>> 0;
    this.s1 = b >>> 0;
    this.s2 = c >>> 0;
    this.s3 = d >>> 0;
  }

  /**
   * Rebuilds the state from (seed, stream, draw). Each state word hashes the three keys with
   * its own odd offset through three rounds of `mix32`, so neighbouring keys give unrelated
   * states.
   */
  reseed(seed: number, stream: number, draw: number): void {
    this.reseedInStream(streamKeyOf(seed, stream), draw);
  }

  /**
   * `reseed(seed, stream, draw)` with the part that depends on seed and stream alone worked
   * out beforehand by `streamKeyOf`: a run reseeds for every draw of one stream.
   */
  reseedInStream(streamKey: number, draw: number): void {
    const key = mix32(streamKey + Math.imul(GOLDEN_32, draw + 1));
    this.s0 = mix32(key + GOLDEN_32);
    this.s1 = mix32(key + GOLDEN_32_TIMES_2);
    this.s2 = mix32(key + GOLDEN_32_TIMES_3);
    this.s3 = mix32(key + GOLDEN_32_TIMES_4);
    // mix32 is a bijection, so the four words cannot all be 0 (their inputs differ); keep the
    // reference code's requirement explicit all the same.
    if ((this.s0 | this.s1 | this.s2 | this.s3) >>> 0 === 0) this.s0 = 1;
  }

  /** The next 32-bit output, unsigned. */
  nextUint32(): number {
    const s1 = this.s1;
    const result = Math.imul(rotateLeft(Math.imul(s1, 5), 7), 9) >>> 0;
    const t = s1 << 9;
    this.s2 ^= this.s0;
    this.s3 ^= s1;
    this.s1 ^= this.s2;
    this.s0 ^= this.s3;
    this.s2 ^= t;
    this.s3 = rotateLeft(this.s3, 11);
    return result;
  }

  /** The next fraction in [0, 1), in steps of 2^−32. */
  nextFraction(): number {
    return this.nextUint32() / TWO_TO_32;
  }
}

/**
 * The first `count` fractions of one draw's generator into out[0..count−1]: the numbers of
 * `reseedInStream(streamKey, draw)` then `nextFraction()` `count` times, with the state in
 * local variables (a run takes a few numbers a draw, a million draws a portfolio).
 *
 * @param streamKey - `streamKeyOf(seed, stream)`
 * @param draw - which draw of that stream
 * @param out - at least `count` long
 * @param count - how many fractions
 */
export function drawFractions(
  streamKey: number,
  draw: number,
  out: Float64Array,
  count: number,
): void {
  const key = mix32(streamKey + Math.imul(GOLDEN_32, draw + 1));
  let s0 = mix32(key + GOLDEN_32);
  let s1 = mix32(key + GOLDEN_32_TIMES_2);
  let s2 = mix32(key + GOLDEN_32_TIMES_3);
  let s3 = mix32(key + GOLDEN_32_TIMES_4);
  if ((s0 | s1 | s2 | s3) >>> 0 === 0) s0 = 1;
  for (let index = 0; index < count; index += 1) {
    // nextUint32's steps, on the locals.
    const result = Math.imul(rotateLeft(Math.imul(s1, 5), 7), 9) >>> 0;
    const t = s1 << 9;
    s2 ^= s0;
    s3 ^= s1;
    s1 ^= s2;
    s0 ^= s3;
    s2 ^= t;
    s3 = rotateLeft(s3, 11);
    out[index] = result / TWO_TO_32;
  }
}

/**
 * A seed as the generator takes it: a whole number from 0 to 2^32 − 1.
 *
 * @returns the seed, or null when it is not one
 */
export function asSeed(value: unknown): number | null {
  return typeof value === 'number' && Number.isInteger(value) && value >= 0 && value < TWO_TO_32
    ? value
    : null;
}
