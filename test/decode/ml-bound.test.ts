import { describe, expect, it } from 'vitest';
import { type Channel } from '../../src/decode/channel.js';
import type { DecoderOptions, OsdMethod } from '../../src/decode/css-decoder.js';
import { errorSamples, sampleChannel } from '../../src/decode/error-samples.js';
import { DECODED } from '../../src/decode/outcome.js';
import { pairedDifferenceInterval } from '../../src/decode/statistics.js';
import { decoderMatrix, TrialEngine, trialCode } from '../../src/decode/trial-engine.js';
import { cssCode } from '../../src/codes/css.js';
import { buildFamily } from '../../src/codes/families/index.js';
import { fromDense } from '../../src/gf2/bitmatrix.js';
import { streamRng } from '../../src/parallel/seeds.js';
import { MlDecoder } from '../oracles/ml-decoder.js';

// source: Steane, "Multiple particle interference and quantum error correction", Proc. R. Soc. A 452, 1996 —
// the [[7,1,3]] code with HX = HZ = the [7,4] Hamming parity-check matrix.
const hamming = fromDense([
  [1, 0, 1, 0, 1, 0, 1],
  [0, 1, 1, 0, 0, 1, 1],
  [0, 0, 0, 1, 1, 1, 1],
]);

function family(spec: string) {
  const b = buildFamily(spec);
  if (b.kind !== 'css') throw new Error('expected a CSS code');
  return b.code;
}

const CODES = [
  { name: 'Steane [[7,1,3]]', code: cssCode(hamming, hamming, 'steane') },
  { name: 'toric L=2 [[8,2,2]]', code: family('toric:L=2') },
  { name: 'surface d=3 [[9,1,3]]', code: family('surface:d=3') },
];

const OSDS: OsdMethod[] = [{ kind: 'none' }, { kind: 'order0' }, { kind: 'sweep', order: 4 }];
const VARIANTS: DecoderOptions[] = [];
for (const decoder of ['bp2', 'bp4'] as const)
  for (const rule of ['sum-product', 'min-sum'] as const)
    for (const schedule of ['flooding', 'serial'] as const)
      for (const osd of OSDS) VARIANTS.push({ decoder, rule, scale: rule === 'min-sum' ? 0.75 : 1, schedule, iterations: 12, earlyStop: true, osd });

const name = (v: DecoderOptions) => `${v.decoder} ${v.rule} ${v.schedule} osd=${v.osd.kind === 'sweep' ? `cs:${v.osd.order}` : v.osd.kind}`;

describe('no BP variant beats exact (degenerate, coset-summing) maximum likelihood', () => {
  const cases: [(typeof CODES)[number], Channel][] = [
    [CODES[0]!, { model: 'depolarizing', p: 0.09 }],
    [CODES[1]!, { model: 'depolarizing', p: 0.09 }],
    [CODES[2]!, { model: 'depolarizing', p: 0.09 }],
    [CODES[2]!, { model: 'independent', p: 0.06 }],
  ];
  for (const [{ name: codeName, code }, channel] of cases) {
    {
      it(`${codeName}, ${channel.model} p=${channel.p}`, () => {
        const tc = trialCode(code);
        const shots = 1200;
        const samples = errorSamples(code.n, shots);
        sampleChannel(channel, streamRng('ml-check', code.n), samples, shots);
        const ml = new MlDecoder(tc, channel);
        const mlFails = Array.from({ length: shots }, (_, s) => ml.fails(samples.ex[s]!, samples.ez[s]!));
        const mlCount = mlFails.filter(Boolean).length;
        const lines: string[] = [];
        for (const v of VARIANTS) {
          const engine = new TrialEngine(tc, [decoderMatrix(tc, 'original')], v);
          engine.setChannel(channel);
          const outcomes = new Uint8Array(shots);
          const [c] = engine.decodeSamples(samples, shots, undefined, outcomes);
          let onlyBp = 0;
          let onlyMl = 0;
          for (let s = 0; s < shots; s++) {
            const bp = outcomes[s] !== DECODED;
            if (bp && !mlFails[s]) onlyBp++;
            if (!bp && mlFails[s]) onlyMl++;
          }
          expect(onlyBp - onlyMl).toBe(c!.failures - mlCount);
          const d = pairedDifferenceInterval({ both: c!.failures - onlyBp, onlyFirst: onlyBp, onlySecond: onlyMl, neither: shots - c!.failures - onlyMl });
          // BP minus ML: an interval wholly below zero would mean a decoder beats the optimum (a bug)
          expect(d.interval[1], `${name(v)} vs ML`).toBeGreaterThanOrEqual(0);
          if (v.decoder === 'bp4' && v.osd.kind === 'sweep') {
            lines.push(`${name(v)}: ${c!.failures}/${shots} vs ML ${mlCount}/${shots} (difference ${d.difference.toFixed(4)} [${d.interval[0].toFixed(4)}, ${d.interval[1].toFixed(4)}])`);
          }
        }
        console.info(`${codeName}, ${channel.model} p=${channel.p}:\n  ${lines.join('\n  ')}`);
      });
    }
  }
});
