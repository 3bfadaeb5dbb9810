import { describe, expect, it } from 'vitest';
import { openPool, runOrdered } from '../../src/parallel/pool.js';
import { streamRng } from '../../src/parallel/seeds.js';

describe('task pool', () => {
  it('runs tasks in worker threads and delivers them in index order', async () => {
    const pool = await openPool(2);
    try {
      const seen: number[] = [];
      const n = await runOrdered<{ i: number }>(pool, 10, (i) => ({ kind: 'echo', payload: { i } }), (i, r) => {
        expect(r.i).toBe(i);
        seen.push(i);
      });
      expect(n).toBe(10);
      expect(seen).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8, 9]);
      const arr = new Uint32Array([1, 2, 3]);
      const back = await pool.run<Uint32Array>('echo', arr, [arr.buffer]);
      expect(back).toBeInstanceOf(Uint32Array);
      expect([...back]).toEqual([1, 2, 3]);
    } finally {
      await pool.close();
    }
  });

  it('inline pool gives the same results', async () => {
    const pool = await openPool(0);
    const out: number[] = [];
    await runOrdered<{ i: number }>(pool, 3, (i) => ({ kind: 'echo', payload: { i } }), (_, r) => out.push(r.i));
    expect(out).toEqual([0, 1, 2]);
  });

  it('seed streams are reproducible and distinct', () => {
    const a = streamRng(7, 3);
    const b = streamRng(7, 3);
    const c = streamRng(7, 4);
    const xa = Array.from({ length: 5 }, () => a.nextU32());
    expect(Array.from({ length: 5 }, () => b.nextU32())).toEqual(xa);
    expect(Array.from({ length: 5 }, () => c.nextU32())).not.toEqual(xa);
    const r = streamRng('s', 0);
    for (let i = 0; i < 1000; i++) {
      const x = r.below(7);
      expect(x >= 0 && x < 7).toBe(true);
      const d = r.next();
      expect(d >= 0 && d < 1).toBe(true);
    }
  });
});
