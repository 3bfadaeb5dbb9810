import type { BitMatrix } from '../gf2/bitmatrix.js';
import { packedDot } from '../gf2/popcount.js';
import type { ErrorSamples } from './error-samples.js';

/** What became of one decoded shot. */
export const DECODED = 0;
/** The residual e + ê has a nonzero syndrome on the code's own checks. */
export const SYNDROME_NOT_MATCHED = 1;
/** The residual has zero syndrome but anticommutes with a logical operator: a logical error. */
export const LOGICAL_ERROR = 2;

/**
 * Classifies residuals against the code (HX, HZ and logical bases LX, LZ): the residual is harmless exactly
 * when it has zero syndrome and commutes with every logical operator, i.e. when it is a stabilizer.
 * The X part rx must satisfy HZ·rx = 0 and LZ·rx = 0; the Z part rz, HX·rz = 0 and LX·rz = 0.
 */
export class ResidualCheck {
  private readonly rx: Uint32Array;
  private readonly rz: Uint32Array;

  constructor(
    readonly hx: BitMatrix,
    readonly hz: BitMatrix,
    readonly lx: BitMatrix,
    readonly lz: BitMatrix,
  ) {
    this.rx = new Uint32Array(hx.stride);
    this.rz = new Uint32Array(hx.stride);
  }

  /** Outcome of correcting shot `shot` of `samples` by (cx, cz) (one byte per qubit). Allocation-free. */
  classify(samples: ErrorSamples, shot: number, cx: Uint8Array, cz: Uint8Array): number {
    const { rx, rz } = this;
    const stride = samples.stride;
    const off = shot * stride;
    for (let w = 0; w < stride; w++) {
      rx[w] = samples.ex[off + w]!;
      rz[w] = samples.ez[off + w]!;
    }
    const n = samples.n;
    for (let j = 0; j < n; j++) {
      const bit = 1 << (j & 31);
      if (cx[j]) rx[j >>> 5] = rx[j >>> 5]! ^ bit;
      if (cz[j]) rz[j >>> 5] = rz[j >>> 5]! ^ bit;
    }
    if (anyParity(this.hz, rx) || anyParity(this.hx, rz)) return SYNDROME_NOT_MATCHED;
    if (anyParity(this.lz, rx) || anyParity(this.lx, rz)) return LOGICAL_ERROR;
    return DECODED;
  }
}

function anyParity(m: BitMatrix, v: Uint32Array): boolean {
  for (let r = 0; r < m.rows; r++) if (packedDot(m.data, r * m.stride, v, 0, m.stride)) return true;
  return false;
}
