import type { Command } from 'commander';
import type { BitMatrix } from '../gf2/bitmatrix.js';
import { summarizeCode } from '../codes/css.js';
import { NOISE_MODELS, type NoiseModel } from '../decode/channel.js';
import { DEFAULT_ITERATIONS, DEFAULT_MIN_SUM_SCALE } from '../decode/bp-options.js';
import type { DecoderKind, DecoderOptions, OsdMethod } from '../decode/css-decoder.js';
import { pointShots, runTrial, type TrialPlan } from '../decode/runner.js';
import type { SampleMode } from '../decode/trial-batch.js';
import { decoderMatrix, type DecoderMatrix, trialCode } from '../decode/trial-engine.js';
import { formatRate, formatTrialText } from '../decode/trial-text.js';
import { InputError } from '../errors.js';
import { readMatrixFile } from '../formats/index.js';
import { defaultWorkers } from '../parallel/pool.js';
import { DEFAULT_SEED } from '../parallel/seeds.js';
import { matrixHash } from '../codes/hash.js';
import { choiceOption, codeOptions, floatOption, intOption, loadCodeInput, printJson, requireCss, type CodeOptions } from './input.js';
import { parseShard } from './search.js';
import { ExitWith } from './main.js';
import { startRun } from './run-control.js';
import { shardBatchCount } from '../decode/trial-shard.js';
import { defaultJournalPath, journalForRun, journalLines, resumeMessage } from './journal.js';

interface TrialOptions extends CodeOptions {
  withX?: string;
  withZ?: string;
  label?: string;
  compare?: string[];
  p?: string;
  noise?: string;
  decoder?: string;
  rule?: string;
  scale?: string;
  schedule?: string;
  iterations?: string;
  earlyStop?: boolean;
  osd?: string;
  shots?: string;
  failures?: string;
  timeLimit?: string;
  weight?: string;
  exhaustive?: boolean;
  batch?: string;
  seed?: string;
  workers?: string;
  shard?: string;
  checkpoint?: string;
  resume?: string;
  progress?: boolean;
  json?: boolean;
}

const DEFAULT_SHOTS = 10_000;
const DEFAULT_BATCH = 256;
/** Exhaustive audits larger than this are refused (use sampled fixed-weight errors instead). */
const MAX_EXHAUSTIVE = 2 ** 31;

export function parseProbabilities(text: string): number[] {
  const parts = text.split(',').map((s) => s.trim());
  return parts.map((s) => {
    const x = Number(s);
    if (s === '' || !Number.isFinite(x) || x <= 0 || x >= 1) throw new InputError(`--p: expected probabilities strictly between 0 and 1 separated by commas, found "${s}"`);
    return x;
  });
}

export function parseOsd(text: string | undefined): OsdMethod {
  if (text === undefined || text === 'none') return { kind: 'none' };
  if (text === '0') return { kind: 'order0' };
  const m = /^cs:(\d+)$/.exec(text);
  if (m) return { kind: 'sweep', order: Number(m[1]) };
  throw new InputError(`--osd: expected none, 0 or cs:ORDER (e.g. cs:7), found "${text}"`);
}

function parseSeed(text: string | undefined): string | number {
  if (text === undefined) return DEFAULT_SEED;
  if (text.trim() === '') throw new InputError('--seed: expected a value');
  return /^\d+$/.test(text) && Number(text) <= Number.MAX_SAFE_INTEGER ? Number(text) : text;
}

/** LABEL=FX,FZ with "-" for the code's own matrix. */
function parseCompare(spec: string, own: { hx: BitMatrix; hz: BitMatrix }): { label: string; dx: BitMatrix; dz: BitMatrix; fx: string; fz: string } {
  const m = /^([^=,]+)=([^,]+),([^,]+)$/.exec(spec);
  if (!m) throw new InputError(`--compare: expected LABEL=FX,FZ (a label, then the X- and Z-check matrix files, "-" for the code's own), found "${spec}"`);
  const [, label, fx, fz] = m as unknown as [string, string, string, string];
  return {
    label: label.trim(),
    fx,
    fz,
    dx: fx === '-' ? own.hx : readMatrixFile(fx),
    dz: fz === '-' ? own.hz : readMatrixFile(fz),
  };
}

