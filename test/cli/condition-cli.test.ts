import { runCli as run } from '../support/cli.js';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readMatrixFile } from '../../src/formats/index.js';
import { equals, multiply, rank } from '../../src/gf2/index.js';
import { matrixHash } from '../../src/codes/hash.js';

const GB = 'gb:l=24,a=1+x^2+x^8+x^15,b=1+x^2+x^12+x^17';


describe('condition and trim commands', () => {
  const dir = mkdtempSync(join(tmpdir(), 'oc-cond-'));
  const search = run(['search', '--family', GB, '--side', 'both', '--max-weight', '12', '--json'], dir);
  writeFileSync(join(dir, 'words.json'), search.out);

  it('exports a bundle that re-imports to the numbers in its provenance', () => {
    for (const format of ['mtx', 'alist', 'json']) {
      const r = run(['condition', '--family', GB, '--words', 'words.json', '--budget', 'extra=100,col-degree=30', '--strategy', 'fewest-cycles', '--out', `b-${format}`, '--format', format, '--json'], dir);
      expect(r.err).toBe('');
      expect(r.code).toBe(0);
      const prov = JSON.parse(readFileSync(join(dir, `b-${format}.provenance.json`), 'utf8'));
      const orig = run(['make', '--family', GB, '--out', 'g', '--format', 'mtx'], dir);
      expect(orig.code).toBe(0);
      for (const side of ['x', 'z']) {
        const s = prov.sides[side];
        const m = readMatrixFile(join(dir, s.files.matrix));
        const map = readMatrixFile(join(dir, s.files.map));
        const h = readMatrixFile(join(dir, `g.h${side}.mtx`));
        expect(matrixHash(h)).toBe(prov.inputs[`h${side}`]);
        expect(matrixHash(m)).toBe(s.outputHash);
        expect(equals(multiply(map, h), m)).toBe(true);
        expect(rank(m)).toBe(rank(h));
        const info = JSON.parse(run(['info', '--h', s.files.matrix, '--json'], dir).out);
        expect(info.rows).toBe(s.after.rows);
        expect(info.edges).toBe(s.after.edges);
        expect(info.colWeight.max).toBe(s.after.maxColDegree);
        expect(info.colWeight.max).toBeLessThanOrEqual(30);
        expect(s.added).toBeLessThanOrEqual(100);
      }
    }
    // the same seed gives the same bundle
    run(['condition', '--family', GB, '--words', 'words.json', '--budget', 'extra=100,col-degree=30', '--strategy', 'fewest-cycles', '--out', 'again', '--format', 'mtx'], dir);
    expect(readFileSync(join(dir, 'again.hx.mtx'), 'utf8')).toBe(readFileSync(join(dir, 'b-mtx.hx.mtx'), 'utf8'));
  });

  it('trim keeps the row space, meets the budget, and refuses a matrix of another row space', () => {
    run(['condition', '--family', GB, '--words', 'words.json', '--side', 'x', '--budget', 'extra=300', '--out', 'big'], dir);
    run(['make', '--family', GB, '--out', 'g'], dir);
    const t = run(['trim', '--h', 'big.hx.mtx', '--original', 'g.hx.mtx', '--budget', 'rows=60', '--strategy', 'balanced', '--out', 'small', '--json'], dir);
    expect(t.code).toBe(0);
    const r = JSON.parse(t.out);
    expect(r.kept).toBe(60);
    const small = readMatrixFile(join(dir, 'small.h.mtx'));
    const h = readMatrixFile(join(dir, 'g.hx.mtx'));
    expect(rank(small)).toBe(rank(h));
    expect(equals(multiply(readMatrixFile(join(dir, 'small.h-map.mtx')), h), small)).toBe(true);
    const bad = run(['trim', '--h', 'big.hx.mtx', '--original', 'g.hz.mtx', '--budget', 'rows=60'], dir);
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/^overcheck: big\.hx\.mtx: row 0 .* not in the row space of g\.hz\.mtx\n$/);
  });

  it('refuses candidate words outside the row space', () => {
    writeFileSync(join(dir, 'bad.json'), JSON.stringify({ side: 'x', words: [[0, 1]] }));
    const r = run(['condition', '--family', GB, '--words', 'bad.json', '--budget', 'extra=5'], dir);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/not in the row space/);
  });
});
