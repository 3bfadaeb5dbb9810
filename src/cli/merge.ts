import type { Command } from 'commander';
import { readFileSync } from 'node:fs';
import { InputError } from '../errors.js';
import { writeJsonFile } from '../formats/json-out.js';
import { mergeSearchResults, type SavedSearch } from '../search/merge.js';
import { mergeTrialResults, type SavedTrial } from '../decode/trial-merge.js';
import { mergeDistanceResults, type SavedDistance } from '../distance/merge.js';
import { codeOptions, loadCodeInput, printJson, type CodeOptions } from './input.js';

function readResult(file: string): unknown {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch {
    throw new InputError(`${file}: cannot read`);
  }
  try {
    return JSON.parse(text);
  } catch {
    throw new InputError(`${file}:1: not a JSON result (expected the output of a command run with --json)`);
  }
}

function isSearch(o: unknown): o is SavedSearch {
  return typeof o === 'object' && o !== null && 'words' in o && 'chunks' in o && 'codeHash' in o;
}

function isTrial(o: unknown): o is SavedTrial {
  return typeof o === 'object' && o !== null && Array.isArray((o as { points?: unknown }).points) && 'matrices' in o && 'decoder' in o;
}

function isDistance(o: unknown): o is SavedDistance {
  if (typeof o !== 'object' || o === null) return false;
  const k = (o as { kind?: unknown }).kind;
  return (k === 'css' || k === 'classical') && 'd' in o;
}

type Kind = 'search' | 'distance' | 'trial';

function kindOf(o: unknown): Kind {
  if (isTrial(o)) return 'trial';
  if (isDistance(o)) return 'distance';
  return 'search';
}

/** Split a file's content into per-side search results (a single side, or {"x":…, "z":…}). */
function searchSides(file: string, o: unknown): Map<string, SavedSearch> {
  if (isSearch(o)) return new Map([[o.side, o]]);
  const m = new Map<string, SavedSearch>();
  if (typeof o === 'object' && o !== null) for (const [k, v] of Object.entries(o)) if (isSearch(v)) m.set(k, v);
  if (m.size === 0) throw new InputError(`${file}: not a search, distance or trial result (run the command with --shard I/N --json)`);
  return m;
}

export function registerMerge(program: Command): void {
  codeOptions(program.command('merge').description('combine shard results (search, distance or trial with --shard I/N --json) into one result'))
    .argument('<files...>', 'result files to merge')
    .option('--out <file>', 'write the merged result here (else stdout)')
    .option('--json', 'print the merged result as one JSON object (default when --out is not given)')
    .action((files: string[], o: CodeOptions & { out?: string; json?: boolean }) => {
      const given = o.hx !== undefined || o.hz !== undefined || o.family !== undefined || o.h !== undefined;
      const read = files.map((f) => ({ file: f, value: readResult(f) }));
      const kind = kindOf(read[0]!.value);
      for (const r of read) {
        const k = kindOf(r.value);
        if (k !== kind) throw new InputError(`merge: ${r.file} is a ${k} result but ${read[0]!.file} is a ${kind} result`);
      }
      if (kind !== 'search') {
        if (given) process.stderr.write(`overcheck: warning: merge: the code options are used for search results only; ignored\n`);
        const out = kind === 'trial'
          ? mergeTrialResults(read.map((r) => ({ file: r.file, result: r.value as SavedTrial })))
          : mergeDistanceResults(read.map((r) => ({ file: r.file, result: r.value as SavedDistance })));
        if ('points' in out && out.shard && !out.shard.exact) process.stderr.write(`overcheck: warning: merge: ${out.shard.why ?? 'not the counts of one run'}\n`);
        if (o.out) {
          writeJsonFile(o.out, out);
          process.stderr.write(`merged ${files.length} ${kind} files → ${o.out}\n`);
        } else printJson(out);
        return;
      }
      const input = given ? loadCodeInput(o) : null;
      const per = read.map((r) => ({ file: r.file, sides: searchSides(r.file, r.value) }));
      const sideNames = [...per[0]!.sides.keys()];
      for (const p of per) {
        const names = [...p.sides.keys()];
        if (names.join() !== sideNames.join()) throw new InputError(`merge: ${p.file} has side(s) ${names.join(', ')} but ${per[0]!.file} has ${sideNames.join(', ')}`);
      }
      const merged: Record<string, SavedSearch> = {};
      for (const side of sideNames) {
        merged[side] = mergeSearchResults(per.map((p) => ({ file: p.file, result: p.sides.get(side)! })), input?.symmetry);
      }
      const out = sideNames.length === 1 ? merged[sideNames[0]!]! : merged;
      if (o.out) {
        writeJsonFile(o.out, out);
        const r = Object.values(merged);
        process.stderr.write(`merged ${files.length} files: ${r.map((x) => `side ${x.side} ${x.wordCount} words, ${x.iterations} iterations, ${x.chunks.done}/${x.chunks.total} chunks`).join('; ')} → ${o.out}\n`);
      } else printJson(out);
    });
}
