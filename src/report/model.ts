/**
 * What a report shows, normalised from the result objects of the other commands (see read/). Every field
 * that a partial input may lack is optional; a section is rendered only when its view is present.
 */

export interface WeightRange {
  min: number;
  max: number;
}

export interface MatrixView {
  name: string;
  rows?: number;
  cols?: number;
  rank?: number;
  rowWeight?: WeightRange;
  colWeight?: WeightRange;
  edges?: number;
}

/** Code summary (from `info --json`, completed by other results). */
export interface CodeView {
  label?: string;
  n?: number;
  k?: number;
  commute?: boolean;
  matrices: MatrixView[];
}

/** Words found on one side, per weight 1..maxWeight. */
export interface SpectrumView {
  side: string;
  maxWeight: number;
  /** counts[w - 1] = words of weight w. */
  counts: number[];
  /** originals[w - 1] = rows of the original matrix among them (0 when unknown). */
  originals: number[];
  /** miss[w - 1] = probability that a given word of weight w was missed; null when unknown. */
  miss: (number | null)[];
  complete: boolean | null;
  method?: string;
  stopReason?: string;
  iterations?: number;
  n?: number;
  rank?: number;
  wordCount?: number;
  truncated?: boolean;
  seed?: string;
}

export interface DistanceSideView {
  /** dX, dZ or d. */
  name: string;
  upper?: number;
  lower?: number | null;
  certified?: boolean;
  count?: number;
  countExact?: boolean;
  missProbability?: number;
  method?: string;
  stoppedBy?: string;
  witness?: number[];
}

export interface DistanceView {
  code?: string;
  n?: number;
  k?: number;
  seed?: string;
  sides: DistanceSideView[];
  /** d = min(dX, dZ). */
  combined?: { upper?: number; lower?: number | null; certified?: boolean };
}

/** A cycle count as given (possibly larger than 2^53, so kept as text) and as a number for the chart. */
export interface CycleCount {
  text: string;
  value: number;
}

/** Cycle census of one Tanner graph. */
export interface CensusView {
  /** e.g. "before · X". */
  label: string;
  /** null: no cycle (a forest); undefined: not given. */
  girth?: number | null;
  edges?: number;
  rows?: number;
  cols?: number;
  /** length (4, 6, 8, ...) → count. */
  cycles: Map<number, CycleCount>;
}

export interface TrialPointView {
  p: number;
  shots?: number;
  failures?: number;
  rate: number;
  interval?: [number, number];
  meanIterations?: number;
}

export interface TrialSeriesView {
  label: string;
  points: TrialPointView[];
}

export interface TrialView {
  series: TrialSeriesView[];
  seed?: string;
  noise?: string;
  samples?: string;
}

export interface ConditionStats {
  rows?: number;
  edges?: number;
  maxRowWeight?: number;
  maxColDegree?: number;
  cycles4?: CycleCount;
  cycles6?: CycleCount;
}

export interface ConditionSideView {
  /** "" for a single matrix, else the side name. */
  side: string;
  before?: ConditionStats;
  after?: ConditionStats;
  /** What the trial strategy measured on this side, when it chose the rows. */
  selection?: SelectionView;
}

/** Failures of nested prefixes of the ranked candidates on common samples, and the prefix kept. */
export interface SelectionView {
  shots: number;
  ps: number[];
  prefixes: { added: number; failures: number }[];
  chosen: number;
}

export interface ConditionView {
  /** Budget settings as key/value text. */
  budget: [string, string][];
  sides: ConditionSideView[];
  added?: number;
  strategy?: string;
}

/** One line of provenance: where it came from, what, and the value as text. */
export interface ProvenanceEntry {
  source: string;
  key: string;
  value: string;
}

/** An input file and what it was recognised as. */
export interface SourceView {
  file: string;
  kind: string;
  sha256?: string;
}

export interface ReportModel {
  title: string;
  /** A second heading line (the code's label). */
  subtitle?: string;
  code?: CodeView;
  spectra: SpectrumView[];
  distance?: DistanceView;
  cycles: CensusView[];
  trial?: TrialView;
  condition?: ConditionView;
  provenance: ProvenanceEntry[];
  sources: SourceView[];
  /** Things the reader skipped or replaced (partial or duplicate inputs), shown in the report. */
  notes: string[];
  /** Version of the tool that rendered the report. */
  version: string;
  /** The command line that produced the report, if known. */
  command?: string;
}
