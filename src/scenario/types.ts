/**
 * Scenario shapes: what a planner types in (a named list of lines) and what the engine gives back.
 * Vectors are in sector order of the table; money is in the table's money unit, employment in the table's jobs unit.
 */

/** How a line enters the model. */
export type LineKind = 'final-demand' | 'output' | 'jobs';

export const LINE_KINDS: readonly LineKind[] = ['final-demand', 'output', 'jobs'];

/** Where a line came from, for located refusals (the shock file and its 1-based line). */
export interface LineOrigin {
  file?: string;
  line?: number;
}

export interface ScenarioLine {
  /** Sector label exactly as in the table. */
  sector: string;
  /** Money (final-demand, output) or jobs (jobs). Negative for closures and cuts. */
  amount: number;
  kind: LineKind;
  /** Part of the spending supplied from inside the region, 0–1 (final-demand lines only; default 1). */
  localShare: number;
  note?: string;
  /** Name of the spending pattern this line was spread from, when it was. */
  pattern?: string;
  origin?: LineOrigin;
}

export interface Scenario {
  name: string;
  description?: string;
  lines: ScenarioLine[];
}

/** One amount spread over several sectors by shares (e.g. visitor spending). Shares sum to 1. */
export interface SpendingPattern {
  name: string;
  shares: { sector: string; share: number }[];
}

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

export type Variable = 'output' | 'valueAdded' | 'income' | 'employment';
export const VARIABLES: readonly Variable[] = ['output', 'valueAdded', 'income', 'employment'];

/** The shock after validation: what the solvers see. */
export interface ResolvedShock {
  n: number;
  /** Final-demand change, after local shares (zero at fixed sectors). */
  df: Float64Array;
  /** Sector indices whose output is fixed from outside, ascending. */
  fixed: number[];
  /** Fixed output change of each fixed sector (same order as `fixed`). */
  fixedOutput: number[];
}

export interface ScenarioResult {
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
   * Final demand that reproduces the mixed-model solution in the open model: df plus, at fixed sectors, the demand
   * their fixed output implies. Round 0 of the spending rounds and the origin of structural paths.
   */
  effectiveDemand: Float64Array;
  /**
   * The same for the household-closed model (length n + 1, households last, where the scenario puts no demand): the
   * origin of structural paths in the closed model. Null without closure.
   */
  closedEffectiveDemand: Float64Array | null;
  effects: Record<'output' | 'valueAdded' | 'income', EffectSplit> & { employment: EffectSplit | null };
  totals: Record<'output' | 'valueAdded' | 'income', EffectTotals> & { employment: EffectTotals | null };
  multipliers: Record<'output' | 'valueAdded' | 'income', ScenarioMultiplier> & { employment: ScenarioMultiplier | null };
  notes: string[];
}
