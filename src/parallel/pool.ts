import { availableParallelism } from 'node:os';
import { handlers } from './handlers.js';

/**
 * A pool of worker threads running task handlers (see handlers.ts). With `workers: 0` tasks run inline on
 * the calling thread (same results, used by tests and by single-task runs). Results never depend on the
 * worker count: callers split work into numbered seed streams, and merge results in stream order.
 */
export interface TaskPool {
  readonly workers: number;
  run<R>(kind: string, payload: unknown, transfer?: ArrayBuffer[]): Promise<R>;
  close(): Promise<void>;
}

export function defaultWorkers(): number {
  return Math.max(1, availableParallelism());
}

class InlinePool implements TaskPool {
  readonly workers = 0;
  async run<R>(kind: string, payload: unknown): Promise<R> {
    // let the event loop run between tasks, so that signal handlers and timers are seen at chunk boundaries
    await new Promise<void>((resolve) => setImmediate(resolve));
    const h = handlers[kind];
    if (!h) throw new Error(`unknown task kind ${kind}`);
    return (h as (p: unknown) => unknown)(payload) as R;
  }
  async close(): Promise<void> {}
}

/** Open a pool; piscina is loaded lazily so that commands that never compute in parallel start fast. */
export async function openPool(workers: number): Promise<TaskPool> {
  if (workers <= 0) return new InlinePool();
  const { Piscina } = await import('piscina');
  const fromSource = import.meta.url.endsWith('.ts');
  const filename = new URL(fromSource ? './worker.ts' : './worker.js', import.meta.url).href;
  const piscina = new Piscina({
    filename,
    minThreads: workers,
    maxThreads: workers,
    idleTimeout: 60_000,
    ...(fromSource ? { execArgv: ['--import', import.meta.resolve('tsx')] } : {}),
  });
  return {
    workers,
    run: <R>(kind: string, payload: unknown, transfer?: ArrayBuffer[]) =>
      piscina.run({ kind, payload }, transfer ? { transferList: transfer } : {}) as Promise<R>,
    close: () => piscina.destroy(),
  };
}

/**
 * Run `count` numbered tasks with at most `pool.workers` (at least 1) in flight, calling `onResult` in
 * index order (results that finish early wait for their predecessors), so that merging is deterministic.
 * `shouldStop` is asked before each new task is started.
 */
export async function runOrdered<R>(
  pool: TaskPool,
  count: number,
  makeTask: (index: number) => { kind: string; payload: unknown; transfer?: ArrayBuffer[] },
  onResult: (index: number, result: R) => void,
  shouldStop: () => boolean = () => false,
): Promise<number> {
  const inFlight = Math.max(1, pool.workers);
  const done = new Map<number, R>();
  let next = 0;
  let delivered = 0;
  let failure: unknown = null;
  const deliver = () => {
    while (done.has(delivered)) {
      onResult(delivered, done.get(delivered)!);
      done.delete(delivered);
      delivered++;
    }
  };
  const lane = async () => {
    while (failure === null && next < count && !shouldStop()) {
      const i = next++;
      const t = makeTask(i);
      try {
        done.set(i, await pool.run<R>(t.kind, t.payload, t.transfer));
      } catch (e) {
        failure = e;
        return;
      }
      deliver();
    }
  };
  await Promise.all(Array.from({ length: inFlight }, lane));
  if (failure !== null) throw failure;
  deliver();
  return delivered;
}
