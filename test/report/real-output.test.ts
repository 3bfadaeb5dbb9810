import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { collectReport } from '../../src/report/index.js';
import { BIN } from './fixture.js';

describe('the report reads real command output', () => {
  it('`cycles --json` of a CSS code (metadata beside the per-graph censuses), alone and as before/after', () => {
    const out = spawnSync(process.execPath, [BIN, 'cycles', '--family', 'toric:L=3', '--json'], { encoding: 'utf8' }).stdout;
    const value = JSON.parse(out);
    const model = collectReport([{ file: 'c.json', value }], { version: 'test', command: 'test' });
    expect(model.notes).toEqual([]);
    expect(model.cycles.map((c) => c.label).sort()).toEqual(['X', 'Z', 'joint']);
    const both = collectReport([{ file: 'b.json', value: { before: value, after: value } }], { version: 'test', command: 'test' });
    expect(both.notes).toEqual([]);
    expect(both.cycles.length).toBe(6);
  });
});
