/**
 * Which labels are sectors and what every other row and column means. Shared by the matrix, long and
 * coefficients layouts. A label that appears both as a row and as a column is a sector, unless the label is a
 * recognised non-sector label ("Total", "Households", …) or the role map names it; the role map's "sectors" or a
 * "(sector)" mark make it a sector whatever its words. Labels that look like a sector gone astray are warned about.
 */
import type { Location, Warning } from '../diagnostics/index.ts';
import type { ColumnRole, Layout, RoleMap, RowRole } from './types.ts';
import { isKnownLabel, suggestColumnRole, suggestRowRole } from './roles.ts';
import type { DecimalMark } from './numbers.ts';
import { matchKey, SECTOR_MARK_TEXT } from './labels.ts';

export { cleanLabel, matchKey } from './labels.ts';

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

const ROW_ROLE_WORDS: Readonly<Record<RowRole, string>> = {
  labourIncome: 'household (labour) income', otherValueAdded: 'other value added', taxes: 'taxes less subsidies', imports: 'imports',
  employment: 'employment', fte: 'full-time equivalents', totalInput: 'total input', ignore: 'a subtotal (ignored)',
};
const COLUMN_ROLE_WORDS: Readonly<Record<ColumnRole, string>> = {
  householdConsumption: 'household consumption', otherFinalDemand: 'other final demand', totalOutput: 'total output', ignore: 'a subtotal (ignored)',
};

function list(labels: string[], max = 5): string {
  const shown = labels.slice(0, max).map((l) => `'${l}'`);
  return shown.join(', ') + (labels.length > max ? `, … (${labels.length} in all)` : '');
}

/**
 * Sectors and roles. Labels are cleaned (labels.ts) and, where a "(sector)" mark was removed, their match key is in
 * `marked`. A label found as a row and as a column is a sector when it is marked or named under "sectors" in the role
 * map, or else when neither the role map nor the label rules (roles.ts) give it a role.
 */
