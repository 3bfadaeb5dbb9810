import { InputError } from '../errors.js';

/**
 * The `overcheck run` configuration: the whole job in one JSON file. Every field has a default except the
 * code; README.md documents them field by field. Validation errors name the file and the field.
 */
export interface RunConfig {
  /** The code: files (relative to the config file) or a family spec. */
  code: { hx: string; hz: string } | { family: string };
  /** Sides to condition: "x", "z" or "both". */
  sides: 'x' | 'z' | 'both';
  seed: string | number;
  /** Worker threads (null: number of cores). */
  workers: number | null;
  search: { maxWeight: number | null; method: 'auto' | 'exhaustive' | 'isd'; targetMiss: number; iterations: number | null; timeLimit: number | null };
  distance: { enabled: boolean; method: 'auto' | 'exhaustive' | 'isd' | 'certify'; timeLimit: number | null; targetMiss: number };
  condition: { budget: string; strategy: 'lightest' | 'balanced' | 'fewest-cycles' | 'orbits' | 'trial'; basis: 'all' | 'minimal'; latencyModel: 'serial' | 'parallel' | 'layered'; iterations: number; format: 'mtx' | 'alist' | 'dense' | 'json' };
  cycles: { maxLength: number };
  trial: {
    enabled: boolean;
    p: number[];
    noise: 'depolarizing' | 'independent';
    decoder: 'bp2' | 'bp4';
    rule: 'sum-product' | 'min-sum';
    scale: number | null;
    schedule: 'flooding' | 'serial';
    /** BP iterations on the original matrices, and on the conditioned ones. */
    iterationsOriginal: number;
    iterationsConditioned: number;
    osd: string;
    shots: number;
    failures: number | null;
    timeLimit: number | null;
  };
}

export const DEFAULT_CONFIG: Omit<RunConfig, 'code'> = {
  sides: 'both',
  seed: 1,
  workers: null,
  search: { maxWeight: null, method: 'auto', targetMiss: 1e-6, iterations: null, timeLimit: null },
  distance: { enabled: true, method: 'auto', timeLimit: 30, targetMiss: 1e-6 },
  condition: { budget: '', strategy: 'fewest-cycles', basis: 'all', latencyModel: 'serial', iterations: 3, format: 'mtx' },
  cycles: { maxLength: 8 },
  trial: {
    enabled: true, p: [0.01, 0.02, 0.04], noise: 'depolarizing', decoder: 'bp4', rule: 'sum-product', scale: null, schedule: 'flooding',
    iterationsOriginal: 32, iterationsConditioned: 3, osd: 'none', shots: 2000, failures: null, timeLimit: null,
  },
};

type Obj = Record<string, unknown>;

class Checker {
  constructor(readonly file: string) {}

  fail(field: string, what: string): never {
    throw new InputError(`${this.file}: field "${field}": ${what}`);
  }

  object(v: unknown, field: string): Obj {
    if (typeof v !== 'object' || v === null || Array.isArray(v)) this.fail(field, 'expected an object');
    return v as Obj;
  }

  keys(o: Obj, field: string, allowed: readonly string[]): void {
    for (const k of Object.keys(o)) if (!allowed.includes(k)) this.fail(field ? `${field}.${k}` : k, `unknown field (expected one of ${allowed.join(', ')})`);
  }

  choice<T extends string>(v: unknown, field: string, choices: readonly T[], fallback: T): T {
    if (v === undefined) return fallback;
    if (typeof v !== 'string' || !(choices as readonly string[]).includes(v)) this.fail(field, `expected one of ${choices.map((c) => `"${c}"`).join(', ')}`);
    return v as T;
  }

  int(v: unknown, field: string, fallback: number, min = 0): number {
    if (v === undefined) return fallback;
    if (typeof v !== 'number' || !Number.isInteger(v) || v < min) this.fail(field, `expected a whole number ≥ ${min}`);
    return v;
  }

