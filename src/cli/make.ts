import type { Command } from 'commander';
import { buildFamily } from '../codes/families/index.js';
import { type MatrixFormat, readMatrixFile, writeMatrixFile } from '../formats/index.js';
import { choiceOption } from './input.js';

export const FORMATS: readonly MatrixFormat[] = ['mtx', 'alist', 'dense', 'json'];

export function registerMake(program: Command): void {
  program
    .command('make')
    .description('write the matrices of a family spec to files')
    .requiredOption('--family <spec>', 'family spec')
    .requiredOption('--out <prefix>', 'output prefix: writes PREFIX.hx.EXT and PREFIX.hz.EXT (PREFIX.h.EXT for classical families)')
    .option('--format <fmt>', 'mtx, alist, dense or json', 'mtx')
    .action((o: { family: string; out: string; format?: string }) => {
      const format = choiceOption('format', o.format, FORMATS, 'mtx');
      const built = buildFamily(o.family, readMatrixFile);
      const written: string[] = [];
      const put = (suffix: string, m: Parameters<typeof writeMatrixFile>[1]) => {
        const path = `${o.out}.${suffix}.${format}`;
        writeMatrixFile(path, m, format);
        written.push(path);
      };
      if (built.kind === 'css') {
        put('hx', built.code.hx);
        put('hz', built.code.hz);
      } else {
        put('h', built.h);
        if (built.generator) put('g', built.generator);
      }
      process.stderr.write(`wrote ${written.join(', ')}\n`);
    });
}
