import type { BitMatrix } from '../gf2/bitmatrix.js';
import { BinaryBp } from './bp2.js';
import { QuaternaryBp } from './bp4.js';
import type { BpOptions } from './bp-options.js';
import { type Channel, marginalFlipProbability, pauliProbabilities, priorLlr } from './channel.js';
import { OsdDecoder } from './osd.js';
import { syndromeMatches, tannerEdges } from './tanner-edges.js';

export type DecoderKind = 'bp2' | 'bp4';

/** OSD post-processing: none, order 0, or the combination sweep of order λ. */
export type OsdMethod = { readonly kind: 'none' } | { readonly kind: 'order0' } | { readonly kind: 'sweep'; readonly order: number };

export interface DecoderOptions extends BpOptions {
  readonly decoder: DecoderKind;
  readonly osd: OsdMethod;
}

/**
 * A decoder for one pair of (possibly overcomplete) check matrices DX, DZ of a CSS code:
 * - bp2: the Z part of the error from DX's syndrome and the X part from DZ's, by two binary BPs with the
 *   marginal prior (2p/3 under depolarizing noise);
 * - bp4: quaternary BP with scalar messages on DX and DZ together, with the Pauli prior.
 * With OSD, a part whose BP decision misses its syndrome is decoded again by OSD on the BP posteriors (for
 * bp4, the marginal LLR of that part).
 *
 * Usage per shot: fill `syndrome` (DX rows first, then DZ rows), call decode(), read ex/ez.
 */
export class CssDecoder {
  readonly n: number;
  readonly options: DecoderOptions;
  readonly xRows: number;
  readonly zRows: number;
  /** Input: one byte per row of DX, then one per row of DZ. */
  readonly syndrome: Uint8Array;
  /** Output: the decided X and Z parts, one byte per qubit. */
  readonly ex: Uint8Array;
  readonly ez: Uint8Array;
  iterations = 0;
  /** Check-to-variable messages computed on the last shot (edges × iterations, summed over parts). */
  edgeUpdates = 0;
  /** Whether BP alone matched both syndromes. */
  bpMatched = false;
  /** Whether OSD ran on the last shot. */
  osdUsed = false;
  private readonly sx: Uint8Array;
  private readonly sz: Uint8Array;
  private readonly bpX: BinaryBp | null = null;
  private readonly bpZ: BinaryBp | null = null;
  private readonly bp4: QuaternaryBp | null = null;
  private readonly osdX: OsdDecoder | null = null;
  private readonly osdZ: OsdDecoder | null = null;
  private readonly hardZ: Uint8Array;
  private readonly hardX: Uint8Array;

  constructor(dx: BitMatrix, dz: BitMatrix, options: DecoderOptions) {
    if (dx.cols !== dz.cols) throw new RangeError(`decoder matrices: ${dx.cols} vs ${dz.cols} columns`);
    const n = dx.cols;
    this.n = n;
    this.options = options;
    this.xRows = dx.rows;
    this.zRows = dz.rows;
    this.syndrome = new Uint8Array(dx.rows + dz.rows);
    this.sx = this.syndrome.subarray(0, dx.rows);
    this.sz = this.syndrome.subarray(dx.rows);
    this.ex = new Uint8Array(n);
    this.ez = new Uint8Array(n);
    if (options.decoder === 'bp2') {
      this.bpZ = new BinaryBp(tannerEdges(dx), options);
      this.bpX = new BinaryBp(tannerEdges(dz), options);
      this.hardZ = this.bpZ.hard;
      this.hardX = this.bpX.hard;
    } else {
      this.bp4 = new QuaternaryBp(dx, dz, options);
      this.hardZ = this.bp4.hard.subarray(0, n);
      this.hardX = this.bp4.hard.subarray(n);
    }
    if (options.osd.kind !== 'none') {
      const sweep = options.osd.kind === 'sweep';
      const order = options.osd.kind === 'sweep' ? options.osd.order : 0;
      this.osdZ = new OsdDecoder(dx, sweep, order);
      this.osdX = new OsdDecoder(dz, sweep, order);
    }
  }

  /** Set the decoder's prior from a channel. */
  setChannel(ch: Channel): void {
    if (this.bp4) this.bp4.setUniformPrior(pauliProbabilities(ch));
    else {
      const prior = new Float64Array(this.n).fill(priorLlr(marginalFlipProbability(ch)));
      this.bpX!.setPrior(prior);
      this.bpZ!.setPrior(prior);
    }
  }

  decode(): void {
    let matchedZ: boolean;
    let matchedX: boolean;
    if (this.bp4) {
      const bp = this.bp4;
      this.iterations = bp.decode(this.syndrome);
      this.edgeUpdates = this.iterations * bp.g.edges;
      matchedZ = bp.matched || syndromeMatches(bp.g, bp.hard, this.syndrome, 0, this.xRows);
      matchedX = bp.matched || syndromeMatches(bp.g, bp.hard, this.syndrome, this.xRows, bp.g.checks);
    } else {
      const iz = this.bpZ!.decode(this.sx);
      const ix = this.bpX!.decode(this.sz);
      this.iterations = Math.max(iz, ix);
      this.edgeUpdates = iz * this.bpZ!.g.edges + ix * this.bpX!.g.edges;
      matchedZ = this.bpZ!.matched;
      matchedX = this.bpX!.matched;
    }
    this.bpMatched = matchedX && matchedZ;
    this.osdUsed = false;
    if (matchedZ || !this.osdZ) this.ez.set(this.hardZ);
    else {
      this.osdZ.decode(this.sx, this.partLlr(false), this.ez);
      this.osdUsed = true;
    }
    if (matchedX || !this.osdX) this.ex.set(this.hardX);
    else {
      this.osdX.decode(this.sz, this.partLlr(true), this.ex);
      this.osdUsed = true;
    }
  }

  /** Posterior LLRs of the X part (xPart) or the Z part of every qubit, after BP. */
  private partLlr(xPart: boolean): Float64Array {
    if (this.bp4) {
      const llr = this.bp4.posteriorLlr();
      return xPart ? llr.subarray(this.n) : llr.subarray(0, this.n);
    }
    return (xPart ? this.bpX! : this.bpZ!).posteriorLlr();
  }
}
