import { existsSync } from 'node:fs';
import { freemem } from 'node:os';
import type { Command } from 'commander';
import { type BitMatrix, packSupport, packedSupport } from '../gf2/bitmatrix.js';
import { RowSpaceSolver } from '../gf2/solve.js';
import { matrixHash } from '../codes/hash.js';
import type { ShiftSymmetry } from '../codes/families/types.js';
import { InputError } from '../errors.js';
import { finalizeWordsFile, readWordsFile, WordsWriter, type SideRecord } from '../formats/words-file.js';
import { parseSymmetry, verifySymmetry } from '../search/orbits.js';
import type { SearchProgress, SearchResult } from '../search/run.js';
import { ExitWith } from './main.js';
import { choiceOption, codeOptions, floatOption, intOption, loadCodeInput, printJson, type CodeOptions } from './input.js';
import { startRun, type RunControl } from './run-control.js';

export interface SearchCliOptions extends CodeOptions {
  side?: string;
  maxWeight?: string;
  method?: string;
  seed?: string;
  workers?: string;
  timeLimit?: string;
  iterations?: string;
  targetMiss?: string;
  out?: string;
  resume?: string;
  json?: boolean;
  maxWords?: string;
  symmetry?: string;
  orbits?: string;
  progress?: boolean;
  shard?: string;
  maxMemory?: string;
}

export interface SearchSide {
  side: string;
  h: BitMatrix;
  symmetry?: ShiftSymmetry;
}

function maxRowWeight(h: BitMatrix): number {
  let best = 0;
  for (let r = 0; r < h.rows; r++) {
    let w = 0;
    for (let x = 0; x < h.stride; x++) {
      let v = h.data[r * h.stride + x]!;
      while (v) { v &= v - 1; w++; }
    }
    if (w > best) best = w;
  }
  return best;
}

function formatResult(r: SearchResult): string {
  const lines = [
    `side ${r.side}: rowspace of rank ${r.rank} on ${r.n} columns, weights ≤ ${r.maxWeight}`,
    `method ${r.method}: ${r.plan.reason}`,
    `seed ${r.seed}, ${r.iterations} ${r.method === 'exhaustive' ? 'combinations' : 'information sets'}, stopped: ${r.stopReason}, complete: ${r.complete}`,
    ` weight      words     orbits   miss probability`,
  ];
  for (let w = 1; w <= r.maxWeight; w++) {
    const c = r.counts[String(w)] ?? 0;
    const miss = r.missProbability[String(w)] ?? 1;
    lines.push(`${String(w).padStart(7)} ${String(c).padStart(10)} ${String(r.orbits[String(w)] ?? 0).padStart(10)}   ${miss === 0 ? '0' : miss.toExponential(2)}`);
  }
  lines.push(`${r.wordCount} words (${r.original.length} rows of the matrix among them)${r.truncated ? ' — stopped at --max-words' : ''}`);
  return lines.join('\n');
}

export function registerSearch(program: Command): void {
  codeOptions(program.command('search').description('find low-weight words of rowspace(HX) / rowspace(HZ) (redundant checks)'))
    .option('--side <side>', 'x: rowspace(HX), z: rowspace(HZ), both')
    .option('--max-weight <w>', 'largest weight kept (default: the largest row weight of the matrix)')
    .option('--method <m>', 'auto, exhaustive or isd', 'auto')
    .option('--seed <s>', 'random seed', '1')
    .option('--workers <n>', 'worker threads (default: number of cores)')
    .option('--time-limit <sec>', 'stop after this many seconds (resumable)')
    .option('--iterations <n>', 'information sets to visit (isd)')
    .option('--target-miss <p>', 'stop once every weight ≤ W has miss probability below p (default 1e-6)')
    .option('--max-words <n>', 'cap on stored words', '2000000')
    .option('--max-memory <size>', 'approximate memory for the word store, e.g. 512M or 4G (default: a quarter of the free memory)')
    .option('--symmetry <spec>', 'shifts to expand orbits with: blocks=B,l=L[,m=M] (verified before use)')
    .option('--orbits <mode>', 'auto (use the family symmetry) or off', 'auto')
    .option('--out <file>', 'stream words to FILE as JSON lines (resumable)')
    .option('--resume <file>', 'continue a search from its words file')
    .option('--shard <i/n>', 'run shard I of N (0-based): a disjoint share of the chunks; combine with merge')
    .option('--progress', 'progress on stderr even when it is not a terminal')
    .option('--json', 'print one JSON object')
    .action(async (o: SearchCliOptions) => {
      const input = loadCodeInput(o);
      let sides: SearchSide[];
      if (input.kind === 'matrix') {
        if (o.side !== undefined && o.side !== 'h') throw new InputError('--side applies to CSS codes; with --h the row space of that matrix is searched');
        sides = [{ side: 'h', h: input.h, symmetry: input.symmetry }];
      } else {
        const side = choiceOption('side', o.side, ['x', 'z', 'both'] as const, 'both');
        if (o.side === undefined) throw new InputError('--side x|z|both is required for a CSS code');
        const all: SearchSide[] = [
          { side: 'x', h: input.code.hx, symmetry: input.symmetry },
          { side: 'z', h: input.code.hz, symmetry: input.symmetry },
        ];
        sides = side === 'both' ? all : all.filter((s) => s.side === side);
      }
      if (o.orbits === 'off') sides = sides.map((s) => ({ ...s, symmetry: undefined }));
      else if (o.orbits !== 'auto') throw new InputError(`--orbits: expected auto or off, found "${o.orbits}"`);
      if (o.symmetry) {
        sides = sides.map((s) => {
          const sym = parseSymmetry(o.symmetry!, s.h.cols);
          verifySymmetry(s.h, sym, `the ${s.side} matrix`);
          return { ...s, symmetry: sym };
        });
      }
      const results = await searchSides(sides, o);
      const out = results.length === 1 ? results[0]! : Object.fromEntries(results.map((r) => [r.side, r]));
      if (o.json) printJson(out);
      else process.stdout.write(results.map(formatResult).join('\n\n') + '\n');
      if (results.some((r) => r.stopReason === 'interrupted')) throw new ExitWith(130);
    });
}

