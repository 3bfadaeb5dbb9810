import type { TaskPool } from './pool.js';
import { taskKey } from './task-key.js';
import { decodeResult, encodeResult } from './result-codec.js';

/**
 * Resumable long runs: a TaskPool that remembers the result of every task it ran under the task's content
 * key (task-key.ts) and, given a store of earlier results, returns those instead of running the task again.
 *
 * Why this gives exact resumption: every long computation here is a deterministic driver that cuts its work
 * into tasks (pure functions of their payloads) and merges their results in task order, deciding what to
 * dispatch next only from merged results and its stop rules. A second run of the same driver with the first
 * run's results at hand therefore dispatches the same tasks, gets the same results back at once, and carries
 * on past the point where the first run stopped, ending exactly where one uninterrupted run would. Nothing
 * about the driver's inner state has to be saved. A stored result under a key that the new run never asks
 * for is simply unused, so a journal of another run (other options, other code) can do no harm.
 * (Measured timings inside results, such as decoding seconds, are those of the run that computed them.)
 */
export interface ResultStore {
  /** Encoded result under `key`, or undefined. */
  get(key: string): string | undefined;
  /** Record a computed result. */
  put(key: string, kind: string, encoded: string): void;
  readonly size: number;
}

/** Characters of encoded results a MemoryResultStore keeps by default (about 512 MiB of strings). */
export const MEMORY_STORE_CHARS = 2 ** 28;

/**
 * Results kept in memory (a run without a journal file that may still have to save them on a stop), up to
 * a size cap; results past the cap are not kept (a resume recomputes them), and `full` says so.
 */
export class MemoryResultStore implements ResultStore {
  readonly entries = new Map<string, { kind: string; encoded: string }>();
  private chars = 0;
  full = false;
  constructor(readonly capChars = MEMORY_STORE_CHARS) {}
  get(key: string): string | undefined {
    return this.entries.get(key)?.encoded;
  }
  put(key: string, kind: string, encoded: string): void {
    if (this.chars + encoded.length > this.capChars) {
      this.full = true;
      return;
    }
    this.chars += encoded.length;
    this.entries.set(key, { kind, encoded });
  }
  get size(): number {
    return this.entries.size;
  }
}

export class JournalPool implements TaskPool {
  /** Tasks answered from the store, and tasks run (and stored). */
  reused = 0;
  computed = 0;

  constructor(readonly inner: TaskPool, readonly store: ResultStore) {}

  get workers(): number {
    return this.inner.workers;
  }

  async run<R>(kind: string, payload: unknown, transfer?: ArrayBuffer[]): Promise<R> {
    const key = taskKey(kind, payload);
    const hit = this.store.get(key);
    if (hit !== undefined) {
      // let signal handlers and timers run between replayed tasks, as between computed ones
      await new Promise<void>((resolve) => setImmediate(resolve));
      this.reused++;
      return decodeResult(hit) as R;
    }
    const r = await this.inner.run<R>(kind, payload, transfer);
    this.store.put(key, kind, encodeResult(r));
    this.computed++;
    return r;
  }

  close(): Promise<void> {
    return this.inner.close();
  }
}
