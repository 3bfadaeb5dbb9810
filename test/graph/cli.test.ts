import { afterEach, describe, expect, it, vi } from 'vitest';
import { main } from '../../src/cli/main.js';
import { buildFamily } from '../../src/codes/families/index.js';
import { toDense, vstack } from '../../src/gf2/bitmatrix.js';
import { oracleCensus } from '../oracles/cycles.js';

async function run(...args: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const o = vi.spyOn(process.stdout, 'write').mockImplementation((s) => ((out += String(s)), true));
  const e = vi.spyOn(process.stderr, 'write').mockImplementation((s) => ((err += String(s)), true));
  try {
    const code = await main(['node', 'overcheck', ...args]);
    return { code, out, err };
  } finally {
    o.mockRestore();
    e.mockRestore();
  }
}

afterEach(() => vi.restoreAllMocks());

describe('overcheck cycles', () => {
  it('--family toric:L=4 --graph all --json: one object with x, z and joint, matching brute force', async () => {
    const r = await run('cycles', '--family', 'toric:L=4', '--graph', 'all', '--json');
    expect(r.code).toBe(0);
    const lines = r.out.trim().split('\n');
    expect(lines).toHaveLength(1);
    const j = JSON.parse(lines[0]!);
    const b = buildFamily('toric:L=4');
    if (b.kind !== 'css') throw new Error('toric is CSS');
    const { hx, hz } = b.code;
    for (const [key, m] of [['x', hx], ['z', hz], ['joint', vstack(hx, hz)]] as const) {
      const o = oracleCensus(toDense(m), m.cols, 8);
      const g = j[key];
      expect(g.girth).toBe(o.girth);
      expect(g.edges).toBe(toDense(m).flat().reduce((a, v) => a + v, 0));
      for (const L of [4, 6, 8]) expect(g.cycles[String(L)]).toBe(o.counts.get(L));
      expect(g.rows['4']).toEqual(o.perRow.get(4));
      expect(g.cols['4']).toEqual(o.perCol.get(4));
      expect(g.rows[String(o.girth)]).toEqual(o.perRow.get(o.girth!));
      expect(g.cols[String(o.girth)]).toEqual(o.perCol.get(o.girth!));
      expect(Object.keys(g.structure)).toEqual(['rowWeights', 'colDegrees', 'rowOverlaps']);
    }
    expect(j.joint.checks).toEqual({ x: hx.rows, z: hz.rows });
  });

  it('--max-length 10 on one graph; text output names girth, methods and offenders', async () => {
    const r = await run('cycles', '--family', 'toric:L=3', '--graph', 'x', '--max-length', '10');
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/girth +6/);
    expect(r.out).toMatch(/10-cycles +36 +homomorphism counts/);
    expect(r.out).toMatch(/most 6-cycles, rows:/);
    expect(r.out).not.toMatch(/HZ/);
  });

  it('a classical family is one matrix: plain census object; --graph is refused', async () => {
    const r = await run('cycles', '--family', 'cyclic:n=7,g=1+x+x^3', '--json');
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.girth).not.toBeUndefined();
    expect(j.x).toBeUndefined();
    const bad = await run('cycles', '--family', 'cyclic:n=7,g=1+x+x^3', '--graph', 'x');
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/^overcheck: .*--graph/);
  });

  it('bad options exit 2 with one line', async () => {
    for (const args of [['--max-length', '9'], ['--max-length', '14'], ['--graph', 'y'], ['--top', '-1']]) {
      const r = await run('cycles', '--family', 'toric:L=3', ...args);
      expect(r.code).toBe(2);
      expect(r.err.trim().split('\n')).toHaveLength(1);
      expect(r.out).toBe('');
    }
  });
});
