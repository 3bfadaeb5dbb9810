import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { escapeHtml, idToken } from '../../src/report/escape.js';
import { collectReport, renderReport } from '../../src/report/index.js';

/** Undo the five entities escapeHtml writes (test oracle). */
function unescape(s: string): string {
  return s.replace(/&lt;/g, '<').replace(/&gt;/g, '>').replace(/&quot;/g, '"').replace(/&#39;/g, "'").replace(/&amp;/g, '&');
}

/** The sequence of tags (names only) of a page: what user text must not be able to change. */
function tagSequence(html: string): string[] {
  return [...html.matchAll(/<\/?([a-zA-Z][\w:-]*)/g)].map((m) => m[0]);
}

/** A small trial result and provenance with the given text in every user-controlled place (fixture). */
function pageWith(text: string): string {
  const trial = {
    points: [
      { label: text, p: 0.01, shots: 1000, failures: 3, rate: 0.003, interval: [0.001, 0.009], meanIterations: 4 },
      { label: text, p: 0.03, shots: 1000, failures: 30, rate: 0.03, interval: [0.02, 0.043], meanIterations: 6 },
    ],
    seed: text,
  };
  const info = { label: text, n: 4, k: 2, commute: true, hx: { rows: 1, cols: 4, rank: 1 }, hz: { rows: 1, cols: 4, rank: 1 } };
  const search = { [text]: { side: text, maxWeight: 2, counts: { '1': 0, '2': 1 }, missProbability: { '1': 0, '2': 0 }, complete: true } };
  const provenance = { kind: 'provenance', [text]: text, command: ['overcheck', text] };
  const model = collectReport(
    [
      { file: `${text}.json`, value: info },
      { file: 'search.json', value: search },
      { file: 'trial.json', value: trial },
      { file: 'prov.json', value: provenance, sha256: 'ab' },
    ],
    { version: '0.1.0', title: text, command: `overcheck report ${text}` },
  );
  return renderReport(model);
}

describe('escaping', () => {
  it('escapeHtml round-trips and leaves no markup characters', () => {
    fc.assert(
      fc.property(fc.string({ unit: 'grapheme' }), (s) => {
        const e = escapeHtml(s);
        expect(e).not.toMatch(/[<>"']/);
        expect(e.replace(/&(amp|lt|gt|quot|#39);/g, '')).not.toContain('&');
        expect(unescape(e)).toBe(s);
      }),
    );
  });

  it('idToken keeps only [a-z0-9-]', () => {
    expect(idToken('X side <b>')).toBe('x-side-b');
    expect(idToken('<>')).toBe('x');
  });

  it('a label <script> is escaped everywhere it appears', () => {
    const html = pageWith('<script>alert(1)</script>');
    expect(html).not.toMatch(/<script/i);
    expect(html).toContain('&lt;script&gt;alert(1)&lt;/script&gt;');
  });

  it('no user text changes the tag structure of the page', () => {
    const reference = tagSequence(pageWith('plain label'));
    fc.assert(
      fc.property(fc.string({ minLength: 1, maxLength: 30 }), (s) => {
        // 'kind' and 'command' have a meaning as provenance keys; __proto__ is not an own key
        fc.pre(s.trim() !== '' && !['kind', 'command', '__proto__'].includes(s));
        expect(tagSequence(pageWith(s))).toEqual(reference);
      }),
      { numRuns: 60 },
    );
    expect(tagSequence(pageWith(`"><svg onload=alert(1)>' & <img src=x>`))).toEqual(reference);
  });
});
