/**
 * Success probabilities of information-set methods for one fixed word of weight w in a code of length n
 * and dimension k, over the random choice of information set (the standard model: the information set is
 * a uniformly random k-subset of the columns).
 */

/** ln C(n, r), exact for small values and via lgamma-free summation (no overflow). */
export function logChoose(n: number, r: number): number {
  if (r < 0 || r > n) return -Infinity;
  r = Math.min(r, n - r);
  let s = 0;
  for (let i = 1; i <= r; i++) s += Math.log((n - r + i) / i);
  return s;
}

export function choose(n: number, r: number): number {
  return Math.exp(logChoose(n, r));
}

/** Hypergeometric P(|word ∩ I| = i) for a word of weight w and a random k-subset I of n columns. */
export function hypergeometric(n: number, k: number, w: number, i: number): number {
  return Math.exp(logChoose(w, i) + logChoose(n - w, k - i) - logChoose(n, k));
}

/** Lee–Brickell with parameter p: the word is found when it has at most p ones on the information set. */
export function leeBrickellSuccess(n: number, k: number, w: number, p: number): number {
  let s = 0;
  for (let i = 0; i <= Math.min(p, w); i++) s += hypergeometric(n, k, w, i);
  return Math.min(1, s);
}

/**
 * Stern with up to p ones on each half of the information set (sizes k1, k2 = k − k1) and zero on a
 * window of l further columns.
 */
export function sternSuccess(n: number, k: number, w: number, p: number, l: number): number {
  const k1 = Math.floor(k / 2);
  const k2 = k - k1;
  const total = logChoose(n, w);
  let s = 0;
  for (let a = 0; a <= p; a++) {
    for (let b = 0; b <= p; b++) {
      if (a + b === 0 || a + b > w) continue;
      s += Math.exp(logChoose(k1, a) + logChoose(k2, b) + logChoose(n - k - l, w - a - b) - total);
    }
  }
  return Math.min(1, s);
}

/**
 * Miss probability of one word of weight w over one run of the Canteaut–Chabaud chain that visits
 * `visits` information sets: a fresh random one, then visits − 1 single-column swaps, with Lee–Brickell
 * parameter p checked at every information set. The state is i = |word ∩ I|; a swap removes a uniform
 * column of I and adds a uniform column outside it, so i moves down with probability (i/k)·(1 − (w−i)/(n−k)),
 * up with (1 − i/k)·(w−i)/(n−k), else stays. States i ≤ p are hits (absorbed).
 */
export function segmentMissProbability(n: number, k: number, w: number, p: number, visits: number): number {
  if (visits <= 0) return 1;
  if (w <= p) return 0;
  const top = Math.min(w, k);
  let cur = new Float64Array(top + 1);
  let nxt = new Float64Array(top + 1);
  for (let i = p + 1; i <= top; i++) cur[i] = hypergeometric(n, k, w, i);
  for (let s = 1; s < visits; s++) {
    nxt.fill(0);
    for (let i = p + 1; i <= top; i++) {
      const m = cur[i]!;
      if (m === 0) continue;
      const out = i / k;
      const inn = n - k > 0 ? (w - i) / (n - k) : 0;
      const down = out * (1 - inn);
      const up = (1 - out) * inn;
      nxt[i] = nxt[i]! + m * (1 - down - up);
      nxt[i - 1] = nxt[i - 1]! + m * down;
      if (i + 1 <= top) nxt[i + 1] = nxt[i + 1]! + m * up;
    }
    for (let i = 0; i <= p; i++) nxt[i] = 0;
    const t = cur;
    cur = nxt;
    nxt = t;
  }
  let miss = 0;
  for (let i = p + 1; i <= top; i++) miss += cur[i]!;
  return Math.max(0, Math.min(1, miss));
}
