/**
 * Result objects of a distance audit and their text form. A run produces these plain objects; the CLI
 * prints them as JSON or through `formatDistanceText`.
 */
import type { ShardSideRecord } from './shard-record.js';

/** What ended a side's run. */
export type SideStop =
  | 'certified' // lower bound = upper bound and every minimum-weight word enumerated
  | 'certified-count-open' // lower = upper, but the run stopped before the count was proven exact
  | 'target-miss'
  | 'iterations'
  | 'enumeration-limit'
  | 'word-limit' // an exhaustive chunk met more words within the limit than it may return
  | 'time-limit'
  | 'interrupted'
  | 'partial'; // a merge of sharded results with shards missing

export interface EnumerationSummary {
  /** Information sets used: their size, rank and the last level enumerated completely. */
  readonly sets: readonly { size: number; rank: number; level: number }[];
  /** Every codeword of the code (stabilizers included) that was not enumerated has weight ≥ bound. */
  readonly bound: number;
  readonly combinations: number;
  /** Further combinations the enumeration needs to prove lower = upper (0 when it has; null: beyond reach). */
  readonly toCertify: number | null;
}

export interface SideReport {
  /** Weight of the lightest word found (verified witness). */
  readonly upper: number;
  /** Proven lower bound. */
  readonly lower: number;
  /** lower === upper. */
  readonly certified: boolean;
  /** Distinct minimum-weight words found. */
  readonly count: number;
  /** Whether `count` is the exact number of words of weight `upper` ("at least" otherwise). */
  readonly countExact: boolean;
  /** More minimum-weight words were met than --max-words allows keeping (the count is then "at least"). */
  readonly truncated: boolean;
  /** Support of a word of weight `upper` (the smallest support in lexicographic order among those found). */
  readonly witness: readonly number[];
  /** Row of the partner logical basis (LZ for dX, LX for dZ) the witness anticommutes with; null for classical codes. */
  readonly anticommutesWith: number | null;
  /** Probability that a given word of weight in [lower, upper − 1] was missed by the information-set search; 0 when certified. */
  readonly missProbability: number;
  /** Dimension of the code searched (ker HZ for dX, ker HX for dZ). */
  readonly dimension: number;
  /** Which method produced the final bounds. */
  readonly method: 'exhaustive' | 'brouwer-zimmermann' | 'isd';
  readonly stoppedBy: SideStop;
  /**
   * Information-set search: total information sets visited, and the stretches it ran in (each planned by the
   * search stage's planner: variant, p, window, swap segment, information sets visited, chunks run).
   */
  readonly isd: {
    readonly iterations: number;
    readonly stages: readonly { variant: string; p: number; window: number; segment: number; iterations: number; chunks: number }[];
  };
  readonly enumeration: EnumerationSummary | null;
  readonly exhaustive: { readonly visited: number; readonly total: number } | null;
  /** Sharded runs (--shard I/N): the fixed plan, which chunks were done, the minimum-weight words (shard-record.ts). */
  readonly shard?: ShardSideRecord;
}

/** The options that fix what a run computes, besides seed and method. */
export interface AuditReportSettings {
  readonly iterations: number | null;
  readonly targetMiss: number | null;
  readonly enumerationLimit: number;
  readonly maxWords: number;
}

/** Which shards of how many a sharded result holds. */
export interface ReportShard {
  readonly count: number;
  readonly parts: readonly number[];
}

export interface CssDistanceReport {
  readonly kind: 'css';
  readonly code: string;
  readonly n: number;
  readonly k: number;
  readonly seed: string | number;
  readonly method: string;
  readonly settings: AuditReportSettings;
  readonly shard?: ReportShard;
  readonly side: 'x' | 'z' | 'both';
  readonly dx?: SideReport;
  readonly dz?: SideReport;
  /** d = min(dX, dZ); lower is null when only one side was audited. */
  readonly d: { readonly upper: number; readonly lower: number | null; readonly certified: boolean };
}

