/**
 * Scenario shapes: what a planner types in (a named scenario of phases, each a list of lines) and what the engine gives
 * back. Vectors are in sector order of the table; money is in the table's money unit, employment in the table's jobs
 * unit, full-time equivalents in the table's FTE unit.
 */

/**
 * How a line enters the model:
 * - final-demand: new sales to final buyers of one sector, of which `localShare` is supplied inside the region;
 * - output, jobs: the sector's own output (or jobs) set from outside (mixed model);
 * - labour-income: household income paid to residents (a payroll, pensions, commuters' wages); no sector; it acts only
 *   through household spending (induced effects, household-closed model);
 * - mix: one amount spread over sectors by a spending mix (`sector` holds the mix's name), as final demand;
 * - activity: an activity not in the table, described by its own budget (`sector` holds the activity's name); `amount`
 *   is its output in this phase, and its budget is scaled to it.
 */
export type LineKind = 'final-demand' | 'output' | 'jobs' | 'labour-income' | 'mix' | 'activity';

export const LINE_KINDS: readonly LineKind[] = ['final-demand', 'output', 'jobs', 'labour-income', 'mix', 'activity'];

/** Kinds whose `sector` is a sector of the table. */
export const SECTOR_KINDS: readonly LineKind[] = ['final-demand', 'output', 'jobs'];

/** Producer prices (the table's valuation, the default) or purchaser prices (with trade and transport margins). */
export type PriceBasis = 'producer' | 'purchaser';

/** Where a line came from, for located refusals (the file, its 1-based line, and the 1-based field of each column). */
export interface LineOrigin {
  file?: string;
  line?: number;
  /** Field (1-based) of each column of the file, by column name: refusals about a field name it. */
  columns?: Record<string, number>;
}

export interface ScenarioLine {
  /**
   * What the line is on: a sector label exactly as in the table (final-demand, output, jobs), a spending mix's name
   * (mix), an activity's name (activity), or '' (labour-income).
   */
  sector: string;
  /** Money (final-demand, output, labour-income, mix, activity) or jobs (jobs). Negative for closures and cuts. */
  amount: number;
  kind: LineKind;
  /** Part of the spending supplied from inside the region, 0–1 (final-demand and mix lines only; default 1). */
  localShare: number;
  /** Purchaser prices need margins to split off trade and transport; default producer. */
  prices?: PriceBasis;
  /** Year the amount is expressed in; converted to the table's money year with the price index. Default: the table's. */
  priceYear?: number;
  /** Share of the activity taken from existing local firms (0–1, default 0): results are also given net of it. */
  displacement?: number;
  /** Share that would have happened anyway (0–1, default 0): results are also given net of it. */
  deadweight?: number;
  note?: string;
  /** Name of the spending mix this line was spread from, when it was (lines the app spread before version 4). */
  mix?: string;
  origin?: LineOrigin;
}

/** One-time (a construction budget, spent once) or annual (operations, every year). */
export type Timing = 'once' | 'annual';

export const TIMINGS: readonly Timing[] = ['once', 'annual'];

/**
 * A phase of a scenario: its lines happen together, once or every year. Results are per phase; one-time and annual
 * results are never added together.
 */
export interface Phase {
  name: string;
  timing: Timing;
  /** A one-time phase's year, or an annual phase's first year (labels only). */
  year?: number;
  /** An annual phase's number of years (cumulative effects and present value). */
  years?: number;
  lines: ScenarioLine[];
}

/** The lines of one phase with a name for messages and reports: what the effects are computed from. */
export interface LineSet {
  name: string;
  lines: ScenarioLine[];
}

export interface Scenario {
  name: string;
  description?: string;
  phases: Phase[];
}

/** One amount spread over several sectors by shares (e.g. a visitor's day, a construction budget). Shares sum to 1. */
export interface SpendingMix {
  name: string;
  shares: { sector: string; share: number; origin?: LineOrigin }[];
  origin?: LineOrigin;
}

/**
 * An activity the table does not have (a new kind of plant, a research station), described by its own yearly budget:
 * its output, jobs, FTE, labour income, value added and taxes (its direct effects, on a row of its own) and its
 * purchases from the table's sectors with local shares (demand on those sectors: indirect effects). Its payroll
 * enters household spending (induced effects) at the resident share.
 */
export interface Activity {
  name: string;
  output: number;
  jobs?: number;
  fte?: number;
  labourIncome?: number;
  /** Default: output less all purchases (local and imported). */
  valueAdded?: number;
  /** Default 0. */
  taxes?: number;
  purchases: { sector: string; amount: number; localShare: number; origin?: LineOrigin }[];
  origin?: LineOrigin;
  /** Where each budget item was given (for refusals). */
  itemOrigins?: Partial<Record<'output' | 'jobs' | 'fte' | 'labourIncome' | 'valueAdded' | 'taxes', LineOrigin>>;
}

export const MARGIN_KINDS = ['retail', 'wholesale', 'transport'] as const;
export type MarginKind = (typeof MARGIN_KINDS)[number];

/**
 * Trade and transport margins: for each sector, the shares of a purchaser-price amount that are retail, wholesale and
 * transport margins; the sectors of the table that earn each margin, and the local share of each margin.
 */
