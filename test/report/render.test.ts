import fc from 'fast-check';
import { beforeAll, describe, expect, it } from 'vitest';
import { InputError } from '../../src/errors.js';
import { collectReport, renderReport, reportSections, resultKind, type ReportInput } from '../../src/report/index.js';
import { buildFixture, type Fixture } from './fixture.js';

const OPTIONS = { version: '0.1.0' };
const ALL_SECTIONS = ['code', 'spectrum', 'distance', 'cycles', 'error-rate', 'budget', 'provenance'];

let fx: Fixture;
beforeAll(() => {
  fx = buildFixture();
});

function render(inputs: ReportInput[]): string {
  return renderReport(collectReport(inputs, OPTIONS));
}

function sectionIds(html: string): string[] {
  return [...html.matchAll(/<section id="([^"]+)"/g)].map((m) => m[1]!);
}

/** Opening tags of one chart kind. */
function charts(html: string, kind: string): string[] {
  return [...html.matchAll(new RegExp(`<svg [^>]*data-chart="${kind}"[^>]*>`, 'g'))].map((m) => m[0]);
}

/** The markup of the element with this id, up to its closing </svg>. */
function svgById(html: string, id: string): string {
  const start = html.indexOf(`id="${id}"`);
  expect(start, `chart ${id}`).toBeGreaterThan(0);
  return html.slice(html.lastIndexOf('<svg', start), html.indexOf('</svg>', start) + 6);
}

