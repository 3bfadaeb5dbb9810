import { InputError } from '../errors.js';

/** Limits on the conditioned matrix; any combination may be given. */
export interface Budget {
  /** Total rows. */
  rows?: number;
  /** Redundant rows added. */
  extra?: number;
  /** Non-zeros (Tanner-graph edges). */
  edges?: number;
  /** Maximum weight of an added row. */
  rowWeight?: number;
  /** Maximum column degree. */
  colDegree?: number;
  /** Latency under the latency model, in that model's units. */
  latency?: number;
}

const KEYS: Record<string, keyof Budget> = {
  rows: 'rows', extra: 'extra', edges: 'edges', 'row-weight': 'rowWeight', 'col-degree': 'colDegree', latency: 'latency',
};

/** Parse `rows=N,extra=N,edges=E,row-weight=W,col-degree=D,latency=T`. */
export function parseBudget(text: string | undefined): Budget {
  const b: Budget = {};
  if (text === undefined || text.trim() === '') return b;
  for (const part of text.split(',')) {
    const m = /^\s*([a-z-]+)\s*=\s*([0-9]+(?:\.[0-9]+)?)\s*$/.exec(part);
    if (!m) throw new InputError(`--budget: expected KEY=VALUE (keys ${Object.keys(KEYS).join(', ')}), found "${part}"`);
    const key = KEYS[m[1]!];
    if (!key) throw new InputError(`--budget: unknown key "${m[1]}" (expected ${Object.keys(KEYS).join(', ')})`);
    if (b[key] !== undefined) throw new InputError(`--budget: ${m[1]} given twice`);
    const v = Number(m[2]);
    if (key !== 'latency' && !Number.isInteger(v)) throw new InputError(`--budget: ${m[1]} must be a whole number`);
    b[key] = v;
  }
  return b;
}

export function formatBudget(b: Budget): string {
  const inv = Object.fromEntries(Object.entries(KEYS).map(([k, v]) => [v, k]));
  const parts = Object.entries(b).filter(([, v]) => v !== undefined).map(([k, v]) => `${inv[k]}=${v}`);
  return parts.length ? parts.join(',') : 'none';
}