  intOrNull(v: unknown, field: string, fallback: number | null, min = 0): number | null {
    if (v === null) return null;
    return v === undefined ? fallback : this.int(v, field, 0, min);
  }

  num(v: unknown, field: string, fallback: number, min: number, max: number): number {
    if (v === undefined) return fallback;
    if (typeof v !== 'number' || !Number.isFinite(v) || v < min || v > max) this.fail(field, `expected a number in [${min}, ${max}]`);
    return v;
  }

  numOrNull(v: unknown, field: string, fallback: number | null, min: number, max: number): number | null {
    if (v === null) return null;
    return v === undefined ? fallback : this.num(v, field, 0, min, max);
  }

  bool(v: unknown, field: string, fallback: boolean): boolean {
    if (v === undefined) return fallback;
    if (typeof v !== 'boolean') this.fail(field, 'expected true or false');
    return v;
  }

  str(v: unknown, field: string, fallback: string): string {
    if (v === undefined) return fallback;
    if (typeof v !== 'string') this.fail(field, 'expected a string');
    return v;
  }
}

/** Validate a parsed JSON value as a run configuration, filling defaults. */
export function parseRunConfig(value: unknown, file: string): RunConfig {
  const c = new Checker(file);
  const o = c.object(value, '(top level)');
  c.keys(o, '', ['code', 'sides', 'seed', 'workers', 'search', 'distance', 'condition', 'cycles', 'trial', 'description']);
  const code = c.object(o['code'], 'code');
  let parsedCode: RunConfig['code'];
  if (code['family'] !== undefined) {
    c.keys(code, 'code', ['family']);
    parsedCode = { family: c.str(code['family'], 'code.family', '') };
  } else {
    c.keys(code, 'code', ['hx', 'hz']);
    if (typeof code['hx'] !== 'string') c.fail('code.hx', 'expected a file name (or give code.family)');
    if (typeof code['hz'] !== 'string') c.fail('code.hz', 'expected a file name');
    parsedCode = { hx: code['hx'] as string, hz: code['hz'] as string };
  }
  const d = DEFAULT_CONFIG;
  const seed = o['seed'] === undefined ? d.seed : typeof o['seed'] === 'string' || (typeof o['seed'] === 'number' && Number.isInteger(o['seed'])) ? (o['seed'] as string | number) : c.fail('seed', 'expected a whole number or a string');
  const s = o['search'] === undefined ? {} : c.object(o['search'], 'search');
  c.keys(s, 'search', ['maxWeight', 'method', 'targetMiss', 'iterations', 'timeLimit']);
  const di = o['distance'] === undefined ? {} : c.object(o['distance'], 'distance');
  c.keys(di, 'distance', ['enabled', 'method', 'timeLimit', 'targetMiss']);
  const co = o['condition'] === undefined ? {} : c.object(o['condition'], 'condition');
  c.keys(co, 'condition', ['budget', 'strategy', 'basis', 'latencyModel', 'iterations', 'format']);
  const cy = o['cycles'] === undefined ? {} : c.object(o['cycles'], 'cycles');
  c.keys(cy, 'cycles', ['maxLength']);
  const t = o['trial'] === undefined ? {} : c.object(o['trial'], 'trial');
  c.keys(t, 'trial', ['enabled', 'p', 'noise', 'decoder', 'rule', 'scale', 'schedule', 'iterationsOriginal', 'iterationsConditioned', 'osd', 'shots', 'failures', 'timeLimit']);
  let p = d.trial.p;
  if (t['p'] !== undefined) {
    if (!Array.isArray(t['p']) || t['p'].length === 0 || !t['p'].every((x) => typeof x === 'number' && x > 0 && x < 1)) c.fail('trial.p', 'expected a non-empty list of probabilities strictly between 0 and 1');
    p = t['p'] as number[];
  }
  const osd = c.str(t['osd'], 'trial.osd', d.trial.osd);
  if (!/^(none|0|cs:\d+)$/.test(osd)) c.fail('trial.osd', 'expected "none", "0" or "cs:ORDER"');
  const maxLength = c.int(cy['maxLength'], 'cycles.maxLength', d.cycles.maxLength, 4);
  if (maxLength % 2 !== 0) c.fail('cycles.maxLength', 'expected an even length');
  return {
    code: parsedCode,
    sides: c.choice(o['sides'], 'sides', ['x', 'z', 'both'] as const, d.sides),
    seed,
    workers: c.intOrNull(o['workers'], 'workers', d.workers, 0),
    search: {
      maxWeight: c.intOrNull(s['maxWeight'], 'search.maxWeight', d.search.maxWeight, 1),
      method: c.choice(s['method'], 'search.method', ['auto', 'exhaustive', 'isd'] as const, d.search.method),
      targetMiss: c.num(s['targetMiss'], 'search.targetMiss', d.search.targetMiss, 1e-300, 1),
      iterations: c.intOrNull(s['iterations'], 'search.iterations', d.search.iterations, 1),
      timeLimit: c.numOrNull(s['timeLimit'], 'search.timeLimit', d.search.timeLimit, 0, 1e9),
    },
    distance: {
      enabled: c.bool(di['enabled'], 'distance.enabled', d.distance.enabled),
      method: c.choice(di['method'], 'distance.method', ['auto', 'exhaustive', 'isd', 'certify'] as const, d.distance.method),
      timeLimit: c.numOrNull(di['timeLimit'], 'distance.timeLimit', d.distance.timeLimit, 0, 1e9),
      targetMiss: c.num(di['targetMiss'], 'distance.targetMiss', d.distance.targetMiss, 1e-300, 1),
    },
    condition: {
      budget: c.str(co['budget'], 'condition.budget', d.condition.budget),
      strategy: c.choice(co['strategy'], 'condition.strategy', ['lightest', 'balanced', 'fewest-cycles', 'orbits', 'trial'] as const, d.condition.strategy),
      basis: c.choice(co['basis'], 'condition.basis', ['all', 'minimal'] as const, d.condition.basis),
      latencyModel: c.choice(co['latencyModel'], 'condition.latencyModel', ['serial', 'parallel', 'layered'] as const, d.condition.latencyModel),
      iterations: c.int(co['iterations'], 'condition.iterations', d.condition.iterations, 1),
      format: c.choice(co['format'], 'condition.format', ['mtx', 'alist', 'dense', 'json'] as const, d.condition.format),
    },
    cycles: { maxLength },
    trial: {
      enabled: c.bool(t['enabled'], 'trial.enabled', d.trial.enabled),
      p,
      noise: c.choice(t['noise'], 'trial.noise', ['depolarizing', 'independent'] as const, d.trial.noise),
      decoder: c.choice(t['decoder'], 'trial.decoder', ['bp2', 'bp4'] as const, d.trial.decoder),
      rule: c.choice(t['rule'], 'trial.rule', ['sum-product', 'min-sum'] as const, d.trial.rule),
      scale: c.numOrNull(t['scale'], 'trial.scale', d.trial.scale, 0, 1),
      schedule: c.choice(t['schedule'], 'trial.schedule', ['flooding', 'serial'] as const, d.trial.schedule),
      iterationsOriginal: c.int(t['iterationsOriginal'], 'trial.iterationsOriginal', d.trial.iterationsOriginal, 1),
      iterationsConditioned: c.int(t['iterationsConditioned'], 'trial.iterationsConditioned', d.trial.iterationsConditioned, 1),
      osd,
      shots: c.int(t['shots'], 'trial.shots', d.trial.shots, 1),
      failures: c.intOrNull(t['failures'], 'trial.failures', d.trial.failures, 1),
      timeLimit: c.numOrNull(t['timeLimit'], 'trial.timeLimit', d.trial.timeLimit, 0, 1e9),
    },
  };
}
