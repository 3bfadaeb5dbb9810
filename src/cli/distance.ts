import type { Command } from 'commander';
import { InputError } from '../errors.js';
import { readMatrixFile } from '../formats/index.js';
import { DEFAULT_SEED } from '../parallel/seeds.js';
import { choiceOption, codeOptions, floatOption, intOption, loadCodeInput, printJson, type CodeOptions } from './input.js';
import { EXIT_NO, ExitWith } from './main.js';
import { startRun } from './run-control.js';
import { defaultJournalPath, journalForRun, journalLines, resumeMessage } from './journal.js';
import { formatSize, parseShard, parseSize } from './search.js';
import { freemem } from 'node:os';
import { wordCapFor } from '../distance/words.js';
import { matrixHash } from '../codes/hash.js';
import type { AuditProgress } from '../distance/audit.js';
import type { DistanceReport } from '../distance/result.js';

interface DistanceOptions extends CodeOptions {
  generator?: string;
  side?: string;
  method?: string;
  seed?: string;
  workers?: string;
  timeLimit?: string;
  iterations?: string;
  targetMiss?: string;
  enumerationLimit?: string;
  maxWords?: string;
  json?: boolean;
  progress?: boolean;
  shard?: string;
  checkpoint?: string;
  resume?: string;
  maxMemory?: string;
}

