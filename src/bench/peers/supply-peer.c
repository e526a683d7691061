/*
 * A plain C peer of trimfree's Monte Carlo benchmark, for `npm run bench -- --peers` only (never built by npm, never
 * a test). It runs the bench model of examples/engine/bench-supply.json (an invented CV/CC bench-supply module)
 * with the same statistics as trimfree's bench case: worst case over every vertex of the parts' bands, then the
 * trials in chunks of 65536, each output reduced to moments (two-pass per chunk, merged by Chan, Golub & LeVeque
 * 1983), an 8192-bin histogram over the widened worst-case range and the in-spec count; then from the histogram the
 * percentiles, the probabilistically symmetric and shortest 95 % and 99.73 % intervals (JCGM 101:2008 7.7), the
 * yield and Cp/Cpk (NIST/SEMATECH e-Handbook 6.1.6). Random numbers: xoshiro256+ (Blackman & Vigna 2018), seeded
 * through splitmix64; normal draws by the same inverse CDF as trimfree (Acklam 2003), truncated ones through the
 * same Φ (Numerical Recipes 2nd ed. §6.2 erfcc) and clamped to the band.
 *
 * Input on stdin (written by src/bench/peers.ts from the engine's own Model of the bench design):
 *   trials seed bins chunk theta
 *   voutLo voutHi ilimitLo ilimitHi lossLo lossHi ampLo ampHi
 *   16 lines "kind lo hi k", kind 0 uniform, 1 normal, 2 truncated normal, in the Model's part order
 * Optional argument: a thread count (default 1); thread t runs chunks t, t + T, … with its own stream, and the threads'
 * sums are merged at the end.
 * Output on stdout: one JSON object with the CPU time of the computation (clock(): process CPU time, all threads,
 * after the input is read), its wall time, and each output's figures.
 *
 * Build: gcc -O2 -pthread -o supply-peer supply-peer.c -lm
 */
#include <math.h>
#include <pthread.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

#define PARTS 16
#define OUTPUTS 5
#define MAX_CHUNK 65536

/* Part order of the bench Model (src/analysis/models/supply.ts builds it in this order; peers.ts checks the names). */
enum { T_AMB, VREF, VREF_TC, R1, R1_TCR, R2, R2_TCR, IFB, RS, RS_TCR, VTH, VOS_CMP, VOS_AMP, IB_AMP, RF, RG };

static const char *OUTPUT_NAMES[OUTPUTS] = {"vout", "dividerCurrent", "ilimit", "shuntLoss", "ampOutput"};
static const double PERCENTILES[11] = {0.135, 1, 2.5, 5, 25, 50, 75, 95, 97.5, 99, 99.865};

typedef struct {
  int kind;
  double lo, hi, k;
  double mean, sigma, pLo, span; /* normal kinds: centre, σ; truncated: Φ(α) and Φ(β) − Φ(α) */
} Part;

/* ---- xoshiro256+ (Blackman & Vigna, "Scrambled linear pseudorandom number generators", 2018) ---- */
typedef struct { uint64_t s[4]; } Rng;
static inline uint64_t rotl(uint64_t x, int k) { return (x << k) | (x >> (64 - k)); }
static inline double next_uniform(Rng *g) {
  uint64_t *s = g->s;
  const uint64_t result = s[0] + s[3];
  const uint64_t t = s[1] << 17;
  s[2] ^= s[0];
  s[3] ^= s[1];
  s[1] ^= s[2];
  s[0] ^= s[3];
  s[2] ^= t;
  s[3] = rotl(s[3], 45);
  return (double)(result >> 11) * 0x1.0p-53;
}
static uint64_t splitmix64(uint64_t *x) {
  uint64_t z = (*x += 0x9e3779b97f4a7c15ULL);
  z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9ULL;
  z = (z ^ (z >> 27)) * 0x94d049bb133111ebULL;
  return z ^ (z >> 31);
}

