import type { BitMatrix } from '../gf2/bitmatrix.js';
import { rank } from '../gf2/elimination.js';
import type { CssCode } from '../codes/css.js';
import { logicalBasis } from '../codes/logicals.js';
import type { Channel } from './channel.js';
import { CssDecoder, type DecoderOptions } from './css-decoder.js';
import type { ErrorSamples } from './error-samples.js';
import { DECODED, LOGICAL_ERROR, ResidualCheck } from './outcome.js';
import { deriveSyndrome, syndromeMap, type SyndromeMap } from './syndrome-map.js';
import { tannerEdges, type TannerEdges } from './tanner-edges.js';

/** What a trial needs of the code: its checks (errors' syndromes) and logical operators (LX·LZᵀ = I). */
export interface TrialCode {
  readonly n: number;
  readonly hx: BitMatrix;
  readonly hz: BitMatrix;
  readonly lx: BitMatrix;
  readonly lz: BitMatrix;
}

export function trialCode(code: CssCode): TrialCode {
  const { lx, lz } = logicalBasis(code);
  return { n: code.n, hx: code.hx, hz: code.hz, lx, lz };
}

/** A candidate decoder matrix pair with the syndrome maps that derive its syndrome from the code's checks. */
export interface DecoderMatrix {
  readonly label: string;
  readonly dx: BitMatrix;
  readonly dz: BitMatrix;
  readonly mapX: SyndromeMap;
  readonly mapZ: SyndromeMap;
  /** rank(D) < rank(H) on that side: some syndromes cannot be reproduced from D alone. */
  readonly spansX: boolean;
  readonly spansZ: boolean;
}

/**
 * Validate a decoder matrix pair against the code and compute its syndrome maps. dx/dz default to the code's
 * own HX/HZ. `names` are used in error messages (for example the file names).
 * Throws InputError naming the first row that is not in the right row space.
 */
export function decoderMatrix(
  code: TrialCode,
  label: string,
  dx: BitMatrix = code.hx,
  dz: BitMatrix = code.hz,
  names: { x?: string; z?: string } = {},
): DecoderMatrix {
  const mapX = syndromeMap(code.hx, dx, names.x ?? `${label} X-check matrix`, 'HX');
  const mapZ = syndromeMap(code.hz, dz, names.z ?? `${label} Z-check matrix`, 'HZ');
  return {
    label,
    dx,
    dz,
    mapX,
    mapZ,
    spansX: dx === code.hx || rank(dx) === rank(code.hx),
    spansZ: dz === code.hz || rank(dz) === rank(code.hz),
  };
}

/** Counts of one matrix over some shots. Paired counts compare with matrix 0 (the baseline) shot by shot. */
export interface MatrixCounts {
  shots: number;
  failures: number;
  syndromeFailures: number;
  logicalFailures: number;
  iterationSum: number;
  iterationMax: number;
  osdRuns: number;
  /** Seconds spent decoding (measured only when a clock is given). */
  seconds: number;
  /** Shots where this matrix failed and the baseline did not, and the reverse. */
  onlyThisFailed: number;
  onlyBaselineFailed: number;
}

export function emptyCounts(): MatrixCounts {
  return { shots: 0, failures: 0, syndromeFailures: 0, logicalFailures: 0, iterationSum: 0, iterationMax: 0, osdRuns: 0, seconds: 0, onlyThisFailed: 0, onlyBaselineFailed: 0 };
}

export function addCounts(into: MatrixCounts, c: MatrixCounts): void {
  into.shots += c.shots;
  into.failures += c.failures;
  into.syndromeFailures += c.syndromeFailures;
  into.logicalFailures += c.logicalFailures;
  into.iterationSum += c.iterationSum;
  into.iterationMax = Math.max(into.iterationMax, c.iterationMax);
  into.osdRuns += c.osdRuns;
  into.seconds += c.seconds;
  into.onlyThisFailed += c.onlyThisFailed;
  into.onlyBaselineFailed += c.onlyBaselineFailed;
}

/**
 * Decodes given error samples with several decoder matrices (common random numbers: every matrix sees the
 * same errors) and counts outcomes. This is the library entry point for stages that compare matrices: build
 * once, set the channel, then call decodeSamples on as many sample batches as needed.
 */
export class TrialEngine {
  readonly code: TrialCode;
  readonly matrices: readonly DecoderMatrix[];
  readonly options: DecoderOptions;
  private readonly decoders: CssDecoder[];
  private readonly residual: ResidualCheck;
  private readonly gx: TannerEdges;
  private readonly gz: TannerEdges;
  private measuredX: Uint8Array = new Uint8Array(0);
  private measuredZ: Uint8Array = new Uint8Array(0);
  private outcomes: Uint8Array = new Uint8Array(0);

