import { METHOD_TEXT, type CycleCensus } from './census.js';
import type { StructureSummary } from './structure.js';
import { countToJson } from './widesum.js';

/**
 * JSON and text forms of a census. JSON: counts are numbers when exact in a double (< 2^53) and decimal
 * strings beyond; a graph without cycles has "girth": null. Per-node lists are keyed by cycle length
 * ("4" and the girth), like the counts.
 */
export interface CensusJson {
  girth: number | null;
  edges: number;
  cycles: Record<string, number | string>;
  rows: Record<string, number[]>;
  cols: Record<string, number[]>;
  methods: Record<string, string>;
  maxLength: number;
  size: { rows: number; cols: number };
  iterated: 'rows' | 'cols';
  structure: {
    rowWeights: Record<string, number>;
    colDegrees: Record<string, number>;
    rowOverlaps: number[];
  };
}

export function censusJson(c: CycleCensus, s: StructureSummary): CensusJson {
  const cycles: Record<string, number | string> = {};
  for (const [L, n] of [...c.cycles].sort((a, b) => a[0] - b[0])) cycles[String(L)] = countToJson(n);
  const methods: Record<string, string> = {};
  for (const [L, m] of [...c.methods].sort((a, b) => a[0] - b[0])) methods[String(L)] = m;
  return {
    girth: c.girth,
    edges: c.edges,
    cycles,
    rows: perNode(c.rowCycles),
    cols: perNode(c.colCycles),
    methods,
    maxLength: c.maxLength,
    size: { rows: c.rows, cols: c.cols },
    iterated: c.iterated,
    structure: {
      rowWeights: Object.fromEntries([...s.rowWeights].map(([k, v]) => [String(k), v])),
      colDegrees: Object.fromEntries([...s.colDegrees].map(([k, v]) => [String(k), v])),
      rowOverlaps: [...s.rowOverlaps],
    },
  };
}

function perNode(m: ReadonlyMap<number, Float64Array>): Record<string, number[]> {
  const out: Record<string, number[]> = {};
  for (const [L, a] of [...m].sort((x, y) => x[0] - y[0])) {
    out[String(L)] = Array.from(a, (x) => {
      if (!Number.isSafeInteger(x)) throw new RangeError(`a per-node ${L}-cycle count (${x}) is beyond 2^53 and not exact`);
      return x;
    });
  }
  return out;
}

export interface TextOptions {
  /** Heading, e.g. "HX of bb:…". */
  readonly title: string;
  /** How many rows and columns to list as top offenders. */
  readonly top: number;
  /** Names rows in lists (default: the row index). */
  readonly rowName?: (r: number) => string;
}

export function censusText(c: CycleCensus, s: StructureSummary, o: TextOptions): string {
  const lines: string[] = [];
  lines.push(`${o.title}: ${c.rows} rows × ${c.cols} columns, ${c.edges} edges`);
  lines.push(`  girth    ${c.girth === null ? '∞ (no cycles)' : c.girth}`);
  const lengths = [...c.cycles.keys()].sort((a, b) => a - b);
  const width = Math.max(...lengths.map((L) => c.cycles.get(L)!.toString().length), 1);
  for (const L of lengths) {
    const extra = L > c.maxLength ? ' (the girth, beyond the maximum length)' : '';
    lines.push(`  ${String(L).padStart(2)}-cycles ${c.cycles.get(L)!.toString().padStart(width)}   ${METHOD_TEXT[c.methods.get(L)!]}${extra}`);
  }
  lines.push(`  row weights      ${histText(s.rowWeights)}`);
  lines.push(`  column degrees   ${histText(s.colDegrees)}`);
  lines.push(`  row overlaps     ${s.rowOverlaps.map((n, k) => `${k}:${n}`).join(' ')}   (row pairs sharing k columns)`);
  if (c.girth !== null && o.top > 0) {
    const g = c.girth;
    lines.push(`  most ${g}-cycles, rows:    ${topText(c.rowCycles.get(g)!, o.top, o.rowName ?? String)}`);
    lines.push(`  most ${g}-cycles, columns: ${topText(c.colCycles.get(g)!, o.top, String)}`);
  }
  return lines.join('\n');
}

function histText(h: ReadonlyMap<number, number>): string {
  return [...h].map(([v, n]) => `${v}×${n}`).join(' ') || '-';
}

function topText(per: Float64Array, top: number, name: (i: number) => string): string {
  const idx = Array.from(per.keys())
    .filter((i) => per[i]! > 0)
    .sort((a, b) => per[b]! - per[a]! || a - b)
    .slice(0, top);
  if (idx.length === 0) return '-';
  return idx.map((i) => `${name(i)} (${per[i]})`).join(', ');
}