export function registerDistance(program: Command): void {
  codeOptions(program.command('distance').description('audit the minimum weight of logical operators (dX, dZ) or of a classical code: bounds, witness, count'))
    .option('--generator <file>', 'a classical generator matrix (instead of --h)')
    .option('--side <side>', 'x, z or both (CSS codes)')
    .option('--method <method>', 'auto, exhaustive, isd or certify', 'auto')
    .option('--seed <seed>', `random seed (default ${DEFAULT_SEED})`)
    .option('--workers <n>', 'worker threads (default: number of cores; 0 runs on the main thread)')
    .option('--time-limit <sec>', 'stop after this many seconds and report the bounds reached')
    .option('--iterations <n>', 'information-set iterations (alone: exactly this many)')
    .option('--target-miss <p>', 'stop the information-set search once the miss probability is below p (default 1e-6)')
    .option('--enumeration-limit <n>', 'largest certifying enumeration auto plans for, in combinations (default 1e9)')
    .option('--max-words <n>', 'most minimum-weight words kept per side (default 200000); beyond it the count is a lower bound')
    .option('--max-memory <size>', 'approximate memory for the kept minimum-weight words, e.g. 512M or 4G (default: a quarter of the free memory); lowers --max-words to fit')
    .option('--shard <i/n>', 'run shard I of N (0-based) of a fixed plan: a disjoint share of its chunks; combine with merge')
    .option('--checkpoint <file>', 'journal every finished chunk to FILE as it completes; an existing FILE is replayed first, so rerunning the same command continues it')
    .option('--resume <file>', 'replay the finished chunks journalled in FILE and carry on (same result as one uninterrupted audit); goes on writing to FILE')
    .option('--progress', 'progress on stderr even when it is not a terminal')
    .option('--json', 'print one JSON object')
    .action(async (o: DistanceOptions) => {
      const { auditDistance, DISTANCE_METHODS, DEFAULT_ENUMERATION_LIMIT, DEFAULT_MAX_WORDS } = await import('../distance/audit.js');
      const { classicalCheckProblem, classicalGeneratorProblem } = await import('../distance/problem.js');
      const { formatDistanceText } = await import('../distance/result.js');

      const method = choiceOption('method', o.method, DISTANCE_METHODS, 'auto');
      const seed = o.seed ?? String(DEFAULT_SEED);
      const timeLimit = floatOption('time-limit', o.timeLimit, Infinity, 0);
      const iterations = o.iterations === undefined ? undefined : intOption('iterations', o.iterations, 0, 0);
      const targetMiss = o.targetMiss === undefined ? undefined : floatOption('target-miss', o.targetMiss, 0, 0, 1);
      const enumerationLimit = floatOption('enumeration-limit', o.enumerationLimit, DEFAULT_ENUMERATION_LIMIT, 0);
      const askedWords = intOption('max-words', o.maxWords, DEFAULT_MAX_WORDS, 1);
      const maxMemory = parseSize(o.maxMemory) ?? Math.floor(freemem() / 4);
      const shard = parseShard(o.shard);

      let input: Parameters<typeof auditDistance>[1];
      let codeHash: Record<string, string>;
      if (o.generator !== undefined) {
        if (o.hx !== undefined || o.hz !== undefined || o.family !== undefined || o.h !== undefined) {
          throw new InputError('--generator takes the place of --h, --family and --hx/--hz: give only one input');
        }
        if (o.side !== undefined) throw new InputError('--side applies to CSS codes only');
        const g = readMatrixFile(o.generator);
        input = { kind: 'classical', problem: classicalGeneratorProblem(g), label: o.generator };
        codeHash = { generator: matrixHash(g) };
      } else {
        const loaded = loadCodeInput(o);
        if (loaded.kind === 'css') {
          input = { kind: 'css', code: loaded.code, label: loaded.label, side: choiceOption('side', o.side, ['x', 'z', 'both'] as const, 'both') };
          codeHash = { hx: matrixHash(loaded.code.hx), hz: matrixHash(loaded.code.hz) };
        } else {
          if (o.side !== undefined) throw new InputError('--side applies to CSS codes only');
          input = { kind: 'classical', problem: classicalCheckProblem(loaded.h), label: loaded.label };
          codeHash = { h: matrixHash(loaded.h) };
        }
      }

      const n = input.kind === 'css' ? input.code.n : input.problem.n;
      const maxWords = wordCapFor(n, askedWords, maxMemory);
      if (maxWords < askedWords && (o.maxWords !== undefined || o.maxMemory !== undefined)) {
        process.stderr.write(`overcheck: note: --max-memory ${formatSize(maxMemory)} holds about ${maxWords} minimum-weight words of length ${n}; keeping at most that many (not ${askedWords})\n`);
      }
      const started = Date.now();
      const journalPath = o.resume ?? o.checkpoint ?? defaultJournalPath('distance');
      const control = await startRun({ workers: o.workers, timeLimit: o.timeLimit, progress: o.progress, what: 'distance', resumeHint: journalPath });
      const journal = await journalForRun(control, 'distance', o);
      const show = o.progress === true || process.stderr.isTTY === true;
      const tty = process.stderr.isTTY === true;
      let lastShown = 0;
      let shown = false;
      // --iterations with --time-limit: warn once when the information sets left cannot be done in time
      let warned = iterations === undefined || !Number.isFinite(timeLimit);
      const sidesLeft = (key: string) => (input.kind === 'css' && input.side === 'both' && key === 'dx' ? 1 : 0);
      const progress = (p: AuditProgress) => {
        const now = Date.now();
        const secs = (now - started) / 1000;
        if (!warned && p.phase === 'isd' && secs >= 2 && p.iterations > 0) {
          const left = iterations! - p.iterations + sidesLeft(p.key) * iterations!;
          const need = left / (p.iterations / secs);
          if (need > timeLimit - secs) {
            warned = true;
            process.stderr.write(`${shown && tty ? '\n' : ''}overcheck: warning: at the measured ${(p.iterations / secs).toFixed(0)} information sets/s the remaining ${left} take about ${need.toFixed(0)} s, more than the ${(timeLimit - secs).toFixed(0)} s left of --time-limit; the bounds will be those reached by then\n`);
          }
        }
        if (!show || now - lastShown < 500) return;
        lastShown = now;
        const what =
          p.phase === 'isd'
            ? `information-set search: ${p.iterations} information sets, miss ≤ ${p.missProbability.toExponential(1)}`
            : p.phase === 'enumeration'
              ? `enumeration: level ${p.level}, ${p.combinations.toExponential(2)} combinations`
              : `exhaustive: ${p.combinations.toExponential(2)} of 2^${p.level} words`;
        const name = p.key === 'dx' ? 'dX' : p.key === 'dz' ? 'dZ' : 'd';
        const line = `distance: ${p.lower} ≤ ${name} ≤ ${p.upper}; ${what}; ${((now - started) / 1000).toFixed(1)} s`;
        process.stderr.write(tty ? `\r${line}\x1b[K` : `${line}\n`);
        shown = true;
      };
      let interrupted = false;
      let saved: string | null = null;
      let report: DistanceReport & { codeHash?: Record<string, string> };
      try {
        report = await auditDistance(journal.pool, input, { method, seed, iterations, targetMiss, enumerationLimit, maxWords, ...(shard ? { shard } : {}) }, {
          shouldStop: control.shouldStop,
          stopReason: () => {
            if ((Date.now() - started) / 1000 >= timeLimit) return 'time-limit';
            interrupted = true;
            return 'interrupted';
          },
          progress,
        });
      } finally {
        if (shown && tty) process.stderr.write('\n');
        await control.close();
        saved = journal.finish(control.stopCause() === 'interrupted');
      }
      const timedOut = (report.kind === 'classical' ? [report.d] : [report.dx, report.dz]).some((x) => x?.stoppedBy === 'time-limit');
      if (saved !== null && (interrupted || timedOut)) process.stderr.write(resumeMessage('distance', saved, interrupted ? 'interrupted' : 'stopped at --time-limit'));
      const js = journal.summary();
      report = { ...report, codeHash, ...(js.file !== null ? { journal: js } : {}) };
      if (o.json) printJson(report);
      else process.stdout.write(formatDistanceText(report) + journalLines(journal).map((l) => `${l}\n`).join('') + `elapsed ${((Date.now() - started) / 1000).toFixed(2)} s\n`);
      for (const [name, side] of report.kind === 'classical' ? [['d', report.d] as const] : ([['dX', report.dx], ['dZ', report.dz]] as const)) {
        if (side?.truncated) process.stderr.write(`overcheck: ${name}: stopped keeping minimum-weight words at ${side.count} (the --max-words ${maxWords} / --max-memory ${formatSize(maxMemory)} limit); the count is a lower bound\n`);
      }
      if (interrupted) throw new ExitWith(130);
      // a shard alone rarely certifies: the check is for the merged result (exit 0 so that job arrays go on)
      if (method === 'certify' && !(shard && shard.count > 1)) {
        const certified = report.kind === 'classical' ? report.d.certified : [report.dx, report.dz].every((s) => s === undefined || s.certified);
        if (!certified) throw new ExitWith(EXIT_NO);
      }
    });
}
