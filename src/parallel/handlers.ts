import { grayChunk } from '../search/gray.js';
import { isdChunk } from '../search/isd.js';
import { combinationChunkTask } from '../distance/certify.js';
import { trialBatch, type TrialBatchTask } from '../decode/trial-batch.js';

/**
 * Task kinds a worker can run, each a pure function of a structured-clonable payload.
 * Add one line per kind; the functions live with their stage (search, decode, ...), not here.
 */

export type TaskHandler = (payload: never) => unknown;

export const handlers: Record<string, TaskHandler> = {
  echo: ((p: unknown) => p) as TaskHandler,
  'search.gray': grayChunk as TaskHandler,
  'search.isd': isdChunk as TaskHandler,
  'distance.combinations': combinationChunkTask as TaskHandler,
  'trial-batch': ((p: TrialBatchTask) => trialBatch(p, () => performance.now())) as TaskHandler,
};
