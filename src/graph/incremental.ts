import { type BitMatrix, packedSupport, rowSupport, zeros, setBit } from '../gf2/bitmatrix.js';
import { InputError } from '../errors.js';
import { cycleCensus } from './census.js';

/** Change in the numbers of 4- and 6-cycles: the cycles through one row. */
export interface CycleDelta {
  readonly four: number;
  readonly six: number;
}

/** A row as a support list (column indices) or a packed vector of ceil(cols/32) words. */
export type RowInput = readonly number[] | Uint32Array;

/**
 * The rows of a check matrix under additions and removals, with the numbers of 4- and 6-cycles of its
 * Tanner graph kept current. A delta is the number of cycles through the row in question, computed
 * locally from the column lists (no recount):
 *
 * with v_i = |R ∩ row_i| over the other rows i, w_i = |row_i|, deg_c their column degrees and
 * n_cc' = number of them holding both c and c' (the column-overlap table, n_cc = deg_c),
 *   four = Σ_i C(v_i, 2)
 *   six  = ½ (Σ_c U_c² − Σ_i w_i v_i²) − Σ_{c∈R} (deg_c − 1)·U_c − Σ_{c∈R} P_c + 2 Σ_{c∈R} C(deg_c, 2),
 *   U_c = Σ_{i∋c} v_i = Σ_{c'∈R} n_cc',  P_c = Σ_{c'} C(n_cc', 2).
 * (A 6-cycle through row R visits rows R, i, j and columns c1 ∈ R∩i, c2 ∈ i∩j, c3 ∈ j∩R, all distinct;
 * inclusion–exclusion over equal columns, summed over row pairs, gives the line above.)
 * The table n and the sums P are kept up to date (|R|² updates per change) while cols ≤ TABLE_COLS;
 * a delta then costs O(Σ_{c∈R} deg_c + cols·|R|). Wider matrices go without the table:
 * O(Σ_{c∈R} deg_c + Σ over rows meeting R of their weight + Σ_{c∈R} Σ_{i∋c} |row_i|).
 *
 * Rows keep the id they were given (initial rows 0..m.rows−1, then increasing); ids of removed rows are
 * not reused. Counts are JS numbers; a RangeError is thrown if one would pass 2^53.
 */
/** Widest matrix for which the tracker keeps the cols×cols column-overlap table (16 MB). */
export const TABLE_COLS = 2048;

export class CycleTracker {
  readonly cols: number;
  private readonly supports: (Int32Array | null)[] = [];
  private readonly colRows: number[][];
  private live = 0;
  private fourTotal = 0;
  private sixTotal = 0;
  // scratch, grown on demand
  private v = new Float64Array(16);
  private touchedRows = new Int32Array(16);
  private readonly u: Float64Array;
  private readonly n: Float64Array;
  private readonly touchedCols: Int32Array;
  private readonly marks: Int32Array;
  /** n[c·cols + c'] (null above TABLE_COLS) and P_c. */
  private readonly table: Int32Array | null;
  private readonly pairSums: Float64Array;

  /** `options.table`: keep the column-overlap table (default: when cols ≤ TABLE_COLS). */
  constructor(cols: number, initial?: BitMatrix, options: { table?: boolean } = {}) {
    if (!Number.isInteger(cols) || cols < 0) throw new InputError(`column count must be a whole number, found ${cols}`);
    this.cols = cols;
    this.colRows = Array.from({ length: cols }, () => []);
    this.u = new Float64Array(cols);
    this.n = new Float64Array(cols);
    this.touchedCols = new Int32Array(cols);
    this.marks = new Int32Array(cols);
    this.table = (options.table ?? cols <= TABLE_COLS) ? new Int32Array(cols * cols) : null;
    this.pairSums = new Float64Array(cols);
    if (initial) {
      if (initial.cols !== cols) throw new InputError(`initial matrix has ${initial.cols} columns, expected ${cols}`);
      for (let r = 0; r < initial.rows; r++) this.insert(Int32Array.from(rowSupport(initial, r)));
      const c = cycleCensus(initial, 6);
      this.fourTotal = safe(c.cycles.get(4)!);
      this.sixTotal = safe(c.cycles.get(6)!);
    }
  }

  /** Number of rows present. */
  get size(): number {
    return this.live;
  }

