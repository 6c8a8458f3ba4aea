/**
 * What crosses from the engine worker to the screens: plain, structured-clone-friendly views of the engine's
 * results, sized for the screen (no n×n matrices unless asked for). Values that cannot be computed are null with a
 * reason, never NaN.
 */
import type { api } from './compute.ts';
import type {
  Activity, Closure, Commuting, DecimalMark, Delimiter, LinkageClass, Margins, MeasureKey, PriceIndex, ProjectSourceOrigin, RoleMap, Scenario, SpendingMix, Timing, Variable,
} from '../../src/study/index.ts';

export type EngineApi = typeof api;

/** A scenario as the screens edit it (lines still being typed included). */
export type ScenarioDraft = Scenario;

/** How a table file is read and named: everything a source says besides its content. */
interface SourceSettings {
  fileName: string;
  roles?: Partial<RoleMap>;
  layout?: string | undefined;
  /** Table name; defaults to the file name. */
  name?: string;
  /** Field delimiter and decimal mark chosen on the Import screen; detected when absent. */
  delimiter?: Delimiter;
  decimalMark?: DecimalMark;
  /** The supply and use pair the table was derived from, each file with its SHA-256 (kept in the study's source). */
  derivedFrom?: ProjectSourceOrigin[];
}

/** A table file given as its text (the sample, a derived table, a file the desktop shell read). */
export interface TextSource extends SourceSettings {
  text: string;
}

/**
 * A table file picked or dropped in the window, given as the file itself: a Blob crosses to the worker by reference
 * and is read there (worker ops `previewFile`, `loadFile`), so the window never decodes or copies its text (20 MB at
 * 2,000 sectors: each copy was a task of 100–300 ms). `id` names it for the worker's copy of the last file it read.
 */
export interface FileSource extends SourceSettings {
  file: Blob;
  id: string;
}

/** Where a table came from: enough to import it again (the study keeps its bytes and these settings). */
export type TableSource = TextSource | FileSource;

/**
 * The inputs of a plain FLQ county estimate (no RAS, no grouping, employment by sector) whose CSV is the table in use,
 * remembered when the planner takes it from the Larger-table screen: with them the sensitivity can vary FLQ δ, after
 * the study layer (flqOriginOf) has checked the estimate is this table flow for flow. Not kept in projects.
 */
export interface FlqInputs {
  national: TextSource;
  employment: TextSource;
  delta: number;
}

/** The screen's choices that the study keeps in its settings. */
/** The study's input files besides the table (README "Shock files"). */
export type StudyInputKind = 'mix' | 'activity' | 'margins' | 'price-index' | 'commuting';
/** Each input file in words ("2 mixes: Visitor day, Festival"), or null when the study has none. */
export type StudyInputsView = Record<StudyInputKind, string | null>;

/**
 * The study's own content besides the table and scenarios, as the app's editors change it and undo restores it: its
 * spending mixes, activities not in the table, margins, price index and commuting shares by sector (no file origins).
 */
export interface StudyContent {
  mixes: SpendingMix[];
  activities: Activity[];
  margins: Margins | null;
  priceIndex: PriceIndex | null;
  commuting: Commuting['sectors'];
}

/** What a change of the study's content gives back: the table's view (its mixes and activities), the words, the content. */
export interface StudyContentView {
  table: TableInfo;
  inputs: StudyInputsView;
  content: StudyContent;
}

export interface StudyChoices {
  closure: Closure;
  /** Sector the structural paths go to; null: the most affected sector not shocked itself. */
  destination: string | null;
  /** Discount rate of annual phases (a share per year), or null for none; absent: the study's as loaded. */
  discountRate?: number | null;
  /** Share of every sector's labour income paid to non-residents (0–1); absent: the study's as loaded. */
  commutingShare?: number;
  /** The table's money year, or null to read it from the table's corner cell; absent: the study's as loaded. */
  tableYear?: number | null;
}

export interface Ratio {
  value: number | null;
  reason?: string;
}

export interface TableInfo {
  name: string;
  fileName: string;
  n: number;
  sectors: string[];
  moneyUnit: string;
  layout: string;
  hasEmployment: boolean;
  hasHouseholds: boolean;
  warnings: string[];
  /** Total output per sector, money. */
  output: number[];
  totalOutput: number;
  /** Spending mixes: the study's own and those read from the table's final-demand columns (shares of each column). */
  mixes: { name: string; shares: { sector: string; share: number }[] }[];
  /** Activities not in the table that the study describes (their names, for activity lines). */
  activities: string[];
  /** The sectors each activity buys from, by activity name (a new table may lack some). */
  activitySectors: Record<string, string[]>;
  hasTaxes: boolean;
  hasFte: boolean;
  /** Roles as imported (for the project file and the role editor). */
  roles: { rows: Record<string, string>; columns: Record<string, string> };
}

