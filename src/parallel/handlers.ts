/**
 * Task kinds a worker can run, each a pure function of a structured-clonable payload.
 * Add one line per kind; the functions live with their stage (search, decode, ...), not here.
 */
import { trialBatch, type TrialBatchTask } from '../decode/trial-batch.js';

export type TaskHandler = (payload: never) => unknown;

export const handlers: Record<string, TaskHandler> = {
  echo: ((p: unknown) => p) as TaskHandler,
  'trial-batch': ((p: TrialBatchTask) => trialBatch(p, () => performance.now())) as TaskHandler,
};
