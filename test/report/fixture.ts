/**
 * Test inputs for the report. The code summary and the search results are REAL: produced by running the
 * built CLI (`info --json`, `search --json`) on the [[48,6]] generalized-bicycle code below. The distance,
 * cycle census, trial and conditioning results are HAND-MADE FIXTURES shaped like the JSON of those
 * commands (their modules were still being written): their numbers are plausible, not published or
 * computed data, and no test checks them as facts. The before-conditioning 4-cycle counts are the one
 * exception: computed here by brute force from the real rows of HX and HZ.
 */
import { execFileSync } from 'node:child_process';
import { BIN } from '../support/cli.js';

export { BIN };
export const FAMILY = 'gb:l=24,a=1+x^2+x^8+x^15,b=1+x^2+x^12+x^17';

function cliJson(...args: string[]): unknown {
  const out = execFileSync(process.execPath, [BIN, ...args, '--json'], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'], maxBuffer: 64 << 20 });
  return JSON.parse(out);
}

type Json = Record<string, unknown>;

/** Wilson score interval, 95 % (Wilson, "Probable inference ...", J. Amer. Statist. Assoc. 22, 1927); fixture helper. */
function wilson(k: number, n: number): [number, number] {
  const z = 1.959963984540054;
  const z2 = z * z;
  const c = (k + z2 / 2) / (n + z2);
  const h = (z / (n + z2)) * Math.sqrt((k * (n - k)) / n + z2 / 4);
  return [k === 0 ? 0 : Math.max(0, c - h), Math.min(1, c + h)];
}

/** Number of 4-cycles of the Tanner graph of the given rows: Σ over row pairs of C(overlap, 2) (brute force). */
function fourCycles(rows: number[][]): number {
  let total = 0;
  for (let i = 0; i < rows.length; i++) {
    const a = new Set(rows[i]);
    for (let j = i + 1; j < rows.length; j++) {
      const o = rows[j]!.filter((c) => a.has(c)).length;
      total += (o * (o - 1)) / 2;
    }
  }
  return total;
}

function originalRows(side: Json): number[][] {
  const words = side['words'] as number[][];
  return (side['original'] as number[]).map((i) => words[i]!);
}

export interface Fixture {
  info: Json;
  /** {x, z}: X searched exhaustively (complete), Z by a short information-set search (not proven complete). */
  search: { x: Json; z: Json };
  distance: Json;
  cycles: { before: Json; after: Json };
  trial: Json;
  condition: Json;
  provenance: Json;
  bundle: Json;
}

export function buildFixture(): Fixture {
  const info = cliJson('info', '--family', FAMILY) as Json;
  const x = cliJson('search', '--family', FAMILY, '--side', 'x', '--max-weight', '12', '--workers', '1') as Json;
  const z = cliJson('search', '--family', FAMILY, '--side', 'z', '--max-weight', '12', '--method', 'isd', '--iterations', '100', '--workers', '1', '--seed', '7') as Json;

  // ---- hand-made fixtures below (shapes of the other commands' JSON; not data) ----
  const distance = {
    kind: 'css', code: FAMILY, n: 48, k: 6, seed: '1', method: 'auto', side: 'both',
    dx: { upper: 8, lower: 8, certified: true, count: 36, countExact: true, witness: [0, 3, 7, 12, 25, 30, 38, 44], anticommutesWith: 2, missProbability: 0, dimension: 27, method: 'brouwer-zimmermann', stoppedBy: 'certified', isd: { kernel: 'stern', iterations: 4000, successProbability: 0.999 }, enumeration: null, exhaustive: null },
    dz: { upper: 8, lower: 6, certified: false, count: 30, countExact: false, witness: [1, 4, 9, 15, 26, 31, 40, 47], anticommutesWith: 0, missProbability: 3.2e-7, dimension: 27, method: 'isd', stoppedBy: 'target-miss', isd: { kernel: 'stern', iterations: 20000, successProbability: 0.9 }, enumeration: null, exhaustive: null },
    d: { upper: 8, lower: 6, certified: false },
  };
  const hx4 = fourCycles(originalRows(x));
  const hz4 = fourCycles(originalRows(z));
  const census = (four: number, six: number | string, eight: number | string, girth: number, rows: number) => ({
    girth, edges: rows * 8, cycles: { '4': four, '6': six, '8': eight }, rows: { count: rows }, cols: { count: 48 },
  });
  const cycles = {
    before: { x: census(hx4, 1536, 26112, hx4 > 0 ? 4 : 6, 24), z: census(hz4, 1536, 26112, hz4 > 0 ? 4 : 6, 24), joint: census(2 * hx4, 3500, '61440', 4, 48) },
    after: { x: census(hx4 + 120, 4990, 98304, 4, 30), z: census(hz4 + 96, 4410, 90112, 4, 29), joint: census(2 * hx4 + 216, 9800, '231424', 4, 59) },
  };
  const point = (label: string, p: number, shots: number, failures: number, meanIterations: number) => ({
    label, p, shots, failures, syndromeFailures: Math.floor(failures / 3), logicalFailures: failures - Math.floor(failures / 3), rate: failures / shots,
    interval: wilson(failures, shots), meanIterations, maxIterations: 100, osdRuns: 0, decodesPerSecond: 25000, stoppedBy: 'shots',
  });
  const trial = {
    points: [
      point('original', 0.01, 20000, 4, 3.1), point('original', 0.02, 20000, 61, 5.2), point('original', 0.05, 10000, 702, 14.8), point('original', 0.1, 5000, 1851, 31.0),
      point('conditioned', 0.01, 20000, 0, 2.4), point('conditioned', 0.02, 20000, 17, 3.9), point('conditioned', 0.05, 10000, 318, 9.6), point('conditioned', 0.1, 5000, 1320, 22.5),
    ],
    comparisons: [], seed: '11', batch: 1000, noise: 'depolarizing', samples: { kind: 'channel' }, decoder: { kind: 'bp4', iterations: 100 }, elapsedSeconds: 12.5,
  };
  const condition = {
    budget: { maxRows: { x: 30, z: 30 }, maxRowWeight: 12, maxColDegree: 6, strategy: 'fewest-new-4-cycles' },
    before: { x: { rows: 24, edges: 192, maxRowWeight: 8, maxColDegree: 4, cycles: { '4': hx4, '6': 1536 } }, z: { rows: 24, edges: 192, maxRowWeight: 8, maxColDegree: 4, cycles: { '4': hz4, '6': 1536 } } },
    after: { x: { rows: 30, edges: 264, maxRowWeight: 12, maxColDegree: 6, cycles: { '4': hx4 + 120, '6': 4990 } }, z: { rows: 29, edges: 252, maxRowWeight: 12, maxColDegree: 6, cycles: { '4': hz4 + 96, '6': 4410 } } },
    added: { x: 6, z: 5 },
    strategy: 'fewest-new-4-cycles',
    provenance: { seed: '5', searchWords: { x: 'sha256:2f1c…', z: 'sha256:9ab0…' } },
  };
  const provenance = {
    seed: '1',
    versions: { overcheck: '0.1.0', node: 'v20.20.2' },
    inputs: { family: FAMILY },
    command: ['overcheck', 'run', 'matrices/demo.json', '--out', 'out/demo'],
  };
  const bundle = { kind: 'overcheck-run', info, search: { x, z }, distance, cycles, trial, condition, provenance };
  return { info, search: { x, z }, distance, cycles, trial, condition, provenance, bundle };
}
