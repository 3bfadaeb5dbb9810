/*
 * Reference C implementation of the flooding BP update used by src/decode (check-rules.ts, bp2.ts, bp4.ts):
 * the same edge layout (CSR in check order), the same formulas (sum-product on likelihood ratios, one division
 * per edge for the reply, or scaled min-sum on LLRs; BP4 variable update rational in the ratio domain,
 * one exp and one log per qubit part on LLRs, reused while that part's sum repeats; BP4's starting state
 * computed once), the same clamps, the same early stop: every saving of the TypeScript kernels is made here
 * too. Used only by scripts/bench/trial.ts to measure how far the TypeScript kernel is from C.
 *
 * Input file (little endian), written by the bench:
 *   int32 kind (0 = bp2, 1 = bp4), rule (0 = sum-product, 1 = min-sum), iterations, earlyStop, n, mx, mz,
 *         shots, edgesX, edgesZ
 *   float64 scale, p, prior LLR and ratio (bp2), pI pX pY pZ, their logs, clamp LLR and ratio of the DX graph,
 *           of the DZ graph and of the stacked BP4 graph (all computed by the bench, so both sides use the
 *           very same constants)
 *   int32 checkStartX[mx+1], edgeVarX[edgesX], checkStartZ[mz+1], edgeVarZ[edgesZ]
 *   uint8 syndromes[shots*(mx+mz)]  (DX rows then DZ rows per shot)
 * Prints: CPU seconds of the decoding loop, edge updates, a checksum of the decisions.
 * Build: gcc -O2 -o bp-kernel bp-kernel.c -lm
 */
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

typedef struct {
  int checks, vars, edges;
  int32_t *start, *var;
  double maxLlr, maxRatio;
} graph;

static double *xs, *ts;

/* leave-one-out replies by forward/backward sweeps, in place (t on entry) */
static void leave_one_out(double *a, int d, int flip) {
  double forward = flip ? -1 : 1;
  for (int k = 0; k < d; k++) { double tk = a[k]; ts[k] = tk; a[k] = forward; forward *= tk; }
  double backward = 1;
  for (int k = d - 1; k >= 0; k--) { double y = a[k] * backward; a[k] = (1 + y) / (1 - y); backward *= ts[k]; }
}

/* sum-product pass in the ratio domain: t = (P - C)/(P + C), reply (t + T)/(t - T) with T the signed product, products at variables */
static void sp_pass(const graph *g, const double *post, double *c2v, double *prod, const uint8_t *syn) {
  const double maxR = g->maxRatio, minR = 1 / g->maxRatio;
  const int32_t *start = g->start, *var = g->var;
  int e0 = 0;
  for (int c = 0; c < g->checks; c++) {
    const int e1 = start[c + 1];
    double total = syn[c] ? -1 : 1;
    int e = e0;
    for (; e + 1 < e1; e += 2) { /* same pairing (and rounding) as the TypeScript kernel */
      double p0 = post[var[e]], m0 = c2v[e], p1 = post[var[e + 1]], m1 = c2v[e + 1];
      double t0 = (p0 - m0) / (p0 + m0), t1 = (p1 - m1) / (p1 + m1);
      c2v[e] = t0;
      c2v[e + 1] = t1;
      total *= t0 * t1;
    }
    if (e < e1) {
      double p0 = post[var[e]], m0 = c2v[e];
      double t0 = (p0 - m0) / (p0 + m0);
      c2v[e] = t0;
      total *= t0;
    }
    if (total == 0) {
      leave_one_out(c2v + e0, e1 - e0, syn[c]);
      for (e = e0; e < e1; e++) {
        double r = c2v[e];
        r = r > maxR ? maxR : r < minR ? minR : r;
        c2v[e] = r;
        prod[var[e]] *= r;
      }
    } else {
      for (e = e0; e < e1; e++) { /* |T| <= |t_k|, so (|t|+u)/(|t|-u) = (t+T)/(t-T), a zero denominator saturating */
        double tk = c2v[e];
        double den = tk - total;
        double r = den != 0 ? (tk + total) / den : maxR;
        r = r > maxR ? maxR : r < minR ? minR : r;
        c2v[e] = r;
        prod[var[e]] *= r;
      }
    }
    e0 = e1;
  }
}

/* scaled min-sum pass on LLRs */
static void ms_pass(const graph *g, const double *post, double *c2v, double *sums, const uint8_t *syn, double scale) {
  const double maxLlr = g->maxLlr;
  for (int c = 0; c < g->checks; c++) {
    const int e0 = g->start[c], d = g->start[c + 1] - e0;
    double min1 = INFINITY, min2 = INFINITY;
    int arg = -1, sign = syn[c];
    for (int k = 0; k < d; k++) {
      double v = post[g->var[e0 + k]] - c2v[e0 + k], a = v;
      xs[k] = v;
      if (v < 0) { sign ^= 1; a = -v; }
      if (a < min1) { min2 = min1; min1 = a; arg = k; } else if (a < min2) min2 = a;
    }
    double m1 = scale * min1, m2 = scale * min2;
    if (m1 > maxLlr) m1 = maxLlr;
    if (m2 > maxLlr) m2 = maxLlr;
    for (int k = 0; k < d; k++) {
      double mag = k == arg ? m2 : m1;
      double m = (sign ^ (xs[k] < 0)) ? -mag : mag;
      c2v[e0 + k] = m;
      sums[g->var[e0 + k]] += m;
    }
  }
}

