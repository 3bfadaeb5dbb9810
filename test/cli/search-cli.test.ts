import { BIN, runCli as run } from '../support/cli.js';
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const HGP = 'hgp:h1=(regular:n=40,col=3,row=4,seed=1)';


function wordsIn(path: string): { words: Set<string>; iterations: number } {
  const words = new Set<string>();
  let iterations = 0;
  for (const line of readFileSync(path, 'utf8').split('\n')) {
    if (!line.trim()) continue;
    let o: { support?: number[]; progress?: { iterations: number } };
    try {
      o = JSON.parse(line);
    } catch {
      continue; // a line cut by the kill
    }
    if (o.support) words.add(o.support.join(','));
    if (o.progress) iterations = o.progress.iterations;
  }
  return { words, iterations };
}

async function waitFor(cond: () => boolean, ms: number): Promise<void> {
  const t0 = Date.now();
  while (!cond()) {
    if (Date.now() - t0 > ms) throw new Error('timed out waiting');
    await new Promise((r) => setTimeout(r, 100));
  }
}

describe('search command', () => {
  it('prints the JSON contract for one side and for both', () => {
    const one = run(['search', '--family', 'gb:l=24,a=1+x^2+x^8+x^15,b=1+x^2+x^12+x^17', '--side', 'x', '--max-weight', '12', '--json']);
    expect(one.code).toBe(0);
    const r = JSON.parse(one.out);
    for (const k of ['side', 'maxWeight', 'method', 'seed', 'iterations', 'counts', 'orbits', 'missProbability', 'complete', 'words']) expect(r).toHaveProperty(k);
    expect(r.complete).toBe(true);
    expect(r.counts['8']).toBe(24); // the 24 weight-8 rows of HX
    const both = JSON.parse(run(['search', '--family', 'toric:L=3', '--side', 'both', '--json']).out);
    expect(Object.keys(both).sort()).toEqual(['x', 'z']);
    // common practice: the toric code's checks have weight 4; with L = 3 the lightest words are the 9 checks
    expect(both.x.counts['4']).toBe(9);
  });

  it('rejects bad options with exit 2 and one line', () => {
    for (const args of [
      ['search', '--family', 'toric:L=3'],
      ['search', '--family', 'toric:L=3', '--side', 'w'],
      ['search', '--family', 'toric:L=3', '--side', 'x', '--target-miss', 'abc'],
      ['search', '--family', 'toric:L=3', '--side', 'x', '--symmetry', 'blocks=2,l=4'],
      ['search', '--family', 'bb:l=12,m=6,A=x^3+y+y^2,B=y^3+x+x^2', '--side', 'x', '--method', 'exhaustive'],
    ]) {
      const r = run(args);
      expect(r.code).toBe(2);
      expect(r.err.trim().split('\n')).toHaveLength(1);
      expect(r.err).toMatch(/^overcheck: /);
    }
  });

  it('a killed --out run resumes without losing words and sums the iterations', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'oc-search-'));
    const file = join(dir, 'words.jsonl');
    const child = spawn(process.execPath, [BIN, 'search', '--family', HGP, '--side', 'x', '--max-weight', '10', '--method', 'isd', '--target-miss', '1e-30', '--workers', '1', '--out', file], { stdio: 'ignore' });
    await waitFor(() => existsSync(file) && wordsIn(file).iterations > 0, 60_000);
    child.kill('SIGKILL');
    await new Promise((r) => child.on('exit', r));
    const before = wordsIn(file);
    expect(before.words.size).toBeGreaterThan(0);
    const resumed = run(['search', '--family', HGP, '--side', 'x', '--max-weight', '10', '--method', 'isd', '--iterations', '8', '--workers', '1', '--resume', file, '--json']);
    expect(resumed.err).toBe('');
    expect(resumed.code).toBe(0);
    const r = JSON.parse(resumed.out);
    const after = new Set<string>(r.words.map((w: number[]) => w.join(',')));
    for (const w of before.words) expect(after.has(w)).toBe(true);
    expect(r.iterations).toBe(before.iterations + 8);
    expect(r.streams.first).toBeGreaterThan(0);
    const final = wordsIn(file);
    expect(final.iterations).toBe(r.iterations);
    expect(final.words).toEqual(after);
  }, 120_000);

  it('SIGINT stops at a chunk boundary, saves, says how to resume and exits 130', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'oc-search-'));
    const file = join(dir, 'words.jsonl');
    const child = spawn(process.execPath, [BIN, 'search', '--family', HGP, '--side', 'x', '--max-weight', '10', '--method', 'isd', '--target-miss', '1e-30', '--workers', '1', '--out', file], { stdio: ['ignore', 'pipe', 'pipe'] });
    let err = '';
    child.stderr.on('data', (d) => (err += d));
    await waitFor(() => existsSync(file) && wordsIn(file).iterations > 0, 60_000);
    child.kill('SIGINT');
    const code = await new Promise((r) => child.on('exit', r));
    expect(code).toBe(130);
    expect(err).toMatch(/--resume/);
    const text = readFileSync(file, 'utf8');
    expect(text).toMatch(/"summary"/);
    expect(text).toMatch(/"stopReason":"interrupted"/);
  }, 120_000);

  it('SIGINT without --out saves the words in the working directory all the same, and --resume goes on from them', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'oc-search-'));
    const args = ['search', '--family', HGP, '--side', 'x', '--max-weight', '10', '--method', 'isd', '--target-miss', '1e-30', '--workers', '1', '--progress'];
    const child = spawn(process.execPath, [BIN, ...args], { cwd: dir, stdio: ['ignore', 'pipe', 'pipe'] });
    let err = '';
    child.stderr.on('data', (d) => (err += d));
    await waitFor(() => /search x: \d+ iterations/.test(err), 60_000);
    child.kill('SIGINT');
    const code = await new Promise((r) => child.on('exit', r));
    expect(code).toBe(130);
    const saved = join(dir, 'overcheck-search.words.jsonl');
    expect(err).toMatch(/--resume overcheck-search\.words\.jsonl/);
    const before = wordsIn(saved);
    expect(before.words.size).toBeGreaterThan(0);
    const again = spawnSync(process.execPath, [BIN, ...args.slice(0, -1).map((a) => (a === '1e-30' ? '1e-3' : a)), '--resume', 'overcheck-search.words.jsonl', '--json'], { cwd: dir, encoding: 'utf8' });
    expect(again.status).toBe(0);
    const r = JSON.parse(again.stdout);
    const after = new Set<string>(r.words.map((w: number[]) => w.join(',')));
    for (const w of before.words) expect(after.has(w)).toBe(true);
  }, 120_000);

  it('--max-memory stops the word store before it outgrows the limit, says so, and the result is marked incomplete', () => {
    const lantern = 'gb:l=21,a=1+x+x^5,b=1+x^6+x^11'; // demo code; 546 words of weight ≤ 10 per side by exhaustive search
    const full = JSON.parse(run(['search', '--family', lantern, '--side', 'x', '--max-weight', '10', '--json']).out);
    expect(full.complete).toBe(true);
    const r = run(['search', '--family', lantern, '--side', 'x', '--max-weight', '10', '--max-memory', '16K', '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.truncated).toBe(true);
    expect(j.complete).toBe(false);
    expect(j.wordCount).toBeLessThan(full.wordCount);
    expect(r.err).toMatch(/stopped at \d+ words, the --max-words 2000000 \/ --max-memory 16K limit for the word store/);
    expect(run(['search', '--family', lantern, '--side', 'x', '--max-memory', '0']).err).toMatch(/--max-memory: 0 is too small/);
  });
});
