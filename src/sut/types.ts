/**
 * Supply and use tables as read, and the names of the transformations to a symmetric table.
 *
 * Convention (SNA 2008 ch. 14; Eurostat, Manual of Supply, Use and Input-Output Tables, 2008, ch. 11; Miller & Blair,
 * Input-Output Analysis, 2nd ed. 2009, ch. 5): the supply table has products in rows and industries in columns, so the
 * make table V (industries × products, v_jp = output of product p by industry j) is the supply table transposed. The
 * use table U has products in rows and industries in columns, then final-demand columns; value added and jobs by
 * industry are rows below the products. q = product output (column sums of V), g = industry output (row sums of V).
 */
import type { Warning } from '../diagnostics/index.ts';
import type { ColumnRole, FinalDemandIncome, RowRole } from '../table/index.ts';

/** The row of the symmetric table: industries (industry-by-industry) or products (product-by-product). */
export type TableBy = 'industry' | 'product';
export const TABLE_BY: readonly TableBy[] = ['industry', 'product'];

/**
 * The assumption that turns the rectangular pair into a square table (Eurostat 2008, ch. 11, models A–D):
 * - `product-sales`: fixed product sales structure (industry-by-industry, model D): A = D·B;
 * - `industry-sales`: fixed industry sales structure (industry-by-industry, model C): A = C⁻¹·B;
 * - `industry`: industry technology (product-by-product, model B): A = B·D;
 * - `product`: product technology (product-by-product, model A): A = B·C⁻¹.
 */
export type Assumption = 'product-sales' | 'industry-sales' | 'industry' | 'product';
export const ASSUMPTIONS: readonly Assumption[] = ['product-sales', 'industry-sales', 'industry', 'product'];

/** The kind of table each assumption gives. */
export const ASSUMPTION_BY: Readonly<Record<Assumption, TableBy>> = {
  'product-sales': 'industry', 'industry-sales': 'industry', industry: 'product', product: 'product',
};

/** The default for each kind of table: the assumption that never gives negative coefficients. */
export const DEFAULT_ASSUMPTION: Readonly<Record<TableBy, Assumption>> = { industry: 'product-sales', product: 'industry' };

/** How to treat negative flows that the product technology or fixed industry sales structure gives. */
export type NegativesRemedy = 'keep' | 'zero-ras';
export const NEGATIVES_REMEDIES: readonly NegativesRemedy[] = ['keep', 'zero-ras'];

/** What a supply-table column that is not an industry holds. */
export type SupplyColumnRole = 'imports' | 'margins' | 'productTaxes' | 'total' | 'ignore';
export const SUPPLY_COLUMN_ROLES: readonly SupplyColumnRole[] = ['imports', 'margins', 'productTaxes', 'total', 'ignore'];

/**
 * Role overrides for a supply and use pair (CLI `--map`): `rows` and `columns` as a table's role map, for the use
 * table's value-added rows and final-demand columns; `supply` for supply-table columns (and rows: `ignore`, `total`)
 * that are not industries (products).
 */
export interface SutRoleMap {
  rows?: Record<string, RowRole>;
  columns?: Record<string, ColumnRole>;
  supply?: Record<string, SupplyColumnRole>;
}

/** A row of the use table below the products, by industry (value added, imports, jobs …). */
export interface IndustryRow {
  label: string;
  role: Exclude<RowRole, 'ignore' | 'totalInput'>;
  /** Per industry. */
  values: Float64Array;
}

/** A final-demand column of the use table, by product (domestic products only, after any import split). */
export interface ProductColumn {
  label: string;
  role: 'householdConsumption' | 'otherFinalDemand';
  /** Per product. */
  values: Float64Array;
}

/**
 * What the use table's product rows add up to, which says how it is valued (Eurostat 2008, ch. 11 works at basic
 * prices): `domestic` — domestic output q (a use table of domestic products; imports, if any, are a row by industry);
 * `total` — q plus imports (a use table of all products at basic prices: imports are split off in proportion to use).
 */
export type UseValuation = 'domestic' | 'total';

/** Supply against use, product by product. */
export interface ProductBalance {
  products: string[];
  /** Domestic output q, imports, trade and transport margins and taxes less subsidies on products, from the supply table. */
  output: number[];
  imports: number[];
  margins: number[];
  productTaxes: number[];
  /** Intermediate plus final use, the use table's product rows. */
  use: number[];
  /** What the use was compared with: `domestic` output, or output plus imports (`total`). */
  valuation: UseValuation;
  /** Relative gaps (use − supply) / max(|use|, |supply|). */
  gap: number[];
  /** Products beyond the tolerance, worst first (at most 5). */
  worst: { product: string; gap: number }[];
  tolerance: number;
}

export interface SupplyUse {
  name: string;
  moneyUnit: string;
  supplyFile: string;
  useFile: string;
  products: string[];
  industries: string[];
  /** Make table, industries × products. */
  V: Float64Array;
  /** Use of domestic products, products × industries. */
  U: Float64Array;
  /** Product output (column sums of V) and industry output (row sums of V). */
  q: Float64Array;
  g: Float64Array;
  finalDemand: ProductColumn[];
  /** Value-added, import, tax and job rows by industry, in file order (the import split adds an import row). */
  industryRows: IndustryRow[];
  /** Labour income paid by final-demand columns (carried as it is: final-demand columns keep their labels). */
  householdIncomeFromFinalDemand: FinalDemandIncome[];
  valuation: UseValuation;
  /** Imports by product from the supply table (zeros without an imports column). */
  imports: Float64Array;
  /** With `total` valuation: the imported part of each final-demand column, split off by import proportionality. */
  importedFinalDemand: { label: string; value: number }[];
  balance: ProductBalance;
  /** Use-table rows and columns with their roles, for the role map of the derived table and the preview. */
  roles: { rows: Record<string, RowRole>; columns: Record<string, ColumnRole>; supply: Record<string, SupplyColumnRole | 'industry'> };
  warnings: Warning[];
}
