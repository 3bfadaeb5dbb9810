import type { ConditionedSide } from './condition.js';
import type { Budget } from './budget.js';
import type { LatencyModel } from './latency.js';

/** What produced an export bundle: enough to trace it and to check it on re-import. No clock readings, so a bundle is reproducible. */
export interface Provenance {
  tool: 'overcheck';
  version: string;
  command: string[];
  seed: string | number;
  strategy: string;
  budget: Budget;
  latencyModel: LatencyModel;
  iterations: number;
  basis: 'all' | 'minimal';
  inputs: Record<string, string>;
  sides: Record<string, {
    files: { matrix: string; map: string };
    outputHash: string;
    rank: number;
    candidates: number;
    dropped: { duplicate: number; originalRow: number; zero: number };
    added: number;
    addedByWeight: Record<string, number>;
    before: ConditionedSide['before'];
    after: ConditionedSide['after'];
  }>;
}
