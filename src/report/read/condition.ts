import type { ConditionSideView, ConditionStats, ConditionView, SelectionView } from '../model.js';
import { cycleCount } from './cycles.js';
import { count, isObject, str, type JsonObject } from './values.js';
import { flatten } from './provenance.js';

const STAT_KEYS = ['rows', 'edges', 'maxRowWeight', 'maxColDegree', 'cycles'];

function looksLikeStats(v: unknown): v is JsonObject {
  return isObject(v) && STAT_KEYS.some((k) => k in v);
}

/** The conditioning result: {budget, before, after, added, strategy, provenance}. */
export function looksLikeCondition(v: unknown): v is JsonObject {
  return isObject(v) && 'budget' in v && ('before' in v || 'after' in v);
}

function readStats(v: unknown): ConditionStats | undefined {
  if (!looksLikeStats(v)) return undefined;
  const cycles = isObject(v['cycles']) ? v['cycles'] : {};
  return {
    rows: count(v['rows']),
    edges: count(v['edges']),
    maxRowWeight: count(v['maxRowWeight']),
    maxColDegree: count(v['maxColDegree']),
    cycles4: cycleCount(cycles['4']),
    cycles6: cycleCount(cycles['6']),
  };
}

export function readCondition(v: JsonObject): ConditionView {
  const budget = v['budget'];
  const budgetRows: [string, string][] = isObject(budget) ? flatten(budget) : budget !== undefined && budget !== null ? [['budget', String(budget)]] : [];
  const before = v['before'];
  const after = v['after'];
  const sides: ConditionSideView[] = [];
  if (looksLikeStats(before) || looksLikeStats(after)) {
    sides.push({ side: '', before: readStats(before), after: readStats(after) });
  } else {
    const names = new Set([...Object.keys(isObject(before) ? before : {}), ...Object.keys(isObject(after) ? after : {})]);
    for (const name of names) {
      const b = isObject(before) ? readStats(before[name]) : undefined;
      const a = isObject(after) ? readStats(after[name]) : undefined;
      if (b || a) sides.push({ side: name, before: b, after: a });
    }
  }
  const perSide = isObject(v['sides']) ? v['sides'] : {};
  for (const sv of sides) {
    const selection = readSelection(isObject(perSide[sv.side]) ? (perSide[sv.side] as JsonObject)['selection'] : undefined);
    if (selection) sv.selection = selection;
  }
  const added = v['added'];
  return {
    budget: budgetRows,
    sides,
    added: count(added) ?? (isObject(added) ? Object.values(added).reduce<number>((s, x) => s + (count(x) ?? 0), 0) : undefined),
    strategy: str(v['strategy']),
  };
}

/** The trial strategy's measurements ({shots, ps, prefixes: [{added, failures}], chosen}), or undefined. */
function readSelection(v: unknown): SelectionView | undefined {
  if (!isObject(v) || !Array.isArray(v['prefixes'])) return undefined;
  const shots = count(v['shots']);
  const chosen = count(v['chosen']);
  if (shots === undefined || chosen === undefined) return undefined;
  const prefixes: SelectionView['prefixes'] = [];
  for (const p of v['prefixes']) {
    if (!isObject(p)) continue;
    const added = count(p['added']);
    const failures = count(p['failures']);
    if (added !== undefined && failures !== undefined) prefixes.push({ added, failures });
  }
  const ps = Array.isArray(v['ps']) ? v['ps'].filter((x): x is number => typeof x === 'number') : [];
  return prefixes.length > 0 ? { shots, ps, prefixes, chosen } : undefined;
}
