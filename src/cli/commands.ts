import type { Command } from 'commander';
import { registerInfo } from './info.js';
import { registerMake } from './make.js';
import { registerTrial } from './trial.js';

/** Every command, one file each. Add a line here when a command is added. */
export function registerCommands(program: Command): void {
  registerInfo(program);
  registerMake(program);
  registerTrial(program);
}
