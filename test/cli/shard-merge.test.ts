import { BIN, runCliAsync as runAsync } from '../support/cli.js';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const BB = 'bb:l=12,m=6,A=x^3+y+y^2,B=y^3+x+x^2';


describe('sharding and merge', () => {
  it('4 shards run as separate processes and merged equal one run of the same total work and seed', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'oc-shard-'));
    const common = ['search', '--family', BB, '--side', 'both', '--max-weight', '12', '--method', 'isd', '--iterations', '120', '--seed', '9', '--workers', '1', '--json'];
    const shards = await Promise.all([0, 1, 2, 3].map((i) => runAsync([...common, '--shard', `${i}/4`], dir)));
    shards.forEach((s, i) => {
      expect(s.code).toBe(0);
      writeFileSync(join(dir, `s${i}.json`), s.out);
    });
    const one = await runAsync(common, dir);
    const merged = spawnSync(process.execPath, [BIN, 'merge', 's0.json', 's1.json', 's2.json', 's3.json', '--family', BB, '--out', 'm.json'], { cwd: dir, encoding: 'utf8' });
    expect(merged.status).toBe(0);
    const a = JSON.parse(one.out);
    const b = JSON.parse(readFileSync(join(dir, 'm.json'), 'utf8'));
    for (const side of ['x', 'z']) {
      expect(b[side].words).toEqual(a[side].words);
      expect(b[side].counts).toEqual(a[side].counts);
      expect(b[side].orbits).toEqual(a[side].orbits);
      expect(b[side].iterations).toBe(a[side].iterations);
      expect(b[side].missProbability).toEqual(a[side].missProbability);
      expect(b[side].original).toEqual(a[side].original);
    }
    // a shard alone did a quarter of the chunks
    const s0 = JSON.parse(shards[0]!.out);
    expect(s0.x.chunks.done).toBe(Math.ceil(s0.x.chunks.total / 4));
    // refuses mixing other parameters, and repeated shards
    const other = await runAsync(['search', '--family', BB, '--side', 'both', '--max-weight', '10', '--method', 'isd', '--iterations', '120', '--seed', '9', '--json', '--shard', '1/4'], dir);
    writeFileSync(join(dir, 'other.json'), other.out);
    const bad = spawnSync(process.execPath, [BIN, 'merge', 's0.json', 'other.json'], { cwd: dir, encoding: 'utf8' });
    expect(bad.status).toBe(2);
    expect(bad.stderr).toMatch(/other\.json is from --max-weight 10, not 12/);
    const twice = spawnSync(process.execPath, [BIN, 'merge', 's0.json', 's0.json'], { cwd: dir, encoding: 'utf8' });
    expect(twice.status).toBe(2);
    expect(twice.stderr).toMatch(/repeats shard 0\/4/);
  }, 120_000);
});
