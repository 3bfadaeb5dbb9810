import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, renameSync, rmSync } from 'node:fs';
import { dirname, isAbsolute, join, resolve } from 'node:path';
import type { Command } from 'commander';
import { summarizeCode, type CssCode } from '../codes/css.js';
import { type BitMatrix, vstack } from '../gf2/bitmatrix.js';
import { readMatrixFile, type MatrixFormat } from '../formats/index.js';
import { parseBudget } from '../condition/budget.js';
import { InputError } from '../errors.js';
import { readJsonFile, writeTextFileAtomic } from '../formats/json-file.js';
import { writeJsonFile } from '../formats/json-out.js';
import { readWordsFile } from '../formats/words-file.js';
import { JournalFile } from '../formats/journal-file.js';
import { JournalPool } from '../parallel/journal-pool.js';
import { parseRunConfig, type RunConfig } from '../pipeline/config.js';
import { VERSION } from '../version.js';
import { runConditioning } from './condition.js';
import { loadCodeInput, printJson, requireCss } from './input.js';
import { ExitWith } from './main.js';
import { startRun, type RunControl } from './run-control.js';
import { searchSides } from './search.js';

/** The demo configuration the README's first command runs. */
export const DEMO_CONFIG = 'matrices/lantern42.run.json';

interface RunState {
  configHash: string;
  stages: Record<string, unknown>;
}

function locateDemo(): string {
  const here = dirname(new URL(import.meta.url).pathname);
  return join(here, '..', '..', DEMO_CONFIG);
}

/** A stage's result, computed once per configuration and kept in DIR/state.json so that a rerun resumes. */
class Checkpoints {
  private state: RunState;
  constructor(private readonly path: string, configHash: string, fresh: boolean) {
    let prev: RunState | null = null;
    if (!fresh && existsSync(path)) {
      try {
        prev = JSON.parse(readFileSync(path, 'utf8')) as RunState;
      } catch {
        prev = null;
      }
    }
    this.state = prev && prev.configHash === configHash ? prev : { configHash, stages: {} };
  }

  has(stage: string): boolean {
    return stage in this.state.stages;
  }

  get<T>(stage: string): T {
    return this.state.stages[stage] as T;
  }

  put(stage: string, value: unknown): void {
    this.state.stages[stage] = value;
    writeJsonFile(this.path, this.state);
  }
}