  get four(): number {
    return this.fourTotal;
  }

  get six(): number {
    return this.sixTotal;
  }

  /** Ids of the rows present, ascending. */
  ids(): number[] {
    const out: number[] = [];
    this.supports.forEach((s, i) => {
      if (s) out.push(i);
    });
    return out;
  }

  support(id: number): number[] {
    return Array.from(this.row(id));
  }

  /** The rows present, in id order. */
  matrix(): BitMatrix {
    const ids = this.ids();
    const m = zeros(ids.length, this.cols);
    ids.forEach((id, r) => {
      for (const c of this.supports[id]!) setBit(m, r, c, 1);
    });
    return m;
  }

  /** Cycles that adding `row` would create. */
  deltaAdd(row: RowInput): CycleDelta {
    return this.through(this.normalize(row), -1);
  }

  /** Cycles that removing row `id` would destroy. */
  deltaRemove(id: number): CycleDelta {
    return this.through(this.row(id), id);
  }

  /** Add a row; returns its id and the change in the counts. */
  add(row: RowInput): { id: number; delta: CycleDelta } {
    const r = this.normalize(row);
    const delta = this.through(r, -1);
    this.fourTotal = safeNumber(this.fourTotal + delta.four);
    this.sixTotal = safeNumber(this.sixTotal + delta.six);
    return { id: this.insert(r), delta };
  }

  /** Remove row `id`; returns the change in the counts (as positive numbers of cycles destroyed). */
  remove(id: number): CycleDelta {
    const r = this.row(id);
    const delta = this.through(r, id);
    this.fourTotal -= delta.four;
    this.sixTotal -= delta.six;
    for (const c of r) {
      const list = this.colRows[c]!;
      const at = list.indexOf(id);
      list[at] = list[list.length - 1]!;
      list.pop();
    }
    this.supports[id] = null;
    this.live--;
    const n = this.table;
    if (n) {
      const cols = this.cols;
      for (const c of r) {
        for (const c2 of r) {
          n[c * cols + c2]! -= 1;
          this.pairSums[c]! -= n[c * cols + c2]!;
        }
      }
    }
    return delta;
  }

  private row(id: number): Int32Array {
    const s = Number.isInteger(id) ? this.supports[id] : undefined;
    if (!s) throw new InputError(`no row with id ${id}`);
    return s;
  }

  private normalize(row: RowInput): Int32Array {
    if (row instanceof Uint32Array) {
      if (row.length !== (this.cols + 31) >>> 5) throw new InputError(`packed row has ${row.length} words, expected ${(this.cols + 31) >>> 5}`);
      const s = packedSupport(row, 0, row.length);
      if (s.length > 0 && s[s.length - 1]! >= this.cols) throw new InputError(`packed row has bits beyond column ${this.cols - 1}`);
      return Int32Array.from(s);
    }
    const sorted = Int32Array.from(row).sort();
    for (let i = 0; i < sorted.length; i++) {
      const c = sorted[i]!;
      if (!Number.isInteger(row[i]) || c < 0 || c >= this.cols) throw new InputError(`column ${row[i]} is outside 0..${this.cols - 1}`);
      if (i > 0 && sorted[i - 1] === c) throw new InputError(`column ${c} appears twice in the row`);
    }
    return sorted;
  }

  private insert(r: Int32Array): number {
    const id = this.supports.length;
    this.supports.push(r);
    for (const c of r) this.colRows[c]!.push(id);
    this.live++;
    const n = this.table;
    if (n) {
      const cols = this.cols;
      for (const c of r) {
        for (const c2 of r) {
          this.pairSums[c]! += n[c * cols + c2]!;
          n[c * cols + c2]! += 1;
        }
      }
    }
    if (this.v.length < this.supports.length) {
      const size = Math.max(this.supports.length, 2 * this.v.length);
      const v = new Float64Array(size);
      v.set(this.v);
      this.v = v;
      this.touchedRows = new Int32Array(size);
    }
    return id;
  }

