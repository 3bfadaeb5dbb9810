import fc from 'fast-check';
import { appendFileSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { FormatError, InputError } from '../../src/errors.js';
import { JournalFile, parseJournal, writeJournal } from '../../src/formats/journal-file.js';
import { decodeResult, encodeResult } from '../../src/parallel/result-codec.js';

const dir = mkdtempSync(join(tmpdir(), 'oc-journal-'));
let n = 0;
const fresh = () => join(dir, `j${n++}.jsonl`);

describe('results journal file', () => {
  it('what is put is read back by a later open (property)', () => {
    const entryArb = fc.array(fc.tuple(fc.string({ unit: fc.constantFrom(...'0123456789abcdef'), minLength: 8, maxLength: 8 }), fc.constantFrom('trial-batch', 'search.isd'), fc.array(fc.integer(), { maxLength: 6 })), { maxLength: 12 });
    fc.assert(fc.property(entryArb, (entries) => {
      const path = fresh();
      const a = new JournalFile(path, 'trial', false);
      const expected = new Map<string, unknown>();
      for (const [key, kind, value] of entries) {
        const r = { kind, words: Uint32Array.from(value.map((x) => x >>> 0)), inf: Infinity };
        a.put(key, kind, encodeResult(r));
        if (!expected.has(key)) expected.set(key, r);
      }
      a.close();
      const b = new JournalFile(path, 'trial', true);
      expect(b.loaded).toBe(expected.size);
      for (const [key, r] of expected) expect(decodeResult(b.get(key)!)).toStrictEqual(r);
      b.close();
    }));
  });

  it('a last line cut short by a hard kill is dropped, cut off the file, and appending goes on cleanly', () => {
    const path = fresh();
    writeJournal(path, 'distance', [['k1', { kind: 'x', encoded: '{"a":1}' }], ['k2', { kind: 'x', encoded: '{"a":2}' }]]);
    appendFileSync(path, '{"task":"k3","kind":"x","result":{"a":');
    const j = new JournalFile(path, 'distance', true);
    expect(j.cutShort).toBe(true);
    expect(j.loaded).toBe(2);
    j.put('k4', 'x', '{"a":4}');
    j.close();
    const text = readFileSync(path, 'utf8');
    expect(text.split('\n').filter((l) => l !== '').length).toBe(4);
    const again = parseJournal(text, path, 'distance');
    expect([...again.entries.keys()]).toEqual(['k1', 'k2', 'k4']);
    expect(again.cutShort).toBe(false);
  });

  it('a whole last line without its newline is kept', () => {
    const path = fresh();
    writeFileSync(path, '{"overcheck":"results-journal","version":1,"command":"trial"}\n{"task":"a","kind":"x","result":5}');
    const j = new JournalFile(path, 'trial', true);
    expect(j.loaded).toBe(1);
    j.put('b', 'x', '6');
    j.close();
    expect(parseJournal(readFileSync(path, 'utf8'), path, 'trial').entries.size).toBe(2);
  });

  it('bad journals get one line naming the file and line', () => {
    const bad = (text: string, command = 'trial') => {
      const path = fresh();
      writeFileSync(path, text);
      try {
        new JournalFile(path, command, true);
      } catch (e) {
        expect(e).toBeInstanceOf(InputError);
        return (e as Error).message.replace(path, 'F');
      }
      throw new Error('accepted');
    };
    expect(bad('{"side":"x","support":[1,2]}\n')).toMatch(/^F:1: not a results journal/);
    expect(bad('hello\n')).toMatch(/^F:1: not a results journal/);
    expect(bad('')).toMatch(/^F:1: empty file/);
    expect(bad('{"overcheck":"results-journal","version":2,"command":"trial"}\n')).toMatch(/^F:1: journal version 2/);
    expect(bad('{"overcheck":"results-journal","version":1,"command":"distance"}\n')).toMatch(/^F: a journal of "overcheck distance", not of "overcheck trial"/);
    expect(bad('{"overcheck":"results-journal","version":1,"command":"trial"}\n{"task":"a"\n{"task":"b","kind":"x","result":1}\n')).toMatch(/^F:2: not JSON/);
    expect(bad('{"overcheck":"results-journal","version":1,"command":"trial"}\n{"x":1}\n{"task":"b","kind":"x","result":1}\n')).toMatch(/^F:2: expected \{"task"/);
    expect(() => new JournalFile(join(dir, 'missing.jsonl'), 'trial', true)).toThrow(/no such file/);
    const e = (() => { try { parseJournal('x', 'G', 'trial'); } catch (err) { return err; } })();
    expect(e).toBeInstanceOf(FormatError);
  });
});
