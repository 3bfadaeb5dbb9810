import { createHash, type Hash } from 'node:crypto';

/**
 * A content key for a worker task: SHA-256 over a canonical encoding of (kind, payload). Task handlers are
 * pure functions of their payload (handlers.ts), so two tasks with the same key have the same result, and a
 * result stored under its key can stand in for running the task again (journal-pool.ts).
 *
 * The encoding tags every value with its type; object keys are taken in sorted order; typed arrays
 * contribute their element type, length and raw bytes. Functions, symbols and class instances other than
 * plain objects, arrays and typed arrays are not task payloads and throw.
 */
export function taskKey(kind: string, payload: unknown): string {
  const h = createHash('sha256');
  feedString(h, kind);
  feed(h, payload, 0);
  return h.digest('hex').slice(0, 40);
}

function feedString(h: Hash, s: string): void {
  h.update(`s${s.length}:`);
  h.update(s);
}

function feed(h: Hash, v: unknown, depth: number): void {
  if (depth > 64) throw new Error('taskKey: payload nested too deeply');
  if (v === undefined) return void h.update('u');
  if (v === null) return void h.update('n');
  switch (typeof v) {
    case 'boolean':
      return void h.update(v ? 't' : 'f');
    case 'number':
      return void h.update(`d${Object.is(v, -0) ? '-0' : String(v)};`);
    case 'string':
      return feedString(h, v);
    case 'bigint':
      return void h.update(`b${v.toString()};`);
    case 'object':
      break;
    default:
      throw new Error(`taskKey: a ${typeof v} cannot be part of a task payload`);
  }
  if (ArrayBuffer.isView(v)) {
    h.update(`T${v.constructor.name}:${v.byteLength}:`);
    h.update(new Uint8Array(v.buffer, v.byteOffset, v.byteLength));
    return;
  }
  if (Array.isArray(v)) {
    h.update(`[${v.length}:`);
    for (const x of v) feed(h, x, depth + 1);
    h.update(']');
    return;
  }
  const proto = Object.getPrototypeOf(v) as unknown;
  if (proto !== Object.prototype && proto !== null && !isPlainData(v)) {
    throw new Error(`taskKey: an instance of ${(v as object).constructor?.name ?? 'a class'} cannot be part of a task payload`);
  }
  const keys = Object.keys(v).sort();
  h.update(`{${keys.length}:`);
  for (const k of keys) {
    feedString(h, k);
    feed(h, (v as Record<string, unknown>)[k], depth + 1);
  }
  h.update('}');
}

/** Class instances whose own enumerable fields are all there is to them (what structured cloning sends). */
function isPlainData(v: object): boolean {
  return !(v instanceof Map || v instanceof Set || v instanceof Date || v instanceof RegExp || v instanceof Promise);
}
