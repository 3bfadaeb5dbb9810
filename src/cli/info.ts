import type { Command } from 'commander';
import { summarizeCode, summarizeMatrix, type MatrixSummary } from '../codes/css.js';
import { codeOptions, loadCodeInput, printJson, type CodeOptions } from './input.js';

function matrixLines(name: string, m: MatrixSummary): string[] {
  return [
    `${name.padEnd(4)} ${String(m.rows).padStart(6)} rows  rank ${String(m.rank).padStart(6)}  ` +
      `row weight ${m.rowWeight.min}..${m.rowWeight.max}  column weight ${m.colWeight.min}..${m.colWeight.max}  edges ${m.edges}`,
  ];
}

export function registerInfo(program: Command): void {
  codeOptions(program.command('info').description('summarize a CSS code or a binary matrix'))
    .option('--json', 'print one JSON object')
    .action((o: CodeOptions & { json?: boolean }) => {
      const input = loadCodeInput(o);
      if (input.kind === 'matrix') {
        const s = summarizeMatrix(input.h);
        if (o.json) printJson(s);
        else process.stdout.write([`matrix ${input.label}`, `size ${s.rows} x ${s.cols}`, ...matrixLines('H', s)].join('\n') + '\n');
        return;
      }
      const s = summarizeCode(input.code);
      if (o.json) {
        printJson(s);
        return;
      }
      process.stdout.write(
        [
          `code    ${input.label}`,
          `[[n,k]] [[${s.n},${s.k}]]`,
          `commute ${s.commute ? 'yes (HX·HZᵀ = 0)' : 'NO'}`,
          ...matrixLines('HX', s.hx),
          ...matrixLines('HZ', s.hz),
        ].join('\n') + '\n',
      );
    });
}
