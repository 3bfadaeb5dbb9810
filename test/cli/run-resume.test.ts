import { BIN } from '../support/cli.js';
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';


function progressOf(path: string): { words: Set<string>; iterations: number; nextStream: number } {
  const words = new Set<string>();
  let iterations = 0;
  let nextStream = 0;
  for (const line of readFileSync(path, 'utf8').split('\n')) {
    let o: { side?: string; support?: number[]; progress?: { iterations: number; nextStream: number } };
    try {
      o = JSON.parse(line);
    } catch {
      continue;
    }
    if (o.side !== 'x') continue;
    if (o.support) words.add(o.support.join(','));
    if (o.progress) ({ iterations, nextStream } = o.progress);
  }
  return { words, iterations, nextStream };
}

describe('run: interrupted and resumed', () => {
  it('a killed run resumes: nothing found before the kill is lost and the iterations add up', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'oc-run-'));
    const config = join(dir, 'c.json');
    writeFileSync(config, JSON.stringify({
      code: { family: 'hgp:h1=(regular:n=40,col=3,row=4,seed=1)' },
      sides: 'x',
      seed: 5,
      workers: 1,
      search: { maxWeight: 10, method: 'isd', targetMiss: 1e-4 },
      distance: { enabled: false },
      condition: { budget: 'extra=10', strategy: 'lightest' },
      cycles: { maxLength: 4 },
      trial: { enabled: false },
    }));
    const out = join(dir, 'out');
    const words = join(out, 'words.jsonl');
    const child = spawn(process.execPath, [BIN, 'run', config, '--out', out], { stdio: 'ignore' });
    const t0 = Date.now();
    while (!(existsSync(words) && progressOf(words).iterations > 0)) {
      if (Date.now() - t0 > 60_000) throw new Error('no progress');
      await new Promise((r) => setTimeout(r, 100));
    }
    child.kill('SIGKILL');
    await new Promise((r) => child.on('exit', r));
    const before = progressOf(words);
    expect(before.words.size).toBeGreaterThan(0);
    const again = spawnSync(process.execPath, [BIN, 'run', config, '--out', out], { encoding: 'utf8' });
    expect(again.status).toBe(0);
    const bundle = JSON.parse(readFileSync(join(out, 'run.json'), 'utf8'));
    const x = bundle.search.x;
    const after = new Set<string>(x.words.map((w: number[]) => w.join(',')));
    for (const w of before.words) expect(after.has(w)).toBe(true);
    // the resumed part started on fresh streams after the saved ones, and the totals are the sum of both parts
    expect(x.streams.first).toBe(before.nextStream);
    const resumedPart = x.iterations - before.iterations;
    expect(resumedPart).toBeGreaterThan(0);
    expect(Math.max(...Object.values(x.missProbability as Record<string, number>))).toBeLessThan(1e-4);
    expect(existsSync(join(out, 'report.html'))).toBe(true);
    expect(existsSync(join(out, 'conditioned.hx.mtx'))).toBe(true);
    // a third run reuses every stage
    const third = spawnSync(process.execPath, [BIN, 'run', config, '--out', out], { encoding: 'utf8' });
    expect(third.status).toBe(0);
    expect(third.stderr).toMatch(/search: reusing the saved result/);
  }, 180_000);

  it('SIGINT during a run saves, says how to resume and exits 130', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'oc-run-'));
    const config = join(dir, 'c.json');
    writeFileSync(config, JSON.stringify({
      code: { family: 'hgp:h1=(regular:n=40,col=3,row=4,seed=1)' }, sides: 'x', workers: 1,
      search: { maxWeight: 10, method: 'isd', targetMiss: 1e-12 }, distance: { enabled: false }, trial: { enabled: false },
    }));
    const out = join(dir, 'out');
    const child = spawn(process.execPath, [BIN, 'run', config, '--out', out], { stdio: ['ignore', 'ignore', 'pipe'] });
    let err = '';
    child.stderr.on('data', (d) => (err += d));
    const words = join(out, 'words.jsonl');
    const t0 = Date.now();
    while (!(existsSync(words) && progressOf(words).iterations > 0)) {
      if (Date.now() - t0 > 60_000) throw new Error('no progress');
      await new Promise((r) => setTimeout(r, 100));
    }
    child.kill('SIGINT');
    const code = await new Promise((r) => child.on('exit', r));
    expect(code).toBe(130);
    expect(err).toMatch(/run the same command again to resume/);
    expect(progressOf(words).words.size).toBeGreaterThan(0);
  }, 120_000);
});
