/**
 * Task results as JSON text and back, exactly: typed arrays become {"$typed": TYPE, "base64": …} and
 * non-finite numbers {"$number": "Infinity" | "-Infinity" | "NaN"}; everything else in a result is plain
 * JSON (numbers, strings, booleans, arrays, objects). decodeResult(encodeResult(r)) is structurally equal to r.
 */

const TYPED = {
  Uint8Array, Int8Array, Uint16Array, Int16Array, Uint32Array, Int32Array, Float32Array, Float64Array,
} as const;
type TypedName = keyof typeof TYPED;

export function encodeResult(result: unknown): string {
  return JSON.stringify(result, function (this: unknown, _key: string, value: unknown) {
    if (typeof value === 'number' && !Number.isFinite(value)) return { $number: String(value) };
    if (ArrayBuffer.isView(value) && !(value instanceof DataView)) {
      const name = value.constructor.name;
      if (!(name in TYPED)) throw new Error(`encodeResult: ${name} is not supported`);
      return { $typed: name, base64: Buffer.from(value.buffer, value.byteOffset, value.byteLength).toString('base64') };
    }
    return value;
  });
}

export function decodeResult(text: string): unknown {
  return JSON.parse(text, (_key: string, value: unknown) => {
    if (value === null || typeof value !== 'object' || Array.isArray(value)) return value;
    const o = value as Record<string, unknown>;
    if (typeof o.$number === 'string' && Object.keys(o).length === 1) return Number(o.$number);
    if (typeof o.$typed === 'string' && typeof o.base64 === 'string' && Object.keys(o).length === 2) {
      const Ctor = TYPED[o.$typed as TypedName];
      if (!Ctor) throw new Error(`unknown typed array ${o.$typed}`);
      const bytes = Buffer.from(o.base64, 'base64');
      const size = Ctor.BYTES_PER_ELEMENT;
      if (bytes.length % size !== 0) throw new Error(`${o.$typed}: ${bytes.length} bytes is not a whole number of elements`);
      // copy into a fresh, aligned buffer
      const out = new Ctor(bytes.length / size);
      new Uint8Array(out.buffer).set(bytes);
      return out;
    }
    return value;
  });
}
