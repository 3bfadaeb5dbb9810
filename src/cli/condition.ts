import { basename } from 'node:path';
import type { Command } from 'commander';
import type { BitMatrix } from '../gf2/bitmatrix.js';
import { matrixHash } from '../codes/hash.js';
import { formatBudget, parseBudget } from '../condition/budget.js';
import { verifyCandidates } from '../condition/candidates.js';
import { conditionSide, type ConditionedSide, type ConditionRequest } from '../condition/condition.js';
import { scorePairs, trialSelector, type TrialScoring, type TrialSelection } from '../condition/trial-select.js';
import { wilsonInterval } from '../decode/statistics.js';
import type { Budget } from '../condition/budget.js';
import type { LatencyModel } from '../condition/latency.js';
import type { Strategy } from '../condition/select.js';
import { LATENCY_MODELS, LATENCY_UNITS } from '../condition/latency.js';
import type { Provenance } from '../condition/provenance.js';
import { STRATEGIES } from '../condition/select.js';
import { InputError } from '../errors.js';
import { type MatrixFormat, writeMatrixFile } from '../formats/index.js';
import { writeJsonFile } from '../formats/json-out.js';
import { readCandidateWords } from '../formats/words-file.js';
import { VERSION } from '../version.js';
import { choiceOption, codeOptions, intOption, loadCodeInput, printJson, requireCss, type CodeInput, type CodeOptions } from './input.js';
import { FORMATS } from './make.js';

export interface ConditionCliOptions extends CodeOptions {
  score?: string;
  scoreShots?: string;
  decoder?: string;
  noise?: string;
  words?: string;
  side?: string;
  budget?: string;
  strategy?: string;
  seed?: string;
  out?: string;
  format?: string;
  json?: boolean;
  basis?: string;
  iterations?: string;
  latencyModel?: string;
}

/** The shared options of condition and trim. */
export function conditioningOptions(cmd: Command): Command {
  return cmd
    .option('--budget <list>', 'rows=N,extra=N,edges=E,row-weight=W,col-degree=D,latency=T (any combination)')
    .option('--strategy <s>', STRATEGIES.join(', '), 'lightest')
    .option('--iterations <n>', 'BP iterations the latency budget is for', '3')
    .option('--latency-model <m>', `${LATENCY_MODELS.join(', ')} (see README)`, 'serial')
    .option('--seed <s>', 'seed for tie-breaks and the trial strategy', '1')
    .option('--score <p,...>', 'decode original and conditioned matrices at these error rates (and select by them with --strategy trial)')
    .option('--score-shots <n>', 'shots per error rate for --score', '2000')
    .option('--decoder <d>', 'decoder for --score: bp2 or bp4', 'bp4')
    .option('--noise <model>', 'noise for --score: depolarizing or independent', 'depolarizing')
    .option('--out <prefix>', 'write the bundle: PREFIX.<side>.EXT, PREFIX.<side>-map.EXT, PREFIX.provenance.json')
    .option('--format <fmt>', 'mtx, alist, dense or json', 'mtx')
    .option('--json', 'print one JSON object');
}

export function summaryLines(s: ConditionedSide, units: string): string[] {
  const row = (name: string, f: ConditionedSide['before']) =>
    `  ${name.padEnd(7)} ${String(f.rows).padStart(6)} ${String(f.edges).padStart(7)} ${String(f.maxRowWeight).padStart(8)} ${String(f.maxColDegree).padStart(8)} ${String(f.cycles['4']).padStart(10)} ${String(f.cycles['6']).padStart(12)} ${String(f.latency).padStart(10)}`;
  return [
    `side ${s.side}: ${s.added.length} redundant rows added (${Object.entries(s.addedByWeight).map(([w, c]) => `${c} of weight ${w}`).join(', ') || 'none'}), rank ${s.rank}`,
    `  ${''.padEnd(7)} ${'rows'.padStart(6)} ${'edges'.padStart(7)} ${'max row'.padStart(8)} ${'max col'.padStart(8)} ${'4-cycles'.padStart(10)} ${'6-cycles'.padStart(12)} ${'latency'.padStart(10)}  (${units})`,
    row('before', s.before),
    row('after', s.after),
  ];
}

