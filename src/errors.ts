/**
 * Errors that are the user's input, not a bug: the CLI prints `overcheck: <message>` on one line and
 * exits 2. Everything in the core that rejects input throws one of these.
 */
export class InputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'InputError';
  }
}

/** An input file problem, located: the message reads `FILE:LINE: what is wrong`. */
export class FormatError extends InputError {
  readonly file: string;
  readonly line: number;
  readonly problem: string;

  constructor(file: string, line: number, problem: string) {
    super(`${file}:${line}: ${problem}`);
    this.name = 'FormatError';
    this.file = file;
    this.line = line;
    this.problem = problem;
  }
}
