import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildFamily } from '../../src/codes/families/index.js';
import { runTrial, type TrialPlan, type TrialResult } from '../../src/decode/runner.js';
import { decoderMatrix, trialCode } from '../../src/decode/trial-engine.js';
import { auditDistance, type AuditSettings } from '../../src/distance/audit.js';
import type { DistanceReport } from '../../src/distance/result.js';
import { JournalPool, MemoryResultStore } from '../../src/parallel/journal-pool.js';
import { openPool, type TaskPool } from '../../src/parallel/pool.js';
import { decodeResult, encodeResult } from '../../src/parallel/result-codec.js';
import { taskKey } from '../../src/parallel/task-key.js';

function css(spec: string) {
  const b = buildFamily(spec);
  if (b.kind !== 'css') throw new Error('expected a CSS code');
  return b.code;
}

/** A pool that says how many tasks it ran. */
function counting(inner: TaskPool): TaskPool & { ran: number } {
  const p = { workers: inner.workers, ran: 0, run: <R>(k: string, x: unknown) => { p.ran++; return inner.run<R>(k, x); }, close: () => inner.close() };
  return p;
}

const typedArb = fc.oneof(
  fc.array(fc.integer({ min: 0, max: 0xffffffff }), { maxLength: 40 }).map((a) => Uint32Array.from(a)),
  fc.array(fc.integer({ min: -(2 ** 31), max: 2 ** 31 - 1 }), { maxLength: 40 }).map((a) => Int32Array.from(a)),
  fc.array(fc.double(), { maxLength: 10 }).map((a) => Float64Array.from(a)),
  fc.uint8Array({ maxLength: 30 }),
);
const valueArb = fc.letrec((tie) => ({
  v: fc.oneof(
    { depthSize: 'small' },
    fc.integer(), fc.double(), fc.boolean(), fc.string(), fc.constant(null), typedArb,
    fc.constantFrom(Infinity, -Infinity, NaN),
    fc.array(tie('v'), { maxLength: 5 }),
    fc.dictionary(fc.string({ maxLength: 6 }).filter((k) => k !== '__proto__'), tie('v'), { maxKeys: 5, noNullPrototype: true }),
  ),
})).v;

describe('result codec', () => {
  it('decode(encode(r)) equals r, typed arrays and non-finite numbers included (property)', () => {
    fc.assert(fc.property(valueArb, (v) => {
      expect(decodeResult(encodeResult(v))).toStrictEqual(v);
    }));
  });

  it('keeps a typed array view exactly (offset into a larger buffer)', () => {
    const big = Uint32Array.from([1, 2, 3, 4, 5]);
    const r = decodeResult(encodeResult({ words: big.subarray(1, 4), count: 3 })) as { words: Uint32Array };
    expect([...r.words]).toEqual([2, 3, 4]);
    expect(r.words).toBeInstanceOf(Uint32Array);
  });
});

describe('task key', () => {
  it('is the same for equal payloads whatever the key order, and differs when anything differs (property)', () => {
    fc.assert(fc.property(valueArb, valueArb, (a, b) => {
      const same = JSON.stringify(encodeResult(a)) === JSON.stringify(encodeResult(b));
      if (same) return;
      // different encodings of different values give different keys
      if (!Object.is(a, b) && encodeResult(a) !== encodeResult(b)) expect(taskKey('k', a)).not.toBe(taskKey('k', b));
    }));
    expect(taskKey('k', { a: 1, b: [2, 3] })).toBe(taskKey('k', { b: [2, 3], a: 1 }));
    expect(taskKey('k', { a: 1 })).not.toBe(taskKey('j', { a: 1 }));
    expect(taskKey('k', { a: 1 })).not.toBe(taskKey('k', { a: '1' }));
    expect(taskKey('k', Uint32Array.from([1, 2]))).not.toBe(taskKey('k', Int32Array.from([1, 2])));
    expect(taskKey('k', Uint32Array.from([1, 2]))).not.toBe(taskKey('k', Uint32Array.from([1, 3])));
  });

  it('refuses what cannot be a payload', () => {
    expect(() => taskKey('k', { f: () => 1 })).toThrow(/function/);
    expect(() => taskKey('k', new Map())).toThrow(/Map/);
  });
});

