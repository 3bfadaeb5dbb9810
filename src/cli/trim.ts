import type { Command } from 'commander';
import { fromRowVectors, packedSupport } from '../gf2/bitmatrix.js';
import { rank } from '../gf2/elimination.js';
import { RowSpaceSolver } from '../gf2/solve.js';
import { matrixHash } from '../codes/hash.js';
import { formatBudget, parseBudget } from '../condition/budget.js';
import { verifyCandidates } from '../condition/candidates.js';
import { conditionSide, matrixFigures } from '../condition/condition.js';
import { LATENCY_MODELS, LATENCY_UNITS } from '../condition/latency.js';
import { STRATEGIES } from '../condition/select.js';
import { InputError } from '../errors.js';
import { readMatrixFile } from '../formats/index.js';
import { VERSION } from '../version.js';
import { conditioningOptions, summaryLines, writeBundle, type ConditionCliOptions } from './condition.js';
import { choiceOption, intOption, printJson } from './input.js';
import { FORMATS } from './make.js';
import { GrowingBasis } from '../gf2/basis.js';

export function registerTrim(program: Command): void {
  conditioningOptions(program.command('trim').description('remove rows of an existing overcomplete matrix to meet a budget'))
    .requiredOption('--h <file>', 'the overcomplete matrix')
    .requiredOption('--original <file>', 'the original check matrix it must span the row space of')
    .action((o: ConditionCliOptions & { original: string }) => {
      const m = readMatrixFile(o.h!);
      const h = readMatrixFile(o.original);
      if (m.cols !== h.cols) throw new InputError(`${o.h} has ${m.cols} columns but ${o.original} has ${h.cols}`);
      const solver = new RowSpaceSolver(h);
      for (let r = 0; r < m.rows; r++) {
        if (!solver.contains(m.data.subarray(r * m.stride, (r + 1) * m.stride))) {
          throw new InputError(`${o.h}: row ${r} (support ${packedSupport(m.data, r * m.stride, m.stride).slice(0, 12).join(',')}) is not in the row space of ${o.original}`);
        }
      }
      if (rank(m) !== solver.rank) {
        const mSolver = new RowSpaceSolver(m);
        for (let r = 0; r < h.rows; r++) {
          if (!mSolver.contains(h.data.subarray(r * h.stride, (r + 1) * h.stride))) throw new InputError(`${o.h} does not span the row space of ${o.original}: row ${r} of ${o.original} is not in it`);
        }
      }
      const budget = parseBudget(o.budget);
      const strategy = choiceOption('strategy', o.strategy, STRATEGIES, 'lightest');
      if (strategy === 'trial') throw new InputError('--strategy trial: not available yet (needs the trial decoding engine)');
      const latencyModel = choiceOption('latency-model', o.latencyModel, LATENCY_MODELS, 'serial');
      const iterations = intOption('iterations', o.iterations, 3, 1);
      const format = choiceOption('format', o.format, FORMATS, 'mtx');
      // Base: the rows of M that are rows of the original, completed to full rank by the lightest other rows of M.
      const orig = new Set<string>();
      for (let r = 0; r < h.rows; r++) orig.add(packedSupport(h.data, r * h.stride, h.stride).join(','));
      const baseVecs: Uint32Array[] = [];
      const rest: number[][] = [];
      const basis = new GrowingBasis(m.cols);
      const others: { sup: number[]; v: Uint32Array }[] = [];
      for (let r = 0; r < m.rows; r++) {
        const v = m.data.slice(r * m.stride, (r + 1) * m.stride);
        const sup = packedSupport(v, 0, m.stride);
        if (orig.has(sup.join(','))) {
          baseVecs.push(v);
          basis.insert(v);
        } else others.push({ sup, v });
      }
      others.sort((a, b) => a.sup.length - b.sup.length);
      for (const x of others) {
        if (basis.size < solver.rank && basis.insert(x.v)) baseVecs.push(x.v);
        else rest.push(x.sup);
      }
      const base = fromRowVectors(m.cols, baseVecs);
      const candidates = verifyCandidates(base, rest, o.h!);
      const out = conditionSide({ side: 'h', h: base, candidates, basis: 'all', budget, latencyModel, iterations, strategy, seed: o.seed ?? '1' });
      // re-express against the original matrix
      const comb = solver.combinations(out.matrix);
      if ('missingRow' in comb) throw new Error('internal: trimmed row left the row space');
      out.map = comb.map;
      // "before" is the overcomplete matrix as given
      out.before = matrixFigures(m.cols, Array.from({ length: m.rows }, (_, r) => m.data.slice(r * m.stride, (r + 1) * m.stride)), latencyModel, iterations);
      const prov = o.out
        ? writeBundle(o.out, format, [{ side: 'h', out, candidates: candidates.words.length, dropped: candidates.dropped }], {
            tool: 'overcheck', version: VERSION, command: process.argv.slice(2), seed: o.seed ?? '1', strategy, budget, latencyModel, iterations, basis: 'all',
            inputs: { h: matrixHash(h), overcomplete: matrixHash(m) },
          })
        : null;
      if (o.json) printJson({ strategy, budget, kept: out.matrix.rows, removed: m.rows - out.matrix.rows, before: out.before, after: out.after, ...(prov ? { provenance: `${o.out}.provenance.json` } : {}) });
      else {
        const lines = [`trim ${o.h} (${m.rows} rows) to budget ${formatBudget(budget)} with ${strategy}: kept ${out.matrix.rows}, removed ${m.rows - out.matrix.rows}`];
        lines.push(...summaryLines(out, LATENCY_UNITS[latencyModel]).slice(1));
        process.stdout.write(lines.join('\n') + '\n');
      }
    });
}
