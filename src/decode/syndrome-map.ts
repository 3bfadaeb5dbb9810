import { type BitMatrix, rowSupport } from '../gf2/bitmatrix.js';
import { RowSpaceSolver } from '../gf2/solve.js';
import { InputError } from '../errors.js';

/**
 * How each row of a decoder matrix D is a sum of rows of the code's check matrix H (M·H = D), in sparse
 * form: row r of D is the sum of H rows source[start[r] .. start[r+1]-1]. A device measures H's checks
 * only; the bit of every row of D follows as the parity of the measured bits it combines.
 */
export interface SyndromeMap {
  readonly rows: number;
  readonly sourceRows: number;
  readonly start: Int32Array;
  readonly source: Int32Array;
}

/** Sparse form of a packed map M (D.rows × H.rows). */
export function sparseSyndromeMap(map: BitMatrix): SyndromeMap {
  const start = new Int32Array(map.rows + 1);
  const source: number[] = [];
  for (let r = 0; r < map.rows; r++) {
    for (const i of rowSupport(map, r)) source.push(i);
    start[r + 1] = source.length;
  }
  return { rows: map.rows, sourceRows: map.cols, start, source: Int32Array.from(source) };
}

/**
 * The syndrome map of D over H, after checking that D acts on the same qubits and that every row of D lies
 * in rowspace(H). `what` names D in messages (e.g. `--with-x m.mtx`), `over` names H (e.g. `HX`).
 */
export function syndromeMap(h: BitMatrix, d: BitMatrix, what: string, over: string): SyndromeMap {
  if (d.cols !== h.cols) throw new InputError(`${what}: ${d.cols} columns, but the code has ${h.cols} qubits`);
  const found = new RowSpaceSolver(h).combinations(d);
  if ('missingRow' in found) {
    const r = found.missingRow;
    const s = rowSupport(d, r);
    const shown = s.length > 12 ? `${s.slice(0, 12).join(',')},… (weight ${s.length})` : s.join(',');
    throw new InputError(`${what}: row ${r} (0-based; qubits ${shown}) is not in the row space of ${over}, so it is not a check of this code`);
  }
  return sparseSyndromeMap(found.map);
}

/** out[r] = parity of the measured bits that row r of D combines. Allocation-free. */
export function deriveSyndrome(map: SyndromeMap, measured: Uint8Array, measuredAt: number, out: Uint8Array, outAt: number): void {
  const { rows, start, source } = map;
  for (let r = 0; r < rows; r++) {
    let bit = 0;
    const end = start[r + 1]!;
    for (let k = start[r]!; k < end; k++) bit ^= measured[measuredAt + source[k]!]!;
    out[outAt + r] = bit;
  }
}
