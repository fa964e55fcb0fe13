import { describe, it, expect } from 'vitest';
import { createRandom, createRandomGenerator, deriveSeed, splitMix64Mix } from '../../../workers/random/seeded-random.js';

/**
 * A second, deliberately plain implementation of the published algorithms in BigInt arithmetic (mod 2^32 and
 * mod 2^64 written out), independent of the engine's Math.imul / shift tricks:
 * SplitMix64 (Steele, Lea and Flood 2014, OOPSLA) and xoshiro128** (Blackman and Vigna 2021, ACM TOMS 47(4):36).
 */
function referenceGenerator(seed: bigint): () => bigint {
  const M32 = (1n << 32n) - 1n;
  const M64 = (1n << 64n) - 1n;
  let x = seed & M64;
  const splitmix = (): bigint => {
    x = (x + 0x9e3779b97f4a7c15n) & M64;
    let z = x;
    z = ((z ^ (z >> 30n)) * 0xbf58476d1ce4e5b9n) & M64;
    z = ((z ^ (z >> 27n)) * 0x94d049bb133111ebn) & M64;
    return z ^ (z >> 31n);
  };
  const a = splitmix();
  const b = splitmix();
  const s = [a & M32, a >> 32n, b & M32, b >> 32n];
  const rotl = (v: bigint, k: bigint) => ((v << k) | (v >> (32n - k))) & M32;
  return () => {
    const result = (rotl((s[1]! * 5n) & M32, 7n) * 9n) & M32;
    const t = (s[1]! << 9n) & M32;
    s[2] = s[2]! ^ s[0]!;
    s[3] = s[3]! ^ s[1]!;
    s[1] = s[1]! ^ s[2]!;
    s[0] = s[0]! ^ s[3]!;
    s[2] = s[2]! ^ t;
    s[3] = rotl(s[3]!, 11n);
    return result;
  };
}

describe('createRandomGenerator: xoshiro128** seeded by SplitMix64', () => {
  it('SplitMix64 from state 0 gives the published first outputs 0xe220a8397b1dcdaf, 0x6e789e6aa1b965f4', () => {
    // Vigna's splitmix64.c from x = 0 (test/engine/random/reference/xoshiro128starstar-reference.c prints them;
    // also widely quoted, from memory)
    expect(splitMix64Mix(0x9e3779b97f4a7c15n)).toBe(0xe220a8397b1dcdafn);
    expect(splitMix64Mix(2n * 0x9e3779b97f4a7c15n)).toBe(0x6e789e6aa1b965f4n);
  });

  it('matches the reference C code compiled with gcc (first 8 outputs for seeds 0, 42, 20240601)', () => {
    // gcc -O2 -o /tmp/xoshiro test/engine/random/reference/xoshiro128starstar-reference.c && /tmp/xoshiro
    const expected: Record<number, number[]> = {
      0: [3737715805, 2584255861, 2876756834, 3286328325, 1553311962, 1625202774, 3260698944, 2754151956],
      42: [1776835114, 4165204688, 17111135, 2317295270, 2792088233, 2554630222, 2940343271, 2244566231],
      20240601: [3865763728, 2928583729, 2344800337, 1191762289, 3077710244, 979031933, 3233772133, 86503030],
    };
    for (const [seed, outputs] of Object.entries(expected)) {
      const generator = createRandomGenerator(Number(seed));
      expect(outputs.map(() => generator.nextUint32())).toEqual(outputs);
    }
  });

  it('matches the plain BigInt implementation for 10000 outputs at several seeds, negative seeds included', () => {
    for (const seed of [1, 7, 123456789, 2 ** 53 - 1, -5]) {
      const generator = createRandomGenerator(seed);
      const reference = referenceGenerator(BigInt.asUintN(64, BigInt(seed)));
      for (let k = 0; k < 10000; k++) expect(generator.nextUint32()).toBe(Number(reference()));
    }
  });

  it('doubles take 53 bits from two outputs: (a >>> 5) * 2^26 + (b >>> 6), over 2^53', () => {
    const generator = createRandomGenerator(99);
    const random = createRandom(99);
    for (let k = 0; k < 1000; k++) {
      const a = generator.nextUint32();
      const b = generator.nextUint32();
      const value = random();
      expect(value).toBe(((a >>> 5) * 67108864 + (b >>> 6)) / 9007199254740992);
      expect(value).toBeGreaterThanOrEqual(0);
      expect(value).toBeLessThan(1);
    }
  });

  it('is uniform: chi-square of 101 equal bins over 200000 draws below the 1 % critical value 135.80672 (df 100)', () => {
    // critical value: NIST/SEMATECH e-Handbook 1.3.6.7.4, df 100, upper 1 %
    for (const seed of [3, 2024]) {
      const random = createRandom(seed);
      const bins = new Array<number>(101).fill(0);
      const draws = 200000;
      for (let k = 0; k < draws; k++) bins[Math.floor(random() * 101)]!++;
      const expected = draws / 101;
      const chi2 = bins.reduce((sum, observed) => sum + (observed - expected) ** 2 / expected, 0);
      expect(chi2).toBeLessThan(135.80672);
    }
  });

  it('rejects seeds that are not safe integers', () => {
    expect(() => createRandom(1.5)).toThrow(/safe integer/);
    expect(() => createRandom(Number.NaN)).toThrow(RangeError);
    expect(() => deriveSeed(1, -0.5)).toThrow(/stream must be a safe integer/);
  });
});

describe('deriveSeed: separate streams', () => {
  it('is deterministic, gives distinct safe-integer seeds per stream and per master seed', () => {
    const seen = new Set<number>();
    for (const master of [0, 1, 42]) {
      for (let stream = 0; stream < 500; stream++) {
        const seed = deriveSeed(master, stream);
        expect(Number.isSafeInteger(seed)).toBe(true);
        expect(deriveSeed(master, stream)).toBe(seed);
        seen.add(seed);
      }
    }
    expect(seen.size).toBe(1500);
  });

  it('streams are uncorrelated: Pearson correlation of paired draws of neighbouring streams is within 4 standard errors', () => {
    const draws = 20000;
    for (let stream = 0; stream < 5; stream++) {
      const a = createRandom(deriveSeed(7, stream));
      const b = createRandom(deriveSeed(7, stream + 1));
      let sa = 0;
      let sb = 0;
      let sab = 0;
      let saa = 0;
      let sbb = 0;
      for (let k = 0; k < draws; k++) {
        const x = a();
        const y = b();
        sa += x;
        sb += y;
        sab += x * y;
        saa += x * x;
        sbb += y * y;
      }
      const covariance = sab / draws - (sa / draws) * (sb / draws);
      const correlation = covariance / Math.sqrt((saa / draws - (sa / draws) ** 2) * (sbb / draws - (sb / draws) ** 2));
      expect(Math.abs(correlation)).toBeLessThan(4 / Math.sqrt(draws));
    }
  });
});
