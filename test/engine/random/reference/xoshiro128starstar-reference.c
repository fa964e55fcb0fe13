/*
 * Reference outputs for test/engine/random/seeded-random.test.ts, from the published algorithms:
 *   SplitMix64: G. L. Steele, D. Lea, C. H. Flood (2014), "Fast splittable pseudorandom number generators",
 *     OOPSLA 2014; code as in S. Vigna's public-domain splitmix64.c.
 *   xoshiro128**: D. Blackman, S. Vigna (2018/2021), "Scrambled linear pseudorandom number generators",
 *     ACM Transactions on Mathematical Software 47(4):36; code as in the public-domain xoshiro128starstar.c.
 * Seeding of gridshake: s[0..3] = low, high 32-bit halves of the first two SplitMix64 outputs of the seed.
 * Build and run: gcc -O2 -o /tmp/xoshiro xoshiro128starstar-reference.c && /tmp/xoshiro
 */
#include <stdint.h>
#include <stdio.h>

static uint64_t splitmix_state;
static uint64_t splitmix64_next(void) {
  uint64_t z = (splitmix_state += 0x9e3779b97f4a7c15ULL);
  z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9ULL;
  z = (z ^ (z >> 27)) * 0x94d049bb133111ebULL;
  return z ^ (z >> 31);
}

static inline uint32_t rotl(const uint32_t x, int k) { return (x << k) | (x >> (32 - k)); }
static uint32_t s[4];
static uint32_t xoshiro128ss_next(void) {
  const uint32_t result = rotl(s[1] * 5, 7) * 9;
  const uint32_t t = s[1] << 9;
  s[2] ^= s[0];
  s[3] ^= s[1];
  s[1] ^= s[2];
  s[0] ^= s[3];
  s[2] ^= t;
  s[3] = rotl(s[3], 11);
  return result;
}

static void seed_with(uint64_t seed) {
  splitmix_state = seed;
  uint64_t a = splitmix64_next();
  uint64_t b = splitmix64_next();
  s[0] = (uint32_t)a;
  s[1] = (uint32_t)(a >> 32);
  s[2] = (uint32_t)b;
  s[3] = (uint32_t)(b >> 32);
}

int main(void) {
  splitmix_state = 0;
  printf("splitmix64 seed 0:");
  for (int k = 0; k < 3; k++) printf(" 0x%016llx", (unsigned long long)splitmix64_next());
  printf("\n");
  uint64_t seeds[3] = {0, 42, 20240601};
  for (int q = 0; q < 3; q++) {
    seed_with(seeds[q]);
    printf("xoshiro128** seed %llu:", (unsigned long long)seeds[q]);
    for (int k = 0; k < 8; k++) printf(" %u", xoshiro128ss_next());
    printf("\n");
  }
  return 0;
}
