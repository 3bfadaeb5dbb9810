import type { CodeView, MatrixView, WeightRange } from '../model.js';
import { bool, count, isObject, str, type JsonObject } from './values.js';

/** `info --json` of a CSS code ({n, k, commute, hx, hz}) or of one matrix ({rows, cols, rank, ...}). */
export function looksLikeInfo(v: unknown): v is JsonObject {
  if (!isObject(v)) return false;
  if (isObject(v['hx']) && isObject(v['hz']) && ('n' in v || 'k' in v)) return true;
  return 'rows' in v && 'cols' in v && 'rank' in v && 'rowWeight' in v;
}

function range(v: unknown): WeightRange | undefined {
  if (!isObject(v)) return undefined;
  const min = count(v['min']);
  const max = count(v['max']);
  return min !== undefined && max !== undefined ? { min, max } : undefined;
}

function matrix(name: string, v: unknown): MatrixView | undefined {
  if (!isObject(v)) return undefined;
  return {
    name,
    rows: count(v['rows']),
    cols: count(v['cols']),
    rank: count(v['rank']),
    rowWeight: range(v['rowWeight']),
    colWeight: range(v['colWeight']),
    edges: count(v['edges']),
  };
}

export function readInfo(v: JsonObject): CodeView {
  const label = str(v['label']) ?? str(v['name']) ?? str(v['code']);
  if (isObject(v['hx']) || isObject(v['hz'])) {
    const matrices = [matrix('HX', v['hx']), matrix('HZ', v['hz'])].filter((m): m is MatrixView => m !== undefined);
    return { label, n: count(v['n']), k: count(v['k']), commute: bool(v['commute']), matrices };
  }
  const h = matrix('H', v)!;
  return { label, n: h.cols, matrices: [h] };
}
