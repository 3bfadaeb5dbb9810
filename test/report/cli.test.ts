import { runCliAsync } from '../support/cli.js';
import { createHash } from 'node:crypto';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { FormatError, InputError } from '../../src/errors.js';
import { parseJsonText, readJsonFile } from '../../src/formats/json-file.js';

const dir = mkdtempSync(join(tmpdir(), 'overcheck-report-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));


function file(name: string, text: string): string {
  const path = join(dir, name);
  writeFileSync(path, text);
  return path;
}

/** A small trial result (hand-made fixture, not data). */
const TRIAL = JSON.stringify({
  points: [
    { label: 'original', p: 0.01, shots: 1000, failures: 9, rate: 0.009, interval: [0.0047, 0.017] },
    { label: 'original', p: 0.02, shots: 1000, failures: 40, rate: 0.04, interval: [0.0295, 0.054] },
  ],
  seed: '3',
});

describe('json-file', () => {
  it('names the line of a syntax error, and tells JSON lines apart', () => {
    expect(() => parseJsonText('{\n  "a": 1,\n}\n', 'f.json')).toThrow(FormatError);
    expect(() => parseJsonText('{\n  "a": 1,\n}\n', 'f.json')).toThrow(/^f\.json:3: not JSON: /);
    expect(() => parseJsonText('{"a":1}\n{"b":2}\n', 'w.json')).toThrow(/^w\.json:2: several JSON values \(JSON lines\?\)/);
    expect(() => parseJsonText('  \n', 'e.json')).toThrow('e.json:1: empty file');
    expect(parseJsonText('\ufeff{"a":[1]}', 'b.json')).toEqual({ a: [1] });
  });

  it('a missing file is a one-line InputError; the hash is of the bytes of the file', () => {
    expect(() => readJsonFile(join(dir, 'none.json'))).toThrow(InputError);
    expect(() => readJsonFile(join(dir, 'none.json'))).toThrow(/none\.json: no such file$/);
    const text = '\ufeff {"a": 1}\n';
    const r = readJsonFile(file('bom.json', text));
    expect(r.value).toEqual({ a: 1 });
    expect(r.bytes).toBe(Buffer.byteLength(text));
    expect(r.sha256).toBe(createHash('sha256').update(Buffer.from(text)).digest('hex'));
    expect(r.sha256).not.toBe(createHash('sha256').update('{"a":1}').digest('hex'));
  });
});

describe('overcheck report', () => {
  it('writes the page atomically and says what it wrote', async () => {
    const trial = file('trial.json', TRIAL);
    const out = join(dir, 'page.html');
    const r = await cli('report', trial, '--out', out);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    expect(r.stdout).toBe(`wrote ${out} (error-rate, provenance)\n`);
    const html = readFileSync(out, 'utf8');
    expect(html.startsWith('<!DOCTYPE html>')).toBe(true);
    expect(html).toContain('data-chart="error-rate"');
    expect(readdirSync(dir).filter((f) => f.endsWith('.tmp'))).toEqual([]);
  });

  it('--json prints one object; input hashes are in the page', async () => {
    const trial = file('trial2.json', TRIAL);
    const out = join(dir, 'page2.html');
    const r = await cli('report', trial, '--out', out, '--json', '--title', 'Trial <b>only</b>');
    expect(r.code).toBe(0);
    const j = JSON.parse(r.stdout) as { out: string; sections: string[]; inputs: { file: string; kind: string; sha256: string }[] };
    expect(j.out).toBe(out);
    expect(j.sections).toEqual(['error-rate', 'provenance']);
    expect(j.inputs).toEqual([{ file: trial, kind: 'trial', sha256: readJsonFile(trial).sha256 }]);
    const html = readFileSync(out, 'utf8');
    expect(html).toContain(j.inputs[0]!.sha256);
    expect(html).toContain('<title>Trial &lt;b&gt;only&lt;/b&gt;</title>');
  });

  it('bad input: one line naming the file, exit 2, nothing written', async () => {
    const out = join(dir, 'never.html');
    const cases: [string[], RegExp][] = [
      [[file('broken.json', '{"points": [\n1,\n'), '--out', out], /^overcheck: .*broken\.json:3: not JSON: .*\n$/],
      [[file('lines.json', '{"side":"x"}\n{"support":[1]}\n'), '--out', out], /^overcheck: .*lines\.json:2: several JSON values/],
      [[file('odd.json', '{"hello": 1}'), '--out', out], /^overcheck: .*odd\.json: not a recognised overcheck result/],
      [[join(dir, 'absent.json'), '--out', out], /^overcheck: .*absent\.json: no such file\n$/],
      [[file('t3.json', TRIAL)], /^overcheck: --out FILE\.html is required\n$/],
      [[file('t4.json', TRIAL), '--out', join(dir, 'no-such-dir', 'x.html')], /^overcheck: .*x\.html: directory does not exist\n$/],
    ];
    const runs = await Promise.all(cases.map(([args]) => cli('report', ...args)));
    for (const [i, [args, message]] of cases.entries()) {
      const r = runs[i]!;
      expect(r.code, args.join(' ')).toBe(2);
      expect(r.stderr).toMatch(message);
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
      expect(r.stdout).toBe('');
    }
    expect(existsSync(out)).toBe(false);
  });
});

/** The built CLI, with stdout/stderr under the names these tests use. */
async function cli(...args: string[]): Promise<{ code: number | null; stdout: string; stderr: string }> {
  const r = await runCliAsync(args);
  return { code: r.code, stdout: r.out, stderr: r.err };
}
