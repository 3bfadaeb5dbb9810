// Kill and resume for trial, distance and the trial stage of run: every finished batch or chunk is in the
// results journal, and the resumed run ends with exactly the result of one uninterrupted run.
import { spawn, type ChildProcess } from 'node:child_process';
import { copyFileSync, existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { BIN, runCli } from '../support/cli.js';

const LANTERN = 'gb:l=21,a=1+x+x^5,b=1+x^6+x^11';
const BB144 = 'bb:l=12,m=6,A=x^3+y+y^2,B=y^3+x+x^2';

function lines(path: string): number {
  if (!existsSync(path)) return 0;
  return readFileSync(path, 'utf8').split('\n').filter((l) => l !== '').length;
}

/** Start the CLI, wait until `path` has more than `atLeast` lines, then send `signal`; resolves with the exit. */
async function killWhen(args: string[], path: string, atLeast: number, signal: NodeJS.Signals, cwd?: string) {
  const child: ChildProcess = spawn(process.execPath, [BIN, ...args], { cwd, stdio: ['ignore', 'pipe', 'pipe'] });
  let out = '';
  let err = '';
  child.stdout!.on('data', (d) => (out += d));
  child.stderr!.on('data', (d) => (err += d));
  const exited = new Promise<number | null>((r) => child.on('exit', (code, sig) => r(code ?? (sig ? -1 : null))));
  let ended = false;
  void exited.then(() => (ended = true));
  const t0 = Date.now();
  while (!ended && lines(path) <= atLeast) {
    if (Date.now() - t0 > 120_000) throw new Error('no progress');
    await new Promise((r) => setTimeout(r, 20));
  }
  if (!ended) child.kill(signal);
  const code = await exited;
  await new Promise((r) => setTimeout(r, 50));
  return { code, out, err, linesAtKill: lines(path) };
}

type Point = { label: string; p: number; shots: number; failures: number; iterationSum: number; syndromeFailures: number; stoppedBy: string };
const counts = (r: { points: Point[] }) => r.points.map((p) => [p.label, p.p, p.shots, p.failures, p.syndromeFailures, p.iterationSum, p.stoppedBy]);

describe('results journal: killed runs resume exactly', () => {
  const trialArgs = ['trial', '--family', LANTERN, '--p', '0.03,0.05', '--shots', '250000', '--seed', '8', '--json'];
  let whole: { points: Point[] } | null = null;
  const reference = () => {
    if (!whole) {
      const r = runCli(trialArgs);
      expect(r.code).toBe(0);
      whole = JSON.parse(r.out);
    }
    return whole!;
  };
  const totalBatches = 2 * Math.ceil(250000 / 256);

  it('trial: SIGKILL mid-run, then --resume: the journal kept every finished batch and the totals equal one run', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'oc-journal-'));
    const j = join(dir, 'trial.jsonl');
    const killed = await killWhen([...trialArgs, '--checkpoint', j], j, 30, 'SIGKILL');
    expect(killed.code).toBe(-1);
    // killed mid-run: some batches journalled, not all
    expect(killed.linesAtKill).toBeGreaterThan(30);
    expect(killed.linesAtKill).toBeLessThan(totalBatches + 1);
    const resumed = runCli([...trialArgs, '--resume', j]);
    expect(resumed.code).toBe(0);
    const r = JSON.parse(resumed.out);
    expect(r.journal.reused).toBeGreaterThanOrEqual(killed.linesAtKill - 1);
    expect(r.journal.reused + r.journal.computed).toBe(totalBatches);
    expect(counts(r)).toEqual(counts(reference()));
  }, 180_000);

  it('trial: SIGINT without --checkpoint saves the journal in the working directory, says how to resume, exits 130', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'oc-journal-'));
    const child = spawn(process.execPath, [BIN, ...trialArgs, '--progress'], { cwd: dir, stdio: ['ignore', 'pipe', 'pipe'] });
    let out = '';
    let err = '';
    child.stdout.on('data', (d) => (out += d));
    child.stderr.on('data', (d) => (err += d));
    const exited = new Promise<number | null>((r) => child.on('exit', (c) => r(c)));
    // wait for the first progress line (about a second of decoding)
    const t0 = Date.now();
    while (!/shots \d+\/250000/.test(err)) {
      if (Date.now() - t0 > 120_000) throw new Error('no progress');
      await new Promise((r) => setTimeout(r, 20));
    }
    child.kill('SIGINT');
    const code = await exited;
    expect(code).toBe(130);
    const part = JSON.parse(out);
    expect(part.points.some((p: Point) => p.stoppedBy === 'interrupted')).toBe(true);
    const saved = join(dir, 'overcheck-trial.journal.jsonl');
    expect(err).toMatch(/--resume overcheck-trial\.journal\.jsonl/);
    const done = part.points.reduce((a: number, p: Point) => a + p.shots, 0);
    expect(lines(saved) - 1).toBe(Math.ceil(done / 256));
    const resumed = runCli([...trialArgs, '--resume', 'overcheck-trial.journal.jsonl'], dir);
    expect(resumed.code).toBe(0);
    expect(counts(JSON.parse(resumed.out))).toEqual(counts(reference()));
  }, 180_000);

  it('distance: SIGINT mid-audit with --checkpoint, then --resume: same bounds, words, iterations and miss probability as one run', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'oc-journal-'));
    const args = ['distance', '--family', BB144, '--side', 'x', '--method', 'isd', '--iterations', '30000', '--seed', '3', '--json'];
    const j = join(dir, 'd.jsonl');
    const killed = await killWhen([...args, '--checkpoint', j], j, 8, 'SIGINT');
    expect(killed.code).toBe(130);
    expect(killed.err).toMatch(new RegExp(`--resume ${j.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&')}`));
    const part = JSON.parse(killed.out);
    expect(part.dx.stoppedBy).toBe('interrupted');
    expect(part.dx.isd.iterations).toBeLessThan(30000);
    const resumed = runCli([...args, '--resume', j]);
    expect(resumed.code).toBe(0);
    const whole = runCli(args);
    const facts = (s: string) => {
      const r = JSON.parse(s);
      return [r.dx.upper, r.dx.lower, r.dx.count, r.dx.witness, r.dx.missProbability, r.dx.stoppedBy, r.dx.isd];
    };
    expect(facts(resumed.out)).toEqual(facts(whole.out));
    expect(JSON.parse(resumed.out).journal.reused).toBeGreaterThan(8);
  }, 180_000);

  it('run: killed during the trial stage, the same command resumes the stage from DIR/trial.journal.jsonl', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'oc-journal-run-'));
    for (const f of ['lantern42.hx.mtx', 'lantern42.hz.alist']) copyFileSync(join(__dirname, '..', '..', 'matrices', f), join(dir, f));
    const config = join(dir, 'c.json');
    writeFileSync(config, JSON.stringify({
      code: { hx: 'lantern42.hx.mtx', hz: 'lantern42.hz.alist' }, sides: 'both', seed: 3,
      search: { maxWeight: 8 }, distance: { enabled: false }, condition: { budget: 'extra=20' }, cycles: { maxLength: 6 },
      trial: { p: [0.02, 0.04], decoder: 'bp2', iterationsOriginal: 16, iterationsConditioned: 3, shots: 60000 },
    }));
    const out = join(dir, 'out');
    const journal = join(out, 'trial.journal.jsonl');
    const killed = await killWhen(['run', config, '--out', out], journal, 20, 'SIGKILL');
    expect(killed.code).toBe(-1);
    expect(killed.linesAtKill).toBeLessThan(4 * Math.ceil(60000 / 256) + 1);
    const again = runCli(['run', config, '--out', out]);
    expect(again.code).toBe(0);
    expect(again.err).toMatch(/search: reusing the saved result/);
    expect(again.err).toMatch(/trial: \d+ finished batches replayed/);
    const fresh = runCli(['run', config, '--out', join(dir, 'fresh')]);
    expect(fresh.code).toBe(0);
    const trialOf = (d: string) => counts(JSON.parse(readFileSync(join(d, 'run.json'), 'utf8')).trial);
    expect(trialOf(out)).toEqual(trialOf(join(dir, 'fresh')));
  }, 240_000);
});
