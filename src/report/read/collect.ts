import { InputError } from '../../errors.js';
import type { CensusView, CodeView, DistanceView, ProvenanceEntry, ReportModel, SourceView, SpectrumView, TrialView } from '../model.js';
import { looksLikeCondition, readCondition } from './condition.js';
import { looksLikeCycles, readCycles } from './cycles.js';
import { looksLikeDistance, readDistance } from './distance.js';
import { looksLikeInfo, readInfo } from './info.js';
import { looksLikeProvenance, readProvenance } from './provenance.js';
import { looksLikeSearch, readSearch } from './search.js';
import { looksLikeTrial, readTrial } from './trial.js';
import { isObject, seedText, str, type JsonObject } from './values.js';

/** A parsed result file. */
export interface ReportInput {
  file: string;
  value: unknown;
  sha256?: string;
}

export type ResultKind = 'run' | 'info' | 'search' | 'distance' | 'cycles' | 'trial' | 'condition' | 'provenance';

/** The run bundle written by `overcheck run`. */
export const RUN_KIND = 'overcheck-run';

/** What a parsed result is, judged by its shape (most specific first); null when it is none of them. */
export function resultKind(v: unknown): ResultKind | null {
  if (!isObject(v)) return null;
  if (v['kind'] === RUN_KIND) return 'run';
  if (looksLikeDistance(v)) return 'distance';
  if (looksLikeTrial(v)) return 'trial';
  if (looksLikeCondition(v)) return 'condition';
  if (looksLikeCycles(v)) return 'cycles';
  if (looksLikeSearch(v)) return 'search';
  if (looksLikeInfo(v)) return 'info';
  if (looksLikeProvenance(v)) return 'provenance';
  return null;
}

export interface CollectOptions {
  title?: string;
  version: string;
  command?: string;
}

/** Accumulates the views of every input in order; later inputs of the same kind add to or replace earlier ones. */
class Collector {
  code?: CodeView;
  spectra = new Map<string, SpectrumView>();
  distance?: DistanceView;
  cycles: CensusView[] = [];
  /** Cycle results given as files of their own, labelled once all are known (see censuses()). */
  cycleFiles: { source: string; value: JsonObject }[] = [];
  trials: { source: string; view: TrialView }[] = [];
  condition?: ReportModel['condition'];
  provenance: ProvenanceEntry[] = [];
  notes: string[] = [];
  label?: string;

  add(kind: ResultKind, v: JsonObject, source: string, cycleLabel?: string): void {
    switch (kind) {
      case 'info':
        if (this.code) this.notes.push(`${source}: code summary replaces an earlier one`);
        this.code = readInfo(v);
        break;
      case 'search':
        for (const s of readSearch(v, this.notes)) {
          if (this.spectra.has(s.side)) this.notes.push(`${source}: search side ${s.side} replaces an earlier one`);
          this.spectra.set(s.side, s);
          if (s.seed !== undefined) this.provenance.push({ source, key: `search ${s.side} seed`, value: s.seed });
        }
        break;
      case 'distance': {
        const d = readDistance(v);
        if (this.distance) {
          // separate runs for dX and dZ: keep the sides of both, the later winning on a clash
          const names = new Set(d.sides.map((s) => s.name));
          d.sides = [...this.distance.sides.filter((s) => !names.has(s.name)), ...d.sides].sort((a, b) => a.name.localeCompare(b.name));
          if (d.sides.length === this.distance.sides.length) this.notes.push(`${source}: distance bounds replace earlier ones`);
          d.combined = combineDistance(d);
        }
        this.distance = d;
        if (d.seed !== undefined) this.provenance.push({ source, key: 'distance seed', value: d.seed });
        break;
      }
      case 'cycles':
        if (cycleLabel !== undefined) this.cycles.push(...readCycles(v, cycleLabel));
        else this.cycleFiles.push({ source, value: v });
        break;
      case 'trial': {
        const t = readTrial(v, this.notes, source);
        this.trials.push({ source, view: t });
        if (t.seed !== undefined) this.provenance.push({ source, key: 'trial seed', value: t.seed });
        break;
      }
      case 'condition':
        if (this.condition) this.notes.push(`${source}: conditioning result replaces an earlier one`);
        this.condition = readCondition(v);
        if (isObject(v['provenance'])) this.provenance.push(...readProvenance(v['provenance'], source, 'conditioning'));
        break;
      case 'provenance':
        this.provenance.push(...readProvenance(v, source));
        break;
      case 'run':
        this.addRun(v, source);
        break;
    }
  }

