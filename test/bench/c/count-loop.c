/*
 * The benchmark's C reference: counts points into square cells exactly as the grid contract of shared/design.md
 * says, i = floor(x'/s - u), j = floor(y'/s - v) with x' = dx cos t + dy sin t, y' = -dx sin t + dy cos t,
 * in float64 on one thread. Built by the benchmark with -O3 -ffp-contract=off so that no fused multiply-add
 * changes a rounding: its counts equal the engine's. It only counts (no coverage, no statistics).
 *
 * usage: count-loop POINTS PLACEMENTS REPEATS
 *   POINTS      little-endian float64 x, y pairs (planar metres, relative to the grid origin)
 *   PLACEMENTS  little-endian float64 records of 9 values: cos t, sin t, cell side s, u, v, i0, j0, nx, ny
 *   REPEATS     how often the whole set of placements is counted; the best pass is reported
 * prints one JSON line: {"n":…, "placements":…, "bestSeconds":…, "checksum":…}
 * checksum = sum over placements and cells k of count_k * ((k mod 1000003) + 1), modulo 2^64.
 */
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

static double *read_doubles(const char *path, size_t *count) {
  FILE *file = fopen(path, "rb");
  if (!file) { perror(path); exit(2); }
  fseek(file, 0, SEEK_END);
  long bytes = ftell(file);
  fseek(file, 0, SEEK_SET);
  double *values = malloc((size_t)bytes);
  if (!values || fread(values, 1, (size_t)bytes, file) != (size_t)bytes) { fprintf(stderr, "cannot read %s\n", path); exit(2); }
  fclose(file);
  *count = (size_t)bytes / sizeof(double);
  return values;
}

static double now_seconds(void) {
  struct timespec t;
  clock_gettime(CLOCK_MONOTONIC, &t);
  return (double)t.tv_sec + 1e-9 * (double)t.tv_nsec;
}

int main(int argc, char **argv) {
  if (argc != 4) { fprintf(stderr, "usage: count-loop POINTS PLACEMENTS REPEATS\n"); return 2; }
  size_t values = 0, records = 0;
  const double *xy = read_doubles(argv[1], &values);
  const double *plan = read_doubles(argv[2], &records);
  const size_t n = values / 2;
  const size_t placements = records / 9;
  const int repeats = atoi(argv[3]);
  size_t largest = 0;
  for (size_t k = 0; k < placements; k++) {
    size_t cells = (size_t)plan[9 * k + 7] * (size_t)plan[9 * k + 8];
    if (cells > largest) largest = cells;
  }
  int32_t *out = malloc(largest * sizeof(int32_t));
  double best = INFINITY;
  uint64_t checksum = 0;
  for (int r = 0; r < repeats; r++) {
    uint64_t sum = 0;
    double start = now_seconds();
    for (size_t k = 0; k < placements; k++) {
      const double *p = plan + 9 * k;
      const double c = p[0], s = p[1], side = p[2], u = p[3], v = p[4];
      const long i0 = (long)p[5], j0 = (long)p[6], nx = (long)p[7], ny = (long)p[8];
      memset(out, 0, (size_t)(nx * ny) * sizeof(int32_t));
      for (size_t q = 0; q < n; q++) {
        const double dx = xy[2 * q], dy = xy[2 * q + 1];
        const long i = (long)floor((dx * c + dy * s) / side - u) - i0;
        const long j = (long)floor((-dx * s + dy * c) / side - v) - j0;
        if (i >= 0 && i < nx && j >= 0 && j < ny) out[j * nx + i]++;
      }
      for (long cell = 0; cell < nx * ny; cell++) sum += (uint64_t)out[cell] * (uint64_t)((cell % 1000003) + 1);
    }
    double elapsed = now_seconds() - start;
    if (elapsed < best) best = elapsed;
    checksum = sum;
  }
  printf("{\"n\":%zu,\"placements\":%zu,\"bestSeconds\":%.9g,\"checksum\":\"%llu\"}\n", n, placements, best,
         (unsigned long long)checksum);
  return 0;
}