export function registerRun(program: Command): void {
  program
    .command('run')
    .description('the whole job: search, distance audit, conditioning, cycle census, trial decoding, export and report')
    .argument('[config]', `a run configuration (JSON; default: the bundled demo ${DEMO_CONFIG})`)
    .option('--out <dir>', 'directory for every result, the export bundle and report.html', 'overcheck-run')
    .option('--workers <n>', 'worker threads (default: the config, else the number of cores)')
    .option('--fresh', 'recompute every stage instead of reusing the ones saved in DIR/state.json')
    .option('--progress', 'progress on stderr even when it is not a terminal')
    .option('--json', 'print the run bundle as one JSON object')
    .action(async (configPath: string | undefined, o: { out: string; workers?: string; fresh?: boolean; progress?: boolean; json?: boolean }) => {
      const file = configPath ?? locateDemo();
      const raw = readJsonFile(file);
      const config = parseRunConfig(raw.value, file);
      const base = dirname(resolve(file));
      const rel = (p: string) => (isAbsolute(p) ? p : join(base, p));
      const dir = o.out;
      mkdirSync(dir, { recursive: true });
      if (o.fresh) for (const stage of ['distance', 'trial']) rmSync(join(dir, `${stage}.journal.jsonl`), { force: true });
      const configHash = createHash('sha256').update(JSON.stringify(config)).digest('hex');
      const ck = new Checkpoints(join(dir, 'state.json'), configHash, o.fresh === true);
      const say = (msg: string) => process.stderr.write(`${msg}\n`);
      const input = requireCss(
        loadCodeInput('family' in config.code ? { family: config.code.family } : { hx: rel(config.code.hx), hz: rel(config.code.hz) }),
        'run',
      );
      const workers = o.workers ?? (config.workers === null ? undefined : String(config.workers));
      const control: RunControl = await startRun({ workers, progress: o.progress, what: 'run', resumeHint: dir });
      let interrupted = false;
      // what a reader of the report should know about how the stages ended
      const notes: string[] = [];
      try {
        const sides = config.sides === 'both' ? ['x', 'z'] : [config.sides];
        // 1. code summary
        const info = summarizeCode(input.code);
        ck.put('info', info);
        say(`code ${input.label}: [[${info.n},${info.k}]], HX ${info.hx.rows}×${info.n} rank ${info.hx.rank}, HZ ${info.hz.rows}×${info.n} rank ${info.hz.rank}`);
        // 2. search both sides (resumable through DIR/words.jsonl)
        let search: Record<string, unknown>;
        if (ck.has('search')) {
          search = ck.get('search');
          say('search: reusing the saved result');
        } else {
          const wordsFile = join(dir, 'words.jsonl');
          const resume = existsSync(wordsFile) && !o.fresh ? safeResume(wordsFile) : undefined;
          const searchOnce = (from: string | undefined) =>
            searchSides(
              sides.map((s) => ({ side: s, h: s === 'x' ? input.code.hx : input.code.hz, symmetry: input.symmetry })),
              {
                maxWeight: config.search.maxWeight === null ? undefined : String(config.search.maxWeight),
                method: config.search.method,
                seed: String(config.seed),
                iterations: config.search.iterations === null ? undefined : String(config.search.iterations),
                targetMiss: String(config.search.targetMiss),
                maxWords: '2000000',
                out: from ? undefined : wordsFile,
                resume: from,
              },
              stageControl(control, config.search.timeLimit),
            );
          let results;
          try {
            results = await searchOnce(resume);
          } catch (e) {
            // a words file from another configuration (other weight, seed or code) cannot be continued
            if (!(resume && e instanceof InputError)) throw e;
            say(`search: ${e.message}; starting the search afresh`);
            results = await searchOnce(undefined);
          }
          search = Object.fromEntries(results.map((r) => [r.side, r]));
          if (results.some((r) => r.stopReason === 'interrupted')) {
            interrupted = true;
            return;
          }
          if (results.some((r) => r.stopReason === 'time')) {
            say(`search: stopped at search.timeLimit; the words found so far are used (rerun with a larger limit to continue from ${wordsFile})`);
            notes.push('search: stopped at search.timeLimit; the word lists may be incomplete (see the miss probabilities)');
          }
          ck.put('search', search);
          for (const r of results) say(`search ${r.side}: ${r.wordCount} words of weight ≤ ${r.maxWeight} (${r.method}, ${r.complete ? 'complete' : `miss probability ≤ ${Math.max(...Object.values(r.missProbability)).toExponential(1)}`})`);
        }
        if (control.shouldStop()) {
          interrupted = true;
          return;
        }
        // 3. distance audit (the bounds it proves within its time limit)
        let distance: unknown = null;
        if (config.distance.enabled) {
          if (ck.has('distance')) {
            distance = ck.get('distance');
            say('distance: reusing the saved result');
          } else {
            const { auditDistance } = await import('../distance/audit.js');
            const dc = stageControl(control, config.distance.timeLimit);
            const journal = stageJournal(control, dir, 'distance', say);
            const report = await auditDistance(
              journal.pool,
              { kind: 'css', code: input.code, label: input.label, side: 'both' },
              { method: config.distance.method, seed: String(config.seed), targetMiss: config.distance.targetMiss },
              { shouldStop: dc.shouldStop, stopReason: () => (dc.stopCause() === 'interrupted' ? 'interrupted' : 'time-limit') },
            ).finally(() => journal.close());
            if (journal.reused > 0) say(`distance: ${journal.reused} finished chunks replayed from ${journal.path}`);
            if (control.stopCause() === 'interrupted') {
              interrupted = true;
              return;
            }
            distance = report;
            ck.put('distance', report);
            const r = report as { dx?: { upper: number; lower: number; certified: boolean }; dz?: { upper: number; lower: number; certified: boolean } };
            say(`distance: ${r.dx?.lower} ≤ dX ≤ ${r.dx?.upper}${r.dx?.certified ? ' (certified)' : ''}, ${r.dz?.lower} ≤ dZ ≤ ${r.dz?.upper}${r.dz?.certified ? ' (certified)' : ''}`);
          }
        }
        // 4. conditioning and export bundle
        const words = new Map<string, number[][]>(Object.entries(search).map(([s, r]) => [s, (r as { words: number[][] }).words]));
        const bundlePrefix = join(dir, 'conditioned');
        const { summary: condition } = runConditioning(input, words, 'search result', {
          budget: parseBudget(config.condition.budget),
          strategy: config.condition.strategy,
          latencyModel: config.condition.latencyModel,
          iterations: config.condition.iterations,
          format: config.condition.format,
          basis: config.condition.basis,
          seed: String(config.seed),
          side: config.sides,
          out: bundlePrefix,
          score: config.condition.strategy === 'trial' ? await runScoring(config, input.code) : undefined,
        });
        ck.put('condition', condition);
        for (const s of sides) {
          const c = condition.sides[s]!;
          say(`condition ${s}: +${c.added} rows, ${c.before.rows}→${c.after.rows} rows, 4-cycles ${c.before.cycles['4']}→${c.after.cycles['4']}`);
        }
        // 5. cycle census of the original and the conditioned matrices (X, Z and joint graphs)
        const { cycleCensus, censusJson, structureSummary, tannerGraph } = await import('../graph/index.js');
        const conditioned = readConditioned(bundlePrefix, sides, config.condition.format, input.code.hx, input.code.hz);
        const census = (hx: BitMatrix, hz: BitMatrix) => {
          const one = (m: BitMatrix) => censusJson(cycleCensus(m, config.cycles.maxLength), structureSummary(tannerGraph(m)));
          return { maxLength: config.cycles.maxLength, x: one(hx), z: one(hz), joint: { ...one(vstack(hx, hz)), checks: { x: hx.rows, z: hz.rows } } };
        };
        const cycles = { before: census(input.code.hx, input.code.hz), after: census(conditioned.hx, conditioned.hz) };
        ck.put('cycles', cycles);
        say(`cycles: joint graph 4-cycles ${cycles.before.joint.cycles['4']} → ${cycles.after.joint.cycles['4']}, girth ${cycles.before.joint.girth} → ${cycles.after.joint.girth}`);
        // 6. trial decoding: the original matrices at their iteration count, and original and conditioned
        //    side by side at the conditioned count, all on the same error samples (same seed and batches)
        let trial: unknown = null;
        if (config.trial.enabled) {
          if (ck.has('trial')) {
            trial = ck.get('trial');
            say('trial: reusing the saved result');
          } else {
            const journal = stageJournal(control, dir, 'trial', say);
            trial = await trialStage(config, input.code, conditioned, { ...control, pool: journal.pool }).finally(() => journal.close());
            if (journal.reused > 0) say(`trial: ${journal.reused} finished batches replayed from ${journal.path}`);
            if (control.stopCause() === 'interrupted') {
              interrupted = true;
              return;
            }
            ck.put('trial', trial);
            for (const pt of (trial as { points: { label: string; p: number; rate: number; failures: number; shots: number }[] }).points) {
              say(`trial ${pt.label} p=${pt.p}: ${pt.failures}/${pt.shots} failures (rate ${pt.rate.toExponential(2)})`);
            }
          }
        }
        // 7. the run bundle and the report
        const provenance = JSON.parse(readFileSync(`${bundlePrefix}.provenance.json`, 'utf8'));
        const bundle = {
          kind: 'overcheck-run',
          version: VERSION,
          config: { file, sha256: raw.sha256, settings: config },
          info,
          search,
          distance,
          condition,
          cycles,
          trial,
          provenance,
          notes: [...notes, ...stageNotes(distance, trial)],
        };
        writeJsonFile(join(dir, 'run.json'), bundle);
        const { collectReport, renderReport } = await import('../report/index.js');
        const model = collectReport([{ file: join(dir, 'run.json'), value: bundle }], { version: VERSION, command: ['overcheck', ...process.argv.slice(2)].join(' ') });
        writeTextFileAtomic(join(dir, 'report.html'), renderReport(model));
        say(`wrote ${join(dir, 'report.html')}, ${join(dir, 'run.json')} and the bundle ${bundlePrefix}.*`);
        if (o.json) printJson(bundle);
      } finally {
        control.endLine();
        await control.close();
        if (interrupted) {
          say(`overcheck: interrupted; what was found is saved in ${dir}; run the same command again to resume`);
          // the stages return early on an interrupt; throwing here sets the exit code
          throw new ExitWith(130);
        }
      }
    });
}

