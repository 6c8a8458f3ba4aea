/**
 * The imported table, after roles are assigned and numbers validated. Everything downstream
 * (model, scenarios, regionalization, reports) works from this one shape.
 *
 * Convention: Z[i*n + j] is the flow from selling sector i (row) to buying sector j (column),
 * in money per year; x[j] is total output of sector j.
 */
import type { Warning } from '../diagnostics/index.ts';

/** What a non-sector row of the source table means. */
export type RowRole = 'labourIncome' | 'otherValueAdded' | 'taxes' | 'imports' | 'employment' | 'fte' | 'totalInput' | 'ignore';
/** What a non-sector column of the source table means. */
export type ColumnRole = 'householdConsumption' | 'otherFinalDemand' | 'totalOutput' | 'ignore';

/** Role map: label -> role for every non-sector row and column. Saved with the project; CLI `--map map.json`. */
export interface RoleMap {
  rows: Record<string, RowRole>;
  columns: Record<string, ColumnRole>;
  /** Labels read as sectors whatever their words ("Import services"), when found both as a row and as a column. */
  sectors?: string[];
}

/**
 * Labour income paid by a final-demand column (government wages, households' domestic staff): a cell of a
 * labour-income row under a final-demand column. It is household income, so it enters total household income in the
 * household-closed model (Miller & Blair 2009, §2.5).
 */
export interface FinalDemandIncome {
  /** Label of the labour-income row. */
  row: string;
  /** Label of the final-demand column. */
  column: string;
  value: number;
}

export type Layout = 'matrix' | 'long' | 'coefficients';

export interface LabelledVector {
  label: string;
  values: Float64Array; // length n, sector order
}

export interface IOTable {
  name: string;
  /** Sector labels in order, length n. */
  sectors: string[];
  n: number;
  /** Intermediate flows, n×n row-major. */
  Z: Float64Array;
  /** Total output per sector (given, or rows/columns summed when no total is given). */
  x: Float64Array;
  /** Rows of the value-added block, by role. Several rows may share a role; they are summed where needed. */
  labourIncome: LabelledVector[];
  otherValueAdded: LabelledVector[];
  /**
   * Taxes on production and imports less subsidies (national-accounts term), part of value added; several rows add
   * up. Absent or empty when the table has no taxes row (older stored tables, tables built in code).
   */
  taxes?: LabelledVector[];
  imports: LabelledVector[];
  /** Jobs per sector (headcount or FTE, not money); null when the table has no employment row. */
  employment: Float64Array | null;
  /** Full-time equivalents per sector, beside the jobs row; absent or null when the table has no FTE row. */
  fte?: Float64Array | null;
  /** Final-demand columns, by role. */
  householdConsumption: LabelledVector[];
  otherFinalDemand: LabelledVector[];
  /** Labour income paid by final-demand columns (non-zero cells only); absent or empty when there is none. */
  householdIncomeFromFinalDemand?: FinalDemandIncome[];
  /** Units of money as stated by the user or the corner cell, e.g. "thousand dollars". */
  moneyUnit: string;
  layout: Layout;
  roles: RoleMap;
  warnings: Warning[];
}
