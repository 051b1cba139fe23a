/*
 * A bound, not a peer: how fast can 128-bit vectors do the D6 workload's arithmetic (the
 * modern softmax network, d = 400, P = 2000; bench/README.md) under the rule the engine's
 * kernel keeps, outputs bit-identical to the plain JavaScript loops? That rule fixes the
 * arithmetic: every overlap x^mu . xi and every entry of sum_mu c_mu x^mu is a sequential sum
 * of doubles in the plain order, one add per term, never a fused multiply-add (JavaScript
 * cannot fuse, and a fused result rounds differently). WebAssembly SIMD128 holds two doubles
 * per vector.
 *
 * This program gives that arithmetic every advantage the engine's kernel does not have: it
 * is compiled by gcc -O3 for SSE2 (128-bit, as WebAssembly SIMD), the +-1 entries are stored
 * as ready 64-bit sign masks (8 bytes an entry, where the engine keeps 1), so each term is one
 * XOR and one add, and 16 sums advance side by side (8 accumulators), more than enough to
 * hide the adds' latency. It runs PASSES passes over the d x P patterns, half overlap passes
 * and half weighted-sum passes, and nothing else: no exponentials, no JavaScript. The report
 * scales its time to the engine's own count of passes in D6.
 *
 * A measuring instrument for bench/run.ts, not part of the product.
 *
 * usage: softmax128 [passes]     prints one JSON line
 */
#include <emmintrin.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <time.h>

enum { D = 400, P = 2000 };

static double seconds(void) {
  struct timespec t;
  clock_gettime(CLOCK_MONOTONIC, &t);
  return (double)t.tv_sec + 1e-9 * (double)t.tv_nsec;
}

int main(int argc, char **argv) {
  int passes = argc > 1 ? atoi(argv[1]) : 350;
  if (passes < 2) passes = 2;
  /* Overlap pass: patterns paired per entry, [mu / 2][i][mu % 2]; weighted sum: rows [mu][i]. */
  uint64_t *pairs = aligned_alloc(64, sizeof(uint64_t) * D * P);
  uint64_t *rows = aligned_alloc(64, sizeof(uint64_t) * D * P);
  double *state = aligned_alloc(64, sizeof(double) * D);
  double *overlaps = aligned_alloc(64, sizeof(double) * P);
  double *sums = aligned_alloc(64, sizeof(double) * D);
  uint64_t x = 1;
  for (int mu = 0; mu < P; mu++) {
    for (int i = 0; i < D; i++) {
      x = x * 6364136223846793005ULL + 1442695040888963407ULL;
      uint64_t sign = (x >> 63) << 63;
      rows[mu * D + i] = sign;
      pairs[(mu / 2) * D * 2 + i * 2 + (mu & 1)] = sign;
    }
  }
  for (int i = 0; i < D; i++) state[i] = (i % 3 ? 0.05 : -0.05);
  double check = 0;
  double t0 = seconds();
  for (int pass = 0; pass < passes / 2; pass++) {
    for (int mb = 0; mb < P; mb += 16) {
      __m128d a[8];
      for (int q = 0; q < 8; q++) a[q] = _mm_setzero_pd();
      for (int i = 0; i < D; i++) {
        __m128d s = _mm_set1_pd(state[i]);
        for (int q = 0; q < 8; q++) {
          __m128i m = _mm_load_si128((const __m128i *)&pairs[(mb / 2 + q) * D * 2 + i * 2]);
          a[q] = _mm_add_pd(a[q], _mm_xor_pd(s, _mm_castsi128_pd(m)));
        }
      }
      for (int q = 0; q < 8; q++) _mm_store_pd(&overlaps[mb + 2 * q], a[q]);
    }
    for (int ib = 0; ib < D; ib += 16) {
      __m128d a[8];
      for (int q = 0; q < 8; q++) a[q] = _mm_setzero_pd();
      for (int mu = 0; mu < P; mu++) {
        __m128d c = _mm_set1_pd(overlaps[mu] * 1e-3);
        for (int q = 0; q < 8; q++) {
          __m128i m = _mm_load_si128((const __m128i *)&rows[mu * D + ib + 2 * q]);
          a[q] = _mm_add_pd(a[q], _mm_xor_pd(c, _mm_castsi128_pd(m)));
        }
      }
      for (int q = 0; q < 8; q++) _mm_store_pd(&sums[ib + 2 * q], a[q]);
    }
    /* The next pass reads a changed state, so no pass can be skipped. */
    state[pass % D] += 1e-3 * sums[pass % D];
    check += overlaps[pass % P];
  }
  double t1 = seconds();
  printf("{\"impl\":\"c\",\"workload\":\"D6\",\"variant\":\"sse2-bound\",\"passes\":%d,\"sim_s\":%.9f,\"check\":%.17g}\n", 2 * (passes / 2), t1 - t0, check);
  return 0;
}
