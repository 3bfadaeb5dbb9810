/**
 * Exact integer accumulation beyond 2^53 without BigInt in the common case.
 *
 * The value is big + hi·2^32 + lo with |lo| < 2^52 and |hi| < 2^52 kept as doubles (both exact
 * integers). Adding a term below 2^52 in magnitude costs two float additions; larger terms, products that
 * do not fit, and carries out of `hi` go to the BigInt part, which is rarely touched.
 * Preconditions: every argument is an integer-valued double (safe integer).
 */
export class WideSum {
  private hi = 0;
  private lo = 0;
  private big = 0n;

  add(x: number): void {
    if (x >= LIMIT || x <= -LIMIT) {
      this.big += BigInt(x);
      return;
    }
    let lo = this.lo + x;
    if (lo >= LIMIT || lo <= -LIMIT) {
      const h = Math.trunc(lo / TWO32);
      lo -= h * TWO32;
      let hi = this.hi + h;
      if (hi >= LIMIT || hi <= -LIMIT) {
        this.big += BigInt(hi) << 32n;
        hi = 0;
      }
      this.hi = hi;
    }
    this.lo = lo;
  }

  /** Add x·y exactly. */
  addProduct(x: number, y: number): void {
    const p = x * y;
    if (p < LIMIT && p > -LIMIT) this.add(p);
    else this.big += BigInt(x) * BigInt(y);
  }

  /** Add x·y·z exactly. */
  addProduct3(x: number, y: number, z: number): void {
    const p = x * y * z;
    if (p < LIMIT && p > -LIMIT) this.add(p);
    else this.big += BigInt(x) * BigInt(y) * BigInt(z);
  }

  addBig(x: bigint): void {
    this.big += x;
  }

  value(): bigint {
    return this.big + (BigInt(this.hi) << 32n) + BigInt(this.lo);
  }
}

const LIMIT = 2 ** 52;
const TWO32 = 2 ** 32;

/** A count as JSON: a number when it is a safe integer, else its decimal digits as a string. */
export function countToJson(x: bigint): number | string {
  return x <= BigInt(Number.MAX_SAFE_INTEGER) && x >= -BigInt(Number.MAX_SAFE_INTEGER) ? Number(x) : x.toString();
}
