import type { Command } from 'commander';
import { vstack, type BitMatrix } from '../gf2/bitmatrix.js';
import { InputError } from '../errors.js';
import { cycleCensus, DEFAULT_WORK_LIMIT } from '../graph/census.js';
import { censusJson, censusText } from '../graph/format.js';
import { structureSummary } from '../graph/structure.js';
import { tannerGraph } from '../graph/tanner.js';
import { choiceOption, codeOptions, floatOption, intOption, loadCodeInput, printJson, type CodeOptions } from './input.js';

const GRAPHS = ['x', 'z', 'joint', 'all'] as const;

interface CyclesOptions extends CodeOptions {
  graph?: string;
  maxLength?: string;
  top?: string;
  workLimit?: string;
  json?: boolean;
}

export function registerCycles(program: Command): void {
  codeOptions(program.command('cycles').description('exact Tanner-graph cycle census (lengths 4..12), girth and structure of check matrices'))
    .option('--graph <kind>', 'for a CSS code: x (HX), z (HZ), joint (HX and HZ rows on the same qubits) or all', 'all')
    .option('--max-length <L>', 'longest cycles to count, even, 4..12', '8')
    .option('--top <n>', 'rows and columns to list as the worst offenders (text output)', '5')
    .option('--work-limit <steps>', 'refuse length-10/12 counts planned to take more steps than this', String(DEFAULT_WORK_LIMIT))
    .option('--json', 'print one JSON object')
    .action((o: CyclesOptions, cmd: Command) => {
      const maxLength = intOption('max-length', o.maxLength, 8, 4);
      const top = intOption('top', o.top, 5, 0);
      const workLimit = floatOption('work-limit', o.workLimit, DEFAULT_WORK_LIMIT, 0);
      const input = loadCodeInput(o);
      const run = (m: BitMatrix) => ({ census: cycleCensus(m, maxLength, { workLimit }), structure: structureSummary(tannerGraph(m)) });
      if (input.kind === 'matrix') {
        if (cmd.getOptionValueSource('graph') === 'cli') throw new InputError('--graph applies to a CSS code; a single matrix has one Tanner graph');
        const r = run(input.h);
        if (o.json) printJson({ input: input.label, ...censusJson(r.census, r.structure) });
        else process.stdout.write(censusText(r.census, r.structure, { title: `H of ${input.label}`, top }) + '\n');
        return;
      }
      const kind = choiceOption('graph', o.graph, GRAPHS, 'all');
      const { hx, hz } = input.code;
      const graphs: { key: 'x' | 'z' | 'joint'; title: string; m: BitMatrix; rowName?: (r: number) => string }[] = [];
      if (kind === 'x' || kind === 'all') graphs.push({ key: 'x', title: 'HX', m: hx });
      if (kind === 'z' || kind === 'all') graphs.push({ key: 'z', title: 'HZ', m: hz });
      if (kind === 'joint' || kind === 'all') {
        graphs.push({ key: 'joint', title: 'joint (HX rows, then HZ rows)', m: vstack(hx, hz), rowName: (r) => (r < hx.rows ? `X${r}` : `Z${r - hx.rows}`) });
      }
      const out: Record<string, unknown> = { input: input.label, maxLength };
      const texts: string[] = [];
      for (const g of graphs) {
        const r = run(g.m);
        if (o.json) out[g.key] = g.key === 'joint' ? { ...censusJson(r.census, r.structure), checks: { x: hx.rows, z: hz.rows } } : censusJson(r.census, r.structure);
        else texts.push(censusText(r.census, r.structure, { title: `${g.title} of ${input.label}`, top, rowName: g.rowName }));
      }
      if (o.json) printJson(out);
      else process.stdout.write(texts.join('\n\n') + '\n');
    });
}
