import type { Command } from 'commander';
import { InputError } from '../errors.js';
import { readJsonFile, writeTextFileAtomic } from '../formats/json-file.js';
import { VERSION } from '../version.js';
import { printJson } from './input.js';

interface ReportCliOptions {
  out?: string;
  title?: string;
  json?: boolean;
}

/** Quote an argument for the provenance line only when the shell would need it. */
function shellWord(a: string): string {
  return /^[\w@%+=:,./-]+$/.test(a) ? a : `'${a.replace(/'/g, `'\\''`)}'`;
}

export function registerReport(program: Command): void {
  program
    .command('report')
    .description('render saved results (JSON) as one self-contained HTML page')
    .argument('<results...>', 'result files: --json output of info, search, distance, cycles, trial, conditioning, or a run bundle')
    .option('--out <file>', 'the HTML file to write (required)')
    .option('--title <text>', 'page title (default: from the code label)')
    .option('--json', 'print one JSON object describing what was written')
    .action(async (files: string[], o: ReportCliOptions) => {
      if (!o.out) throw new InputError('--out FILE.html is required');
      const { collectReport, renderReport, reportSections } = await import('../report/index.js');
      const inputs = files.map((file) => ({ file, ...readJsonFile(file) }));
      const command = ['overcheck', ...process.argv.slice(2)].map(shellWord).join(' ');
      const model = collectReport(inputs, { title: o.title, version: VERSION, command });
      const html = renderReport(model);
      writeTextFileAtomic(o.out, html);
      const sections = reportSections(model).filter((s) => s.html !== null).map((s) => s.id);
      for (const note of model.notes) process.stderr.write(`overcheck: warning: ${note}\n`);
      if (o.json) printJson({ out: o.out, bytes: Buffer.byteLength(html), sections, inputs: model.sources, notes: model.notes });
      else process.stdout.write(`wrote ${o.out} (${sections.join(', ')})\n`);
    });
}
