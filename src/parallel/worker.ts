// Worker entry point: thin by design. It looks up the task kind and runs the stage's pure function.
import { handlers } from './handlers.js';

export default function runTask(msg: { kind: string; payload: unknown }): unknown {
  const h = handlers[msg.kind];
  if (!h) throw new Error(`unknown task kind ${msg.kind}`);
  return (h as (p: unknown) => unknown)(msg.payload);
}
