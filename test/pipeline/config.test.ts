import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { DEFAULT_CONFIG, parseRunConfig } from '../../src/pipeline/config.js';

describe('run configuration', () => {
  it('the bundled demo configuration is valid and fills defaults', () => {
    const file = join(import.meta.dirname, '..', '..', 'matrices', 'lantern42.run.json');
    const c = parseRunConfig(JSON.parse(readFileSync(file, 'utf8')), file);
    expect(c.code).toEqual({ hx: 'lantern42.hx.mtx', hz: 'lantern42.hz.alist' });
    expect(c.workers).toBe(DEFAULT_CONFIG.workers);
    expect(c.trial.p).toEqual([0.01, 0.02, 0.04]);
  });

  const bad: [unknown, RegExp][] = [
    [{}, /field "code": expected an object/],
    [{ code: { hx: 'a' } }, /field "code.hz": expected a file name/],
    [{ code: { family: 'toric:L=3' }, colour: 1 }, /field "colour": unknown field/],
    [{ code: { family: 'toric:L=3' }, trial: { p: [0.5, 2] } }, /field "trial.p": expected a non-empty list/],
    [{ code: { family: 'toric:L=3' }, search: { method: 'fast' } }, /field "search.method": expected one of "auto", "exhaustive", "isd"/],
    [{ code: { family: 'toric:L=3' }, condition: { iterations: 0 } }, /field "condition.iterations": expected a whole number ≥ 1/],
    [{ code: { family: 'toric:L=3' }, cycles: { maxLength: 9 } }, /field "cycles.maxLength": expected an even length/],
    [{ code: { family: 'toric:L=3' }, trial: { osd: 'cs' } }, /field "trial.osd"/],
    [{ code: { family: 'toric:L=3' }, search: { speed: 1 } }, /field "search.speed": unknown field/],
  ];
  for (const [value, re] of bad) {
    it(`names the field: ${re.source}`, () => {
      expect(() => parseRunConfig(value, 'c.json')).toThrow(re);
      expect(() => parseRunConfig(value, 'c.json')).toThrow(/^c\.json: /);
    });
  }
});