static int matches(const graph *g, const uint8_t *hard, const uint8_t *syn) {
  for (int c = 0; c < g->checks; c++) {
    int p = syn[c];
    for (int e = g->start[c]; e < g->start[c + 1]; e++) p ^= hard[g->var[e]];
    if (p) return 0;
  }
  return 1;
}

/* binary BP; prior is the ratio (sum-product) or the LLR (min-sum); returns iterations run */
static int bp2(const graph *g, const uint8_t *syn, double prior, int iters, int early, int minsum, double scale,
               double *c2v, double *post, double *acc, uint8_t *hard) {
  const double unit = minsum ? 0 : 1;
  for (int e = 0; e < g->edges; e++) c2v[e] = unit;
  for (int v = 0; v < g->vars; v++) { post[v] = prior; hard[v] = prior < unit; }
  int it = 0;
  if (early && matches(g, hard, syn)) return 0;
  while (it < iters) {
    if (minsum) {
      memset(acc, 0, sizeof(double) * g->vars);
      ms_pass(g, post, c2v, acc, syn, scale);
      for (int v = 0; v < g->vars; v++) { post[v] = prior + acc[v]; hard[v] = post[v] < 0; }
    } else {
      for (int v = 0; v < g->vars; v++) acc[v] = 1;
      sp_pass(g, post, c2v, acc, syn);
      for (int v = 0; v < g->vars; v++) { post[v] = prior * acc[v]; hard[v] = post[v] < 1; }
    }
    it++;
    if (early && matches(g, hard, syn)) break;
  }
  return it;
}

/* log term of one qubit part given the other part's LLR sum s (see bp4.ts logTerm) */
static double log_term(double s, double p0, double p1, double q0, double q1) {
  if (s >= 0) { double u = exp(-s); return log((p0 + p1 * u) / (q0 + q1 * u)); }
  double u = exp(s);
  return log((p0 * u + p1) / (q0 * u + q1));
}

/* beliefs and decisions of every qubit from the sums acc (what bp4.ts does after each pass); memo (4n, min-sum):
   the last sum seen by each part and its log term, reused while the sum repeats exactly */
static void bp4_refresh(int n, const double *pr, const double *lp, int minsum, const double *acc, double *post,
                        uint8_t *hard, double *memo) {
  const double pI = pr[0], pX = pr[1], pY = pr[2], pZ = pr[3];
  for (int j = 0; j < n; j++) {
    double a = acc[j], b = acc[n + j];
    int x = 0, z = 0;
    if (!minsum) {
      post[j] = a * (b >= 1 ? (pI + pX / b) / (pZ + pY / b) : (pI * b + pX) / (pZ * b + pY));
      post[n + j] = b * (a >= 1 ? (pI + pZ / a) / (pX + pY / a) : (pI * a + pZ) / (pX * a + pY));
      double best = pI * a * b, wX = pX * a, wZ = pZ * b;
      if (wX > best) { best = wX; x = 1; }
      if (wZ > best) { best = wZ; x = 0; z = 1; }
      if (pY > best) { x = 1; z = 1; }
    } else {
      double *m = memo + 4 * j;
      if (b != m[0]) { m[0] = b; m[1] = log_term(b, pI, pX, pZ, pY); }
      if (a != m[2]) { m[2] = a; m[3] = log_term(a, pI, pZ, pX, pY); }
      post[j] = m[1] + a;
      post[n + j] = m[3] + b;
      double best = lp[0], sx = lp[1] - b, sz = lp[3] - a, sy = lp[2] - a - b;
      if (sx > best) { best = sx; x = 1; }
      if (sz > best) { best = sz; x = 0; z = 1; }
      if (sy > best) { x = 1; z = 1; }
    }
    hard[j] = z;
    hard[n + j] = x;
  }
}

