/*
 * C peer for the Glauber workload G1 (bench/README.md): Hebbian network held in overlap
 * space (int16 overlaps m_mu, patterns neuron-major as int16 so the field is a multiply-add
 * dot product the compiler vectorises), asynchronous Glauber dynamics
 *   s_i <- +1  iff  u * (1 + exp(factor * h_i)) < 1,  factor = -2 (1/N) / T,
 * on the canonical xoshiro256** stream the engine draws (WORKLOADS.md section 7): patterns,
 * then per trial the cue, then per sweep the Fisher-Yates shuffle followed by one uniform per
 * visit. Same decisions as the engine, so the outputs can be compared.
 *
 * Variants: "exp"   one libm exp per visit (the textbook loop);
 *           "table" 1 + exp(factor*h) memoised per integer field h (computed on first use).
 * A measuring instrument for bench/run.ts, not part of the product.
 *
 * usage: glauber exp|table [seed]     prints one JSON line
 */
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

enum { NEURONS = 1000, PATTERNS = 50, TRIALS = 100, FLIPS = 100, SWEEPS = 20, BURN_IN = 10 };
static const double TEMPERATURE = 0.4;

typedef struct { uint64_t s[4]; } stream_t;

static uint64_t splitmix_next(uint64_t *x) {
  uint64_t z = (*x += 0x9E3779B97F4A7C15ULL);
  z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9ULL;
  z = (z ^ (z >> 27)) * 0x94D049BB133111EBULL;
  return z ^ (z >> 31);
}

static uint64_t rol64(uint64_t x, int k) { return (x << k) | (x >> (64 - k)); }

static uint64_t draw(stream_t *g) {
  uint64_t *s = g->s;
  uint64_t out = rol64(s[1] * 5, 7) * 9, t = s[1] << 17;
  s[2] ^= s[0]; s[3] ^= s[1]; s[1] ^= s[2]; s[0] ^= s[3];
  s[2] ^= t; s[3] = rol64(s[3], 45);
  return out;
}

static uint32_t draw_below(stream_t *g, uint32_t n) { return (uint32_t)(((__uint128_t)draw(g) * n) >> 64); }
static double draw_uniform(stream_t *g) { return (double)(draw(g) >> 11) * 0x1p-53; }

static double seconds(void) {
  struct timespec ts;
  clock_gettime(CLOCK_MONOTONIC, &ts);
  return ts.tv_sec + ts.tv_nsec * 1e-9;
}

int main(int argc, char **argv) {
  if (argc < 2 || (strcmp(argv[1], "exp") && strcmp(argv[1], "table"))) {
    fprintf(stderr, "usage: %s exp|table [seed]\n", argv[0]);
    return 2;
  }
  const int tabulated = !strcmp(argv[1], "table");
  const uint64_t seed = argc > 2 ? strtoull(argv[2], 0, 10) : 1;
  const int n = NEURONS, p = PATTERNS;
  stream_t g;
  uint64_t x = seed;
  for (int k = 0; k < 4; k++) g.s[k] = splitmix_next(&x);

  int8_t *xi = malloc((size_t)n * p);          /* pattern-major, xi[mu*n + i] */
  int16_t *rows = malloc(sizeof(int16_t) * (size_t)n * p); /* neuron-major, rows[i*p + mu] */
  int16_t *m = malloc(sizeof(int16_t) * p);
  int8_t *s = malloc(n);
  uint32_t *order = malloc(sizeof(uint32_t) * n), *idx = malloc(sizeof(uint32_t) * n);
  /* |h| <= p (n + 1): the memo covers every field the dynamics can meet. */
  const int half = p * (n + 1);
  double *memo = tabulated ? calloc(2 * (size_t)half + 1, sizeof(double)) : NULL;

  double t0 = seconds();
  for (int mu = 0; mu < p; mu++)
    for (int i0 = 0; i0 < n; i0 += 64) {
      uint64_t bits = draw(&g);
      for (int k = 0; k < 64 && i0 + k < n; k++) xi[(size_t)mu * n + i0 + k] = ((bits >> k) & 1) ? 1 : -1;
    }
  for (int mu = 0; mu < p; mu++)
    for (int i = 0; i < n; i++) rows[(size_t)i * p + mu] = xi[(size_t)mu * n + i];
  const double factor = -2.0 * (1.0 / n) / TEMPERATURE;
  double t1 = seconds();

  double sum = 0, sum_sq = 0;
  for (int t = 0; t < TRIALS; t++) {
    const int target = t % p;
    memcpy(s, xi + (size_t)target * n, n);
    for (int i = 0; i < n; i++) idx[i] = (uint32_t)i;
    for (int k = 0; k < FLIPS; k++) {
      uint32_t j = k + draw_below(&g, (uint32_t)(n - k)), c = idx[j];
      idx[j] = idx[k]; idx[k] = c;
      s[c] = (int8_t)-s[c];
    }
    for (int mu = 0; mu < p; mu++) {
      int32_t acc = 0;
      for (int i = 0; i < n; i++) acc += xi[(size_t)mu * n + i] * s[i];
      m[mu] = (int16_t)acc;
    }
    for (int i = 0; i < n; i++) order[i] = (uint32_t)i;
    double sampled = 0;
    for (int sweep = 1; sweep <= SWEEPS; sweep++) {
      for (int i = n - 1; i > 0; i--) {
        uint32_t j = draw_below(&g, (uint32_t)i + 1), c = order[i];
        order[i] = order[j]; order[j] = c;
      }
      for (int k = 0; k < n; k++) {
        const int i = (int)order[k];
        const int16_t *restrict row = rows + (size_t)i * p;
        int32_t h = 0;
        for (int mu = 0; mu < p; mu++) h += (int32_t)row[mu] * m[mu];
        h -= p * s[i];
        const double u = draw_uniform(&g);
        double e;
        if (tabulated) {
          double *slot = memo + (h + half);
          if (*slot == 0) *slot = 1 + exp(factor * h);
          e = *slot;
        } else {
          e = 1 + exp(factor * h);
        }
        const int8_t v = u * e < 1 ? 1 : -1;
        if (v != s[i]) {
          s[i] = v;
          const int16_t d = (int16_t)(2 * v);
          for (int mu = 0; mu < p; mu++) m[mu] += d * row[mu];
        }
      }
      if (sweep > BURN_IN) sampled += (double)m[target] / n;
    }
    const double overlap = sampled / (SWEEPS - BURN_IN);
    sum += overlap;
    sum_sq += overlap * overlap;
  }
  double t2 = seconds();
  const double mean = sum / TRIALS, sim = t2 - t1;
  const long long updates = (long long)TRIALS * SWEEPS * n;
  printf("{\"impl\":\"c\",\"workload\":\"G1\",\"variant\":\"%s\",\"seed\":%llu,\"N\":%d,\"P\":%d,\"trials\":%d,"
         "\"mean_overlap\":%.6f,\"sd_overlap\":%.6f,\"mean_sweeps\":%d,\"updates\":%lld,\"build_s\":%.6f,"
         "\"sim_s\":%.6f,\"total_s\":%.6f,\"trials_per_s\":%.3f,\"updates_per_s\":%.4e}\n",
         argv[1], (unsigned long long)seed, n, p, TRIALS, mean,
         sqrt((sum_sq - sum * mean) / (TRIALS - 1)), SWEEPS, updates, t1 - t0, sim, t2 - t0, TRIALS / sim, updates / sim);
  free(xi); free(rows); free(m); free(s); free(order); free(idx); free(memo);
  return 0;
}