/**
 * The results journal of a stage (DIR/STAGE.journal.jsonl): a rerun replays the stage's finished tasks and
 * carries on, so an interrupted distance or trial stage loses nothing (see src/parallel/journal-pool.ts).
 * Entries are keyed by task content, so a journal left by another configuration is harmless; one that
 * cannot be read is set aside.
 */
function stageJournal(control: RunControl, dir: string, stage: 'distance' | 'trial', say: (m: string) => void): { pool: JournalPool; path: string; reused: number; close(): void } {
  const path = join(dir, `${stage}.journal.jsonl`);
  let file: JournalFile;
  try {
    file = new JournalFile(path, stage, false);
  } catch (e) {
    if (!(e instanceof InputError)) throw e;
    say(`${stage}: ${e.message}; the journal is set aside as ${path}.damaged and the stage starts afresh`);
    renameSync(path, `${path}.damaged`);
    file = new JournalFile(path, stage, false);
  }
  const pool = new JournalPool(control.pool, file);
  return {
    pool,
    path,
    get reused() {
      return pool.reused;
    },
    close: () => file.close(),
  };
}

/** Notes on distance sides left uncertified and trial points cut short, from the stored stage results. */
function stageNotes(distance: unknown, trial: unknown): string[] {
  const out: string[] = [];
  const d = distance as { dx?: { certified: boolean; stoppedBy: string }; dz?: { certified: boolean; stoppedBy: string } } | null;
  for (const [name, side] of [['dX', d?.dx], ['dZ', d?.dz]] as const) {
    if (side && !side.certified) out.push(`distance: ${name} is not certified (stopped by ${side.stoppedBy}); the bounds are those reached`);
  }
  const t = trial as { points?: { label: string; p: number; stoppedBy: string }[] } | null;
  const short = (t?.points ?? []).filter((pt) => pt.stoppedBy === 'time');
  if (short.length > 0) out.push(`trial: ${short.length} point${short.length > 1 ? 's' : ''} stopped at trial.timeLimit before the shot count (${short.map((pt) => `${pt.label} p=${pt.p}`).join(', ')})`);
  return out;
}