/* post0/hard0: the state for neutral sums, computed once (bp4.ts: setPrior) */
static int bp4(const graph *g, int n, const uint8_t *syn, const double *post0, const uint8_t *hard0, const double *pr,
               const double *lp, int iters, int early, int minsum, double scale, double *c2v, double *post, double *acc,
               uint8_t *hard, double *memo) {
  const double unit = minsum ? 0 : 1;
  for (int e = 0; e < g->edges; e++) c2v[e] = unit;
  memcpy(post, post0, sizeof(double) * 2 * n);
  memcpy(hard, hard0, 2 * n);
  int it = 0;
  for (;;) {
    if (early && matches(g, hard, syn)) break;
    if (it == iters) break;
    if (minsum) {
      memset(acc, 0, sizeof(double) * 2 * n);
      ms_pass(g, post, c2v, acc, syn, scale);
    } else {
      for (int v = 0; v < 2 * n; v++) acc[v] = 1;
      sp_pass(g, post, c2v, acc, syn);
    }
    it++;
    bp4_refresh(n, pr, lp, minsum, acc, post, hard, memo);
  }
  return it;
}

static double now(void) {
  struct timespec t;
  clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &t);
  return t.tv_sec + 1e-9 * t.tv_nsec;
}

static void readn(FILE *f, void *p, size_t size, size_t count) {
  if (fread(p, size, count, f) != count) { fprintf(stderr, "short input\n"); exit(2); }
}

int main(int argc, char **argv) {
  if (argc < 2) { fprintf(stderr, "usage: bp-kernel INPUT\n"); return 2; }
  FILE *f = fopen(argv[1], "rb");
  if (!f) { perror(argv[1]); return 2; }
  int32_t h[10];
  double hd[18];
  readn(f, h, 4, 10);
  readn(f, hd, 8, 18);
  int kind = h[0], rule = h[1], iters = h[2], early = h[3], n = h[4], mx = h[5], mz = h[6], shots = h[7], ex = h[8], ez = h[9];
  double scale = hd[0], prior = hd[2];
  const double *pr = hd + 4, *lp = hd + 8;
  int32_t *sx = malloc(4 * (mx + 1)), *vx = malloc(4 * (ex + 1)), *sz = malloc(4 * (mz + 1)), *vz = malloc(4 * (ez + 1));
  readn(f, sx, 4, mx + 1);
  readn(f, vx, 4, ex);
  readn(f, sz, 4, mz + 1);
  readn(f, vz, 4, ez);
  uint8_t *syn = malloc((size_t)shots * (mx + mz));
  readn(f, syn, 1, (size_t)shots * (mx + mz));
  fclose(f);
  graph gx = {mx, n, ex, sx, vx, hd[12], hd[13]}, gz = {mz, n, ez, sz, vz, hd[14], hd[15]};
  /* stacked graph for BP4: X checks on vars 0..n-1, Z checks on n..2n-1 */
  int32_t *st = malloc(4 * (mx + mz + 1)), *sv = malloc(4 * (ex + ez + 1));
  for (int c = 0; c <= mx; c++) st[c] = sx[c];
  for (int c = 1; c <= mz; c++) st[mx + c] = ex + sz[c];
  for (int e = 0; e < ex; e++) sv[e] = vx[e];
  for (int e = 0; e < ez; e++) sv[ex + e] = n + vz[e];
  graph g4 = {mx + mz, 2 * n, ex + ez, st, sv, hd[16], hd[17]};
  int maxd = 1;
  for (int c = 0; c < g4.checks; c++) if (st[c + 1] - st[c] > maxd) maxd = st[c + 1] - st[c];
  xs = malloc(8 * maxd); ts = malloc(8 * maxd);
  double *c2v = malloc(8 * (ex + ez + 1)), *post = malloc(8 * 2 * n), *sums = malloc(8 * 2 * n);
  uint8_t *hard = malloc(2 * n), *hard0 = malloc(2 * n);
  double *post0 = malloc(8 * 2 * n), *memo = malloc(8 * 4 * n);
  for (int k = 0; k < 4 * n; k++) memo[k] = NAN;
  for (int v = 0; v < 2 * n; v++) sums[v] = rule ? 0 : 1;
  bp4_refresh(n, pr, lp, rule, sums, post0, hard0, memo);
  for (int k = 0; k < 4 * n; k++) memo[k] = NAN;
  long total = 0, check = 0;
  double t0 = now();
  for (int s = 0; s < shots; s++) {
    const uint8_t *ss = syn + (size_t)s * (mx + mz);
    if (kind == 0) {
      int a = bp2(&gx, ss, rule ? prior : hd[3], iters, early, rule, scale, c2v, post, sums, hard);
      for (int v = 0; v < n; v++) check += hard[v] * (v + 1);
      int b = bp2(&gz, ss + mx, rule ? prior : hd[3], iters, early, rule, scale, c2v, post, sums, hard);
      for (int v = 0; v < n; v++) check += hard[v] * (v + 7);
      total += (long)a * ex + (long)b * ez;
    } else {
      total += (long)bp4(&g4, n, ss, post0, hard0, pr, lp, iters, early, rule, scale, c2v, post, sums, hard, memo) * (ex + ez);
      for (int v = 0; v < 2 * n; v++) check += hard[v] * (v + 1);
    }
  }
  double t1 = now();
  printf("%.6f %ld %ld\n", t1 - t0, total, check);
  return 0;
}
