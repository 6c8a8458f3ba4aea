/**
 * Which labels are sectors and what every other row and column means. Shared by the matrix, long and
 * coefficients layouts. A label that appears both as a row and as a column is a sector, unless the label is a
 * recognised non-sector label ("Total", "Households", …) or the role map names it.
 */
import type { Location, Warning } from '../diagnostics/index.ts';
import { unescapeFormulaLead } from '../csv/index.ts';
import type { ColumnRole, Layout, RoleMap, RowRole } from './types.ts';
import { suggestColumnRole, suggestRowRole } from './roles.ts';
import type { DecimalMark } from './numbers.ts';

/** A row or column label with its role, as the preview shows it before the table is accepted. */
export interface LabelRole<R> {
  label: string;
  /** The role in force ('sector' for the inter-industry block). */
  role: R | 'sector';
  /** What the label alone suggests; differs from `role` when the role map overrides it. */
  suggested: R | 'sector';
  /** Where the label is in the file. */
  location: Location;
}

export interface Classified {
  sectors: string[];
  /** For each row label: sector index, or −1. */
  rowSector: Int32Array;
  colSector: Int32Array;
  rows: LabelRole<RowRole>[];
  columns: LabelRole<ColumnRole>[];
  roles: RoleMap;
  warnings: Warning[];
}

/** Strip the leading apostrophe that CSV-injection escaping puts before =, +, -, @ (src/csv/write.ts), and outer spaces. */
export function cleanLabel(s: string): string {
  return unescapeFormulaLead(s.trim());
}

/**
 * Key for matching a row label to a column label, and for duplicates: case and runs of spaces do not count, so a
 * column "Real Estate" meets the row "Real estate" (the sector keeps the row's spelling).
 */
export function matchKey(label: string): string {
  return label.toLowerCase().replace(/\s+/g, ' ');
}

export function classify(
  rowLabels: readonly string[],
  rowLoc: (k: number) => Location,
  colLabels: readonly string[],
  colLoc: (k: number) => Location,
  overrides: Partial<RoleMap> | undefined,
  fileName: string,
): Classified {
  const ovRows = overrides?.rows ?? {};
  const ovCols = overrides?.columns ?? {};
  const rowSet = new Set(rowLabels);
  const colSet = new Set(colLabels);
  const rowKeys = new Set(rowLabels.map(matchKey));
  const colKeys = new Set(colLabels.map(matchKey));
  const overridden = new Set([...Object.keys(ovRows), ...Object.keys(ovCols)].map(matchKey));
  const isSector = (label: string): boolean => {
    const k = matchKey(label);
    return rowKeys.has(k) && colKeys.has(k) && !overridden.has(k) && !suggestRowRole(label).recognised && !suggestColumnRole(label).recognised;
  };

  const sectors: string[] = [];
  const sectorOf = new Map<string, number>();
  const rowSector = new Int32Array(rowLabels.length).fill(-1);
  const colSector = new Int32Array(colLabels.length).fill(-1);
  const rows: LabelRole<RowRole>[] = [];
  const columns: LabelRole<ColumnRole>[] = [];
  const roles: RoleMap = { rows: {}, columns: {} };
  rowLabels.forEach((label, k) => {
    if (isSector(label)) {
      sectorOf.set(matchKey(label), sectors.length);
      rowSector[k] = sectors.length;
      sectors.push(label);
      rows.push({ label, role: 'sector', suggested: 'sector', location: rowLoc(k) });
    } else {
      const suggested = suggestRowRole(label).role;
      const role = Object.hasOwn(ovRows, label) ? ovRows[label]! : suggested;
      roles.rows[label] = role;
      rows.push({ label, role, suggested, location: rowLoc(k) });
    }
  });
  colLabels.forEach((label, k) => {
    const s = sectorOf.get(matchKey(label));
    if (s !== undefined) {
      colSector[k] = s;
      columns.push({ label, role: 'sector', suggested: 'sector', location: colLoc(k) });
    } else {
      const suggested = suggestColumnRole(label).role;
      const role = Object.hasOwn(ovCols, label) ? ovCols[label]! : suggested;
      roles.columns[label] = role;
      columns.push({ label, role, suggested, location: colLoc(k) });
    }
  });
  const warnings: Warning[] = [];
  const unusedRows = Object.keys(ovRows).filter((l) => !rowSet.has(l));
  const unusedCols = Object.keys(ovCols).filter((l) => !colSet.has(l));
  if (unusedRows.length || unusedCols.length) {
    const names = [...unusedRows.map((l) => `row '${l}'`), ...unusedCols.map((l) => `column '${l}'`)];
    warnings.push({ code: 'role-map-unused', message: `the role map names labels the table does not have: ${names.slice(0, 5).join(', ')}${names.length > 5 ? ', …' : ''}`, location: { file: fileName } });
  }
  return { sectors, rowSector, colSector, rows, columns, roles, warnings };
}

/** A non-sector row that is read (role other than 'ignore'). */
export interface ExtraRow {
  label: string;
  role: Exclude<RowRole, 'ignore'>;
  values: Float64Array;
}

export interface ExtraColumn {
  label: string;
  role: Exclude<ColumnRole, 'ignore'>;
  values: Float64Array;
}

/** The numbers of a table as read, before totals are chosen and checks run. */
export interface RawTable {
  layout: Layout;
  fileName: string;
  corner: string;
  decimalMark: DecimalMark;
  sectors: string[];
  Z: Float64Array;
  rows: ExtraRow[];
  columns: ExtraColumn[];
  classified: Classified;
  /** Locations for messages: an intermediate flow, a cell of an extra row (k) or extra column (k). */
  flowAt(i: number, j: number): Location;
  rowCellAt(k: number, j: number): Location;
  columnCellAt(k: number, i: number): Location;
}
