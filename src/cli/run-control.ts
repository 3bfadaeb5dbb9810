import { defaultWorkers, openPool, type TaskPool } from '../parallel/pool.js';
import { floatOption, intOption } from './input.js';

/**
 * The imperative shell around a long computation: worker pool, time limit, SIGINT/SIGTERM (stop at the
 * next chunk boundary and save), and a progress line on stderr when it is a terminal (or --progress).
 */
export interface RunControl {
  readonly pool: TaskPool;
  readonly shouldStop: () => boolean;
  /** Why shouldStop became true: 'interrupted' (a signal) or 'time' (the time limit); null while running. */
  readonly stopCause: () => 'interrupted' | 'time' | null;
  report(label: string, state: { iterations: number; counts?: Record<string, number>; missProbability?: Record<string, number> }): void;
  endLine(): void;
  close(): Promise<void>;
  /**
   * Rate-based estimate once a few seconds of work are done: seconds for `planned` units at the rate of
   * the `done` so far, and whether that overruns the time limit. Null before there is a rate to go on.
   */
  estimate(done: number, planned: number): { rate: number; seconds: number; exceedsLimit: boolean } | null;
}

export async function startRun(o: { workers?: string; timeLimit?: string; progress?: boolean; what: string; resumeHint?: string }): Promise<RunControl> {
  const workers = intOption('workers', o.workers, defaultWorkers(), 0);
  const limit = o.timeLimit !== undefined ? floatOption('time-limit', o.timeLimit, 0, 0) : Infinity;
  const started = Date.now();
  let interrupted = false;
  const onSignal = (sig: string) => {
    if (interrupted) process.exit(130);
    interrupted = true;
    process.stderr.write(`\novercheck: ${sig}: finishing the work in flight${o.resumeHint ? ` and saving to ${o.resumeHint}` : ''} (again to abort)\n`);
  };
  const onInt = () => onSignal('SIGINT');
  const onTerm = () => onSignal('SIGTERM');
  process.on('SIGINT', onInt);
  process.on('SIGTERM', onTerm);
  const pool = await openPool(workers);
  const show = o.progress === true || process.stderr.isTTY === true;
  let last = 0;
  let shown = false;
  return {
    pool,
    shouldStop: () => interrupted || (Date.now() - started) / 1000 >= limit,
    stopCause: () => (interrupted ? 'interrupted' : (Date.now() - started) / 1000 >= limit ? 'time' : null),
    report(label, state) {
      if (!show) return;
      const now = Date.now();
      if (now - last < 500) return;
      last = now;
      const secs = (now - started) / 1000;
      const counts = state.counts ? Object.entries(state.counts).filter(([, c]) => c > 0).map(([w, c]) => `${w}:${c}`).join(' ') : '';
      const miss = state.missProbability ? Math.max(...Object.values(state.missProbability)) : NaN;
      process.stderr.write(`\r${o.what} ${label}: ${state.iterations} iterations, ${(state.iterations / Math.max(secs, 1e-3)).toFixed(0)}/s, words ${counts}${Number.isNaN(miss) ? '' : `, miss ≤ ${miss.toExponential(1)}`}   `);
      shown = true;
    },
    estimate(done, planned) {
      const secs = (Date.now() - started) / 1000;
      if (secs < 2 || done <= 0 || planned <= 0) return null;
      const rate = done / secs;
      const seconds = planned / rate;
      return { rate, seconds, exceedsLimit: seconds > limit };
    },
    endLine() {
      if (shown) process.stderr.write('\n');
      shown = false;
    },
    async close() {
      process.off('SIGINT', onInt);
      process.off('SIGTERM', onTerm);
      await pool.close();
    },
  };
}
