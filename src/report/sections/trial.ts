import { errorRateChart } from '../charts/error-rate.js';
import { countText, probabilityText } from '../format.js';
import type { TrialView } from '../model.js';
import { type Cell, numCell, para, section, table } from '../table.js';

export function trialSection(t: TrialView): string {
  const meta = [
    t.noise ? `noise: ${t.noise}` : '',
    t.samples ? `samples: ${t.samples}` : '',
    t.seed !== undefined ? `seed ${t.seed}` : '',
  ].filter(Boolean);
  const head: Cell[] = ['matrix', { text: 'p', num: true }, { text: 'shots', num: true }, { text: 'failures', num: true }, { text: 'rate', num: true }, { text: 'interval', num: true }, { text: 'mean iterations', num: true }];
  const rows: Cell[][] = [];
  for (const s of t.series) {
    for (const [i, p] of s.points.entries()) {
      rows.push([
        i === 0 ? s.label : '',
        { text: probabilityText(p.p), num: true },
        numCell(p.shots, countText),
        numCell(p.failures, countText),
        { text: probabilityText(p.rate), num: true },
        p.interval ? { text: `${probabilityText(p.interval[0])} – ${probabilityText(p.interval[1])}`, num: true } : { text: '–', num: true, cls: 'missing' },
        numCell(p.meanIterations, (x) => x.toFixed(1)),
      ]);
    }
  }
  const body =
    (meta.length > 0 ? para(meta.join(' · '), 'meta') : '') +
    `<figure>${errorRateChart(t, 'chart-error-rate')}</figure>` +
    table(head, rows, { rowHeads: true, cls: 'trial' });
  return section('error-rate', 'Logical error rate versus p', body);
}