export function registerTrial(program: Command): void {
  codeOptions(program.command('trial').description('Monte Carlo decoding trial: logical error rate of BP (+ OSD) on original or overcomplete check matrices'), false)
    .option('--with-x <file>', 'X-check matrix the decoder runs on (rows in the row space of HX; default HX)')
    .option('--with-z <file>', 'Z-check matrix the decoder runs on (rows in the row space of HZ; default HZ)')
    .option('--label <name>', 'label of the main matrix pair (default "original", or "overcomplete" with --with-x/--with-z)')
    .option('--compare <specs...>', 'more matrix pairs LABEL=FX,FZ decoded on the same errors ("-" = the code\'s own matrix)')
    .requiredOption('--p <list>', 'physical error probabilities, comma-separated, e.g. 0.01,0.02')
    .option('--noise <model>', 'depolarizing (X, Y, Z each p/3) or independent (X and Z flips each p)', 'depolarizing')
    .option('--decoder <kind>', 'bp2 (X and Z parts separately) or bp4 (quaternary BP, scalar messages)', 'bp2')
    .option('--rule <rule>', 'check-node rule: sum-product or min-sum', 'sum-product')
    .option('--scale <s>', `factor on check messages (default 1 for sum-product, ${DEFAULT_MIN_SUM_SCALE} for min-sum)`)
    .option('--schedule <schedule>', 'flooding or serial (one check at a time)', 'flooding')
    .option('--iterations <n>', 'maximum BP iterations', String(DEFAULT_ITERATIONS))
    .option('--no-early-stop', 'always run all iterations (default: stop once the syndrome is matched)')
    .option('--osd <method>', 'OSD post-processing: none, 0 (order 0) or cs:ORDER (combination sweep)', 'none')
    .option('--shots <n>', 'shots per point (cap)', String(DEFAULT_SHOTS))
    .option('--failures <n>', 'stop a point once every matrix has this many failures')
    .option('--time-limit <sec>', 'seconds for the whole run (shared over the points)')
    .option('--weight <t>', 'decode errors of weight exactly t (the prior still comes from --p)')
    .option('--exhaustive', 'with --weight: every error of that weight instead of random ones')
    .option('--batch <n>', 'shots per numbered batch (part of what the seed reproduces)', String(DEFAULT_BATCH))
    .option('--seed <seed>', `random seed (default ${DEFAULT_SEED})`)
    .option('--workers <n>', 'worker threads (default: all cores); results do not depend on it')
    .option('--shard <i/n>', 'decode only the batches ≡ I (mod N) of every point (0-based); combine the N results with merge')
    .option('--checkpoint <file>', 'journal every finished batch to FILE as it completes; an existing FILE is replayed first, so rerunning the same command continues it')
    .option('--resume <file>', 'replay the finished batches journalled in FILE and carry on (same result as one uninterrupted run); goes on writing to FILE')
    .option('--progress', 'progress on stderr even when it is not a terminal (a line a second)')
    .option('--json', 'print one JSON object')
    .action(async (o: TrialOptions) => {
      const input = requireCss(loadCodeInput(o), 'trial');
      const code = trialCode(input.code);
      const ps = parseProbabilities(o.p ?? '');
      const noise = choiceOption<NoiseModel>('noise', o.noise, NOISE_MODELS, 'depolarizing');
      const kind = choiceOption<DecoderKind>('decoder', o.decoder, ['bp2', 'bp4'], 'bp2');
      const rule = choiceOption('rule', o.rule, ['sum-product', 'min-sum'] as const, 'sum-product');
      const decoder: DecoderOptions = {
        decoder: kind,
        rule,
        scale: floatOption('scale', o.scale, rule === 'min-sum' ? DEFAULT_MIN_SUM_SCALE : 1, 0, 100),
        schedule: choiceOption('schedule', o.schedule, ['flooding', 'serial'] as const, 'flooding'),
        iterations: intOption('iterations', o.iterations, DEFAULT_ITERATIONS, 1),
        earlyStop: o.earlyStop !== false,
        osd: parseOsd(o.osd),
      };
      if (o.exhaustive && o.weight === undefined) throw new InputError('--exhaustive needs --weight t');
      const weight = o.weight === undefined ? null : intOption('weight', o.weight, 1, 1);
      if (weight !== null && weight > code.n) throw new InputError(`--weight ${weight}: the code has only ${code.n} qubits`);
      const samples: SampleMode = weight === null ? { kind: 'channel' } : { kind: 'weight', weight, exhaustive: o.exhaustive === true };
      const matrices: DecoderMatrix[] = [];
      const withGiven = o.withX !== undefined || o.withZ !== undefined;
      const main = o.label ?? (withGiven ? 'overcomplete' : 'original');
      matrices.push(
        decoderMatrix(code, main, o.withX === undefined ? code.hx : readMatrixFile(o.withX), o.withZ === undefined ? code.hz : readMatrixFile(o.withZ), {
          x: o.withX === undefined ? undefined : `--with-x ${o.withX}`,
          z: o.withZ === undefined ? undefined : `--with-z ${o.withZ}`,
        }),
      );
      for (const spec of o.compare ?? []) {
        const c = parseCompare(spec, code);
        if (matrices.some((m) => m.label === c.label)) throw new InputError(`--compare: label "${c.label}" used twice`);
        matrices.push(decoderMatrix(code, c.label, c.dx, c.dz, { x: `--compare ${c.label}: ${c.fx}`, z: `--compare ${c.label}: ${c.fz}` }));
      }
      for (const m of matrices) {
        if (!m.spansX) process.stderr.write(`overcheck: warning: ${m.label}: the X-check matrix does not span the row space of HX; some syndromes cannot be matched\n`);
        if (!m.spansZ) process.stderr.write(`overcheck: warning: ${m.label}: the Z-check matrix does not span the row space of HZ; some syndromes cannot be matched\n`);
      }
      const plan: TrialPlan = {
        code,
        matrices,
        decoder,
        noise,
        ps,
        samples,
        shots: intOption('shots', o.shots, DEFAULT_SHOTS, 1),
        failures: o.failures === undefined ? null : intOption('failures', o.failures, 1, 1),
        timeLimit: o.timeLimit === undefined ? null : floatOption('time-limit', o.timeLimit, 0, 0),
        batch: intOption('batch', o.batch, DEFAULT_BATCH, 1),
        seed: parseSeed(o.seed),
        ...(o.shard !== undefined ? { shard: parseShard(o.shard)! } : {}),
      };
      if (plan.shard && plan.failures !== null && plan.shard.count > 1) {
        process.stderr.write(`overcheck: warning: --failures with --shard: each shard stops a point at ⌈${plan.failures}/${plan.shard.count}⌉ = ${Math.ceil(plan.failures / plan.shard.count)} failures of its own batches, so the merged counts will not be those of one run (marked exact: false); use --shots alone for an exact split\n`);
      }
      const total = pointShots(plan);
      if (samples.kind === 'weight' && samples.exhaustive) {
        if (total > MAX_EXHAUSTIVE) throw new InputError(`--weight ${samples.weight} --exhaustive: ${total.toExponential(3)} errors; too many, drop --exhaustive to sample them`);
        if (o.shots !== undefined) process.stderr.write('overcheck: warning: --shots is ignored with --exhaustive (every error of the weight is decoded)\n');
      }
      const workers = intOption('workers', o.workers, defaultWorkers(), 0);
      // SIGINT/SIGTERM: finish the batches in flight, print what was decoded (points marked interrupted), exit 130
      const journalPath = o.resume ?? o.checkpoint ?? defaultJournalPath('trial');
      const control = await startRun({ workers: String(workers <= 1 ? 0 : workers), what: 'trial', resumeHint: journalPath });
      const journal = await journalForRun(control, 'trial', o);
      const pool = journal.pool;
      const tty = process.stderr.isTTY === true;
      let lastProgress = 0;
      let result;
      let saved: string | null = null;
      const t0 = performance.now();
      // the time-limit warning: batches computed (not replayed) per second against the batches still to run
      const totalBatches = plan.ps.length * shardBatchCount(Math.ceil(total / plan.batch), plan.shard?.index ?? 0, plan.shard?.count ?? 1);
      let warned = plan.timeLimit === null || plan.failures !== null;
      try {
        result = await runTrial(plan, pool, {
          now: () => performance.now(),
          shouldStop: control.shouldStop,
          onProgress: (p, _pi, counts, shots) => {
            const t = performance.now();
            const secs = (t - t0) / 1000;
            if (!warned && secs >= 2 && pool.computed > 0) {
              const left = totalBatches - pool.computed - pool.reused;
              const need = left / (pool.computed / secs);
              if (need > plan.timeLimit! - secs) {
                warned = true;
                process.stderr.write(`\novercheck: warning: at the measured ${((pool.computed * plan.batch) / secs).toFixed(0)} shots/s the remaining ${left * plan.batch} shots take about ${need.toFixed(0)} s, more than the ${(plan.timeLimit! - secs).toFixed(0)} s left of --time-limit; points will stop early (stoppedBy "time")\n`);
              }
            }
            if (!(tty || o.progress) || t - lastProgress < (tty ? 200 : 1000)) return;
            lastProgress = t;
            const c = counts[0]!;
            const line = `p=${p}  shots ${c.shots}/${shots}  failures ${counts.map((x) => x.failures).join('/')}  rate ${formatRate(c.shots ? c.failures / c.shots : 0)}`;
            process.stderr.write(tty ? `\r${line}   ` : `${line}\n`);
          },
        });
      } finally {
        await control.close();
        if (tty) process.stderr.write('\r\x1b[K');
        saved = journal.finish(control.stopCause() === 'interrupted');
      }
      const interrupted = result.points.some((p) => p.stoppedBy === 'interrupted');
      const timedOut = result.points.some((p) => p.stoppedBy === 'time');
      if (saved !== null && (interrupted || timedOut)) process.stderr.write(resumeMessage('trial', saved, interrupted ? 'interrupted' : 'stopped at --time-limit'));
      const summary = summarizeCode(input.code);
      if (o.json) {
        printJson({
          ...result,
          code: { label: input.label, n: summary.n, k: summary.k },
          codeHash: { hx: matrixHash(input.code.hx), hz: matrixHash(input.code.hz) },
          matrices: matrices.map((m) => ({ label: m.label, xRows: m.dx.rows, zRows: m.dz.rows, spansX: m.spansX, spansZ: m.spansZ, xHash: matrixHash(m.dx), zHash: matrixHash(m.dz) })),
          workers: pool.workers,
          ...(journal.summary().file !== null ? { journal: journal.summary() } : {}),
        });
        if (interrupted) throw new ExitWith(130);
        return;
      }
      const osd = decoder.osd.kind === 'none' ? 'no OSD' : decoder.osd.kind === 'order0' ? 'OSD order 0' : `OSD combination sweep order ${decoder.osd.order}`;
      const mode = samples.kind === 'channel' ? `${noise} noise` : `${samples.exhaustive ? 'every' : 'random'} weight-${samples.weight} error${samples.exhaustive ? '' : 's'} (${noise} types; prior from p)`;
      process.stdout.write(
        formatTrialText(result, [
          `code     ${input.label}  [[${summary.n},${summary.k}]]`,
          `decoder  ${kind} ${rule}${decoder.scale !== 1 ? ` scale ${decoder.scale}` : ''}, ${decoder.schedule}, ${decoder.iterations} iterations${decoder.earlyStop ? ' (early stop)' : ''}, ${osd}`,
          `errors   ${mode}`,
          ...matrices.map((m) => `matrix   ${m.label}: ${m.dx.rows} X-checks, ${m.dz.rows} Z-checks`),
          ...journalLines(journal),
        ]),
      );
      if (interrupted) throw new ExitWith(130);
    });
}
