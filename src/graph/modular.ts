/**
 * Multi-prime modular arithmetic for exact big results from float hot loops: primes below 2^26 keep every
 * product of two residues below 2^52, exact in a double; results are rebuilt by the Chinese remainder
 * theorem in BigInt (outside hot loops).
 */
const PRIME_CEILING = 2 ** 26;
const primes: number[] = [];

/** The i-th largest prime below 2^26 (i = 0, 1, …). */
export function modulusPrime(i: number): number {
  let c = primes.length > 0 ? primes[primes.length - 1]! - 2 : PRIME_CEILING - 1;
  while (primes.length <= i) {
    if (isPrime(c)) primes.push(c);
    c -= 2;
  }
  return primes[i]!;
}

function isPrime(n: number): boolean {
  if (n < 2) return false;
  if (n % 2 === 0) return n === 2;
  for (let d = 3; d * d <= n; d += 2) if (n % d === 0) return false;
  return true;
}

/** How many of the primes are needed for their product to exceed `bound` (a positive number). */
export function primesForBound(bound: number): number {
  let k = 0;
  let logP = 0;
  const need = Math.log2(Math.max(bound, 2));
  while (logP <= need + 1) {
    logP += Math.log2(modulusPrime(k));
    k++;
  }
  return k;
}

/** The unique x in [0, Π p_i) with x ≡ residues[i] (mod p_i) for the first residues.length primes. */
export function chineseRemainder(residues: readonly number[]): bigint {
  let x = 0n;
  let m = 1n;
  residues.forEach((r, i) => {
    const p = BigInt(modulusPrime(i));
    // x' = x + m·((r − x)·m⁻¹ mod p)
    const diff = (((BigInt(r) - (x % p)) % p) + p) % p;
    const t = (diff * modInverse(m % p, p)) % p;
    x += m * t;
    m *= p;
  });
  return x;
}

function modInverse(a: bigint, p: bigint): bigint {
  let [r0, r1] = [a, p];
  let [s0, s1] = [1n, 0n];
  while (r1 !== 0n) {
    const q = r0 / r1;
    [r0, r1] = [r1, r0 - q * r1];
    [s0, s1] = [s1, s0 - q * s1];
  }
  return ((s0 % p) + p) % p;
}
