import { InputError } from '../errors.js';
import { JournalFile, writeJournal } from '../formats/journal-file.js';
import { JournalPool, MemoryResultStore } from '../parallel/journal-pool.js';
import type { TaskPool } from '../parallel/pool.js';
import type { RunControl } from './run-control.js';

/**
 * --checkpoint / --resume for the commands whose work runs as pool tasks (trial, distance): every finished
 * task's result goes to a results journal (src/formats/journal-file.ts), and a later run of the same command
 * replays the journal and carries on (src/parallel/journal-pool.ts explains why that is exact). Without
 * either option the results are kept in memory and written to `overcheck-COMMAND.journal.jsonl` only if a
 * signal stops the run.
 */
export interface CommandJournal {
  readonly pool: JournalPool;
  /** The journal file being written, or where an interrupted run without one will save. */
  readonly path: string;
  /** For --json output and the text report. */
  summary(): { file: string | null; reused: number; computed: number; loaded: number };
  /** Close the file; after a signal stop, save the in-memory results. Returns the path holding them, or null. */
  finish(interrupted: boolean): string | null;
}

export function defaultJournalPath(command: string): string {
  return `overcheck-${command}.journal.jsonl`;
}

export function openJournal(pool: TaskPool, command: string, o: { checkpoint?: string; resume?: string }): CommandJournal {
  if (o.checkpoint !== undefined && o.resume !== undefined && o.checkpoint !== o.resume) {
    throw new InputError('--checkpoint and --resume name different files: --resume FILE goes on writing to FILE, so give only --resume');
  }
  const path = o.resume ?? o.checkpoint;
  const file = path === undefined ? null : new JournalFile(path, command, o.resume !== undefined);
  if (file?.cutShort) process.stderr.write(`overcheck: ${path}: the last line was cut short (a hard stop?); it is dropped and recomputed\n`);
  const memory = file ? null : new MemoryResultStore();
  const jp = new JournalPool(pool, file ?? memory!);
  const target = path ?? defaultJournalPath(command);
  return {
    pool: jp,
    path: target,
    summary: () => ({ file: path ?? null, reused: jp.reused, computed: jp.computed, loaded: file?.loaded ?? 0 }),
    finish(interrupted) {
      if (file) {
        file.close();
        return path!;
      }
      if (!interrupted || memory!.size === 0) return null;
      if (memory!.full) process.stderr.write(`overcheck: only the first ${memory!.size} finished tasks were kept in memory; use --checkpoint FILE on long runs to keep them all\n`);
      try {
        writeJournal(target, command, memory!.entries);
      } catch (e) {
        // the partial result is still printed; only the chance to resume is lost
        process.stderr.write(`overcheck: could not save the finished work: ${(e as Error).message}\n`);
        return null;
      }
      return target;
    },
  };
}

/** openJournal on a run's pool; a journal that cannot be opened closes the run (its pool) before the error. */
export async function journalForRun(control: RunControl, command: string, o: { checkpoint?: string; resume?: string }): Promise<CommandJournal> {
  try {
    return openJournal(control.pool, command, o);
  } catch (e) {
    await control.close();
    throw e;
  }
}

/** The closing line of a stopped run that can be continued. */
export function resumeMessage(command: string, saved: string, why: string): string {
  return `overcheck: ${why}; the finished work is saved in ${saved}; run the same ${command} command with --resume ${saved} to continue\n`;
}

/** Text-report lines about the journal (none without --checkpoint / --resume). */
export function journalLines(j: CommandJournal): string[] {
  const s = j.summary();
  if (s.file === null) return [];
  return [`journal  ${s.file}: ${s.reused} finished task${s.reused === 1 ? '' : 's'} replayed, ${s.computed} computed`];
}
