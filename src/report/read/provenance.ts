import type { ProvenanceEntry } from '../model.js';
import { isObject, type JsonObject } from './values.js';

/** Entries kept per flattened object; the rest is summarised in one line. */
export const MAX_ENTRIES = 200;
const MAX_DEPTH = 5;
/** Keys whose string arrays are command lines (joined with spaces rather than commas). */
const COMMAND_KEYS = /^(argv|args|command|commands|commandLine|cmd)$/i;

function primitive(v: unknown): string | undefined {
  if (v === null) return 'null';
  if (typeof v === 'string') return v;
  if (typeof v === 'number' || typeof v === 'boolean') return String(v);
  return undefined;
}

/**
 * An object as [dotted key, text] pairs: arrays of primitives become one value (space-joined for command
 * lines), nested objects add to the key. At most MAX_ENTRIES pairs.
 */
export function flatten(o: JsonObject): [string, string][] {
  const out: [string, string][] = [];
  let dropped = 0;
  const walk = (prefix: string, key: string, v: unknown, depth: number): void => {
    const path = prefix ? `${prefix}.${key}` : key;
    const p = primitive(v);
    if (p !== undefined || depth >= MAX_DEPTH) {
      if (out.length < MAX_ENTRIES) out.push([path, p ?? JSON.stringify(v)]);
      else dropped++;
      return;
    }
    if (Array.isArray(v)) {
      const parts = v.map(primitive);
      if (parts.every((x): x is string => x !== undefined)) {
        if (out.length < MAX_ENTRIES) out.push([path, parts.join(COMMAND_KEYS.test(key) ? ' ' : ', ')]);
        else dropped++;
        return;
      }
      v.forEach((x, i) => walk(path, String(i), x, depth + 1));
      return;
    }
    if (isObject(v)) for (const [k, x] of Object.entries(v)) walk(path, k, x, depth + 1);
  };
  for (const [k, v] of Object.entries(o)) walk('', k, v, 0);
  if (dropped > 0) out.push(['…', `${dropped} more entries not shown`]);
  return out;
}

const PROVENANCE_KEYS = ['versions', 'version', 'command', 'commandLine', 'argv', 'inputs', 'inputHashes'];

/**
 * A provenance file on its own: {kind: "provenance", ...}, {provenance: {...}} alone, or (judged last,
 * after every other kind) an object with a key such as versions, command or inputs.
 */
export function looksLikeProvenance(v: unknown): v is JsonObject {
  if (!isObject(v)) return false;
  if (v['kind'] === 'provenance' || v['kind'] === 'overcheck-provenance') return true;
  const keys = Object.keys(v);
  if (keys.length === 1 && keys[0] === 'provenance' && isObject(v['provenance'])) return true;
  return v['kind'] === undefined && keys.some((k) => PROVENANCE_KEYS.includes(k));
}

export function readProvenance(v: JsonObject, source: string, prefix = ''): ProvenanceEntry[] {
  const body = isObject(v['provenance']) && Object.keys(v).length === 1 ? v['provenance'] : v;
  return flatten(body)
    .filter(([key]) => key !== 'kind')
    .map(([key, value]) => ({ source, key: prefix ? `${prefix} ${key}` : key, value }));
}
