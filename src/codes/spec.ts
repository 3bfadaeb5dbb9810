import { InputError } from '../errors.js';

/** A parsed family spec `name:key=value,...`; each value remembers where it starts, for error messages. */
export interface FamilySpec {
  readonly text: string;
  readonly family: string;
  readonly params: ReadonlyMap<string, { value: string; offset: number }>;
}

/** A spec syntax error: names the 1-based character position and what was expected. */
export class SpecError extends InputError {
  constructor(text: string, offset: number, expected: string) {
    super(`family spec "${text}", position ${offset + 1}: ${expected}`);
  }
}

/** Split `name:k=v,k=v` at top-level commas (parentheses nest, so a value may itself be a spec). */
export function parseSpec(text: string): FamilySpec {
  const colon = text.indexOf(':');
  const family = (colon < 0 ? text : text.slice(0, colon)).trim();
  if (!/^[a-z][a-z0-9-]*$/.test(family)) throw new SpecError(text, 0, 'expected a family name such as gb, bb, toric, surface, hgp, cyclic, regular');
  const params = new Map<string, { value: string; offset: number }>();
  if (colon < 0) return { text, family, params };
  let start = colon + 1;
  let depth = 0;
  const flush = (end: number) => {
    const part = text.slice(start, end);
    const eq = part.indexOf('=');
    if (eq <= 0) throw new SpecError(text, start, `expected key=value, found "${part}"`);
    const key = part.slice(0, eq).trim();
    if (!/^[A-Za-z][A-Za-z0-9]*$/.test(key)) throw new SpecError(text, start, `expected a parameter name, found "${key}"`);
    if (params.has(key)) throw new SpecError(text, start, `parameter ${key} given twice`);
    let value = part.slice(eq + 1);
    let offset = start + eq + 1;
    const lead = value.length - value.trimStart().length;
    value = value.trim();
    offset += lead;
    if (value === '') throw new SpecError(text, offset, `expected a value for ${key}`);
    params.set(key, { value, offset });
  };
  for (let i = start; i < text.length; i++) {
    const ch = text[i];
    if (ch === '(') depth++;
    else if (ch === ')') {
      depth--;
      if (depth < 0) throw new SpecError(text, i, 'unbalanced ")"');
    } else if (ch === ',' && depth === 0) {
      flush(i);
      start = i + 1;
    }
  }
  if (depth !== 0) throw new SpecError(text, text.length, 'expected ")" to close "("');
  flush(text.length);
  return { text, family, params };
}

/** Accessors that check presence and type, reporting positions in the spec. */
export class SpecReader {
  constructor(readonly spec: FamilySpec, private readonly allowed: readonly string[]) {
    for (const [key, { offset }] of spec.params) {
      if (!allowed.includes(key)) {
        throw new SpecError(spec.text, offset - key.length - 1, `unknown parameter "${key}" for ${spec.family} (expected ${allowed.join(', ')})`);
      }
    }
  }

  has(key: string): boolean {
    return this.spec.params.has(key);
  }

  raw(key: string): { value: string; offset: number } {
    const p = this.spec.params.get(key);
    if (!p) throw new SpecError(this.spec.text, this.spec.text.length, `expected parameter ${key}= for ${this.spec.family}`);
    return p;
  }

  int(key: string, min: number, max = 1_000_000): number {
    const { value, offset } = this.raw(key);
    if (!/^\d+$/.test(value)) throw new SpecError(this.spec.text, offset, `expected a whole number for ${key}, found "${value}"`);
    const n = Number(value);
    if (n < min || n > max) throw new SpecError(this.spec.text, offset, `${key} must be between ${min} and ${max}, found ${n}`);
    return n;
  }

  intOr(key: string, fallback: number, min: number, max = 1_000_000): number {
    return this.has(key) ? this.int(key, min, max) : fallback;
  }
}