  constructor(code: TrialCode, matrices: readonly DecoderMatrix[], options: DecoderOptions) {
    if (matrices.length === 0) throw new RangeError('trial engine: no decoder matrix');
    this.code = code;
    this.matrices = matrices;
    this.options = options;
    this.decoders = matrices.map((m) => new CssDecoder(m.dx, m.dz, options));
    this.residual = new ResidualCheck(code.hx, code.hz, code.lx, code.lz);
    this.gx = tannerEdges(code.hx);
    this.gz = tannerEdges(code.hz);
  }

  /** The decoders' prior (the samples may come from elsewhere, e.g. fixed-weight errors). */
  setChannel(ch: Channel): void {
    for (const d of this.decoders) d.setChannel(ch);
  }

  /**
   * Decode shots 0..count-1 of `samples` with every matrix. Returns one MatrixCounts per matrix. When
   * `outcomes` is given (count × matrices bytes) it receives each shot's outcome (DECODED, SYNDROME_NOT_MATCHED,
   * LOGICAL_ERROR) at [matrix * count + shot]. `clock` (milliseconds) times each matrix's decoding.
   */
  decodeSamples(samples: ErrorSamples, count: number, clock?: () => number, outcomes?: Uint8Array): MatrixCounts[] {
    const { hx, hz } = this.code;
    if (samples.n !== this.code.n) throw new RangeError(`samples on ${samples.n} qubits, code has ${this.code.n}`);
    if (this.measuredX.length < count * hx.rows) this.measuredX = new Uint8Array(count * hx.rows);
    if (this.measuredZ.length < count * hz.rows) this.measuredZ = new Uint8Array(count * hz.rows);
    const m = this.matrices.length;
    if (!outcomes) {
      if (this.outcomes.length < count * m) this.outcomes = new Uint8Array(count * m);
      outcomes = this.outcomes;
    }
    measure(this.gx, samples.ez, samples.stride, count, this.measuredX);
    measure(this.gz, samples.ex, samples.stride, count, this.measuredZ);
    const result: MatrixCounts[] = [];
    for (let k = 0; k < m; k++) {
      const mat = this.matrices[k]!;
      const dec = this.decoders[k]!;
      const c = emptyCounts();
      const t0 = clock ? clock() : 0;
      for (let s = 0; s < count; s++) {
        deriveSyndrome(mat.mapX, this.measuredX, s * hx.rows, dec.syndrome, 0);
        deriveSyndrome(mat.mapZ, this.measuredZ, s * hz.rows, dec.syndrome, dec.xRows);
        dec.decode();
        const o = this.residual.classify(samples, s, dec.ex, dec.ez);
        outcomes[k * count + s] = o;
        c.iterationSum += dec.iterations;
        if (dec.iterations > c.iterationMax) c.iterationMax = dec.iterations;
        if (dec.osdUsed) c.osdRuns++;
        if (o !== DECODED) {
          c.failures++;
          if (o === LOGICAL_ERROR) c.logicalFailures++;
          else c.syndromeFailures++;
        }
      }
      c.shots = count;
      c.seconds = clock ? (clock() - t0) / 1000 : 0;
      result.push(c);
    }
    for (let k = 1; k < m; k++) {
      const c = result[k]!;
      for (let s = 0; s < count; s++) {
        const mine = outcomes[k * count + s] !== DECODED;
        const base = outcomes[s] !== DECODED;
        if (mine && !base) c.onlyThisFailed++;
        else if (base && !mine) c.onlyBaselineFailed++;
      }
    }
    return result;
  }
}

/** Syndromes of the packed error parts for `count` shots, one byte per check, by the code's columns. */
function measure(g: TannerEdges, parts: Uint32Array, stride: number, count: number, out: Uint8Array): void {
  const m = g.checks;
  out.fill(0, 0, count * m);
  const { varStart, varEdge, edgeCheck } = g;
  for (let s = 0; s < count; s++) {
    const off = s * stride;
    const at = s * m;
    for (let w = 0; w < stride; w++) {
      let x = parts[off + w]!;
      while (x !== 0) {
        const low = x & -x;
        const j = (w << 5) + (31 - Math.clz32(low));
        for (let k = varStart[j]!; k < varStart[j + 1]!; k++) {
          const c = at + edgeCheck[varEdge[k]!]!;
          out[c] = out[c]! ^ 1;
        }
        x ^= low;
      }
    }
  }
}