/** Write matrices, maps and provenance; returns the provenance object. */
export function writeBundle(
  prefix: string, format: MatrixFormat, results: { side: string; out: ConditionedSide; candidates: number; dropped: ConditionedSide extends never ? never : { duplicate: number; originalRow: number; zero: number } }[],
  base: Omit<Provenance, 'sides'>,
): Provenance {
  const sides: Provenance['sides'] = {};
  for (const r of results) {
    const name = r.side === 'h' ? 'h' : `h${r.side}`;
    const matrix = `${prefix}.${name}.${format}`;
    const map = `${prefix}.${name}-map.${format}`;
    writeMatrixFile(matrix, r.out.matrix, format);
    writeMatrixFile(map, r.out.map, format);
    sides[r.side] = {
      files: { matrix: basename(matrix), map: basename(map) },
      outputHash: matrixHash(r.out.matrix),
      rank: r.out.rank,
      candidates: r.candidates,
      dropped: r.dropped,
      added: r.out.added.length,
      addedByWeight: r.out.addedByWeight,
      before: r.out.before,
      after: r.out.after,
    };
  }
  const prov: Provenance = { ...base, sides };
  writeJsonFile(`${prefix}.provenance.json`, prov);
  return prov;
}

export function registerCondition(program: Command): void {
  conditioningOptions(codeOptions(program.command('condition').description('assemble overcomplete check matrices within a budget and export them with their syndrome map')))
    .requiredOption('--words <file>', 'candidate words: search --json output or a search --out words file')
    .option('--side <side>', 'x, z or both (default: the sides present in --words)')
    .option('--basis <b>', 'all (keep every original row) or minimal (a full-rank subset)', 'all')
    .action(async (o: ConditionCliOptions) => {
      const input = loadCodeInput(o);
      const settings: ConditioningSettings = {
        budget: parseBudget(o.budget),
        strategy: choiceOption('strategy', o.strategy, STRATEGIES, 'lightest'),
        latencyModel: choiceOption('latency-model', o.latencyModel, LATENCY_MODELS, 'serial'),
        iterations: intOption('iterations', o.iterations, 3, 1),
        format: choiceOption('format', o.format, FORMATS, 'mtx'),
        basis: choiceOption('basis', o.basis, ['all', 'minimal'] as const, 'all'),
        seed: o.seed ?? '1',
        side: o.side,
        out: o.out,
        score: await scoreSettings(o, input),
      };
      const { summary, results, prov } = runConditioning(input, readCandidateWords(o.words!), o.words!, settings);
      if (o.json) printJson(summary);
      else {
        const lines = [`strategy ${settings.strategy}, budget ${formatBudget(settings.budget)}, latency model ${settings.latencyModel} at ${settings.iterations} iterations, seed ${settings.seed}`];
        for (const r of results) lines.push(...summaryLines(r.out, LATENCY_UNITS[settings.latencyModel]));
        if (summary.score) {
          lines.push(`trial decoding at ${settings.iterations} iterations, ${summary.score.shots} shots per point, seed ${settings.seed}:`);
          for (const pt of summary.score.points) lines.push(`  ${pt.label.padEnd(12)} p=${pt.p}  ${pt.failures}/${pt.shots}  rate ${pt.rate.toExponential(2)}  [${pt.interval.map((x) => x.toExponential(2)).join(', ')}]`);
        }
        if (prov) lines.push(`wrote ${Object.values(prov.sides).flatMap((x) => [x.files.matrix, x.files.map]).join(', ')}, ${basename(o.out!)}.provenance.json`);
        process.stdout.write(lines.join('\n') + '\n');
      }
    });
}

export interface ConditioningSettings {
  budget: Budget;
  strategy: Strategy;
  latencyModel: LatencyModel;
  iterations: number;
  format: MatrixFormat;
  basis: 'all' | 'minimal';
  seed: string;
  /** x, z, both, h; default: the sides present in the words. */
  side?: string;
  /** Bundle prefix; no files are written without it. */
  out?: string;
  /** Decoding settings for --score and the trial strategy. */
  score?: TrialScoring;
}

/** The decoding settings of --score (null without it). */
async function scoreSettings(o: ConditionCliOptions, input: CodeInput): Promise<TrialScoring | undefined> {
  if (o.score === undefined) {
    if (o.strategy === 'trial') throw new InputError('--strategy trial selects by decoding: give the error rates to score at with --score p,...');
    return undefined;
  }
  const css = requireCss(input, '--score');
  const { parseProbabilities } = await import('./trial.js');
  const { trialCode } = await import('../decode/trial-engine.js');
  const rule = 'sum-product' as const;
  return {
    code: trialCode(css.code),
    decoder: { decoder: choiceOption('decoder', o.decoder, ['bp2', 'bp4'] as const, 'bp4'), osd: { kind: 'none' }, rule, scale: 1, schedule: 'flooding', iterations: intOption('iterations', o.iterations, 3, 1), earlyStop: true },
    noise: choiceOption('noise', o.noise, ['depolarizing', 'independent'] as const, 'depolarizing'),
    ps: parseProbabilities(o.score),
    shots: intOption('score-shots', o.scoreShots, 2000, 1),
    seed: o.seed ?? '1',
  };
}