/* ---- Φ⁻¹ (Acklam 2003) and Φ (Numerical Recipes erfcc), as src/tolerance/distributions/normal.ts ---- */
static double inverse_normal(double u) {
  const double p = u > 0 ? u : 0x1.0p-33;
  if (p < 0.02425) {
    const double q = sqrt(-2 * log(p));
    return (((((-7.784894002430293e-3 * q - 3.223964580411365e-1) * q - 2.400758277161838) * q - 2.549732539343734) * q + 4.374664141464968) * q + 2.938163982698783) /
           ((((7.784695709041462e-3 * q + 3.224671290700398e-1) * q + 2.445134137142996) * q + 3.754408661907416) * q + 1);
  }
  if (p <= 1 - 0.02425) {
    const double q = p - 0.5;
    const double r = q * q;
    return (((((-3.969683028665376e1 * r + 2.209460984245205e2) * r - 2.759285104469687e2) * r + 1.38357751867269e2) * r - 3.066479806614716e1) * r + 2.506628277459239) * q /
           (((((-5.447609879822406e1 * r + 1.615858368580409e2) * r - 1.556989798598866e2) * r + 6.680131188771972e1) * r - 1.328068155288572e1) * r + 1);
  }
  const double q = sqrt(-2 * log(1 - p));
  return -(((((-7.784894002430293e-3 * q - 3.223964580411365e-1) * q - 2.400758277161838) * q - 2.549732539343734) * q + 4.374664141464968) * q + 2.938163982698783) /
         ((((7.784695709041462e-3 * q + 3.224671290700398e-1) * q + 2.445134137142996) * q + 3.754408661907416) * q + 1);
}
static double erfc_nr(double x) {
  const double z = fabs(x);
  const double t = 1 / (1 + 0.5 * z);
  const double ans = t * exp(-z * z - 1.26551223 + t * (1.00002368 + t * (0.37409196 + t * (0.09678418 + t * (-0.18628806 + t * (0.27886807 + t * (-1.13520398 + t * (1.48851587 + t * (-0.82215223 + t * 0.17087277)))))))));
  return x >= 0 ? ans : 2 - ans;
}
static double normal_cdf(double z) { return 0.5 * erfc_nr(-z / sqrt(2.0)); }

static inline double draw(const Part *p, double u) {
  switch (p->kind) {
    case 0: return p->lo + (p->hi - p->lo) * u;
    case 1: return p->mean + p->sigma * inverse_normal(u);
    default: {
      const double x = p->mean + p->sigma * inverse_normal(p->pLo + p->span * u);
      return x < p->lo ? p->lo : x > p->hi ? p->hi : x;
    }
  }
}

/* ---- the bench model (src/analysis/models/supply.ts with src/circuits/divider.ts and sense/noninv.ts) ---- */
static double theta;
static inline double noninv_limit(double th, double cmp, double ib, double rf, double gain, double off, double shunt) {
  return ((th - cmp - ib * rf) / gain - off) / shunt;
}
static inline void evaluate(const double *x, double *y) {
  const double dT = x[T_AMB] - 25;
  const double v = x[VREF] * (1 + x[VREF_TC] * dT);
  const double rTop = x[R1] * (1 + x[R1_TCR] * dT);
  const double rBottom = x[R2] * (1 + x[R2_TCR] * dT);
  y[0] = v + rTop * (v / rBottom + x[IFB]);
  y[1] = v / rBottom;
  const double rAmbient = x[RS] * (1 + x[RS_TCR] * dT);
  const double gain = 1 + x[RF] / x[RG];
  double current = noninv_limit(x[VTH], x[VOS_CMP], x[IB_AMP], x[RF], gain, x[VOS_AMP], rAmbient);
  /* Self-heating, closed form (supply.ts hotShunt): R_hot = (R + √(R² + 4·R·α·θ·K²))/2 with K = I·R. */
  const double k = current * rAmbient;
  const double hot = (rAmbient + sqrt(rAmbient * rAmbient + 4 * rAmbient * x[RS_TCR] * theta * k * k)) / 2;
  current = noninv_limit(x[VTH], x[VOS_CMP], x[IB_AMP], x[RF], gain, x[VOS_AMP], hot);
  y[2] = current;
  y[3] = current * current * hot;
  y[4] = gain * (current * hot + x[VOS_AMP]) + x[IB_AMP] * x[RF];
}