  /** The parts of a run bundle; a part that is missing or of the wrong shape is skipped with a note. */
  private addRun(v: JsonObject, source: string): void {
    const part = (key: string, test: (x: unknown) => boolean, kind: ResultKind, cycleLabel?: string, value: unknown = v[key]): void => {
      if (value === undefined || value === null) return;
      if (!test(value)) {
        this.notes.push(`${source}: part "${key}" is not a recognised ${kind} result; skipped`);
        return;
      }
      this.add(kind, value as JsonObject, source, cycleLabel);
    };
    this.label = str(v['label']) ?? str(v['name']) ?? this.label;
    part('info', looksLikeInfo, 'info');
    part('search', looksLikeSearch, 'search');
    part('distance', looksLikeDistance, 'distance');
    const cycles = v['cycles'];
    if (isObject(cycles) && ('before' in cycles || 'after' in cycles) && !looksLikeCycles(cycles)) {
      part('cycles.before', looksLikeCycles, 'cycles', 'before', cycles['before']);
      part('cycles.after', looksLikeCycles, 'cycles', 'after', cycles['after']);
    } else {
      part('cycles', looksLikeCycles, 'cycles', '');
    }
    part('trial', looksLikeTrial, 'trial');
    part('condition', looksLikeCondition, 'condition');
    const prov = v['provenance'];
    if (isObject(prov)) this.provenance.push(...readProvenance(prov, source));
    const seed = seedText(v['seed']);
    if (seed !== undefined) this.provenance.push({ source, key: 'seed', value: seed });
    const version = str(v['version']);
    if (version !== undefined) this.provenance.push({ source, key: 'overcheck version', value: version });
    const config = v['config'];
    if (isObject(config) && str(config['file']) !== undefined) {
      const sha = str(config['sha256']);
      this.provenance.push({ source, key: 'configuration', value: `${str(config['file'])}${sha ? ` (SHA-256 ${sha.slice(0, 16)}…)` : ''}` });
    }
    if (Array.isArray(v['notes'])) for (const n of v['notes']) if (typeof n === 'string') this.notes.push(`${source}: ${n}`);
    const known = new Set(['kind', 'label', 'name', 'seed', 'info', 'search', 'distance', 'cycles', 'trial', 'condition', 'provenance', 'version', 'config', 'notes']);
    const extra = Object.keys(v).filter((k) => !known.has(k));
    if (extra.length > 0) this.notes.push(`${source}: parts not shown: ${extra.join(', ')}`);
  }

  /**
   * Every census. Cycle results from files of their own: one is unlabelled, two are "before" and "after"
   * in the order given, more are labelled by file name.
   */
  censuses(): CensusView[] {
    const n = this.cycleFiles.length;
    const label = (i: number, source: string) => (n === 1 ? '' : n === 2 ? (i === 0 ? 'before' : 'after') : source);
    return [...this.cycles, ...this.cycleFiles.flatMap((f, i) => readCycles(f.value, label(i, f.source)))];
  }

  /** Trial series of every input; a label seen in two inputs gets the input's name added. */
  trial(): TrialView | undefined {
    if (this.trials.length === 0) return undefined;
    if (this.trials.length === 1) return this.trials[0]!.view;
    const seen = new Map<string, number>();
    for (const t of this.trials) for (const s of t.view.series) seen.set(s.label, (seen.get(s.label) ?? 0) + 1);
    const series = this.trials.flatMap((t) => t.view.series.map((s) => ((seen.get(s.label) ?? 0) > 1 ? { ...s, label: `${s.label} (${t.source})` } : s)));
    const first = this.trials[0]!.view;
    return { series, seed: first.seed, noise: first.noise, samples: first.samples };
  }
}

function combineDistance(d: DistanceView): DistanceView['combined'] {
  const uppers = d.sides.map((s) => s.upper).filter((x): x is number => x !== undefined);
  const lowers = d.sides.map((s) => s.lower);
  const upper = uppers.length > 0 ? Math.min(...uppers) : undefined;
  const lower = d.sides.length >= 2 && lowers.every((x): x is number => typeof x === 'number') ? Math.min(...lowers) : null;
  return { upper, lower, certified: lower !== null && lower === upper };
}

/** The code view: info's, completed with n, k and a label from the other results. */
function codeView(c: Collector): CodeView | undefined {
  const d = c.distance;
  const firstSide = [...c.spectra.values()][0];
  const label = c.label ?? c.code?.label ?? d?.code;
  const n = c.code?.n ?? d?.n ?? firstSide?.n;
  const k = c.code?.k ?? d?.k;
  if (!c.code && n === undefined && label === undefined) return undefined;
  return { ...(c.code ?? { matrices: [] }), label, n, k };
}

/**
 * The report model of parsed results (pure). Each input is recognised by its shape (see resultKind);
 * InputError naming the file when one is not a recognised result.
 */
export function collectReport(inputs: readonly ReportInput[], options: CollectOptions): ReportModel {
  const c = new Collector();
  const sources: SourceView[] = [];
  for (const input of inputs) {
    const kind = resultKind(input.value);
    if (kind === null) {
      throw new InputError(
        `${input.file}: not a recognised overcheck result (expected the --json output of info, search, distance, cycles, trial or condition, or a run bundle)`,
      );
    }
    sources.push({ file: input.file, kind, sha256: input.sha256 });
    c.add(kind, input.value as JsonObject, input.file);
  }
  const code = codeView(c);
  return {
    title: options.title ?? 'overcheck report',
    subtitle: code?.label,
    code,
    spectra: [...c.spectra.values()],
    distance: c.distance,
    cycles: c.censuses(),
    trial: c.trial(),
    condition: c.condition,
    provenance: c.provenance,
    sources,
    notes: c.notes,
    version: options.version,
    command: options.command,
  };
}

