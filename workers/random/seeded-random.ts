/**
 * Seeded uniform random numbers for the engine (the engine never calls Math.random).
 *
 * Generator: xoshiro128** (D. Blackman and S. Vigna 2021, "Scrambled linear pseudorandom number generators", ACM
 * Transactions on Mathematical Software 47(4):36), 128-bit state, period 2^128 - 1:
 *   result = rotl(s1 * 5, 7) * 9; t = s1 << 9; s2 ^= s0; s3 ^= s1; s1 ^= s2; s0 ^= s3; s2 ^= t; s3 = rotl(s3, 11)
 * Seeding: the state is the low and high 32-bit halves of the first two SplitMix64 outputs of the seed
 * (G. L. Steele, D. Lea and C. H. Flood 2014, "Fast splittable pseudorandom number generators", OOPSLA), as the
 * xoshiro authors recommend. Doubles in [0, 1) take 53 random bits from two outputs,
 * (a >>> 5) * 2^26 + (b >>> 6) over 2^53 (as genrand_res53 of Matsumoto and Nishimura 1998, ACM TOMACS 8:3-30).
 * Cost O(1) per number; seeding O(1).
 */
import type { RandomSource } from '../types.js';

const MASK64 = (1n << 64n) - 1n;
const GOLDEN_GAMMA = 0x9e3779b97f4a7c15n;

/** The SplitMix64 output function (finalizer) of one 64-bit state. */
export function splitMix64Mix(state: bigint): bigint {
  let z = state & MASK64;
  z = ((z ^ (z >> 30n)) * 0xbf58476d1ce4e5b9n) & MASK64;
  z = ((z ^ (z >> 27n)) * 0x94d049bb133111ebn) & MASK64;
  return z ^ (z >> 31n);
}

function seedToBigInt(seed: number, what: string): bigint {
  if (!Number.isSafeInteger(seed)) throw new RangeError(`${what} must be a safe integer, got ${seed}`);
  return BigInt.asUintN(64, BigInt(seed));
}

export interface RandomGenerator {
  /** The next 32-bit output of xoshiro128**, as an unsigned integer. */
  nextUint32(): number;
  /** A uniform double in [0, 1) with 53 random bits. */
  nextDouble(): number;
}

/** A xoshiro128** generator seeded through SplitMix64. */
export function createRandomGenerator(seed: number): RandomGenerator {
  let state = seedToBigInt(seed, 'seed');
  state = (state + GOLDEN_GAMMA) & MASK64;
  const first = splitMix64Mix(state);
  state = (state + GOLDEN_GAMMA) & MASK64;
  const second = splitMix64Mix(state);
  let s0 = Number(first & 0xffffffffn) | 0;
  let s1 = Number(first >> 32n) | 0;
  let s2 = Number(second & 0xffffffffn) | 0;
  let s3 = Number(second >> 32n) | 0;
  const nextUint32 = (): number => {
    const scaled = Math.imul(s1, 5);
    const result = Math.imul((scaled << 7) | (scaled >>> 25), 9) >>> 0;
    const t = s1 << 9;
    s2 ^= s0;
    s3 ^= s1;
    s1 ^= s2;
    s0 ^= s3;
    s2 ^= t;
    s3 = (s3 << 11) | (s3 >>> 21);
    return result;
  };
  const nextDouble = (): number => ((nextUint32() >>> 5) * 67108864 + (nextUint32() >>> 6)) / 9007199254740992;
  return { nextUint32, nextDouble };
}

/** A seeded uniform source in [0, 1) (53-bit doubles from xoshiro128**). */
export function createRandom(seed: number): RandomSource {
  return createRandomGenerator(seed).nextDouble;
}

/**
 * Seed of stream `stream` (e.g. simulation r) under a master seed: two SplitMix64 finalizer rounds over the seed
 * and the stream number, z = mix(mix(seed) xor (stream + 1) * 0xd1b54a32d192ed03), returned as its top 53 bits
 * (a safe integer). Distinct streams give distinct, decorrelated generator states; this is hashing-based
 * stream separation (as in SplitMix's split), not a proof of independence.
 */
export function deriveSeed(seed: number, stream: number): number {
  const base = splitMix64Mix((seedToBigInt(seed, 'seed') + GOLDEN_GAMMA) & MASK64);
  const streamKey = ((seedToBigInt(stream, 'stream') + 1n) * 0xd1b54a32d192ed03n) & MASK64;
  return Number(splitMix64Mix(base ^ streamKey) >> 11n);
}
