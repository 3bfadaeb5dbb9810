/* Reference C kernel for the search benchmark: the same information-set step as src/search/isd.ts
 * (random column order, Gauss–Jordan to systematic form, Lee–Brickell p = 2 with early-exit popcount).
 * Hits go into a deduplicating hash set like the JS kernel's word store.
 * Input on stdin: k n W iterations, then k*stride 32-bit words of the generator. Prints hits and seconds. */
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

static uint32_t s0 = 1, s1 = 2, s2 = 3, s3 = 4;
static uint32_t rotl(uint32_t x, int k) { return (x << k) | (x >> (32 - k)); }
static uint32_t next(void) {
  uint32_t r = rotl(s1 * 5, 7) * 9, t = s1 << 9;
  s2 ^= s0; s3 ^= s1; s1 ^= s2; s0 ^= s3; s2 ^= t; s3 = rotl(s3, 11);
  return r;
}
static uint32_t below(uint32_t n) { return (uint32_t)(((uint64_t)next() * n) >> 32); }

/* The same deduplication as the JS kernel: an open-addressing set of packed words. */
static uint32_t *arena; static int *table; static int nwords = 0, tmask = (1 << 20) - 1, S;
static int store_add(const uint32_t *v) {
  uint32_t h = 0x811c9dc5u;
  for (int i = 0; i < S; i++) { h = (h ^ v[i]) * 0x01000193u; h ^= h >> 15; }
  int slot = h & tmask;
  for (;;) {
    int idx = table[slot];
    if (idx < 0) break;
    if (memcmp(arena + (size_t)idx * S, v, sizeof(uint32_t) * S) == 0) return 0;
    slot = (slot + 1) & tmask;
  }
  memcpy(arena + (size_t)nwords * S, v, sizeof(uint32_t) * S);
  table[slot] = nwords++;
  return 1;
}

int main(void) {
  int k, n, W, iters;
  if (scanf("%d %d %d %d", &k, &n, &W, &iters) != 4) return 1;
  int s = (n + 31) / 32;
  uint32_t *g = malloc(sizeof(uint32_t) * k * s), *m = malloc(sizeof(uint32_t) * k * s);
  for (int i = 0; i < k * s; i++) if (scanf("%u", &g[i]) != 1) return 1;
  int *order = malloc(sizeof(int) * n);
  S = s;
  arena = malloc(sizeof(uint32_t) * (size_t)s * (1 << 19));
  table = malloc(sizeof(int) * (1 << 20));
  for (int i = 0; i < (1 << 20); i++) table[i] = -1;
  uint32_t *tmp = malloc(sizeof(uint32_t) * s);
  long hits = 0;
  struct timespec t0, t1;
  clock_gettime(CLOCK_MONOTONIC, &t0);
  for (int it = 0; it < iters; it++) {
    memcpy(m, g, sizeof(uint32_t) * k * s);
    for (int i = 0; i < n; i++) order[i] = i;
    for (int i = n - 1; i > 0; i--) { int j = below(i + 1), t = order[i]; order[i] = order[j]; order[j] = t; }
    int r = 0;
    for (int oi = 0; oi < n && r < k; oi++) {
      int c = order[oi], w = c >> 5; uint32_t bit = 1u << (c & 31); int p = -1;
      for (int i = r; i < k; i++) if (m[i * s + w] & bit) { p = i; break; }
      if (p < 0) continue;
      if (p != r) for (int x = 0; x < s; x++) { uint32_t t = m[r * s + x]; m[r * s + x] = m[p * s + x]; m[p * s + x] = t; }
      for (int i = 0; i < k; i++) if (i != r && (m[i * s + w] & bit)) for (int x = 0; x < s; x++) m[i * s + x] ^= m[r * s + x];
      r++;
    }
    for (int a = 0; a < k; a++) {
      int wt = 0;
      for (int x = 0; x < s && wt <= W; x++) wt += __builtin_popcount(m[a * s + x]);
      if (wt <= W) { hits++; store_add(m + a * s); }
      for (int b = a + 1; b < k; b++) {
        /* same filter as the JS kernel: words 0 and 1 first */
        int w2 = __builtin_popcount(m[a * s] ^ m[b * s]) + (s > 1 ? __builtin_popcount(m[a * s + 1] ^ m[b * s + 1]) : 0);
        if (w2 > W) continue;
        for (int x = 2; x < s && w2 <= W; x++) w2 += __builtin_popcount(m[a * s + x] ^ m[b * s + x]);
        if (w2 <= W) { hits++; for (int x = 0; x < s; x++) tmp[x] = m[a * s + x] ^ m[b * s + x]; store_add(tmp); }
      }
    }
  }
  clock_gettime(CLOCK_MONOTONIC, &t1);
 printf("%ld %.6f\n", hits, (t1.tv_sec - t0.tv_sec) + 1e-9 * (t1.tv_nsec - t0.tv_nsec));
  return 0;
}
