import type { Command } from 'commander';
import { registerDistance } from './distance.js';
import { registerInfo } from './info.js';
import { registerMake } from './make.js';

/** Every command, one file each. Add a line here when a command is added. */
export function registerCommands(program: Command): void {
  registerInfo(program);
  registerMake(program);
  registerDistance(program);
}