export interface ClassicalDistanceReport {
  readonly kind: 'classical';
  readonly code: string;
  readonly n: number;
  readonly k: number;
  readonly seed: string | number;
  readonly method: string;
  readonly settings: AuditReportSettings;
  readonly shard?: ReportShard;
  readonly d: SideReport;
}

export type DistanceReport = CssDistanceReport | ClassicalDistanceReport;

/** Combine the two sides into d = min(dX, dZ). */
export function combineSides(dx: SideReport | undefined, dz: SideReport | undefined): CssDistanceReport['d'] {
  const sides = [dx, dz].filter((s): s is SideReport => s !== undefined);
  const upper = Math.min(...sides.map((s) => s.upper));
  if (sides.length < 2) return { upper, lower: null, certified: false };
  const lower = Math.min(...sides.map((s) => s.lower));
  return { upper, lower, certified: lower === upper };
}

function probability(p: number): string {
  if (p === 0) return '0';
  if (p >= 0.01) return p.toFixed(3);
  return p.toExponential(1);
}

function sideLines(name: string, s: SideReport, partnerName: string | null): string[] {
  const bound = s.certified ? `${s.upper} (certified)` : `${s.lower} ≤ ${name} ≤ ${s.upper}`;
  const count = `${s.countExact ? '' : 'at least '}${s.count} word${s.count === 1 ? '' : 's'} of weight ${s.upper}`;
  const lines = [`${name.padEnd(3)} ${bound}   ${count}   [${s.method}, ${s.stoppedBy}]`];
  if (!s.certified) lines.push(`    miss probability ${probability(s.missProbability)} for a word of weight ${s.lower}..${s.upper - 1} (${s.isd.iterations} information sets)`);
  const partner = s.anticommutesWith !== null && partnerName ? `, anticommutes with ${partnerName} row ${s.anticommutesWith}` : '';
  lines.push(`    witness ${s.witness.join(',')}${partner}`);
  if (s.enumeration) {
    const sets = s.enumeration.sets.map((x) => `${x.rank}${x.rank < s.dimension ? ' (partial)' : ''}@${x.level}`).join(', ');
    lines.push(`    enumeration: information sets rank@level ${sets}; ${s.enumeration.combinations} combinations; unseen words have weight ≥ ${s.enumeration.bound}`);
    if (!s.certified) {
      const more = s.enumeration.toCertify;
      lines.push(`    certifying needs ${more === null ? 'levels beyond 2^53 combinations' : `about ${more.toExponential(2)} more combinations`} (--method certify)`);
    }
  }
  return lines;
}

/** Human-readable summary. */
export function formatDistanceText(r: DistanceReport): string {
  const head = r.kind === 'css' ? `code ${r.code}  [[${r.n},${r.k}]]` : `code ${r.code}  [${r.n},${r.k}]`;
  const lines = [head];
  if (r.kind === 'css') {
    if (r.dx) lines.push(...sideLines('dX', r.dx, 'LZ'));
    if (r.dz) lines.push(...sideLines('dZ', r.dz, 'LX'));
    const d = r.d;
    if (d.lower === null) lines.push(`d   ≤ ${d.upper} (one side only)`);
    else lines.push(`d   ${d.certified ? `${d.upper} (certified)` : `${d.lower} ≤ d ≤ ${d.upper}`}`);
  } else {
    lines.push(...sideLines('d', r.d, null));
  }
  lines.push(`seed ${r.seed}, method ${r.method}`);
  if (r.shard) {
    const which = r.shard.parts.length === 1 ? `shard ${r.shard.parts[0]}/${r.shard.count}` : `shards ${r.shard.parts.join(', ')} of ${r.shard.count}`;
    lines.push(`${which} of a fixed plan${r.shard.parts.length < r.shard.count ? ' (bounds from this part of the work only; combine the shards with overcheck merge)' : ''}`);
  }
  return lines.join('\n') + '\n';
}
