import type { Command } from 'commander';
import { registerCycles } from './cycles.js';
import { registerDistance } from './distance.js';
import { registerInfo } from './info.js';
import { registerMake } from './make.js';
import { registerReport } from './report.js';
import { registerSearch } from './search.js';
import { registerCondition } from './condition.js';
import { registerTrim } from './trim.js';
import { registerMerge } from './merge.js';
import { registerRun } from './run.js';
import { registerTrial } from './trial.js';

/** Every command, one file each. Add a line here when a command is added. */
export function registerCommands(program: Command): void {
  registerInfo(program);
  registerMake(program);
  registerSearch(program);
  registerCondition(program);
  registerTrim(program);
  registerMerge(program);
  registerReport(program);
  registerRun(program);
  registerCycles(program);
  registerDistance(program);
  registerTrial(program);
}