/** Condition every requested side from candidate words, write the bundle when asked; returns the summary. */
export function runConditioning(input: CodeInput, words: Map<string, number[][]>, wordsLabel: string, st: ConditioningSettings) {
  const matrices: { side: string; h: BitMatrix }[] =
    input.kind === 'matrix' ? [{ side: 'h', h: input.h }] : [{ side: 'x', h: input.code.hx }, { side: 'z', h: input.code.hz }];
  const wanted = st.side === undefined ? [...words.keys()] : st.side === 'both' ? ['x', 'z'] : [choiceOption('side', st.side, ['x', 'z', 'h'] as const, 'x')];
  const todo = matrices.filter((m) => wanted.includes(m.side));
  if (todo.length === 0) throw new InputError(`${wordsLabel} has words for side(s) ${[...words.keys()].join(', ')}, none of which this input has`);
  if (st.strategy === 'trial' && !st.score) throw new InputError('--strategy trial needs the error rates to select by (--score p,...)');
  // the decoder pair as conditioned so far: the trial strategy scores one side with the other side's current matrix
  const current = input.kind === 'css' ? { x: input.code.hx, z: input.code.hz } : null;
  const results = todo.map(({ side, h }) => {
    const sup = words.get(side);
    if (!sup) throw new InputError(`${wordsLabel} has no words for side ${side}`);
    const candidates = verifyCandidates(h, sup, `${wordsLabel} (side ${side})`);
    let selection: TrialSelection | undefined;
    const req: ConditionRequest = {
      side, h, candidates, basis: st.basis, budget: st.budget, latencyModel: st.latencyModel, iterations: st.iterations, strategy: st.strategy, seed: st.seed, symmetry: input.symmetry,
      trial: st.strategy === 'trial' && st.score && current
        ? trialSelector(st.score, h.cols, (m) => (side === 'x' ? { dx: m, dz: current.z } : { dx: current.x, dz: m }), (sel) => (selection = sel))
        : undefined,
    };
    const out = conditionSide(req);
    if (current && (side === 'x' || side === 'z')) current[side] = out.matrix;
    return { side, out, candidates: candidates.words.length, dropped: candidates.dropped, selection };
  });
  let score: { shots: number; points: ReturnType<typeof scoreTable> } | undefined;
  if (st.score && current && input.kind === 'css') {
    score = { shots: st.score.shots, points: scoreTable(st.score, input.code.hx, input.code.hz, current.x, current.z) };
  }
  const inputs: Record<string, string> = {};
  for (const m of matrices) inputs[m.side === 'h' ? 'h' : `h${m.side}`] = matrixHash(m.h);
  const base = {
    tool: 'overcheck' as const, version: VERSION, command: process.argv.slice(2), seed: st.seed, strategy: st.strategy, budget: st.budget,
    latencyModel: st.latencyModel, iterations: st.iterations, basis: st.basis, inputs,
  };
  const prov = st.out ? writeBundle(st.out, st.format, results, base) : null;
  const bySide = <T>(f: (r: (typeof results)[number]) => T) => Object.fromEntries(results.map((r) => [r.side, f(r)]));
  const summary = {
    strategy: st.strategy, budget: st.budget, latencyModel: st.latencyModel, iterations: st.iterations, seed: st.seed,
    added: bySide((r) => r.out.added.length),
    before: bySide((r) => r.out.before),
    after: bySide((r) => r.out.after),
    sides: bySide((r) => ({
      added: r.out.added.length, addedByWeight: r.out.addedByWeight, before: r.out.before, after: r.out.after, candidates: r.candidates, dropped: r.dropped,
      ...(r.selection ? { selection: r.selection } : {}),
    })),
    ...(score ? { score } : {}),
    ...(prov ? { provenance: `${st.out}.provenance.json` } : {}),
  };
  return { summary, results, prov };
}

/** Trial decoding of the original and the conditioned pair at each scoring point, on the same samples. */
function scoreTable(s: TrialScoring, hx: BitMatrix, hz: BitMatrix, cx: BitMatrix, cz: BitMatrix) {
  const points: { label: string; p: number; shots: number; failures: number; rate: number; interval: [number, number] }[] = [];
  for (const p of s.ps) {
    const one = { ...s, ps: [p] };
    const { failures, shots } = scorePairs(one, [{ label: 'original', dx: hx, dz: hz }, { label: 'conditioned', dx: cx, dz: cz }]);
    ['original', 'conditioned'].forEach((label, i) => {
      points.push({ label, p, shots, failures: failures[i]!, rate: failures[i]! / shots, interval: wilsonInterval(failures[i]!, shots) });
    });
  }
  return points;
}
