import type { TrialPointView, TrialSeriesView, TrialView } from '../model.js';
import { count, isObject, num, seedText, str, type JsonObject } from './values.js';

/** `trial --json`: {points: [{label, p, shots, failures, rate, interval, meanIterations}], seed, ...}. */
export function looksLikeTrial(v: unknown): v is JsonObject {
  if (!isObject(v) || !Array.isArray(v['points'])) return false;
  const points = v['points'] as unknown[];
  return points.length === 0 || points.some((p) => isObject(p) && 'p' in p && ('rate' in p || 'failures' in p));
}

function probability(v: unknown): number | undefined {
  const x = num(v);
  return x !== undefined && x >= 0 && x <= 1 ? x : undefined;
}

function readPoint(v: unknown): TrialPointView | string {
  if (!isObject(v)) return 'not an object';
  const p = probability(v['p']);
  if (p === undefined || p <= 0) return 'no error probability p in (0, 1]';
  const shots = count(v['shots']);
  const failures = count(v['failures']);
  const rate = probability(v['rate']) ?? (shots && failures !== undefined && failures <= shots ? failures / shots : undefined);
  if (rate === undefined) return 'no rate';
  const iv = v['interval'];
  let interval: [number, number] | undefined;
  if (Array.isArray(iv) && iv.length === 2) {
    const lo = probability(iv[0]);
    const hi = probability(iv[1]);
    if (lo !== undefined && hi !== undefined && lo <= hi) interval = [lo, hi];
  }
  return { p, shots, failures, rate, interval, meanIterations: num(v['meanIterations']) };
}

export function readTrial(v: JsonObject, notes: string[], source: string): TrialView {
  const byLabel = new Map<string, TrialPointView[]>();
  const skipped = new Map<string, number>();
  for (const raw of v['points'] as unknown[]) {
    const point = readPoint(raw);
    if (typeof point === 'string') {
      skipped.set(point, (skipped.get(point) ?? 0) + 1);
      continue;
    }
    const label = (isObject(raw) ? str(raw['label']) : undefined) ?? 'matrix';
    const list = byLabel.get(label) ?? [];
    list.push(point);
    byLabel.set(label, list);
  }
  for (const [why, n] of skipped) notes.push(`${source}: ${n} trial point${n === 1 ? '' : 's'} skipped (${why})`);
  const series: TrialSeriesView[] = [...byLabel].map(([label, points]) => ({ label, points: points.sort((a, b) => a.p - b.p) }));
  const noise = v['noise'];
  const samples = v['samples'];
  return {
    series,
    seed: seedText(v['seed']),
    noise: str(noise) ?? (isObject(noise) ? str(noise['model']) : undefined),
    samples: str(samples) ?? (isObject(samples) ? sampleText(samples) : undefined),
  };
}

function sampleText(s: JsonObject): string | undefined {
  const kind = str(s['kind']);
  if (kind === 'weight') return `errors of weight ${count(s['weight']) ?? '?'}${s['exhaustive'] === true ? ' (all of them)' : ''}`;
  return kind;
}
