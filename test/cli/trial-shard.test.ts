import { BIN, runCliAsync as runAsync } from '../support/cli.js';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { buildFamily } from '../../src/codes/families/index.js';
import { fromRowVectors, rowVector } from '../../src/gf2/bitmatrix.js';
import { writeMatrixFile } from '../../src/formats/index.js';



function merge(files: string[], cwd: string) {
  return spawnSync(process.execPath, [BIN, 'merge', ...files, '--out', 'm.json'], { cwd, encoding: 'utf8' });
}

interface Point { label: string; p: number; shots: number; failures: number; decodesPerSecond?: number; stoppedBy: string }
/** The fields that must agree: everything but the timing. */
const counts = (pts: Point[]) => pts.map(({ decodesPerSecond: _t, ...rest }) => rest);

describe('trial --shard and merge', () => {
  it('4 shards run as separate processes and merged equal one run of the same shots and seed', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'oc-trial-shard-'));
    // an overcomplete X-check matrix: HX with the sum of its first two rows appended (a redundant check)
    const toric = buildFamily('toric:L=5');
    if (toric.kind !== 'css') throw new Error('css');
    const hx = toric.code.hx;
    const extra = rowVector(hx, 0).map((w, i) => w ^ rowVector(hx, 1)[i]!);
    writeMatrixFile(join(dir, 'over.mtx'), fromRowVectors(hx.cols, [...Array.from({ length: hx.rows }, (_, r) => rowVector(hx, r)), extra]), 'mtx');
    const common = ['trial', '--family', 'toric:L=5', '--p', '0.04,0.07', '--shots', '2000', '--batch', '128', '--compare', 'extra=over.mtx,-', '--seed', '11', '--workers', '0', '--json'];
    const [one, ...shards] = await Promise.all([runAsync(common, dir), ...[0, 1, 2, 3].map((i) => runAsync([...common, '--shard', `${i}/4`], dir))]);
    expect(one.code).toBe(0);
    shards.forEach((s, i) => {
      expect(s.code).toBe(0);
      writeFileSync(join(dir, `s${i}.json`), s.out);
    });
    const m = merge(['s0.json', 's1.json', 's2.json', 's3.json'], dir);
    expect(m.status, m.stderr).toBe(0);
    const a = JSON.parse(one.out);
    const b = JSON.parse(readFileSync(join(dir, 'm.json'), 'utf8'));
    expect(counts(b.points)).toEqual(counts(a.points));
    expect(b.comparisons).toEqual(a.comparisons);
    expect(b.points.map((p: Point) => p.shots)).toEqual([2000, 2000, 2000, 2000]);
    expect(b.shard).toMatchObject({ count: 4, parts: [0, 1, 2, 3], exact: true });
    expect(a.points.some((p: Point) => p.failures > 0)).toBe(true);
    // 16 batches of 128 (the last of 80 shots): shard 0 decoded batches 0, 4, 8, 12, shard 3 batches 3, 7, 11, 15
    const s0 = JSON.parse(shards[0]!.out);
    const s3 = JSON.parse(shards[3]!.out);
    expect(s0.points[0].shots).toBe(4 * 128);
    expect(s3.points[0].shots).toBe(3 * 128 + 80);
    expect(s0.shard).toMatchObject({ count: 4, parts: [0], exact: false });

    // refused: other parameters, another code, repeated shards, an unsharded result
    const other = await runAsync(['trial', '--family', 'toric:L=5', '--p', '0.05,0.07', '--shots', '2000', '--batch', '128', '--compare', 'extra=over.mtx,-', '--seed', '11', '--workers', '0', '--json', '--shard', '1/4'], dir);
    writeFileSync(join(dir, 'other.json'), other.out);
    const bad = merge(['s0.json', 'other.json'], dir);
    expect(bad.status).toBe(2);
    expect(bad.stderr).toMatch(/^overcheck: merge: other\.json is from --p 0\.05,0\.07, not 0\.04,0\.07/);
    expect(bad.stderr.trim().split('\n')).toHaveLength(1);
    const code3 = await runAsync(['trial', '--family', 'toric:L=3', '--p', '0.04,0.07', '--shots', '2000', '--batch', '128', '--seed', '11', '--workers', '0', '--json', '--shard', '2/4'], dir);
    writeFileSync(join(dir, 'code3.json'), code3.out);
    expect(merge(['s0.json', 'code3.json'], dir).stderr).toMatch(/code3\.json is from a different code/);
    const twice = merge(['s1.json', 's2.json', 's1.json'], dir);
    expect(twice.status).toBe(2);
    expect(twice.stderr).toMatch(/s1\.json repeats shard 1\/4/);
    writeFileSync(join(dir, 'one.json'), one.out);
    expect(merge(['one.json', 's1.json'], dir).stderr).toMatch(/one\.json is a trial run without --shard/);
  }, 60_000);

  it('--failures: one shard is one run; split over shards, the counts are summed and marked as not one run', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'oc-trial-fail-'));
    const common = ['trial', '--family', 'toric:L=5', '--p', '0.08', '--shots', '20000', '--batch', '64', '--failures', '40', '--seed', '4', '--workers', '0', '--json'];
    const [plain, single, ...shards] = await Promise.all([
      runAsync(common, dir),
      runAsync([...common, '--shard', '0/1'], dir),
      ...[0, 1, 2, 3].map((i) => runAsync([...common, '--shard', `${i}/4`], dir)),
    ]);
    const a = JSON.parse(plain.out);
    const one = JSON.parse(single.out);
    expect(a.points[0].stoppedBy).toBe('failures');
    expect(a.points[0].shots).toBeLessThan(20000);
    expect(counts(one.points)).toEqual(counts(a.points));
    expect(one.shard).toMatchObject({ count: 1, exact: true, failuresPerShard: 40 });
    shards.forEach((s, i) => {
      expect(s.err).toMatch(/--failures with --shard/);
      writeFileSync(join(dir, `f${i}.json`), s.out);
    });
    const m = merge(['f0.json', 'f1.json', 'f2.json', 'f3.json'], dir);
    expect(m.status).toBe(0);
    expect(m.stderr).toMatch(/warning: merge: --failures was applied per shard/);
    const b = JSON.parse(readFileSync(join(dir, 'm.json'), 'utf8'));
    const parts = shards.map((s) => JSON.parse(s.out).points[0]);
    expect(b.shard).toMatchObject({ exact: false, failuresPerShard: 10 });
    expect(b.points[0].shots).toBe(parts.reduce((t: number, p: Point) => t + p.shots, 0));
    expect(b.points[0].failures).toBe(parts.reduce((t: number, p: Point) => t + p.failures, 0));
    expect(b.points[0].failures).toBeGreaterThanOrEqual(40);
    expect(b.points[0].stoppedBy).toBe('failures');
    expect(b.points[0].rate).toBe(b.points[0].failures / b.points[0].shots);
  }, 60_000);
});