export interface Verdict {
  /** true: productive; false: not productive; null: could not be decided. */
  productive: boolean | null;
  /** One sentence in plain words. */
  say: string;
  /** Supporting sentences (Hawkins–Simon, bounds, reducibility). */
  detail: string[];
}

export interface MultiplierRow {
  sector: string;
  index: number;
  /** Every multiplier and linkage index by its one name (src/report measures), null where undefined. */
  values: Record<MeasureKey, number | null>;
  /** Rasmussen class, or 'undefined' when the linkages cannot be computed. */
  linkage: LinkageClass | 'undefined';
}

export interface MeasureView {
  key: MeasureKey;
  label: string;
  unit: string;
  model: 'open' | 'closed';
  jobsPerMoney?: true;
}

export interface Eigen {
  re: number;
  im: number;
  modulus: number;
  /** Long-run behaviour of this mode in the spending rounds, in words. */
  behaviour: string;
}

export interface Block {
  sectors: string[];
  cyclic: boolean;
  period: number | null;
}

export interface AnalysisView {
  verdict: Verdict;
  perron: { value: number | null; lower: number | null; upper: number | null; reason?: string };
  hawkinsSimon: boolean | null;
  /** The round by which 99 % of the open-model total is reached (round 0 = the demand itself), or null with a reason. */
  reach99: Ratio;
  /** One unit of final demand in every sector: output added in each round and the share of the open-model total reached. */
  rounds: { round: number; added: number; reached: number }[];
  spectrum: Eigen[];
  spectrumNote?: string;
  blocks: Block[];
  reducible: boolean;
  /** Period of A when irreducible (1 = primitive), else null. */
  period: number | null;
  /** Rounds after which less than `tolerance` of any demand is left unaccounted (engine certificate), or null. */
  roundsToTolerance: number | null;
  tolerance: number;
  /** Perron root of the household-closed coefficients, or null. */
  perronClosed: number | null;
  /** Condition estimate of I − A, or null. */
  condition: number | null;
  measures: MeasureView[];
  multipliers: MultiplierRow[];
  hasTypeII: boolean;
  /** Why there is no Type II model, or null. */
  typeIIReason: string | null;
  /** Average output multipliers, for the headline. */
  meanOutput: number | null;
  meanOutputII: number | null;
  notes: string[];
}

export interface PreviewView {
  fileName: string;
  layout: string;
  sectors: string[];
  rows: { label: string; role: string }[];
  columns: { label: string; role: string }[];
  rowRoles: readonly string[];
  columnRoles: readonly string[];
  /** Labels found both as a row and as a column that were not read as sectors: each may be made a sector. */
  mayBeSectors: string[];
  /** Labels read as sectors because the role map says so (they can be given back their roles). */
  chosenSectors: string[];
  /** How the file was split: each part with how it was decided and a sentence for the screen; null before it was known. */
  dialect: {
    delimiter: Delimiter; delimiterFrom: 'option' | 'sep-line' | 'guessed'; delimiterNote: string;
    decimalMark: DecimalMark; decimalMarkFrom: 'option' | 'delimiter' | 'numbers' | 'guessed'; decimalMarkNote: string;
  } | null;
  /** First cells of the file, exactly as parsed (quotes removed, decimal commas inside their cells). */
  cells: string[][];
  /**
   * The sectors furthest from balance, worst first: on which side (the row's sales, the column's inputs, or the stated
   * total input), that sum, what it is compared with, and the relative gap.
   */
  balance: { sector: string; side: 'sales' | 'inputs' | 'total input'; sum: number | null; against: number; againstName: string; gap: number }[];
  balanced: boolean;
  /** Relative tolerance the import used (0.001 = 0.1 %). */
  tolerance: number;
  outputSource: string | null;
  /** Rows or columns of one role that are added together (two labour-income rows), in words. */
  combined: string[];
  warnings: string[];
  /** Why the file, as it stands, would be refused (located), or null. */
  refusal: string | null;
}

export interface EffectView {
  direct: number[];
  indirect: number[];
  induced: number[] | null;
  total: number[];
  totals: { direct: number; indirect: number; induced: number | null; total: number };
  typeI: number | null;
  typeII: number | null;
}

/** Totals of one variable (direct, indirect, induced, total). */
export interface TotalsView { direct: number; indirect: number; induced: number | null; total: number }

