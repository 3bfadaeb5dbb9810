/**
 * The report in a real browser: Debian's headless Chromium opens the page written by `overcheck report`
 * from the run bundle fixture (real search and info results, hand-made others; see fixture.ts), and we
 * check that it logs no error, loads nothing, lays out every chart, and keep a screenshot and a PDF in
 * test-output/report/. Skips, saying why, only when /usr/bin/chromium is absent.
 */
import { execFileSync } from 'node:child_process';
import { mkdirSync, writeFileSync } from 'node:fs';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Browser, CHROMIUM, chromiumPresent, type Page } from '../support/chromium.js';
import { BIN, buildFixture } from './fixture.js';

const OUT = fileURLToPath(new URL('../../test-output/report/', import.meta.url));
const present = chromiumPresent();
if (!present) console.warn(`browser test skipped: ${CHROMIUM} is absent (Debian package chromium; .ci/run installs it)`);

interface Layout {
  sections: string[];
  charts: { id: string; chart: string; width: number; height: number; xmlOk: boolean }[];
  bands: number;
  lines: number;
  decadeLabels: string[];
  overflowX: boolean;
  bodyWidth: number;
}

describe.skipIf(!present)('report in headless Chromium', () => {
  let browser: Browser;
  let page: Page;
  let url: string;

  beforeAll(async () => {
    mkdirSync(OUT, { recursive: true });
    const bundle = `${OUT}bundle.json`;
    writeFileSync(bundle, JSON.stringify(buildFixture().bundle));
    const html = `${OUT}report.html`;
    execFileSync(process.execPath, [BIN, 'report', bundle, '--out', html], { stdio: ['ignore', 'pipe', 'pipe'] });
    url = pathToFileURL(html).href;
    browser = await Browser.launch();
    page = await browser.newPage();
    await page.goto(url);
  });

  afterAll(async () => {
    await browser?.close();
  });

  it('opens with no console error and no request besides the page itself', () => {
    expect(page.errors).toEqual([]);
    expect(page.requests).toEqual([url]);
  });

  it('lays out every section and chart; each chart is well-formed SVG', async () => {
    const layout = await page.evaluate<Layout>(`(() => {
      const charts = [...document.querySelectorAll('svg[data-chart]')].map((s) => {
        const r = s.getBoundingClientRect();
        const xml = new DOMParser().parseFromString(new XMLSerializer().serializeToString(s), 'image/svg+xml');
        return { id: s.id, chart: s.dataset.chart, width: r.width, height: r.height, xmlOk: !xml.querySelector('parsererror') };
      });
      const er = document.getElementById('chart-error-rate');
      return {
        sections: [...document.querySelectorAll('main > section')].map((s) => s.id),
        charts,
        bands: er.querySelectorAll('polygon.band').length,
        lines: er.querySelectorAll('path.rate-line').length,
        decadeLabels: [...er.querySelectorAll('.tick-label')].map((t) => t.textContent),
        overflowX: document.documentElement.scrollWidth > document.documentElement.clientWidth,
        bodyWidth: document.body.getBoundingClientRect().width,
      };
    })()`);
    expect(layout.sections).toEqual(['code', 'spectrum', 'distance', 'cycles', 'error-rate', 'budget', 'provenance']);
    expect(layout.charts.map((c) => [c.id, c.chart])).toEqual([
      ['chart-spectrum-x', 'spectrum'],
      ['chart-spectrum-z', 'spectrum'],
      ['chart-cycles', 'cycles'],
      ['chart-error-rate', 'error-rate'],
    ]);
    for (const c of layout.charts) {
      expect(c.xmlOk, c.id).toBe(true);
      expect(c.width, c.id).toBeGreaterThan(300);
      expect(c.width, c.id).toBeLessThanOrEqual(layout.bodyWidth);
      expect(c.height, c.id).toBeGreaterThan(150);
    }
    expect(layout.bands).toBe(2);
    expect(layout.lines).toBe(2);
    expect(layout.decadeLabels).toEqual(expect.arrayContaining(['10⁻²', '10⁻¹', '10⁻³']));
    expect(layout.overflowX).toBe(false);
  });

  it('saves a full-page screenshot and an A4 PDF under test-output/report/', async () => {
    const png = await page.screenshot(900);
    expect(png.subarray(1, 4).toString('latin1')).toBe('PNG');
    writeFileSync(`${OUT}report.png`, png);
    const pdf = await page.pdf();
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    writeFileSync(`${OUT}report.pdf`, pdf);
    expect(page.errors).toEqual([]);
  });

  it('the error collector does see errors (control page)', async () => {
    const control = await browser.newPage();
    await control.goto(`data:text/html,${encodeURIComponent('<p>x</p><script>console.error("probe one"); setTimeout(() => { throw new Error("probe two"); });</script>')}`);
    await control.evaluate('new Promise((r) => setTimeout(r, 50))');
    expect(control.errors.some((e) => e.includes('probe one'))).toBe(true);
    expect(control.errors.some((e) => e.includes('probe two'))).toBe(true);
  });
});
