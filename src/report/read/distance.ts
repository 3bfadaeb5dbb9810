import type { DistanceSideView, DistanceView } from '../model.js';
import { bool, count, isObject, num, seedText, str, support, type JsonObject } from './values.js';

function looksLikeSide(v: unknown): v is JsonObject {
  return isObject(v) && ('upper' in v || 'lower' in v);
}

/** `distance --json`: {kind: "css", dx, dz, d} or {kind: "classical", d}. */
export function looksLikeDistance(v: unknown): v is JsonObject {
  if (!isObject(v)) return false;
  if ((looksLikeSide(v['dx']) || looksLikeSide(v['dz'])) && isObject(v['d'])) return true;
  return v['kind'] === 'classical' && looksLikeSide(v['d']);
}

function readSide(name: string, v: JsonObject): DistanceSideView {
  const lower = v['lower'] === null ? null : count(v['lower']);
  const miss = num(v['missProbability']);
  return {
    name,
    upper: count(v['upper']),
    lower,
    certified: bool(v['certified']),
    count: count(v['count']),
    countExact: bool(v['countExact']),
    missProbability: miss !== undefined && miss >= 0 && miss <= 1 ? miss : undefined,
    method: str(v['method']),
    stoppedBy: str(v['stoppedBy']),
    witness: support(v['witness']),
  };
}

export function readDistance(v: JsonObject): DistanceView {
  const sides: DistanceSideView[] = [];
  let combined: DistanceView['combined'];
  if (v['kind'] === 'classical') {
    sides.push(readSide('d', v['d'] as JsonObject));
  } else {
    if (looksLikeSide(v['dx'])) sides.push(readSide('dX', v['dx']));
    if (looksLikeSide(v['dz'])) sides.push(readSide('dZ', v['dz']));
    const d = v['d'];
    if (isObject(d)) combined = { upper: count(d['upper']), lower: d['lower'] === null ? null : count(d['lower']), certified: bool(d['certified']) };
  }
  return { code: str(v['code']), n: count(v['n']), k: count(v['k']), seed: seedText(v['seed']), sides, combined };
}