/** The results of one phase of a scenario. */
export interface PhaseView {
  /** The phase's name, and the label its results carry ("Scenario" for one phase, else "Scenario — Phase"). */
  phase: string;
  name: string;
  timing: Timing;
  year: number | null;
  years: number | null;
  sectors: string[];
  moneyUnit: string;
  closure: 'household' | 'none';
  /** Why there are no induced effects, or null when there are. */
  inducedReason: string | null;
  effects: Record<Variable, EffectView | null>;
  /** Net of displacement and deadweight (totals per variable), or null when no line of the phase has such shares. */
  net: Partial<Record<Variable, TotalsView | null>> | null;
  /** Rows of direct effects outside the sectors (activities not in the table, household income paid directly). */
  outside: { label: string; direct: Partial<Record<Variable, number | null>> }[];
  /** An annual phase with a number of years: years × one year (gross), and the present value of money variables. */
  overTime: { years: number; cumulative: Partial<Record<Variable, TotalsView | null>>; presentValue: Partial<Record<Variable, TotalsView | null>> | null; rate: number | null } | null;
  /** Output of each round (open model) and the share of the open-model total reached after it. */
  rounds: { round: number; output: number; reached: number }[];
  /** The round by which 99 % of the open-model total is reached, or null. */
  reach99: number | null;
  roundsComputed: number;
  /** Sectors whose output is fixed from outside: round 0 holds the demand that produces it, not the direct effect. */
  roundZeroFixed: string[];
  effectiveDemand: number[];
  notes: string[];
}

/** A scenario's results: per phase; sums only across phases of the same timing (never one-time plus annual). */
export interface ScenarioView {
  name: string;
  phases: PhaseView[];
  byTiming: { timing: Timing; phases: string[]; totals: Partial<Record<Variable, TotalsView | null>> }[];
  /** What the study adds to every report's model line (commuting, margins, price conversion). */
  model: string[];
}

export interface PathsView {
  destination: string;
  model: 'open' | 'closed';
  total: number;
  explainedShare: number | null;
  truncated: boolean;
  paths: { labels: string[]; contribution: number; share: number | null; direct: number; pathMultiplier: number }[];
}

export interface GridView {
  which: 'Z' | 'A' | 'L';
  n: number;
  sectors: string[];
  /** Row-major n×n values. */
  values: Float64Array;
  max: number;
  /** Rows under the n×n block (value added, imports, totals, jobs, column sums): n values each, one per column. */
  below: GridMargin[];
  /** Columns right of the block (final demand, totals): n values each, one per row. */
  right: GridMargin[];
}

/** One row or column around a matrix: its label, its n values (NaN where there is none) and how to show them. */
export interface GridMargin {
  label: string;
  values: Float64Array;
  style: 'money' | 'ratio' | 'jobs';
  /** What it is, for the header's tooltip. */
  note: string;
}

/** Settings of the "How sure?" panel (the engine checks them: src/uncertainty/settings.ts). */
export interface BandSettings {
  draws: number;
  seed: number;
  cv: number;
  localShareRange: number;
}

export interface BandView {
  point: number;
  p5: number;
  p50: number;
  p95: number;
  mean: number;
}

/**
 * n bands as columns, NaN where a value has no band (not defined, or too few draws kept): the bands of every multiplier
 * of every sector cross from the worker as a few typed arrays (a copy of bytes), not thousands of objects to rebuild
 * and collect on the main thread. `bandAt` (renderer/charts/bands.ts) reads one back.
 */
export interface BandColumns {
  point: Float64Array;
  p5: Float64Array;
  p50: Float64Array;
  p95: Float64Array;
  mean: Float64Array;
}

/** Monte Carlo bands as the panel shows them; null bands where a value is not defined or too few draws were kept. */
export interface BandsView {
  target: 'multipliers' | 'scenario';
  draws: number;
  accepted: number;
  rejected: number;
  rejectedWhy: { notProductive: number; closedNotUsable: number; refused: number };
  seed: number;
  cv: number;
  localShareRange: number;
  /**
   * When every draw re-estimated the table at a drawn FLQ δ: the range asked for, how many draws did so, and the
   * lowest and highest δ among the draws kept.
   */
  delta: { range: [number, number]; draws: number; drawn: [number, number] | null } | null;
  sectors: string[];
  notes: string[];
  multipliers: { key: string; label: string; unit: string; values: BandColumns }[] | null;
  totals: { variable: Variable; label: string; unit: string; band: BandView | null }[] | null;
  sectorOutput: BandColumns | null;
  sectorJobs: BandColumns | null;
  moneyUnit: string;
}

export interface SensitivitySideView {
  setting: string;
  totals: Record<Variable, number | null>;
  why: string | null;
}

export interface SensitivityView {
  scenario: string;
  step: number;
  point: Record<Variable, number | null>;
  items: { kind: string; assumption: string; base: string; low: SensitivitySideView; high: SensitivitySideView; swing: Record<Variable, number | null> }[];
  notes: string[];
  moneyUnit: string;
}