export interface Margins {
  sectors: Record<MarginKind, string | null>;
  localShare: Record<MarginKind, number>;
  rows: { sector: string; shares: Record<MarginKind, number>; origin?: LineOrigin }[];
  origin?: LineOrigin;
  /** Where the margin sectors were named. */
  sectorOrigin?: LineOrigin;
}

/** A price index entered by the user: `index` per year, any base. */
export interface PriceIndex {
  points: { year: number; index: number; origin?: LineOrigin }[];
  origin?: LineOrigin;
}

/**
 * Everything besides the lines that a shock may refer to: spending mixes, activities, margins, the price index and the
 * table's money year, and the commuting share that applies to activities' payrolls.
 */
export interface ShockInputs {
  mixes: SpendingMix[];
  activities: Activity[];
  margins: Margins | null;
  priceIndex: PriceIndex | null;
  /** The table's money year, and where it came from (shown in the inputs report). */
  tableYear: { year: number; source: string } | null;
  /** Share of an activity's payroll paid to non-residents (0–1). */
  activityCommuting: number;
}

export const NO_SHOCK_INPUTS: ShockInputs = { mixes: [], activities: [], margins: null, priceIndex: null, tableYear: null, activityCommuting: 0 };

/** Effects of one variable, split the usual way. `induced` is null when the table has no household closure. */
export interface EffectSplit {
  direct: Float64Array;
  indirect: Float64Array;
  induced: Float64Array | null;
  /** Closed-model total, or the open-model total when there is no household closure. */
  total: Float64Array;
}

export interface EffectTotals {
  direct: number;
  indirect: number;
  induced: number | null;
  total: number;
}

/** A value that cannot be computed is null with a reason, never NaN. */
export interface Ratio {
  value: number | null;
  reason?: string;
}

/** Multipliers implied by the scenario: (direct + indirect) / direct and total / direct, for one variable. */
export interface ScenarioMultiplier {
  typeI: Ratio;
  typeII: Ratio;
}

export type Variable = 'output' | 'valueAdded' | 'income' | 'employment' | 'taxes' | 'fte';
/** Every variable, in report order; taxes and fte exist only when the table has those rows. */
export const VARIABLES: readonly Variable[] = ['output', 'valueAdded', 'income', 'employment', 'taxes', 'fte'];
/** Variables measured in money (the others count people). */
export const MONEY_VARIABLES: readonly Variable[] = ['output', 'valueAdded', 'income', 'taxes'];

/**
 * A row of direct effects outside the table's sectors: an activity not in the table, or household income paid by
 * labour-income lines. Its effects are direct only; the indirect and induced effects they cause are in the sectors.
 */
export interface OutsideRow {
  label: string;
  kind: 'activity' | 'labour-income';
  direct: Record<Variable, number | null>;
}

/** The shock after validation: what the solvers see. */
export interface ResolvedShock {
  n: number;
  /** Final-demand change, after local shares (zero at fixed sectors): the direct effect of final-demand lines. */
  df: Float64Array;
  /** Demand on the sectors that is not a direct effect: activities' local purchases (their first round is indirect). */
  dfIndirect: Float64Array;
  /** Sector indices whose output is fixed from outside, ascending. */
  fixed: number[];
  /** Fixed output change of each fixed sector (same order as `fixed`). */
  fixedOutput: number[];
  /** Household income entering household spending from outside the sectors (labour-income lines, activities' resident payroll). */
  householdIncome: number;
  /** Direct effects outside the sectors. */
  outside: OutsideRow[];
}

export type EffectRecord<T> = Record<'output' | 'valueAdded' | 'income', T> & { employment: T | null; taxes: T | null; fte: T | null };

export interface ScenarioResult {
  /** Scenario name (and the phase's, for a phase of several: "Scenario — Phase"). */
  scenario: string;
  sectors: string[];
  moneyUnit: string;
  /** 'household' when the Type II (household-closed) model was available, else 'none'. */
  closure: 'household' | 'none';
  shock: ResolvedShock;
  /** Open-model output change (Type I total). */
  openOutput: Float64Array;
  /** Household-closed output change for the n sectors, or null. */
  closedOutput: Float64Array | null;
  /** Change of total household income in the closed model (its extra row), or null. */
  closedHouseholdIncome: number | null;
  /**
   * Final demand that reproduces the mixed-model solution in the open model: df plus activities' purchases plus, at
   * fixed sectors, the demand their fixed output implies. Round 0 of the spending rounds and the origin of structural
   * paths.
   */
  effectiveDemand: Float64Array;
  /**
   * The same for the household-closed model (length n + 1, households last: the household income the lines put in
   * from outside the sectors): the origin of structural paths in the closed model. Null without closure.
   */
  closedEffectiveDemand: Float64Array | null;
  /** By sector; the rows outside the sectors are in `outside` (their direct effects are in `totals`). */
  effects: EffectRecord<EffectSplit>;
  /** Sums over the sectors plus the direct effects of the rows outside them. */
  totals: EffectRecord<EffectTotals>;
  multipliers: EffectRecord<ScenarioMultiplier>;
  /** Direct effects outside the table's sectors (activities, household income paid by labour-income lines). */
  outside: OutsideRow[];
  notes: string[];
}