describe('a full run bundle', () => {
  it('renders every section and every chart', () => {
    const html = render([{ file: 'run.json', value: fx.bundle }]);
    expect(sectionIds(html)).toEqual(ALL_SECTIONS);
    expect(charts(html, 'spectrum')).toHaveLength(2);
    expect(charts(html, 'cycles')).toHaveLength(1);
    expect(charts(html, 'error-rate')).toHaveLength(1);
    expect(html).not.toContain('Not in these results');
    expect(html).toMatch(/^<!DOCTYPE html>/);
    expect(html).not.toMatch(/<script|<link|<img|\bsrc=|@import|url\((?!#)/i); // self-contained: no script, nothing loaded
  });

  it('the spectrum bars are the counts of the real search, with its completeness', () => {
    const html = render([{ file: 'run.json', value: fx.bundle }]);
    for (const side of ['x', 'z'] as const) {
      const r = fx.search[side] as { counts: Record<string, number>; missProbability: Record<string, number> };
      const svg = svgById(html, `chart-spectrum-${side}`);
      const bars = [...svg.matchAll(/<rect [^>]*class="bar"[^>]*data-weight="(\d+)" data-count="(\d+)" data-complete="(\w+)"/g)];
      const expected = Object.entries(r.counts).filter(([, c]) => c > 0);
      expect(bars.map((b) => [b[1], Number(b[2])])).toEqual(expected.map(([w, c]) => [w, c]));
      for (const b of bars) expect(b[3]).toBe(r.missProbability[b[1]!] === 0 ? 'true' : 'false');
    }
    // the original rows: the weight-8 words of this code are its 24 rows (every row of HX has weight 8)
    const x = svgById(html, 'chart-spectrum-x');
    expect(x).toMatch(/class="bar rows" data-weight="8" data-count="24"/);
  });

  it('the error-rate chart has a band, a line and a marker per point for each matrix', () => {
    const html = render([{ file: 'run.json', value: fx.bundle }]);
    const svg = svgById(html, 'chart-error-rate');
    const labels = [...new Set((fx.trial['points'] as { label: string }[]).map((p) => p.label))];
    expect([...svg.matchAll(/<polygon class="band"/g)]).toHaveLength(labels.length);
    expect([...svg.matchAll(/<path class="rate-line"/g)]).toHaveLength(labels.length);
    for (const l of labels) expect(svg).toContain(`data-label="${l}"`);
    expect(svg).toContain('>10⁻²<'); // ticks at decades
    expect(svg).toContain('>10⁻¹<');
    // a point with no failure is drawn hollow (at its upper interval end)
    expect(svg).toMatch(/fill="#ffffff" stroke="#D55E00"/);
  });

  it('cycle census: one bar per graph and length; the table keeps exact counts', () => {
    const html = render([{ file: 'run.json', value: fx.bundle }]);
    const svg = svgById(html, 'chart-cycles');
    expect([...svg.matchAll(/<rect [^>]*class="bar"/g)]).toHaveLength(6 * 3);
    expect(html).toContain('before · X');
    expect(html).toContain('after · joint');
    expect(html).toContain('231\u2009424');
  });
});

describe('separate result files', () => {
  it('are recognised by shape and give the same sections', () => {
    const inputs: ReportInput[] = [
      { file: 'info.json', value: fx.info },
      { file: 'search.json', value: fx.search },
      { file: 'distance.json', value: fx.distance },
      { file: 'cycles-before.json', value: fx.cycles.before },
      { file: 'cycles-after.json', value: fx.cycles.after },
      { file: 'trial.json', value: fx.trial },
      { file: 'condition.json', value: fx.condition },
      { file: 'provenance.json', value: fx.provenance },
    ];
    expect(inputs.map((i) => resultKind(i.value))).toEqual(['info', 'search', 'distance', 'cycles', 'cycles', 'trial', 'condition', 'provenance']);
    const html = render(inputs);
    expect(sectionIds(html)).toEqual(ALL_SECTIONS);
    expect(html).toContain('before · Z'); // first cycles file = before, second = after
    expect(html).toContain('after · Z');
  });

  it('one search side per file, and dX and dZ from two distance runs, combine', () => {
    const dx = { ...fx.distance, side: 'x', dz: undefined, d: { upper: 8, lower: null, certified: false } };
    const dz = { ...fx.distance, side: 'z', dx: undefined, d: { upper: 8, lower: null, certified: false } };
    const m = collectReport(
      [
        { file: 'x.json', value: fx.search.x },
        { file: 'z.json', value: fx.search.z },
        { file: 'dx.json', value: JSON.parse(JSON.stringify(dx)) },
        { file: 'dz.json', value: JSON.parse(JSON.stringify(dz)) },
      ],
      OPTIONS,
    );
    expect(m.spectra.map((s) => s.side)).toEqual(['x', 'z']);
    expect(m.distance!.sides.map((s) => s.name)).toEqual(['dX', 'dZ']);
    expect(m.distance!.combined).toEqual({ upper: 8, lower: 6, certified: false });
  });
});

describe('partial inputs', () => {
  it('a lone search renders its section and provenance, and says what is absent', () => {
    const html = render([{ file: 'x.json', value: fx.search.x }]);
    expect(sectionIds(html)).toEqual(['code', 'spectrum', 'provenance']); // n is known from the search
    expect(html).toContain('Not in these results: distance bounds, cycle census, logical error rate, conditioning budget.');
  });

  it('bundle parts that are missing, null or of an unknown shape are skipped with a note', () => {
    const bundle = { kind: 'overcheck-run', info: fx.info, search: null, distance: { nonsense: true }, trial: fx.trial, extra: 1 };
    const m = collectReport([{ file: 'run.json', value: bundle }], OPTIONS);
    expect(reportSections(m).filter((s) => s.html).map((s) => s.id)).toEqual(['code', 'error-rate', 'provenance']);
    expect(m.notes).toEqual(['run.json: part "distance" is not a recognised distance result; skipped', 'run.json: parts not shown: extra']);
  });

  it('the trial strategy\'s measurements are shown per side, the kept prefix marked', () => {
    const selection = { shots: 900, ps: [0.02, 0.04], prefixes: [{ added: 0, failures: 50 }, { added: 3, failures: 41 }, { added: 6, failures: 47 }], chosen: 3 };
    const condition = { ...(fx.condition as object), strategy: 'trial', sides: { x: { selection } } };
    const html = render([{ file: 'c.json', value: condition }]);
    expect(html).toContain('Measured choice, side x');
    expect(html).toContain('decoded on the same 900 shots at p = 0.02, 0.04');
    const table = /<table class="selection">(.*?)<\/table>/.exec(html)![1]!;
    const rows = [...table.matchAll(/<tr>(.*?)<\/tr>/g)].slice(1).map((m) => [...m[1]!.matchAll(/<td[^>]*>(.*?)<\/td>/g)].map((c) => c[1]));
    expect(rows).toEqual([['0', '50', '0.0556', ''], ['3', '41', '0.0456', 'kept'], ['6', '47', '0.0522', '']]);
  });

  it('a run bundle\'s version and configuration go to the provenance and its notes to the notes', () => {
    const bundle = { kind: 'overcheck-run', version: '9.9.9', config: { file: 'c.json', sha256: 'ab'.repeat(32) }, notes: ['search stopped at its time limit'], info: fx.info };
    const m = collectReport([{ file: 'run.json', value: bundle }], OPTIONS);
    expect(m.notes).toEqual(['run.json: search stopped at its time limit']);
    expect(m.provenance).toEqual(expect.arrayContaining([
      { source: 'run.json', key: 'overcheck version', value: '9.9.9' },
      { source: 'run.json', key: 'configuration', value: `c.json (SHA-256 ${'ab'.repeat(8)}…)` },
    ]));
  });

  it('trial points without p or rate are skipped and counted in a note', () => {
    const trial = { points: [{ label: 'a', p: 0.01, rate: 0.1, interval: [0.05, 0.2] }, { label: 'a', rate: 0.2 }, { label: 'a', p: 0.05 }, 'junk'] };
    const m = collectReport([{ file: 't.json', value: trial }], OPTIONS);
    expect(m.trial!.series[0]!.points).toHaveLength(1);
    expect(m.notes.join('\n')).toMatch(/t\.json: 1 trial point skipped \(no error probability/);
    expect(m.notes.join('\n')).toMatch(/t\.json: 1 trial point skipped \(no rate\)/);
    expect(m.notes.join('\n')).toMatch(/t\.json: 1 trial point skipped \(not an object\)/);
    expect(renderReport(m)).toContain('data-chart="error-rate"');
  });

  it('a trial with no failure anywhere still has a chart (upper interval ends)', () => {
    const trial = { points: [0.001, 0.002].map((p) => ({ label: 'm', p, shots: 1000, failures: 0, rate: 0, interval: [0, 0.0038] })) };
    const html = render([{ file: 't.json', value: trial }]);
    expect(svgById(html, 'chart-error-rate')).toContain('class="band"');
  });

  it('cycle counts beyond 2^53 are shown with all their digits', () => {
    const census = { girth: 6, edges: 10, cycles: { '4': 0, '6': '123456789012345678901', '8': 5 } };
    const html = render([{ file: 'c.json', value: census }]);
    expect(html).toContain('123\u2009456\u2009789\u2009012\u2009345\u2009678\u2009901');
  });

  it('a file that is no recognised result is a one-line InputError naming it', () => {
    for (const value of [{ hello: 1 }, [1, 2], 'text', 3, null, {}]) {
      expect(() => collectReport([{ file: 'odd.json', value }], OPTIONS)).toThrow(InputError);
      expect(() => collectReport([{ file: 'odd.json', value }], OPTIONS)).toThrow(/^odd\.json: not a recognised overcheck result/);
    }
  });

  it('never crashes on damaged results: a page, or an InputError', () => {
    type J = unknown;
    /** Replace the value at a pseudo-random path of v by r. */
    const damage = (v: J, path: number[], r: J): J => {
      if (path.length === 0 || typeof v !== 'object' || v === null) return r;
      const keys = Object.keys(v);
      if (keys.length === 0) return r;
      const k = keys[path[0]! % keys.length]!;
      const copy: Record<string, J> | J[] = Array.isArray(v) ? [...v] : { ...(v as Record<string, J>) };
      (copy as Record<string, J>)[k] = damage((v as Record<string, J>)[k], path.slice(1), r);
      return copy;
    };
    const small = { ...fx.bundle, search: { x: { ...fx.search.x, words: (fx.search.x['words'] as J[]).slice(0, 30) } } };
    fc.assert(
      fc.property(fc.array(fc.nat(), { maxLength: 6 }), fc.jsonValue({ maxDepth: 2 }), (path, r) => {
        const value = damage(small, path, r);
        try {
          const html = renderReport(collectReport([{ file: 'run.json', value }], OPTIONS));
          expect(html).toMatch(/<\/html>\n$/);
        } catch (e) {
          expect(e).toBeInstanceOf(InputError);
        }
      }),
      { numRuns: 100 },
    );
  });
});