/** Counts of a trial result without the timings. */
function trialCounts(r: TrialResult) {
  return {
    points: r.points.map(({ decodesPerSecond: _d, ...p }) => p),
    comparisons: r.comparisons,
  };
}

/** The parts of a distance report that the computation fixes (not the timings). */
function distanceFacts(r: DistanceReport) {
  return JSON.parse(JSON.stringify(r, (k, v) => (k === 'elapsedSeconds' ? undefined : v)));
}

describe('stopped after k tasks and resumed from the journal = one uninterrupted run', () => {
  it('trial decoding, for every stopping point k (fixed shots and the failure rule)', async () => {
    const code = trialCode(css('toric:L=4'));
    for (const failures of [null, 25]) {
      const plan: TrialPlan = {
        code,
        matrices: [decoderMatrix(code, 'original')],
        decoder: { decoder: 'bp2', rule: 'min-sum', scale: 0.75, schedule: 'flooding', iterations: 8, earlyStop: true, osd: { kind: 'none' } },
        noise: 'depolarizing', ps: [0.05, 0.1], samples: { kind: 'channel' }, shots: 600, failures, timeLimit: null, batch: 100, seed: 'journal',
      };
      const inline = await openPool(0);
      const whole = await runTrial(plan, inline, { now: () => 0 });
      const tasks = counting(inline);
      await runTrial(plan, tasks, { now: () => 0 });
      expect(tasks.ran).toBeGreaterThan(2);
      for (let k = 0; k <= tasks.ran; k++) {
        const store = new MemoryResultStore();
        const first = counting(inline);
        const part = await runTrial(plan, new JournalPool(first, store), { now: () => 0, shouldStop: () => first.ran >= k });
        if (k < tasks.ran) expect(part.points.some((p) => p.stoppedBy === 'interrupted')).toBe(true);
        const second = counting(inline);
        const resumed = await runTrial(plan, new JournalPool(second, store), { now: () => 0 });
        expect(trialCounts(resumed)).toEqual(trialCounts(whole));
        // the first part ran k tasks; nothing it finished is computed again
        expect(first.ran).toBe(Math.min(k, tasks.ran));
        expect(second.ran).toBe(tasks.ran - first.ran);
      }
    }
  }, 60_000);

  it('distance audit (information-set stages and the certifying enumeration), for stopping points across the run', async () => {
    const code = css('gb:l=24,a=1+x^2+x^8+x^15,b=1+x^2+x^12+x^17'); // [[48,6,8]]
    const settings: AuditSettings = { method: 'certify', seed: 4 };
    const inline = await openPool(0);
    const input = { kind: 'css' as const, code, label: 'gb48', side: 'x' as const };
    const never = { shouldStop: () => false, stopReason: () => 'interrupted' as const };
    const whole = await auditDistance(inline, input, settings, never);
    expect(whole.kind === 'css' && whole.dx?.certified).toBe(true);
    const tasks = counting(inline);
    await auditDistance(tasks, input, settings, never);
    expect(tasks.ran).toBeGreaterThan(5);
    const ks = [...new Set([0, 1, 2, 3, Math.floor(tasks.ran / 3), Math.floor(tasks.ran / 2), tasks.ran - 1])];
    for (const k of ks) {
      const store = new MemoryResultStore();
      const first = counting(inline);
      const stop = () => first.ran >= k;
      await auditDistance(new JournalPool(first, store), input, settings, { shouldStop: stop, stopReason: () => 'interrupted' });
      const second = counting(inline);
      const resumed = await auditDistance(new JournalPool(second, store), input, settings, never);
      expect(distanceFacts(resumed)).toEqual(distanceFacts(whole));
      expect(first.ran).toBe(k);
      expect(second.ran).toBe(tasks.ran - k);
    }
  }, 120_000);
});
