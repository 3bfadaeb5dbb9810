import { Command, CommanderError } from 'commander';
import { InputError } from '../errors.js';
import { VERSION } from '../version.js';
import { registerCommands } from './commands.js';

/** Exit codes (DESIGN.md): 0 success, 1 a computed "no" or failed check, 2 bad input or usage. */
export const EXIT_OK = 0;
export const EXIT_NO = 1;
export const EXIT_INPUT = 2;

/** Thrown by a command action to end with a given exit code after it has printed its result. */
export class ExitWith extends Error {
  constructor(readonly code: number) {
    super(`exit ${code}`);
  }
}

export function buildProgram(): Command {
  const program = new Command('overcheck')
    .description('Prepare overcomplete check matrices for BP decoding of quantum LDPC (CSS) codes')
    .version(VERSION)
    .showHelpAfterError('(run with --help for usage)')
    .exitOverride();
  registerCommands(program);
  for (const c of program.commands) c.exitOverride();
  return program;
}

/** Run the CLI; returns the exit code. Never throws for user errors. */
export async function main(argv: string[]): Promise<number> {
  // a reader that closes the pipe early (`| head`) is not an error: stop quietly
  process.stdout.on('error', (e: NodeJS.ErrnoException) => {
    if (e.code === 'EPIPE') process.exit(0);
    throw e;
  });
  const program = buildProgram();
  try {
    await program.parseAsync(argv);
    return EXIT_OK;
  } catch (e) {
    return exitCodeFor(e);
  }
}

function exitCodeFor(e: unknown): number {
  if (e instanceof ExitWith) return e.code;
  if (e instanceof CommanderError) {
    if (e.code === 'commander.helpDisplayed' || e.code === 'commander.version' || e.code === 'commander.help') return EXIT_OK;
    return EXIT_INPUT; // commander has already printed its one-line message
  }
  if (e instanceof InputError) {
    process.stderr.write(`overcheck: ${e.message}\n`);
    return EXIT_INPUT;
  }
  const err = e as NodeJS.ErrnoException;
  if (err && typeof err.code === 'string' && typeof err.path === 'string') {
    process.stderr.write(`overcheck: ${err.path}: ${err.code === 'ENOENT' ? 'no such file' : err.message}\n`);
    return EXIT_INPUT;
  }
  const detail = process.env['OVERCHECK_DEBUG'] ? (e as Error)?.stack : (e as Error)?.message;
  process.stderr.write(`overcheck: internal error: ${detail ?? String(e)} (set OVERCHECK_DEBUG=1 for a trace)\n`);
  return EXIT_NO;
}
