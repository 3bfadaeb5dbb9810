import { BIN, runCliAsync as runAsync } from '../support/cli.js';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const BB90 = 'bb:l=15,m=3,A=x^9+y+y^2,B=1+x^2+x^7';


function merge(files: string[], cwd: string, out = 'm.json') {
  const r = spawnSync(process.execPath, [BIN, 'merge', ...files, '--out', out], { cwd, encoding: 'utf8' });
  return { ...r, json: r.status === 0 ? JSON.parse(readFileSync(join(cwd, out), 'utf8')) : null };
}

/** A side without its shard record: the fields that must agree with one run of the whole plan. */
function bare(side: Record<string, unknown>): Record<string, unknown> {
  const { shard: _s, ...rest } = side;
  return rest;
}

/** Run 4 shards (separate processes) and the same plan in one process (--shard 0/1); save the shards. */
async function shardsAndOne(args: string[], dir: string, prefix: string) {
  const [one, ...shards] = await Promise.all([runAsync([...args, '--shard', '0/1'], dir), ...[0, 1, 2, 3].map((i) => runAsync([...args, '--shard', `${i}/4`], dir))]);
  expect(one.code, one.err).toBe(0);
  const files = shards.map((s, i) => {
    expect(s.code, s.err).toBe(0);
    writeFileSync(join(dir, `${prefix}${i}.json`), s.out);
    return `${prefix}${i}.json`;
  });
  return { one: JSON.parse(one.out), shards: shards.map((s) => JSON.parse(s.out)), files };
}

describe('distance --shard and merge', () => {
  it('certify: 4 shards merged equal the whole plan in one process; the lower bound is what the finished chunks prove', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'oc-distance-shard-'));
    const args = ['distance', '--family', 'surface:d=9', '--method', 'certify', '--iterations', '8000', '--seed', '5', '--workers', '1', '--json'];
    const [{ one, shards, files }, adaptive] = await Promise.all([shardsAndOne(args, dir, 's'), runAsync(args, dir)]);
    const m = merge(files, dir);
    expect(m.status, m.stderr).toBe(0);
    const a = JSON.parse(adaptive.out);
    for (const side of ['dx', 'dz']) {
      expect(bare(m.json[side])).toEqual(bare(one[side]));
      // common practice: the rotated surface code of distance 9 has dX = dZ = 9
      expect(m.json[side]).toMatchObject({ upper: 9, lower: 9, certified: true, countExact: true, stoppedBy: 'certified' });
      // certified facts do not depend on the plan: the adaptive run finds the same count and smallest witness
      expect([m.json[side].count, m.json[side].witness]).toEqual([a[side].count, a[side].witness]);
      // the work was split: both phases have chunks in several shards, and no shard alone proves the bound
      const plan = m.json[side].shard.plan;
      expect(plan.isd.chunks).toBeGreaterThan(4);
      expect(plan.enumeration.chunks).toBeGreaterThan(4);
      expect(shards.map((s) => s[side].shard.parts[0].isdChunks)).toEqual([0, 1, 2, 3].map((i) => Math.ceil((plan.isd.chunks - i) / 4)));
      expect(shards.every((s) => s[side].enumeration.bound < m.json[side].enumeration.bound)).toBe(true);
      expect(m.json[side].isd.iterations).toBe(shards.reduce((t, s) => t + s[side].isd.iterations, 0));
    }
    expect(m.json.d).toEqual({ upper: 9, lower: 9, certified: true });
    expect(m.json.shard).toEqual({ count: 4, parts: [0, 1, 2, 3] });

    // three shards of four: only the units whose chunks are all present count, and the count stays open
    const part = merge(files.slice(0, 3), dir, 'part.json');
    expect(part.status).toBe(0);
    for (const side of ['dx', 'dz']) {
      const s = part.json[side];
      expect(s.shard.parts.map((p: { index: number }) => p.index)).toEqual([0, 1, 2]);
      expect(s.enumeration.bound).toBeLessThan(m.json[side].enumeration.bound);
      expect(s.lower).toBeLessThanOrEqual(9);
      expect(s.countExact).toBe(false);
      expect(s.isd.iterations).toBeLessThan(m.json[side].isd.iterations);
    }
  }, 60_000);

  it('isd with a fixed number of information sets: merged equals one run (miss probability from all chunks); refuses mixtures', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'oc-distance-isd-'));
    const args = ['distance', '--family', BB90, '--method', 'isd', '--iterations', '640', '--seed', '3', '--workers', '1', '--json'];
    const { one, shards, files } = await shardsAndOne(args, dir, 'b');
    const m = merge(files, dir);
    expect(m.status, m.stderr).toBe(0);
    for (const side of ['dx', 'dz']) {
      expect(bare(m.json[side])).toEqual(bare(one[side]));
      expect(m.json[side].isd.iterations).toBe(640);
      expect(m.json[side].upper).toBeGreaterThanOrEqual(10); // source: Bravyi et al., Nature 627, 778 (2024): [[90,8,10]]
      expect(m.json[side].certified).toBe(false);
      // more information sets, a smaller miss probability than any shard alone
      expect(shards.every((s) => s[side].missProbability > m.json[side].missProbability)).toBe(true);
    }

    const other = await runAsync(['distance', '--family', BB90, '--method', 'isd', '--iterations', '320', '--seed', '3', '--workers', '1', '--json', '--shard', '1/4'], dir);
    writeFileSync(join(dir, 'other.json'), other.out);
    const bad = merge(['b0.json', 'other.json'], dir);
    expect(bad.status).toBe(2);
    expect(bad.stderr).toMatch(/^overcheck: merge: other\.json is from --iterations 320, not 640/);
    expect(bad.stderr.trim().split('\n')).toHaveLength(1);
    const seed = await runAsync(['distance', '--family', BB90, '--method', 'isd', '--iterations', '640', '--seed', '4', '--workers', '1', '--json', '--shard', '1/4'], dir);
    writeFileSync(join(dir, 'seed.json'), seed.out);
    expect(merge(['b0.json', 'seed.json'], dir).stderr).toMatch(/seed\.json is from seed 4, not 3/);
    // a shard whose plan differs (here edited by hand) is refused even when every option agrees
    const edited = JSON.parse(readFileSync(join(dir, 'b3.json'), 'utf8'));
    edited.dz.shard.plan.isd.chunkIterations += 1;
    writeFileSync(join(dir, 'edited.json'), JSON.stringify(edited));
    expect(merge(['b0.json', 'edited.json'], dir).stderr).toMatch(/edited\.json is from another plan for dz/);
    const twice = merge(['b0.json', 'b2.json', 'b2.json'], dir);
    expect(twice.status).toBe(2);
    expect(twice.stderr).toMatch(/b2\.json repeats shard 2\/4/);
    const plain = await runAsync(['distance', '--family', 'toric:L=3', '--json', '--workers', '0'], dir);
    writeFileSync(join(dir, 'plain.json'), plain.out);
    expect(merge(['plain.json', 'b1.json'], dir).stderr).toMatch(/plain\.json is a distance run without --shard/);
    expect(merge(['b1.json', join('..', 'no-such-file.json')], dir).status).toBe(2);
  }, 60_000);
});