/**
 * Search each side, streaming to --out and resuming from --resume as the options say. `shared` is a run
 * control owned by the caller (the run command); without it one is opened and closed here.
 */
export async function searchSides(sides: SearchSide[], o: SearchCliOptions, shared?: RunControl): Promise<SearchResult[]> {
  const method = choiceOption('method', o.method, ['auto', 'exhaustive', 'isd'] as const, 'auto');
  const seed = o.seed ?? '1';
  const iterations = o.iterations !== undefined ? intOption('iterations', o.iterations, 0, 1) : undefined;
  const targetMiss = o.targetMiss !== undefined ? floatOption('target-miss', o.targetMiss, 1e-6, 1e-300, 1) : undefined;
  const maxWords = intOption('max-words', o.maxWords, 2_000_000, 1);
  const shard = parseShard(o.shard);
  const maxMemory = parseSize(o.maxMemory) ?? Math.floor(freemem() / 4);
  if (shard && o.resume) throw new InputError('--shard and --resume cannot be combined: resume each shard from its own --out file without --shard');
  const resumed = o.resume ? readWordsFile(o.resume) : null;
  const outPath = o.out ?? o.resume;
  const control: RunControl = shared ?? (await startRun({
    workers: o.workers, timeLimit: o.timeLimit, progress: o.progress, what: 'search', resumeHint: outPath,
  }));
  const { runSearch } = await import('../search/run.js');
  const writer = outPath ? new WordsWriter(outPath, false) : null;
  const finalLines: unknown[] = [];
  const results: SearchResult[] = [];
  try {
    for (const s of sides) {
      const W = o.maxWeight !== undefined ? intOption('max-weight', o.maxWeight, 0, 1) : maxRowWeight(s.h);
      const codeHash = matrixHash(s.h);
      const prev = resumed ? resumed.get(s.side) : undefined;
      const previous = prev ? checkResume(prev, s, codeHash, W, method, seed, o.resume!) : undefined;
      let headerWritten = false;
      const headerFor = (plan: SearchResult['plan'] | null) => ({
        side: s.side,
        header: { codeHash, n: s.h.cols, maxWeight: W, method: plan?.method ?? method, settings: plan && plan.method === 'isd' ? plan.settings : null, seed },
      });
      const stride = s.h.stride;
      const rowKeys = new Set<string>();
      for (let r = 0; r < s.h.rows; r++) rowKeys.add(packedSupport(s.h.data, r * stride, stride).join(','));
      let warned = false;
      const onNewWords = (words: Uint32Array[], state: SearchProgress) => {
        control.report(s.side, state);
        const eta = control.estimate(state.iterations - (previous?.iterations ?? 0), (state.planned ?? 0) - (previous?.iterations ?? 0));
        if (!warned && eta !== null && eta.exceedsLimit) {
          warned = true;
          process.stderr.write(`overcheck: warning: side ${s.side}: at the measured ${eta.rate.toFixed(0)} iterations/s the planned ${state.planned} take about ${eta.seconds.toFixed(0)} s, more than --time-limit; the result will be partial (resumable with --out/--resume)\n`);
        }
        if (!writer) return;
        if (!headerWritten) {
          writer.line(headerFor(null));
          headerWritten = true;
        }
        for (const v of words) {
          const sup = packedSupport(v, 0, stride);
          writer.line(rowKeys.has(sup.join(',')) ? { side: s.side, support: sup, original: true } : { side: s.side, support: sup });
        }
        writer.line({ side: s.side, progress: { iterations: state.iterations, nextStream: state.nextStream, complete: state.complete } });
        writer.flush();
      };
      const r = await runSearch(
        { side: s.side, h: s.h, symmetry: s.symmetry },
        { maxWeight: W, method, seed, iterations, targetMiss, maxWords, maxMemory, firstStream: previous?.nextStream, previous, shard },
        { pool: control.pool, shouldStop: control.shouldStop, stopCause: control.stopCause, onNewWords },
      );
      control.endLine();
      (r as SearchResult & { codeHash: string }).codeHash = codeHash;
      if (r.truncated) {
        process.stderr.write(`overcheck: side ${s.side}: stopped at ${r.wordCount} words, the --max-words ${maxWords} / --max-memory ${formatSize(maxMemory)} limit for the word store; raise it or lower --max-weight\n`);
      }
      results.push(r);
      finalLines.push(headerFor(r.plan));
      const orig = new Set(r.original);
      r.words.forEach((w, i) => finalLines.push(orig.has(i) ? { side: s.side, support: w, original: true } : { side: s.side, support: w }));
      finalLines.push({ side: s.side, progress: { iterations: r.iterations, nextStream: r.streams.next, complete: r.complete } });
      finalLines.push({ side: s.side, summary: { counts: r.counts, orbits: r.orbits, missProbability: r.missProbability, complete: r.complete, stopReason: r.stopReason, seed: r.seed, iterations: r.iterations } });
      if (r.stopReason === 'interrupted' || r.stopReason === 'time') break;
    }
  } finally {
    writer?.close();
    if (!shared) await control.close();
  }
  // a signal without --out: the words are saved to a fresh file in the working directory all the same
  const interrupted = results.some((r) => r.stopReason === 'interrupted');
  const savePath = outPath ?? (interrupted ? freshPath('overcheck-search', '.words.jsonl') : undefined);
  if (savePath) {
    // sides not run this time (interrupted before them) keep what the resumed file had
    finalizeWordsFile(savePath, finalLines);
    if (interrupted || results.some((r) => r.stopReason === 'time')) {
      process.stderr.write(`overcheck: stopped (${interrupted ? 'interrupted' : 'time limit'}); words so far are in ${savePath}; continue with the same command and --resume ${savePath}\n`);
    }
  }
  return results;
}