/* ---- statistics ---- */
typedef struct {
  double n, mean, m2, min, max, inSpec;
  double lo, hi, scale;
  double *counts; /* bins + 2 */
  double specLo, specHi;
} Acc;

/* Chan, Golub & LeVeque (1983): merge a part's (n, mean, m2) into the running ones. */
static void merge_moments(Acc *a, double n, double mean, double m2) {
  const double total = a->n + n, delta = mean - a->mean;
  a->m2 += m2 + delta * delta * a->n * n / total;
  a->mean += delta * n / total;
  a->n = total;
}

static double coverage_count(double p, double m) {
  const double pm = p * m;
  return pm == floor(pm) ? pm : floor(pm + 0.5);
}
static double symmetric_start(double p, double m) {
  const double q = coverage_count(p, m);
  const double half = (m - q) / 2;
  const double r = half == floor(half) ? half : floor((m - q + 1) / 2);
  return r > 1 ? r : 1;
}
static int bins;
static double *cumulative;
static void make_cumulative(const Acc *a) {
  cumulative[0] = 0;
  for (int b = 0; b < bins + 2; b++) cumulative[b + 1] = cumulative[b] + a->counts[b];
}
static double rank_value(const Acc *a, double rank) {
  int lo = 0, hi = bins + 1;
  while (lo < hi) {
    const int mid = (lo + hi) >> 1;
    if (cumulative[mid + 1] >= rank) hi = mid; else lo = mid + 1;
  }
  const double c = a->counts[lo];
  if (c == 0) return a->max;
  const double width = (a->hi - a->lo) / bins;
  double from, to;
  if (lo == 0) { from = a->min; to = a->lo; }
  else if (lo == bins + 1) { from = a->hi; to = a->max; }
  else { from = a->lo + (lo - 1) * width; to = a->lo + lo * width; }
  return from + ((rank - cumulative[lo] - 0.5) / c) * (to - from);
}
static void shortest(const Acc *a, double p, double *low, double *high) {
  const double m = cumulative[bins + 2];
  const double q = coverage_count(p, m);
  double best = INFINITY, before = 0;
  *low = a->min;
  *high = a->max;
  for (int b = 0; b < bins + 2; b++) {
    const double c = a->counts[b];
    if (c > 0) {
      const double r = before + 1;
      if (r + q > m) break;
      const double l = rank_value(a, r), h = rank_value(a, r + q);
      if (h - l < best) { best = h - l; *low = l; *high = h; }
    }
    before += c;
  }
}

typedef struct {
  int thread, threads, chunk;
  long trials;
  uint64_t seed;
  const Part *parts;
  Acc acc[OUTPUTS];
} Work;

/* One thread's share: chunks thread, thread + threads, …, each reduced as trimfree's chunk runner does. */
static void *run_chunks(void *arg) {
  Work *w = arg;
  Rng g;
  uint64_t seed = w->seed + 0x632be59bd9b4e019ULL * (uint64_t)w->thread;
  for (int i = 0; i < 4; i++) g.s[i] = splitmix64(&seed);
  double x[PARTS], y[OUTPUTS];
  double *out[OUTPUTS];
  for (int o = 0; o < OUTPUTS; o++) out[o] = malloc(sizeof(double) * w->chunk);
  for (long done = (long)w->thread * w->chunk; done < w->trials; done += (long)w->threads * w->chunk) {
    const int n = w->trials - done < w->chunk ? (int)(w->trials - done) : w->chunk;
    for (int j = 0; j < n; j++) {
      for (int i = 0; i < PARTS; i++) x[i] = draw(&w->parts[i], next_uniform(&g));
      evaluate(x, y);
      for (int o = 0; o < OUTPUTS; o++) out[o][j] = y[o];
    }
    for (int o = 0; o < OUTPUTS; o++) {
      Acc *a = &w->acc[o];
      const double *v = out[o];
      double sum = 0, min = INFINITY, max = -INFINITY, inSpec = 0;
      for (int j = 0; j < n; j++) {
        const double t = v[j];
        if (t < min) min = t;
        if (t > max) max = t;
        sum += t;
        const double f = (t - a->lo) * a->scale;
        a->counts[f < 0 ? 0 : f >= bins ? bins + 1 : (int)f + 1] += 1;
        inSpec += t >= a->specLo && t <= a->specHi;
      }
      const double mean = sum / n;
      double sq = 0, dev = 0;
      for (int j = 0; j < n; j++) {
        const double d = v[j] - mean;
        sq += d * d;
        dev += d;
      }
      merge_moments(a, n, mean, fmax(0, sq - dev * dev / n));
      if (min < a->min) a->min = min;
      if (max > a->max) a->max = max;
      a->inSpec += inSpec;
    }
  }
  for (int o = 0; o < OUTPUTS; o++) free(out[o]);
  return NULL;
}

