/**
 * How uncertain each coefficient is: one coefficient of variation (CV) for the whole table, optionally overridden
 * by a CSV file `row,column,cv` naming cells, whole rows or whole columns (`*`). The perturbed coefficients are the
 * ones the Leontief and household-closed inverses are made of: intermediate coefficients a_ij (sector rows × sector
 * columns), labour income per unit of output (a labour-income row × a sector column) and household purchases (a
 * sector row × a household-consumption column). Lines apply in file order, each overriding what came before it; the
 * --cv value applies first. Cells that are zero stay zero (no trade is treated as known).
 */
import { InputError, type Location } from '../diagnostics/index.ts';
import { checkFieldCount, cleanLabel, matchKey, readNumberCell, readSmallCsv, type IOTable } from '../table/index.ts';

/** Above this CV a coefficient's error is larger than twice the coefficient: refused as a typing slip. */
export const MAX_CV = 2;

export interface CvRule {
  /** A sector label, a labour-income row label, or '*' (every row). */
  row: string;
  /** A sector label, a household-consumption column label, or '*' (every column). */
  column: string;
  cv: number;
  /** Where the rule was read, for located refusals. */
  origin?: { file: string; line: number };
}

export function cvProblem(cv: number): string | null {
  return Number.isFinite(cv) && cv >= 0 && cv <= MAX_CV ? null : `must be a number from 0 to ${MAX_CV} (a CV of 0.1 is a standard error of 10 % of the coefficient)`;
}

/** Read `row,column,cv` (a header row is optional, recognised by a cv cell that is not a number). */
export function parseCvCsv(text: string, fileName: string): CvRule[] {
  const csv = readSmallCsv(text, fileName);
  const mark = csv.dialect.decimalMark;
  if (csv.rows.length === 0) throw new InputError('empty', 'the file is empty: expected lines row,column,cv', { file: fileName });
  const first = csv.rows[0]!;
  const header = first.cells[2] !== undefined && first.cells[2] !== '' && readNumberCell(first.cells[2], mark) === null;
  const body = header ? csv.rows.slice(1) : csv.rows;
  if (body.length === 0) throw new InputError('empty', 'the file has a header but no lines', { file: fileName });
  return body.map((r) => {
    const row = cleanLabel(r.cells[0] ?? '');
    const column = cleanLabel(r.cells[1] ?? '');
    checkFieldCount(csv, r, 3, 'the 3 fields row,column,cv', row || undefined);
    const at = (c: number): Location => ({ file: fileName, line: r.line, column: c, ...(row ? { rowLabel: row } : {}), ...(column ? { columnLabel: column } : {}) });
    if (row === '') throw new InputError('cv-label', 'the row label is empty (a sector, a labour-income row, or * for every row)', at(1));
    if (column === '') throw new InputError('cv-label', 'the column label is empty (a sector, a household column, or * for every column)', at(2));
    const cell = r.cells[2] ?? '';
    const cv = cell === '' ? null : readNumberCell(cell, mark);
    if (cv === null) throw new InputError('cv-range', `the cv '${cell}' is not a number${mark === ',' ? ' (decimal comma expected)' : ''}`, at(3));
    const why = cvProblem(cv);
    if (why) throw new InputError('cv-range', `the cv ${cell} ${why}`, at(3));
    return { row, column, cv, origin: { file: fileName, line: r.line } };
  });
}

/**
 * Standard deviations σ of log-errors per perturbed cell (see perturb.ts): a number when the whole block shares one,
 * else one per cell. `perturbed` is false when every CV is zero (the draws then copy the table as it is).
 */
export interface SigmaPlan {
  z: number | Float64Array;
  /** One per labour-income row of the table, length n each (per sector column). */
  labour: (number | Float64Array)[];
  /** One per household-consumption column, length n each (per sector row). */
  household: (number | Float64Array)[];
  perturbed: boolean;
}

/** σ of the log-normal error with mean 1 and coefficient of variation cv: σ² = ln(1 + cv²). */
export function sigmaOf(cv: number): number {
  return Math.sqrt(Math.log1p(cv * cv));
}