  /** Cycles through a row with support R among the rows present other than `skip` (−1: none), where
   *  row `skip`, when given, has support R. */
  private through(R: Int32Array, skip: number): CycleDelta {
    const { v, touchedRows, supports, colRows } = this;
    let nr = 0;
    for (let k = 0; k < R.length; k++) {
      const list = colRows[R[k]!]!;
      for (let j = 0; j < list.length; j++) {
        const i = list[j]!;
        if (i === skip) continue;
        if (v[i] === 0) touchedRows[nr++] = i;
        v[i]! += 1;
      }
    }
    let four = 0;
    let sw = 0;
    for (let k = 0; k < nr; k++) {
      const i = touchedRows[k]!;
      const vi = v[i]!;
      four += (vi * (vi - 1)) / 2;
      sw += vi * vi * supports[i]!.length;
    }
    const six = this.table ? this.sixWithTable(R, skip, sw) : this.sixWithoutTable(R, skip, nr, sw);
    for (let k = 0; k < nr; k++) v[touchedRows[k]!] = 0;
    return { four: safeNumber(four), six: safeNumber(six) };
  }

  private sixWithTable(R: Int32Array, skip: number, sw: number): number {
    const n = this.table!;
    const { u, cols, colRows, pairSums } = this;
    const own = skip >= 0 ? 1 : 0; // row `skip` (support R) is still in the table and the lists
    const m = R.length;
    for (let k = 0; k < m; k++) {
      const base = R[k]! * cols;
      for (let c = 0; c < cols; c++) u[c]! += n[base + c]!;
    }
    if (own) for (let k = 0; k < m; k++) u[R[k]!]! -= m;
    let s1 = 0;
    for (let c = 0; c < cols; c++) {
      s1 += u[c]! * u[c]!;
    }
    let s2 = 0;
    let s3 = 0;
    let s4 = 0;
    for (let k = 0; k < m; k++) {
      const c = R[k]!;
      const deg = colRows[c]!.length - own;
      s2 += (deg - 1) * u[c]!;
      s4 += (deg * (deg - 1)) / 2;
      let pc = pairSums[c]!;
      if (own) for (let q = 0; q < m; q++) pc -= n[c * cols + R[q]!]! - 1;
      s3 += pc;
    }
    u.fill(0);
    return (s1 - sw) / 2 - s2 - s3 + 2 * s4;
  }

  private sixWithoutTable(R: Int32Array, skip: number, nr: number, sw: number): number {
    const { v, touchedRows, u, n, touchedCols, marks, supports, colRows } = this;
    let nc = 0;
    for (let k = 0; k < nr; k++) {
      const i = touchedRows[k]!;
      const vi = v[i]!;
      const s = supports[i]!;
      for (let j = 0; j < s.length; j++) {
        const c = s[j]!;
        if (u[c] === 0) touchedCols[nc++] = c;
        u[c]! += vi;
      }
    }
    let s1 = 0;
    for (let k = 0; k < nc; k++) s1 += u[touchedCols[k]!]! * u[touchedCols[k]!]!;
    let s2 = 0;
    let s3 = 0;
    let s4 = 0;
    for (let k = 0; k < R.length; k++) {
      const c = R[k]!;
      const list = colRows[c]!;
      const deg = list.length - (skip >= 0 ? 1 : 0);
      s2 += (deg - 1) * u[c]!;
      s4 += (deg * (deg - 1)) / 2;
      // P_c from n_cc' counted over the rows through c
      let mark = 0;
      for (let j = 0; j < list.length; j++) {
        const i = list[j]!;
        if (i === skip) continue;
        const si = supports[i]!;
        for (let q = 0; q < si.length; q++) {
          const c2 = si[q]!;
          if (n[c2] === 0) marks[mark++] = c2;
          n[c2]! += 1;
        }
      }
      for (let q = 0; q < mark; q++) {
        const x = n[marks[q]!]!;
        s3 += (x * (x - 1)) / 2;
        n[marks[q]!] = 0;
      }
    }
    for (let k = 0; k < nc; k++) u[touchedCols[k]!] = 0;
    return (s1 - sw) / 2 - s2 - s3 + 2 * s4;
  }
}

function safe(x: bigint): number {
  if (x > BigInt(Number.MAX_SAFE_INTEGER)) throw new RangeError(`cycle count ${x} exceeds 2^53; the tracker keeps JS numbers`);
  return Number(x);
}

function safeNumber(x: number): number {
  if (!Number.isSafeInteger(x)) throw new RangeError(`cycle count ${x} is not exact in a JS number`);
  return x;
}
