import { afterEach, describe, expect, it, vi } from 'vitest';
import { main } from '../../src/cli/main.js';

async function run(args: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const o = vi.spyOn(process.stdout, 'write').mockImplementation((s: string | Uint8Array) => ((out += String(s)), true));
  const e = vi.spyOn(process.stderr, 'write').mockImplementation((s: string | Uint8Array) => ((err += String(s)), true));
  try {
    const code = await main(['node', 'overcheck', 'trial', ...args]);
    return { code, out, err };
  } finally {
    o.mockRestore();
    e.mockRestore();
  }
}

afterEach(() => vi.restoreAllMocks());

describe('overcheck trial', () => {
  it('prints one JSON object with the contract keys', async () => {
    const r = await run(['--family', 'toric:L=3', '--p', '0.03,0.06', '--shots', '300', '--decoder', 'bp4', '--osd', 'cs:3', '--workers', '0', '--seed', '7', '--json']);
    expect(r.code).toBe(0);
    const lines = r.out.trim().split('\n');
    expect(lines).toHaveLength(1);
    const j = JSON.parse(lines[0]!);
    expect(j.seed).toBe(7);
    expect(j.points).toHaveLength(2);
    for (const p of j.points) {
      for (const key of ['label', 'p', 'shots', 'failures', 'rate', 'interval', 'meanIterations']) expect(p).toHaveProperty(key);
      expect(p.shots).toBe(300);
      expect(p.failures).toBe(p.syndromeFailures + p.logicalFailures);
      expect(p.interval[0]).toBeLessThanOrEqual(p.rate);
      expect(p.interval[1]).toBeGreaterThanOrEqual(p.rate);
    }
  });

  it('same seed, same result for any worker count; compares a matrix on the same errors', async () => {
    const args = ['--family', 'toric:L=3', '--p', '0.05', '--shots', '400', '--batch', '64', '--compare', 'again=-,-', '--json'];
    const a = JSON.parse((await run([...args, '--workers', '0'])).out);
    const b = JSON.parse((await run([...args, '--workers', '2'])).out);
    const strip = (j: { points: { decodesPerSecond?: number }[] }) => j.points.map(({ decodesPerSecond: _, ...rest }) => rest);
    expect(strip(b)).toEqual(strip(a));
    expect(a.comparisons).toHaveLength(1);
    expect(a.comparisons[0].difference).toBe(0);
    expect(a.points.map((p: { label: string }) => p.label)).toEqual(['original', 'again']);
  });

  it('prints a text table by default', async () => {
    const r = await run(['--family', 'surface:d=3', '--p', '0.05', '--shots', '200', '--weight', '1', '--exhaustive', '--workers', '0']);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/matrix +p +shots +failures/);
    expect(r.out).toMatch(/original +0\.05 +27 /);
    expect(r.err).toMatch(/--shots is ignored with --exhaustive/);
  });

  it('bad input: one line, exit 2', async () => {
    for (const args of [
      ['--family', 'toric:L=3', '--p', '1.5'],
      ['--family', 'toric:L=3', '--p', '0.1', '--osd', 'cs:x'],
      ['--family', 'toric:L=3', '--p', '0.1', '--decoder', 'bp8'],
      ['--family', 'toric:L=3', '--p', '0.1', '--exhaustive'],
      ['--family', 'toric:L=3', '--p', '0.1', '--compare', 'nolabel'],
      ['--family', 'cyclic:n=7,g=1+x+x^3', '--p', '0.1'],
    ]) {
      const r = await run(args);
      expect(r.code, args.join(' ')).toBe(2);
      expect(r.err.trim().split('\n')).toHaveLength(1);
      expect(r.err).toMatch(/^overcheck: /);
    }
  });
});