/** PREFIX + SUFFIX in the working directory, or PREFIX-2 + SUFFIX, … when that exists. */
function freshPath(prefix: string, suffix: string): string {
  for (let i = 1; ; i++) {
    const p = `${prefix}${i === 1 ? '' : `-${i}`}${suffix}`;
    if (!existsSync(p)) return p;
  }
}

/** Check that a resumed side matches this run, re-verify its words, and return what it contributes. */
function checkResume(prev: SideRecord, s: SearchSide, codeHash: string, W: number, method: string, seed: string, path: string) {
  const hd = prev.header!;
  if (hd.codeHash !== codeHash) throw new InputError(`${path}: side ${s.side} was searched on a different matrix (hash ${hd.codeHash.slice(0, 12)}…)`);
  if (hd.maxWeight !== W) throw new InputError(`${path}: side ${s.side} was searched with --max-weight ${hd.maxWeight}, not ${W}`);
  if (method !== 'auto' && hd.method !== method && hd.method !== 'auto') throw new InputError(`${path}: side ${s.side} used method ${hd.method}, not ${method}`);
  if (String(hd.seed) !== String(seed)) throw new InputError(`${path}: side ${s.side} used --seed ${hd.seed}; resume with the same seed (fresh streams are used)`);
  const solver = new RowSpaceSolver(s.h);
  const words = prev.words.map((sup, i) => {
    if (sup.some((c) => c >= s.h.cols)) throw new InputError(`${path}: word ${i + 1} of side ${s.side} has a column outside 0..${s.h.cols - 1}`);
    const v = packSupport(s.h.cols, sup);
    if (!solver.contains(v)) throw new InputError(`${path}: word ${i + 1} of side ${s.side} is not in the row space`);
    return v;
  });
  return { words, iterations: prev.iterations, nextStream: prev.nextStream };
}

/** `I/N` with 0 ≤ I < N. */
export function parseShard(text: string | undefined): { index: number; count: number } | undefined {
  if (text === undefined) return undefined;
  const m = /^(\d+)\/(\d+)$/.exec(text.trim());
  if (!m || Number(m[2]) < 1 || Number(m[1]) >= Number(m[2])) throw new InputError(`--shard: expected I/N with 0 ≤ I < N, found "${text}"`);
  return { index: Number(m[1]), count: Number(m[2]) };
}

/** `512M`, `4G`, `100000K` or a byte count. */
export function parseSize(text: string | undefined): number | undefined {
  if (text === undefined) return undefined;
  const m = /^(\d+(?:\.\d+)?)\s*([KMGT]?)B?$/i.exec(text.trim());
  if (!m) throw new InputError(`--max-memory: expected a size such as 512M or 4G, found "${text}"`);
  const mult = { '': 1, K: 2 ** 10, M: 2 ** 20, G: 2 ** 30, T: 2 ** 40 }[m[2]!.toUpperCase() as '' | 'K' | 'M' | 'G' | 'T'];
  const bytes = Math.floor(Number(m[1]) * mult);
  if (bytes < 1024) throw new InputError(`--max-memory: ${text} is too small (at least 1K)`);
  return bytes;
}

export function formatSize(bytes: number): string {
  return bytes >= 2 ** 30 ? `${(bytes / 2 ** 30).toFixed(1)}G` : bytes >= 2 ** 20 ? `${Math.round(bytes / 2 ** 20)}M` : `${Math.round(bytes / 2 ** 10)}K`;
}
