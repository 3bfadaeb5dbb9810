import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it, vi } from 'vitest';
import { main } from '../../src/cli/main.js';
import { buildFamily } from '../../src/codes/families/index.js';
import { fromDense, toDense } from '../../src/gf2/index.js';
import { writeMatrixFile } from '../../src/formats/index.js';

/** Run the CLI in-process; returns exit code, stdout and stderr. */
async function run(...args: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const o = vi.spyOn(process.stdout, 'write').mockImplementation((s: string | Uint8Array) => {
    out += String(s);
    return true;
  });
  const e = vi.spyOn(process.stderr, 'write').mockImplementation((s: string | Uint8Array) => {
    err += String(s);
    return true;
  });
  try {
    const code = await main(['node', 'overcheck', 'distance', ...args]);
    return { code, out, err };
  } finally {
    o.mockRestore();
    e.mockRestore();
  }
}

const BB90 = 'bb:l=15,m=3,A=x^9+y+y^2,B=1+x^2+x^7';

describe('overcheck distance', () => {
  it('--json prints one object with the contracted keys', async () => {
    const r = await run('--family', 'toric:L=3', '--json', '--workers', '0');
    expect(r.code).toBe(0);
    expect(r.err).toBe('');
    const lines = r.out.trim().split('\n');
    expect(lines.length).toBe(1);
    const j = JSON.parse(lines[0]!);
    for (const side of ['dx', 'dz']) {
      for (const key of ['upper', 'lower', 'certified', 'count', 'witness', 'missProbability']) expect(j[side]).toHaveProperty(key);
      expect(j[side].upper).toBe(3); // common practice: toric L = 3 has d = 3
      expect(j[side].certified).toBe(true);
    }
    expect(j.d).toMatchObject({ upper: 3, lower: 3 });
    expect(j.seed).toBe('1');
  });

  it('text output names both sides and d', async () => {
    const r = await run('--family', 'surface:d=3', '--workers', '0');
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/^dX +3 \(certified\)/m);
    expect(r.out).toMatch(/^dZ +3 \(certified\)/m);
    expect(r.out).toMatch(/^d +3 \(certified\)/m);
  });

  it('--max-words caps the words kept: the count becomes a lower bound, the distance stays certified', async () => {
    const full = JSON.parse((await run('--family', 'surface:d=5', '--side', 'x', '--json', '--workers', '0')).out);
    expect(full.dx.countExact).toBe(true);
    expect(full.dx.count).toBeGreaterThan(10);
    const r = await run('--family', 'surface:d=5', '--side', 'x', '--json', '--workers', '0', '--max-words', '10');
    const j = JSON.parse(r.out);
    expect(j.dx).toMatchObject({ upper: 5, lower: 5, certified: true, count: 10, countExact: false, truncated: true }); // common practice: rotated surface d = 5
  });

  it('a classical family is audited through its check matrix', async () => {
    const r = await run('--family', 'cyclic:n=7,g=1+x+x^3', '--json', '--workers', '0');
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.kind).toBe('classical');
    expect(j.d).toMatchObject({ upper: 3, lower: 3, certified: true, count: 7 }); // source: MacWilliams & Sloane (1977)
  });

  it('reads --hx/--hz files and a --generator file', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'oc-distance-'));
    const toric = buildFamily('toric:L=4');
    if (toric.kind !== 'css') throw new Error('css');
    writeMatrixFile(join(dir, 't.hx.mtx'), toric.code.hx, 'mtx');
    writeMatrixFile(join(dir, 't.hz.alist'), toric.code.hz, 'alist');
    const r = await run('--hx', join(dir, 't.hx.mtx'), '--hz', join(dir, 't.hz.alist'), '--json', '--workers', '0');
    expect(r.code).toBe(0);
    expect(JSON.parse(r.out).d).toEqual({ upper: 4, lower: 4, certified: true }); // common practice: toric L = 4 has d = 4
    // extended Golay generator: the cyclic Golay generator with a parity bit appended
    const golay = buildFamily('cyclic:n=23,g=x^11+x^10+x^6+x^5+x^4+x^2+1');
    if (golay.kind !== 'classical') throw new Error('classical');
    const ext = fromDense(toDense(golay.generator!).map((row) => [...row, row.reduce((a, v) => a ^ v, 0)]), 24);
    writeMatrixFile(join(dir, 'g24.json'), ext, 'json');
    const g = await run('--generator', join(dir, 'g24.json'), '--json', '--workers', '0');
    expect(g.code).toBe(0);
    // source: MacWilliams & Sloane (1977): extended Golay [24,12,8], A8 = 759
    expect(JSON.parse(g.out).d).toMatchObject({ upper: 8, lower: 8, certified: true, count: 759, countExact: true });
    const missing = await run('--generator', join(dir, 'none.mtx'));
    expect(missing.code).toBe(2);
    expect(missing.err).toMatch(/^overcheck: .*none\.mtx/);
  });

  it('bad input: one line on stderr, exit 2', async () => {
    for (const args of [
      ['--family', 'toric:L=3', '--method', 'fast'],
      ['--family', 'toric:L=3', '--side', 'y'],
      ['--family', 'cyclic:n=7,g=1+x+x^3', '--side', 'x'],
      ['--family', 'toric:L=3', '--workers', 'many'],
      ['--family', 'toric:L=3', '--target-miss', '2'],
      ['--family', 'nope:x=1'],
      ['--family', 'toric:L=3', '--h', 'x.mtx'],
      ['--family', 'toric:L=3', '--generator', 'g.mtx'],
      ['--family', 'hgp:h1=(cyclic:n=7,g=1+x+x^3),h2=(cyclic:n=7,g=1+x+x^3)', '--method', 'exhaustive', '--workers', '0'],
    ]) {
      const r = await run(...args);
      expect(r.code, args.join(' ')).toBe(2);
      expect(r.out).toBe('');
      expect(r.err.trim().split('\n').length).toBe(1);
      expect(r.err).toMatch(/^overcheck: /);
    }
  });

  it('certify that runs out of time reports the bounds reached and exits 1', async () => {
    const r = await run('--family', BB90, '--method', 'certify', '--time-limit', '0', '--json', '--workers', '0');
    expect(r.code).toBe(1);
    const j = JSON.parse(r.out);
    expect(j.dx.certified).toBe(false);
    expect(j.dx.stoppedBy).toBe('time-limit');
    expect(j.dx.lower).toBeLessThan(j.dx.upper);
    expect(j.dx.witness.length).toBe(j.dx.upper);
  });

  it('same seed, same result for any worker count; another seed may differ but stays sound', async () => {
    const args = ['--family', BB90, '--method', 'isd', '--iterations', '640', '--json'];
    const inline = await run(...args, '--workers', '0');
    const two = await run(...args, '--workers', '2');
    expect(inline.code).toBe(0);
    expect(two.out).toBe(inline.out);
    const target = ['--family', BB90, '--method', 'isd', '--target-miss', '0.01', '--side', 'z', '--json'];
    const t0 = await run(...target, '--workers', '0');
    const t2 = await run(...target, '--workers', '2');
    expect(t2.out).toBe(t0.out);
    const j = JSON.parse(t0.out);
    expect(j.dz.missProbability).toBeLessThanOrEqual(0.01);
    expect(j.dz.stoppedBy).toBe('target-miss');
    expect(j.dx).toBeUndefined();
    // --side z alone reproduces the z half of --side both
    const both = JSON.parse((await run('--family', BB90, '--method', 'isd', '--target-miss', '0.01', '--json', '--workers', '0')).out);
    expect(both.dz).toEqual(j.dz);
  }, 60_000);

  it('--max-memory caps the kept minimum-weight words: the count becomes a lower bound, and the cap is said', async () => {
    const gb48 = 'gb:l=24,a=1+x^2+x^8+x^15,b=1+x^2+x^12+x^17'; // [[48,6,8]] source: Panteleev & Kalachev, Quantum 5, 585 (2021)
    const full = JSON.parse((await run('--family', gb48, '--side', 'x', '--method', 'certify', '--json', '--workers', '0')).out);
    expect(full.dx.countExact).toBe(true);
    const r = await run('--family', gb48, '--side', 'x', '--method', 'certify', '--max-memory', '20K', '--json', '--workers', '0');
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.dx.upper).toBe(8);
    expect(j.dx.certified).toBe(true);
    expect(j.dx.truncated).toBe(true);
    expect(j.dx.countExact).toBe(false);
    expect(j.dx.count).toBe(j.settings.maxWords);
    expect(j.dx.count).toBeLessThan(full.dx.count);
    expect(r.err).toMatch(/--max-memory 20K holds about \d+ minimum-weight words/);
    expect(r.err).toMatch(/the count is a lower bound/);
    expect((await run('--family', gb48, '--max-memory', 'lots')).err).toMatch(/--max-memory: expected a size/);
  }, 60_000);
});