/** The σ of every perturbed cell, from the default CV and the rules; a label the table lacks is refused where it was read. */
export function sigmaPlan(table: IOTable, cv: number, rules: readonly CvRule[]): SigmaPlan {
  const n = table.n;
  const base = sigmaOf(cv);
  if (rules.length === 0) {
    return { z: base, labour: table.labourIncome.map(() => base), household: table.householdConsumption.map(() => base), perturbed: cv > 0 };
  }
  const z = new Float64Array(n * n).fill(base);
  const labour = table.labourIncome.map(() => new Float64Array(n).fill(base));
  const household = table.householdConsumption.map(() => new Float64Array(n).fill(base));
  const sectors = new Map(table.sectors.map((s, i) => [matchKey(s), i]));
  const labourRows = new Map(table.labourIncome.map((v, k) => [matchKey(v.label), k]));
  const householdCols = new Map(table.householdConsumption.map((v, k) => [matchKey(v.label), k]));
  for (const rule of rules) {
    const where = (column: number): Location => ({
      ...(rule.origin ? { file: rule.origin.file, line: rule.origin.line, column } : {}), rowLabel: rule.row, columnLabel: rule.column,
    });
    const s = sigmaOf(rule.cv);
    const rowAll = rule.row === '*';
    const colAll = rule.column === '*';
    const ri = rowAll ? -1 : sectors.get(matchKey(rule.row)) ?? -1;
    const li = rowAll ? -1 : labourRows.get(matchKey(rule.row)) ?? -1;
    const cj = colAll ? -1 : sectors.get(matchKey(rule.column)) ?? -1;
    const hk = colAll ? -1 : householdCols.get(matchKey(rule.column)) ?? -1;
    if (!rowAll && ri < 0 && li < 0) {
      throw new InputError('cv-label', `the table has no sector or labour-income row '${rule.row}' (use a sector label, a labour-income row label, or *)`, where(1));
    }
    if (!colAll && cj < 0 && hk < 0) {
      throw new InputError('cv-label', `the table has no sector or household-consumption column '${rule.column}' (use a sector label, a household column label, or *)`, where(2));
    }
    if (li >= 0 && hk >= 0) {
      throw new InputError('cv-label', `no coefficient is perturbed at labour-income row '${rule.row}' and household column '${rule.column}'`, where(1));
    }
    const rowsOfZ = rowAll ? null : ri >= 0 ? [ri] : [];
    const colsOfZ = colAll ? null : cj >= 0 ? [cj] : [];
    // Intermediate coefficients.
    if ((rowsOfZ === null || rowsOfZ.length) && (colsOfZ === null || colsOfZ.length)) {
      for (let i = 0; i < n; i++) {
        if (rowsOfZ && rowsOfZ[0] !== i) continue;
        for (let j = 0; j < n; j++) if (!colsOfZ || colsOfZ[0] === j) z[i * n + j] = s;
      }
    }
    // Labour income (row: a labour row or every row; column: a sector or every column).
    if ((rowAll || li >= 0) && (colsOfZ === null || colsOfZ.length)) {
      labour.forEach((v, k) => {
        if (!rowAll && k !== li) return;
        for (let j = 0; j < n; j++) if (!colsOfZ || colsOfZ[0] === j) v[j] = s;
      });
    }
    // Household purchases (row: a sector or every row; column: a household column or every column).
    if ((colAll || hk >= 0) && (rowsOfZ === null || rowsOfZ.length)) {
      household.forEach((v, k) => {
        if (!colAll && k !== hk) return;
        for (let i = 0; i < n; i++) if (!rowsOfZ || rowsOfZ[0] === i) v[i] = s;
      });
    }
  }
  const any = (v: number | Float64Array) => (typeof v === 'number' ? v > 0 : v.some((x) => x > 0));
  return { z, labour, household, perturbed: any(z) || labour.some(any) || household.some(any) };
}
