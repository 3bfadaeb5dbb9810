/**
 * Task kinds a worker can run, each a pure function of a structured-clonable payload.
 * Add one line per kind; the functions live with their stage (search, decode, ...), not here.
 */
import { combinationChunkTask } from '../distance/certify.js';
import { grayChunkTask } from '../distance/exhaustive.js';
import { isdChunkTask } from '../distance/upper.js';

export type TaskHandler = (payload: never) => unknown;

export const handlers: Record<string, TaskHandler> = {
  echo: ((p: unknown) => p) as TaskHandler,
  'distance.isd': isdChunkTask as TaskHandler,
  'distance.combinations': combinationChunkTask as TaskHandler,
  'distance.gray': grayChunkTask as TaskHandler,
};