export function classify(
  rowLabels: readonly string[],
  rowLoc: (k: number) => Location,
  colLabels: readonly string[],
  colLoc: (k: number) => Location,
  overrides: Partial<RoleMap> | undefined,
  fileName: string,
  marked: ReadonlySet<string> = new Set(),
): Classified {
  const byKey = <R>(rec: Record<string, R> | undefined): Map<string, R> => new Map(Object.entries(rec ?? {}).map(([l, r]) => [matchKey(l), r]));
  const ovRows = byKey(overrides?.rows);
  const ovCols = byKey(overrides?.columns);
  const mapSectors = new Set((overrides?.sectors ?? []).map(matchKey));
  const forced = new Set([...mapSectors, ...marked]);
  const rowKeys = new Set(rowLabels.map(matchKey));
  const colKeys = new Set(colLabels.map(matchKey));
  const both = (k: string): boolean => rowKeys.has(k) && colKeys.has(k);
  const isSector = (label: string): boolean => {
    const k = matchKey(label);
    if (!both(k)) return false;
    if (forced.has(k)) return true;
    return !ovRows.has(k) && !ovCols.has(k) && !suggestRowRole(label).recognised && !suggestColumnRole(label).recognised;
  };

  const sectors: string[] = [];
  const sectorOf = new Map<string, number>();
  const rowSector = new Int32Array(rowLabels.length).fill(-1);
  const colSector = new Int32Array(colLabels.length).fill(-1);
  const rows: LabelRole<RowRole>[] = [];
  const columns: LabelRole<ColumnRole>[] = [];
  const roles: RoleMap = { rows: {}, columns: {} };
  const forcedSectors: string[] = [];
  rowLabels.forEach((label, k) => {
    if (isSector(label)) {
      sectorOf.set(matchKey(label), sectors.length);
      rowSector[k] = sectors.length;
      sectors.push(label);
      if (forced.has(matchKey(label))) forcedSectors.push(label);
      rows.push({ label, role: 'sector', suggested: 'sector', location: rowLoc(k) });
    } else {
      const suggested = suggestRowRole(label).role;
      const role = ovRows.get(matchKey(label)) ?? suggested;
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
      const role = ovCols.get(matchKey(label)) ?? suggested;
      roles.columns[label] = role;
      columns.push({ label, role, suggested, location: colLoc(k) });
    }
  });
  if (forcedSectors.length) roles.sectors = forcedSectors;

  const warnings: Warning[] = [];
  const unusedRows = Object.keys(overrides?.rows ?? {}).filter((l) => !rowKeys.has(matchKey(l)));
  const unusedCols = Object.keys(overrides?.columns ?? {}).filter((l) => !colKeys.has(matchKey(l)));
  const unusedSectors = (overrides?.sectors ?? []).filter((l) => !both(matchKey(l)));
  if (unusedRows.length || unusedCols.length || unusedSectors.length) {
    const names = [...unusedRows.map((l) => `row '${l}'`), ...unusedCols.map((l) => `column '${l}'`), ...unusedSectors.map((l) => `sector '${l}' (needs a row and a column of that label)`)];
    warnings.push({ code: 'role-map-unused', message: `the role map names labels the table does not have: ${names.slice(0, 5).join(', ')}${names.length > 5 ? ', …' : ''}`, location: { file: fileName } });
  }

  // A label on both axes that is not a sector: the label rules gave it a role on one axis only, so it is probably a
  // sector whose name reads like a role ("Import services"). Labels with a role on both axes ("Households", "Total")
  // or named in the role map are meant.
  const colByKey = new Map(columns.map((c) => [matchKey(c.label), c]));
  const conflicts: string[] = [];
  for (const r of rows) {
    const k = matchKey(r.label);
    const c = colByKey.get(k);
    if (r.role === 'sector' || !c || ovRows.has(k) || ovCols.has(k)) continue;
    if (suggestRowRole(r.label).recognised && suggestColumnRole(c.label).recognised) continue;
    conflicts.push(r.label);
    if (conflicts.length > 5) continue;
    const why = (recognised: boolean) => (recognised ? 'by its words' : 'not a recognised label');
    warnings.push({
      code: 'label-role-conflict',
      message:
        `'${r.label}' is a row and a column label but was not read as a sector: the row as ${ROW_ROLE_WORDS[r.role as RowRole]} (${why(suggestRowRole(r.label).recognised)}), ` +
        `the column as ${COLUMN_ROLE_WORDS[c.role as ColumnRole]} (${why(suggestColumnRole(c.label).recognised)}). If it is a sector, name it in a role map ` +
        `({"sectors": [${JSON.stringify(r.label)}]}) or add '${SECTOR_MARK_TEXT.trim()}' to its row and column labels`,
      location: { ...r.location, rowLabel: r.label },
    });
  }
  if (conflicts.length > 5) {
    warnings.push({ code: 'label-role-conflict', message: `${conflicts.length - 5} more labels are both a row and a column label but were not read as sectors: ${list(conflicts.slice(5))}`, location: { file: fileName } });
  }

  // A row and a column that match nothing and are not usual value-added or final-demand labels: perhaps one sector
  // spelt two ways ('Trade' and 'Retail'), which would otherwise vanish into value added and final demand unnoticed.
  const loose = <R>(xs: LabelRole<R>[], axis: 'row' | 'column', fallback: R, ov: Map<string, unknown>) =>
    xs.filter((x) => x.role === fallback && !ov.has(matchKey(x.label)) && !both(matchKey(x.label)) && !isKnownLabel(x.label, axis));
  const looseRows = loose(rows, 'row', 'otherValueAdded' as RowRole, ovRows);
  const looseCols = loose(columns, 'column', 'otherFinalDemand' as ColumnRole, ovCols);
  if (looseRows.length && looseCols.length) {
    const r = looseRows.map((x) => x.label);
    const c = looseCols.map((x) => x.label);
    warnings.push({
      code: 'labels-unmatched',
      message:
        `${r.length > 1 ? 'rows' : 'row'} ${list(r)} and ${c.length > 1 ? 'columns' : 'column'} ${list(c)} match no label on the other axis and are not usual value-added or final-demand labels: ` +
        `they were read as other value added and other final demand. If a row and a column are one sector, give them the same label; if not, confirm their roles in a role map`,
      location: { ...looseRows[0]!.location, rowLabel: r[0]! },
    });
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
  /** Non-zero cells of labour-income rows under final-demand columns, with where they are. */
  finalDemandIncome: { row: string; column: string; value: number; at: Location }[];
  /** Locations for messages: an intermediate flow, a cell of an extra row (k) or extra column (k). */
  flowAt(i: number, j: number): Location;
  rowCellAt(k: number, j: number): Location;
  columnCellAt(k: number, i: number): Location;
}
