import type { Command } from 'commander';
import type { BitMatrix } from '../gf2/bitmatrix.js';
import { cssCode, type CssCode } from '../codes/css.js';
import { buildFamily, type ShiftSymmetry } from '../codes/families/index.js';
import { readMatrixFile } from '../formats/index.js';
import { InputError } from '../errors.js';

/** What a command works on: a CSS code, or one binary matrix (a classical check matrix, or any matrix). */
export type CodeInput =
  | { kind: 'css'; code: CssCode; label: string; symmetry?: ShiftSymmetry }
  | { kind: 'matrix'; h: BitMatrix; label: string; generator?: BitMatrix; symmetry?: ShiftSymmetry };

export interface CodeOptions {
  hx?: string;
  hz?: string;
  family?: string;
  h?: string;
}

/** Adds --hx/--hz, --family and (optionally) --h to a command. */
export function codeOptions(cmd: Command, single = true): Command {
  cmd.option('--hx <file>', 'X-check matrix file (with --hz)')
    .option('--hz <file>', 'Z-check matrix file (with --hx)')
    .option('--family <spec>', 'build the code from a family spec, e.g. "gb:l=24,a=1+x^2+x^8+x^15,b=1+x^2+x^12+x^17"');
  if (single) cmd.option('--h <file>', 'a single binary matrix (classical check matrix)');
  return cmd;
}

/** Resolve the code options to exactly one input; InputError on a missing or conflicting choice. */
export function loadCodeInput(o: CodeOptions): CodeInput {
  const given = [o.hx !== undefined || o.hz !== undefined, o.family !== undefined, o.h !== undefined].filter(Boolean).length;
  if (given !== 1) throw new InputError('give exactly one of --hx FILE --hz FILE, --family SPEC, or --h FILE');
  if (o.family !== undefined) {
    const built = buildFamily(o.family, readMatrixFile);
    if (built.kind === 'css') return { kind: 'css', code: built.code, label: built.name, symmetry: built.symmetry };
    return { kind: 'matrix', h: built.h, label: built.name, generator: built.generator, symmetry: built.symmetry };
  }
  if (o.h !== undefined) return { kind: 'matrix', h: readMatrixFile(o.h), label: o.h };
  if (o.hx === undefined || o.hz === undefined) throw new InputError('--hx and --hz must be given together');
  const hx = readMatrixFile(o.hx);
  const hz = readMatrixFile(o.hz);
  return { kind: 'css', code: cssCode(hx, hz, `${o.hx} / ${o.hz}`), label: `${o.hx} + ${o.hz}` };
}

/** Only CSS input is meaningful for this command. */
export function requireCss(input: CodeInput, command: string): Extract<CodeInput, { kind: 'css' }> {
  if (input.kind !== 'css') throw new InputError(`${command} needs a CSS code (--hx/--hz or a quantum --family), not a single matrix`);
  return input;
}

/** Parse a non-negative integer option value, naming the option on error. */
export function intOption(name: string, value: string | undefined, fallback: number, min = 0): number {
  if (value === undefined) return fallback;
  if (!/^\d+$/.test(value) || Number(value) < min) throw new InputError(`--${name}: expected a whole number ≥ ${min}, found "${value}"`);
  return Number(value);
}

export function floatOption(name: string, value: string | undefined, fallback: number, min = 0, max = Infinity): number {
  if (value === undefined) return fallback;
  const x = Number(value);
  if (value.trim() === '' || !Number.isFinite(x) || x < min || x > max) throw new InputError(`--${name}: expected a number in [${min}, ${max}], found "${value}"`);
  return x;
}

export function choiceOption<T extends string>(name: string, value: string | undefined, choices: readonly T[], fallback: T): T {
  if (value === undefined) return fallback;
  if (!(choices as readonly string[]).includes(value)) throw new InputError(`--${name}: expected one of ${choices.join(', ')}, found "${value}"`);
  return value as T;
}

/** Write exactly one JSON object on stdout. */
export function printJson(obj: unknown): void {
  process.stdout.write(`${JSON.stringify(obj)}\n`);
}
