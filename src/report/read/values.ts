/**
 * Tolerant accessors for parsed JSON of unknown shape: each returns the value when it has the expected
 * type and undefined otherwise, so a partial or newer result degrades to fewer rendered fields.
 */

export type JsonObject = { [key: string]: unknown };

export function isObject(v: unknown): v is JsonObject {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

/** A finite number, or a numeric string (large counts may travel as text). */
export function num(v: unknown): number | undefined {
  if (typeof v === 'number') return Number.isFinite(v) ? v : undefined;
  if (typeof v === 'string' && /^-?\d+(\.\d+)?([eE][-+]?\d+)?$/.test(v.trim())) return Number(v);
  return undefined;
}

/** A non-negative whole number. */
export function count(v: unknown): number | undefined {
  const x = num(v);
  return x !== undefined && Number.isInteger(x) && x >= 0 ? x : undefined;
}

export function str(v: unknown): string | undefined {
  return typeof v === 'string' ? v : undefined;
}

export function bool(v: unknown): boolean | undefined {
  return typeof v === 'boolean' ? v : undefined;
}

/** A seed as text: seeds are strings or numbers. */
export function seedText(v: unknown): string | undefined {
  if (typeof v === 'string') return v;
  if (typeof v === 'number' && Number.isFinite(v)) return String(v);
  return undefined;
}

/** An array of whole numbers (a support list), or undefined if any entry is not one. */
export function support(v: unknown): number[] | undefined {
  if (!Array.isArray(v)) return undefined;
  const out: number[] = [];
  for (const x of v) {
    const c = count(x);
    if (c === undefined) return undefined;
    out.push(c);
  }
  return out;
}

/** An object's entries whose keys are whole numbers, as [number, value] sorted by key. */
export function numericEntries(o: JsonObject): [number, unknown][] {
  return Object.entries(o)
    .filter(([k]) => /^\d+$/.test(k))
    .map(([k, v]): [number, unknown] => [Number(k), v])
    .sort((a, b) => a[0] - b[0]);
}

/** Whether every key of `keys` is present on `o`. */
export function hasKeys(o: JsonObject, ...keys: string[]): boolean {
  return keys.every((k) => k in o);
}
