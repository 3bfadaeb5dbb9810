import type { Comparison, PointResult, TrialResult } from './runner.js';

/** A probability in a fixed short form (6 decimals, or scientific below 1e-4). */
export function formatRate(x: number): string {
  if (x === 0) return '0';
  if (Math.abs(x) < 1e-4) return x.toExponential(2);
  return x.toFixed(6).replace(/0+$/, '').replace(/\.$/, '');
}

function signed(x: number): string {
  return (x >= 0 ? '+' : '') + formatRate(x);
}

function table(rows: string[][]): string[] {
  const widths = rows[0]!.map((_, c) => Math.max(...rows.map((r) => r[c]!.length)));
  return rows.map((r) => r.map((cell, c) => (c === 0 ? cell.padEnd(widths[c]!) : cell.padStart(widths[c]!))).join('  ').trimEnd());
}

/** The text report of a trial: one row per (p, matrix), then the paired differences. */
export function formatTrialText(result: TrialResult, header: readonly string[]): string {
  const lines = [...header];
  const rows: string[][] = [['matrix', 'p', 'shots', 'failures', 'not matched', 'logical', 'rate', '95% interval', 'mean it', 'max it', 'decodes/s', 'stopped by']];
  for (const pt of result.points) rows.push(pointRow(pt));
  lines.push('', ...table(rows));
  if (result.comparisons.length > 0) {
    const crows: string[][] = [['matrix − baseline', 'p', 'shots', 'difference', '95% interval', 'only it failed', 'only baseline failed']];
    for (const c of result.comparisons) crows.push(comparisonRow(c));
    lines.push('', 'paired on the same errors:', ...table(crows));
  }
  lines.push('', `seed ${result.seed}, batches of ${result.batch} shots, ${result.elapsedSeconds.toFixed(2)} s`);
  const sh = result.shard;
  if (sh) {
    const which = sh.parts.length === 1 ? `shard ${sh.parts[0]}/${sh.count}: batches ≡ ${sh.parts[0]} (mod ${sh.count})` : `shards ${sh.parts.join(', ')} of ${sh.count}`;
    lines.push(`${which}; ${sh.exact ? 'the counts are those of one run' : `not the counts of one run: ${sh.why ?? ''}`}`);
  }
  return `${lines.join('\n')}\n`;
}

function pointRow(pt: PointResult): string[] {
  return [
    pt.label,
    String(pt.p),
    String(pt.shots),
    String(pt.failures),
    String(pt.syndromeFailures),
    String(pt.logicalFailures),
    formatRate(pt.rate),
    `[${formatRate(pt.interval[0])}, ${formatRate(pt.interval[1])}]`,
    pt.meanIterations.toFixed(2),
    String(pt.maxIterations),
    pt.decodesPerSecond > 0 ? pt.decodesPerSecond.toFixed(0) : '-',
    pt.stoppedBy,
  ];
}

function comparisonRow(c: Comparison): string[] {
  return [
    `${c.label} − ${c.baseline}`,
    String(c.p),
    String(c.shots),
    signed(c.difference),
    `[${signed(c.interval[0])}, ${signed(c.interval[1])}]`,
    String(c.onlyThisFailed),
    String(c.onlyBaselineFailed),
  ];
}
