import type { CensusView, CycleCount } from '../model.js';
import { count, isObject, numericEntries, type JsonObject } from './values.js';

/** A count that may exceed 2^53 and then travels as a decimal string. */
export function cycleCount(v: unknown): CycleCount | undefined {
  if (typeof v === 'number' && Number.isInteger(v) && v >= 0) return { text: String(v), value: v };
  if (typeof v === 'string' && /^\d+$/.test(v)) return { text: v.replace(/^0+(?=\d)/, ''), value: Number(v) };
  return undefined;
}

/** One census: {girth, edges, cycles: {"4": n, "6": n, "8": n}, rows, cols}. */
export function looksLikeCensus(v: unknown): v is JsonObject {
  if (!isObject(v) || !isObject(v['cycles'])) return false;
  return numericEntries(v['cycles']).some(([, c]) => cycleCount(c) !== undefined);
}

/**
 * Censuses per graph: {x: census, z: census, joint: census} (any subset), as `cycles --json` prints them for a
 * CSS code, with scalar metadata such as "input" and "maxLength" beside them.
 */
function looksLikePerGraph(v: unknown): v is JsonObject {
  if (!isObject(v)) return false;
  const values = Object.values(v).filter(isObject);
  return values.length > 0 && values.every(looksLikeCensus);
}

/** {before, after} (either may be missing), rather than graphs named before and after. */
function isBeforeAfter(v: JsonObject): boolean {
  const keys = Object.keys(v);
  return !looksLikeCensus(v) && keys.length > 0 && keys.every((k) => k === 'before' || k === 'after');
}

/** `cycles --json` (one census or one per graph), or {before, after} of either. */
export function looksLikeCycles(v: unknown): v is JsonObject {
  if (looksLikeCensus(v) || looksLikePerGraph(v)) return true;
  if (!isObject(v)) return false;
  const parts = [v['before'], v['after']].filter((p) => p !== undefined);
  return parts.length > 0 && parts.every((p) => looksLikeCensus(p) || looksLikePerGraph(p));
}

const GRAPH_NAMES: Record<string, string> = { x: 'X', z: 'Z', joint: 'joint', h: 'H' };

function nodeCount(v: unknown): number | undefined {
  if (isObject(v)) return count(v['count']) ?? count(v['nodes']);
  return count(v);
}

function readCensus(label: string, v: JsonObject): CensusView {
  const cycles = new Map<number, CycleCount>();
  for (const [len, c] of numericEntries(v['cycles'] as JsonObject)) {
    const x = cycleCount(c);
    if (x !== undefined && len >= 4 && len % 2 === 0) cycles.set(len, x);
  }
  const g = v['girth'];
  return {
    label,
    girth: g === null ? null : count(g),
    edges: count(v['edges']),
    rows: nodeCount(v['rows']),
    cols: nodeCount(v['cols']),
    cycles,
  };
}

/** One census or a per-graph set, labelled `prefix` (or `prefix · X`; with no prefix "matrix", or X). */
function readOne(prefix: string, v: JsonObject): CensusView[] {
  if (looksLikeCensus(v)) return [readCensus(prefix || 'matrix', v)];
  return Object.entries(v).filter(([, c]) => looksLikeCensus(c)).map(([k, c]) => {
    const name = GRAPH_NAMES[k] ?? k;
    return readCensus(prefix ? `${prefix} · ${name}` : name, c as JsonObject);
  });
}

/**
 * Censuses of a cycles result. `label` names a lone census or set ("" for none); an object with its own
 * before/after is labelled by those.
 */
export function readCycles(v: JsonObject, label: string): CensusView[] {
  if (!isBeforeAfter(v)) return readOne(label, v);
  const out: CensusView[] = [];
  if (isObject(v['before'])) out.push(...readOne('before', v['before']));
  if (isObject(v['after'])) out.push(...readOne('after', v['after']));
  return out;
}
