import { runCliAsync } from '../support/cli.js';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { FormatError, InputError } from '../../src/errors.js';
import { fromDense, toDense, zeros } from '../../src/gf2/index.js';
import { type MatrixFormat, readMatrixFile, writeMatrixFile } from '../../src/formats/index.js';

const dir = mkdtempSync(join(tmpdir(), 'overcheck-formats-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));


const FORMATS: readonly MatrixFormat[] = ['mtx', 'alist', 'dense', 'json'];

describe('file side', () => {
  it('a missing file is a one-line InputError naming it', () => {
    const path = join(dir, 'nope.mtx');
    expect(() => readMatrixFile(path)).toThrow(InputError);
    expect(() => readMatrixFile(path)).toThrow(`${path}: no such file`);
    expect(() => readMatrixFile(dir)).toThrow(`${dir}: is a directory`);
  });

  it('writes atomically, overwrites, leaves no temporary file, and reads back', () => {
    const m = fromDense([[1, 0, 1], [0, 1, 1]]);
    const sub = mkdtempSync(join(dir, 'w-'));
    for (const f of FORMATS) {
      const path = join(sub, `m.${f}`);
      writeFileSync(path, 'old contents');
      writeMatrixFile(path, m, f);
      expect(toDense(readMatrixFile(path))).toEqual(toDense(m));
    }
    expect(readdirSync(sub).sort()).toEqual(FORMATS.map((f) => `m.${f}`).sort());
  });

  it('a refused write touches nothing; a missing directory is an InputError', () => {
    const path = join(dir, 'empty.dense');
    expect(() => writeMatrixFile(path, zeros(0, 4), 'dense')).toThrow(InputError);
    expect(existsSync(path)).toBe(false);
    expect(() => writeMatrixFile(join(dir, 'no-such-dir', 'm.mtx'), zeros(1, 1), 'mtx')).toThrow(/no-such-dir.*directory does not exist/);
  });

  it('errors from a file carry its path', () => {
    const path = join(dir, 'bad.txt');
    writeFileSync(path, '101\n11\n');
    expect(() => readMatrixFile(path)).toThrow(FormatError);
    expect(() => readMatrixFile(path)).toThrow(`${path}:2: row has 2 entries, but the first row (line 1) has 3`);
  });
});

describe('CLI', () => {
  const bad: [string, string, number][] = [
    ['bad.mtx', '%%MatrixMarket matrix coordinate integer general\n2 2 1\n1 1 5\n', 3],
    ['bad.alist', '2 1\n1 2\n1 1\n2\n1\n3\n1 2\n', 6],
    ['bad.dense', '# c\n10\n101\n', 3],
    ['bad.json', '{"rows":1,"cols":2,\n"support":[[0,2]]}\n', 2],
    ['empty.mtx', '', 1],
    ['cut.mtx', '%%MatrixMarket matrix coordinate pattern general\n2 2 2\n1 1\n', 3],
  ];
  for (const [name, text] of bad) writeFileSync(join(dir, name), text);

  it('bad files: exit 2 and exactly one stderr line "overcheck: FILE:LINE: ..."', async () => {
    const runs = await Promise.all(bad.map(([name]) => cli('info', '--h', join(dir, name))));
    runs.forEach((r, i) => {
      const [name, , line] = bad[i]!;
      expect(r.code).toBe(2);
      expect(r.stdout).toBe('');
      expect(r.stderr.startsWith(`overcheck: ${join(dir, name)}:${line}: `)).toBe(true);
      expect(r.stderr.endsWith('\n')).toBe(true);
      expect(r.stderr.trimEnd().split('\n')).toHaveLength(1);
    });
  });

  it('a bad --hx or --hz file, and a missing one, the same way', async () => {
    const good = join(dir, 'good.txt');
    writeFileSync(good, '11\n');
    const badJson = join(dir, 'bad.json');
    const [x, z, missing] = await Promise.all([
      cli('info', '--hx', badJson, '--hz', good),
      cli('info', '--hx', good, '--hz', badJson),
      cli('info', '--hx', good, '--hz', join(dir, 'missing.mtx')),
    ]);
    for (const r of [x, z]) {
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(new RegExp(`^overcheck: ${badJson.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}:2: [^\\n]+\\n$`));
    }
    expect(missing.code).toBe(2);
    expect(missing.stderr).toBe(`overcheck: ${join(dir, 'missing.mtx')}: no such file\n`);
  });

  it('make toric:L=3 in every format, then info reads n = 18, k = 2', async () => {
    // common practice: the toric code on an L x L torus is [[2L², 2]]
    const makes = await Promise.all(FORMATS.map((f) => cli('make', '--family', 'toric:L=3', '--out', join(dir, `t-${f}`), '--format', f)));
    makes.forEach((r) => expect(r.code).toBe(0));
    const infos = await Promise.all(FORMATS.map((f) => cli('info', '--hx', join(dir, `t-${f}.hx.${f}`), '--hz', join(dir, `t-${f}.hz.${f}`), '--json')));
    infos.forEach((r, i) => {
      expect(r.code, r.stderr).toBe(0);
      const s = JSON.parse(r.stdout) as { n: number; k: number; hx: { rows: number } };
      expect([FORMATS[i], s.n, s.k]).toEqual([FORMATS[i], 18, 2]);
      expect(s.hx.rows).toBe(9); // common practice: the toric code has L² X checks (one of them redundant)
    });
    // all four files describe the same matrices
    const hx = FORMATS.map((f) => toDense(readMatrixFile(join(dir, `t-${f}.hx.${f}`))));
    for (const h of hx) expect(h).toEqual(hx[0]);
    expect(readFileSync(join(dir, 't-mtx.hx.mtx'), 'utf8').split('\n')[0]).toBe('%%MatrixMarket matrix coordinate pattern general');
  });
});

/** The built CLI, with stdout/stderr under the names these tests use. */
async function cli(...args: string[]): Promise<{ code: number | null; stdout: string; stderr: string }> {
  const r = await runCliAsync(args);
  return { code: r.code, stdout: r.out, stderr: r.err };
}