int main(int argc, char **argv) {
  double trialsIn, seedIn, chunkIn;
  double windows[8];
  Part parts[PARTS];
  const int threads = argc > 1 && atoi(argv[1]) > 0 ? atoi(argv[1]) : 1;
  if (scanf("%lf %lf %d %lf %lf", &trialsIn, &seedIn, &bins, &chunkIn, &theta) != 5) return 2;
  for (int i = 0; i < 8; i++) if (scanf("%lf", &windows[i]) != 1) return 2;
  for (int i = 0; i < PARTS; i++) {
    if (scanf("%d %lf %lf %lf", &parts[i].kind, &parts[i].lo, &parts[i].hi, &parts[i].k) != 4) return 2;
    Part *p = &parts[i];
    p->mean = (p->lo + p->hi) / 2;
    p->sigma = (p->hi - p->lo) / 2 / p->k;
    if (p->kind == 2) {
      p->pLo = normal_cdf((p->lo - p->mean) / p->sigma);
      p->span = normal_cdf((p->hi - p->mean) / p->sigma) - p->pLo;
    }
  }
  const long trials = (long)trialsIn;
  const int chunk = (int)chunkIn > MAX_CHUNK ? MAX_CHUNK : (int)chunkIn;
  const clock_t start = clock();
  struct timespec wallStart, wallEnd;
  clock_gettime(CLOCK_MONOTONIC, &wallStart);

  /* Worst case: every vertex of the bands. */
  double wcMin[OUTPUTS], wcMax[OUTPUTS], x[PARTS], y[OUTPUTS];
  for (int o = 0; o < OUTPUTS; o++) { wcMin[o] = INFINITY; wcMax[o] = -INFINITY; }
  for (long vertex = 0; vertex < (1L << PARTS); vertex++) {
    for (int i = 0; i < PARTS; i++) x[i] = (vertex >> i) & 1 ? parts[i].hi : parts[i].lo;
    evaluate(x, y);
    for (int o = 0; o < OUTPUTS; o++) {
      if (y[o] < wcMin[o]) wcMin[o] = y[o];
      if (y[o] > wcMax[o]) wcMax[o] = y[o];
    }
  }

  const int specOf[OUTPUTS] = {0, -1, 1, 2, 3};
  Work *work = calloc(threads, sizeof(Work));
  pthread_t *ids = calloc(threads, sizeof(pthread_t));
  for (int t = 0; t < threads; t++) {
    work[t].thread = t;
    work[t].threads = threads;
    work[t].chunk = chunk;
    work[t].trials = trials;
    work[t].seed = (uint64_t)seedIn;
    work[t].parts = parts;
    for (int o = 0; o < OUTPUTS; o++) {
      const double span = wcMax[o] - wcMin[o];
      const double pad = span > 0 ? span / 2 : fmax(fabs(wcMin[o]) * 1e-9, 1e-300);
      Acc *a = &work[t].acc[o];
      *a = (Acc){0, 0, 0, INFINITY, -INFINITY, 0, wcMin[o] - pad, wcMax[o] + pad, 0, calloc(bins + 2, sizeof(double)), -INFINITY, INFINITY};
      a->scale = bins / (a->hi - a->lo);
      if (specOf[o] >= 0) { a->specLo = windows[2 * specOf[o]]; a->specHi = windows[2 * specOf[o] + 1]; }
    }
    if (t > 0) pthread_create(&ids[t], NULL, run_chunks, &work[t]);
  }
  run_chunks(&work[0]);
  Acc *acc = work[0].acc;
  for (int t = 1; t < threads; t++) {
    pthread_join(ids[t], NULL);
    for (int o = 0; o < OUTPUTS; o++) {
      const Acc *b = &work[t].acc[o];
      if (b->n == 0) continue;
      merge_moments(&acc[o], b->n, b->mean, b->m2);
      if (b->min < acc[o].min) acc[o].min = b->min;
      if (b->max > acc[o].max) acc[o].max = b->max;
      acc[o].inSpec += b->inSpec;
      for (int i = 0; i < bins + 2; i++) acc[o].counts[i] += b->counts[i];
    }
  }
  cumulative = calloc(bins + 3, sizeof(double));

  /* Figures from the histogram, as src/analysis/statistics/histogram.ts reads them. */
  double percentiles[OUTPUTS][11], sym[OUTPUTS][4], sho[OUTPUTS][4], sigma[OUTPUTS];
  for (int o = 0; o < OUTPUTS; o++) {
    Acc *a = &acc[o];
    make_cumulative(a);
    const double m = a->n;
    for (int i = 0; i < 11; i++) {
      double r = ceil(PERCENTILES[i] / 100 * m);
      percentiles[o][i] = rank_value(a, r < 1 ? 1 : r > m ? m : r);
    }
    const double ps[2] = {0.95, 0.9973};
    for (int i = 0; i < 2; i++) {
      const double q = coverage_count(ps[i], m), r = symmetric_start(ps[i], m);
      sym[o][2 * i] = rank_value(a, r);
      sym[o][2 * i + 1] = rank_value(a, r + q < m ? r + q : m);
      shortest(a, ps[i], &sho[o][2 * i], &sho[o][2 * i + 1]);
    }
    sigma[o] = sqrt(a->m2 / (a->n - 1));
  }
  const double cpu = (double)(clock() - start) / CLOCKS_PER_SEC;
  clock_gettime(CLOCK_MONOTONIC, &wallEnd);
  const double wall = (double)(wallEnd.tv_sec - wallStart.tv_sec) + 1e-9 * (double)(wallEnd.tv_nsec - wallStart.tv_nsec);

  printf("{\"runner\":\"c\",\"trials\":%ld,\"threads\":%d,\"cpuSeconds\":%.6f,\"wallSeconds\":%.6f,\"outputs\":{", trials, threads, cpu, wall);
  for (int o = 0; o < OUTPUTS; o++) {
    Acc *a = &acc[o];
    printf("%s\"%s\":{\"mean\":%.17g,\"sigma\":%.17g,\"min\":%.17g,\"max\":%.17g,\"worstCase\":[%.17g,%.17g],\"median\":%.17g,\"interval95\":[%.17g,%.17g],\"interval9973\":[%.17g,%.17g],\"shortest95\":[%.17g,%.17g],\"shortest9973\":[%.17g,%.17g]",
           o ? "," : "", OUTPUT_NAMES[o], a->mean, sigma[o], a->min, a->max, wcMin[o], wcMax[o], percentiles[o][5], sym[o][0], sym[o][1], sym[o][2], sym[o][3], sho[o][0], sho[o][1], sho[o][2], sho[o][3]);
    if (specOf[o] >= 0) {
      const double cp = (a->specHi - a->specLo) / (6 * sigma[o]);
      const double cpk = fmin(a->specHi - a->mean, a->mean - a->specLo) / (3 * sigma[o]);
      printf(",\"yieldPct\":%.17g,\"cp\":%.17g,\"cpk\":%.17g", 100 * a->inSpec / a->n, cp, cpk);
    }
    printf("}");
  }
  printf("}}\n");
  return 0;
}