/** The saved words file, when it holds a search that can be resumed; a damaged one is set aside. */
function safeResume(path: string): string | undefined {
  try {
    readWordsFile(path);
    return path;
  } catch (e) {
    if (e instanceof InputError) return undefined;
    throw e;
  }
}


/** The exported matrices of the bundle (sides not conditioned keep the original matrix). */
function readConditioned(prefix: string, sides: string[], format: MatrixFormat, hx: BitMatrix, hz: BitMatrix): { hx: BitMatrix; hz: BitMatrix } {
  return {
    hx: sides.includes('x') ? readMatrixFile(`${prefix}.hx.${format}`) : hx,
    hz: sides.includes('z') ? readMatrixFile(`${prefix}.hz.${format}`) : hz,
  };
}

/** The run's control with a stage's own time limit added (null: none). */
export function stageControl(control: RunControl, seconds: number | null): RunControl {
  if (seconds === null) return control;
  const t0 = Date.now();
  const late = () => (Date.now() - t0) / 1000 >= seconds;
  return {
    ...control,
    pool: control.pool,
    shouldStop: () => control.shouldStop() || late(),
    stopCause: () => control.stopCause() ?? (late() ? 'time' : null),
    report: (l, st) => control.report(l, st),
    endLine: () => control.endLine(),
    close: () => control.close(),
    estimate: (d, p) => control.estimate(d, p),
  };
}

/** Both trial plans of the run, merged into one result with labels that name the iteration counts. */
async function trialStage(config: RunConfig, code: CssCode, conditioned: { hx: BitMatrix; hz: BitMatrix }, control: RunControl) {
  const { runTrial } = await import('../decode/runner.js');
  const { trialCode, decoderMatrix } = await import('../decode/trial-engine.js');
  const { parseOsd } = await import('./trial.js');
  const { DEFAULT_MIN_SUM_SCALE } = await import('../decode/bp-options.js');
  const tc = trialCode(code);
  const t = config.trial;
  const decoder = (iterations: number) => ({
    decoder: t.decoder, osd: parseOsd(t.osd), rule: t.rule, schedule: t.schedule, iterations, earlyStop: true,
    scale: t.scale ?? (t.rule === 'min-sum' ? DEFAULT_MIN_SUM_SCALE : 1),
  });
  const plan = (labelSuffix: string, iterations: number, withConditioned: boolean) => ({
    code: tc,
    matrices: [
      decoderMatrix(tc, `original ${labelSuffix}`),
      ...(withConditioned ? [decoderMatrix(tc, `conditioned ${labelSuffix}`, conditioned.hx, conditioned.hz)] : []),
    ],
    decoder: decoder(iterations),
    noise: t.noise,
    ps: t.p,
    samples: { kind: 'channel' as const },
    shots: t.shots,
    failures: t.failures,
    timeLimit: t.timeLimit,
    batch: 256,
    seed: String(config.seed),
  });
  const hooks = { now: () => performance.now(), shouldStop: control.shouldStop };
  const a = await runTrial(plan(`(${t.iterationsOriginal} it)`, t.iterationsOriginal, false), control.pool, hooks);
  const b = await runTrial(plan(`(${t.iterationsConditioned} it)`, t.iterationsConditioned, true), control.pool, hooks);
  return { ...b, points: [...a.points, ...b.points], comparisons: [...a.comparisons, ...b.comparisons], iterations: { original: t.iterationsOriginal, conditioned: t.iterationsConditioned } };
}

/** Scoring settings of the trial strategy in a run: the trial section's decoder, noise and points. */
async function runScoring(config: RunConfig, code: CssCode) {
  const { trialCode } = await import('../decode/trial-engine.js');
  const { parseOsd } = await import('./trial.js');
  const t = config.trial;
  return {
    code: trialCode(code),
    decoder: { decoder: t.decoder, osd: parseOsd(t.osd), rule: t.rule, schedule: t.schedule, iterations: t.iterationsConditioned, earlyStop: true, scale: t.scale ?? (t.rule === 'min-sum' ? 0.75 : 1) },
    noise: t.noise,
    ps: t.p,
    shots: Math.max(200, Math.floor(t.shots / 2)),
    seed: `${config.seed}:select`,
  };
}
