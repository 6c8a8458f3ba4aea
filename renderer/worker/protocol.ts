/**
 * What crosses from the engine worker to the screens: plain, structured-clone-friendly views of the engine's
 * results, sized for the screen (no n×n matrices unless asked for). Values that cannot be computed are null with a
 * reason, never NaN.
 */
import type { api } from './compute.ts';

export type EngineApi = typeof api;

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
  /** Spending patterns read from the table's final-demand columns (shares of each column), for scenario lines. */
  patterns: { name: string; shares: { sector: string; share: number }[] }[];
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
  output: number | null;
  outputII: number | null;
  income: number | null;
  incomeII: number | null;
  /** Type I/II income multipliers as ratios (total income change per unit of direct income change). */
  incomeRatioI: number | null;
  incomeRatioII: number | null;
  valueAdded: number | null;
  valueAddedII: number | null;
  employment: number | null;
  employmentII: number | null;
  /** Type I/II employment multipliers as ratios (total jobs per direct job). */
  employmentRatioI: number | null;
  employmentRatioII: number | null;
  backward: number | null;
  forward: number | null;
  /** 'key' (both linkages above average), 'backward', 'forward', 'weak', or 'undefined' when linkages cannot be computed. */
  linkage: 'key' | 'backward' | 'forward' | 'weak' | 'undefined';
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
  /** Rounds of spending needed for 99 % of the total effect, or null with a reason. */
  rounds99: Ratio;
  /** Share of the total effect reached after each round, for a unit of demand spread as final demand. */
  rounds: { round: number; added: number; cumulative: number }[];
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
  multipliers: MultiplierRow[];
  hasTypeII: boolean;
  /** Average output multipliers, for the headline. */
  meanOutput: number | null;
  meanOutputII: number | null;
  notes: string[];
}
