import type { SpectrumView } from '../model.js';
import { bool, count, isObject, num, numericEntries, seedText, str, type JsonObject } from './values.js';

/** Largest weight drawn: a spectrum wider than this is cut (and a note says so). */
export const MAX_SPECTRUM_WEIGHT = 256;

/** One side of `search --json`: {side, maxWeight, counts, missProbability, words, ...}. */
export function looksLikeSearchSide(v: unknown): v is JsonObject {
  return isObject(v) && isObject(v['counts']) && 'maxWeight' in v && ('missProbability' in v || 'side' in v);
}

/** `search --json`: one side, or {x: side, z: side} for both. */
export function looksLikeSearch(v: unknown): v is JsonObject {
  if (looksLikeSearchSide(v)) return true;
  if (!isObject(v)) return false;
  const values = Object.values(v);
  return values.length > 0 && values.every(looksLikeSearchSide);
}

function readSide(name: string, v: JsonObject, notes: string[]): SpectrumView {
  const side = str(v['side']) ?? name;
  const countEntries = numericEntries(v['counts'] as JsonObject);
  let W = count(v['maxWeight']) ?? Math.max(0, ...countEntries.map(([w]) => w));
  if (W > MAX_SPECTRUM_WEIGHT) {
    notes.push(`search side ${side}: weights above ${MAX_SPECTRUM_WEIGHT} not drawn`);
    W = MAX_SPECTRUM_WEIGHT;
  }
  const counts = new Array<number>(W).fill(0);
  for (const [w, c] of countEntries) {
    const x = count(c);
    if (w >= 1 && w <= W && x !== undefined) counts[w - 1] = x;
  }
  const originals = new Array<number>(W).fill(0);
  const words = v['words'];
  const original = v['original'];
  if (Array.isArray(words) && Array.isArray(original)) {
    for (const i of original) {
      const idx = count(i);
      const word = idx !== undefined ? words[idx] : undefined;
      const w = Array.isArray(word) ? word.length : 0;
      if (w >= 1 && w <= W) originals[w - 1]! += 1;
    }
  }
  const miss = new Array<number | null>(W).fill(null);
  const mp = v['missProbability'];
  if (isObject(mp)) {
    for (const [w, p] of numericEntries(mp)) {
      const x = num(p);
      if (w >= 1 && w <= W && x !== undefined && x >= 0 && x <= 1) miss[w - 1] = x;
    }
  }
  return {
    side,
    maxWeight: W,
    counts,
    originals,
    miss,
    complete: bool(v['complete']) ?? null,
    method: str(v['method']),
    stopReason: str(v['stopReason']),
    iterations: count(v['iterations']),
    n: count(v['n']),
    rank: count(v['rank']),
    wordCount: count(v['wordCount']),
    truncated: bool(v['truncated']),
    seed: seedText(v['seed']),
  };
}

export function readSearch(v: JsonObject, notes: string[]): SpectrumView[] {
  if (looksLikeSearchSide(v)) return [readSide('h', v, notes)];
  return Object.entries(v).map(([name, side]) => readSide(name, side as JsonObject, notes));
}
