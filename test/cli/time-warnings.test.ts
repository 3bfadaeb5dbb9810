// The warning a long request gets when it cannot finish within --time-limit at the measured rate.
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCliAsync } from '../support/cli.js';

describe('--time-limit: warned when the measured rate cannot finish the request', () => {
  it('trial and distance warn, stop at the limit with a valid partial result, and exit 0', async () => {
    const [trial, distance] = await Promise.all([
      runCliAsync(['trial', '--family', 'gb:l=21,a=1+x+x^5,b=1+x^6+x^11', '--p', '0.02', '--shots', '50000000', '--time-limit', '3', '--workers', '1', '--json']),
      runCliAsync(['distance', '--family', 'bb:l=12,m=6,A=x^3+y+y^2,B=y^3+x+x^2', '--side', 'x', '--method', 'isd', '--iterations', '50000000', '--time-limit', '3', '--workers', '1', '--json']),
    ]);
    expect(trial.code).toBe(0);
    expect(trial.err).toMatch(/warning: at the measured \d+ shots\/s the remaining \d+ shots take about \d+ s, more than the \d+ s left of --time-limit/);
    const t = JSON.parse(trial.out);
    expect(t.points[0].stoppedBy).toBe('time');
    expect(t.points[0].shots).toBeGreaterThan(0);
    expect(t.points[0].shots).toBeLessThan(50000000);
    expect(distance.code).toBe(0);
    expect(distance.err).toMatch(/warning: at the measured \d+ information sets\/s the remaining \d+ take about \d+ s/);
    const d = JSON.parse(distance.out);
    expect(d.dx.stoppedBy).toBe('time-limit');
    expect(d.dx.upper).toBeGreaterThanOrEqual(12); // [[144,12,12]] source: Bravyi et al., Nature 627, 778 (2024)
  }, 60_000);

  it('run: stages cut short by their limits are noted in run.json (and so in the report)', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'oc-notes-'));
    const config = join(dir, 'c.json');
    writeFileSync(config, JSON.stringify({
      code: { family: 'bb:l=12,m=6,A=x^3+y+y^2,B=y^3+x+x^2' }, sides: 'x', workers: 1,
      search: { maxWeight: 6 }, distance: { enabled: true, method: 'certify', timeLimit: 1 }, condition: { budget: 'extra=4' }, cycles: { maxLength: 4 },
      trial: { p: [0.03], shots: 100000000, timeLimit: 1, iterationsOriginal: 4, iterationsConditioned: 2 },
    }));
    const r = await runCliAsync(['run', config, '--out', join(dir, 'out')]);
    expect(r.code).toBe(0);
    const notes: string[] = JSON.parse(readFileSync(join(dir, 'out', 'run.json'), 'utf8')).notes;
    // [[144,12,12]] cannot be certified in a second (about 9e12 combinations; see DEVELOPERS.md)
    expect(notes).toContain('distance: dX is not certified (stopped by time-limit); the bounds are those reached');
    expect(notes.some((n) => /^trial: 3 points stopped at trial\.timeLimit/.test(n))).toBe(true);
    expect(readFileSync(join(dir, 'out', 'report.html'), 'utf8')).toContain('is not certified (stopped by time-limit)');
  }, 60_000);
});
