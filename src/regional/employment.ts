/**
 * Employment by sector for regionalization: a CSV `sector,regional,national` (jobs in the county and in the nation).
 * The national column may be left out when the national table has an employment row; the table's row is used then.
 * Read with the tables' dialect rules (src/table readSmallCsv); a value beyond the third field is refused.
 */
import { InputError, type Location } from '../diagnostics/index.ts';
import { checkFieldCount, cleanLabel, readNumberCell, readSmallCsv, type DecimalMark } from '../table/index.ts';
import { isHeaderRow } from './header-row.ts';
import { toCsv } from '../csv/index.ts';

export interface EmploymentEntry {
  sector: string;
  regional: number;
  /** Null when the file has no national column. */
  national: number | null;
  /** 1-based file line, when read from a file. */
  line?: number;
}

export interface EmploymentInput {
  /** Shown in messages. */
  fileName: string;
  entries: EmploymentEntry[];
}

function jobs(cell: string | undefined, mark: DecimalMark, loc: Location, what: string): number {
  const c = cell ?? '';
  if (c === '') throw new InputError('employment-missing', `${what} jobs are missing`, loc);
  const v = readNumberCell(c, mark);
  if (v === null) throw new InputError('employment-not-numeric', `${what} jobs '${c}' are not a number${mark === ',' ? ' (decimal comma expected)' : ''}`, loc);
  if (v < 0) throw new InputError('employment-negative', `${what} jobs must not be negative (${c})`, loc);
  return v;
}

/** Parse the employment CSV. A header row is optional; it is recognised by non-numeric job cells. */
export function parseEmploymentCsv(text: string, fileName: string): EmploymentInput {
  const csv = readSmallCsv(text, fileName);
  const rows = csv.rows;
  const mark = csv.dialect.decimalMark;
  if (rows.length === 0) throw new InputError('empty', 'the file is empty', { file: fileName });
  const first = rows[0]!;
  const header = isHeaderRow(first, [1, 2], mark);
  const body = header ? rows.slice(1) : rows;
  const filled = (cells: string[]) => { let w = cells.length; while (w > 0 && cells[w - 1] === '') w--; return w; };
  // A header names its columns (a fourth, e.g. "note", is left alone); without one, a fourth value is a stray delimiter.
  const named = header ? filled(first.cells) : 0;
  const width = header ? named : Math.min(3, Math.max(...rows.map((r) => filled(r.cells))));
  if (width < 2) {
    throw new InputError('employment-columns', 'expected the columns sector,regional,national (jobs in the county and in the nation)', { file: fileName, line: first.line });
  }
  if (body.length === 0) throw new InputError('empty', 'the file has a header but no sectors', { file: fileName });
  const hasNational = width >= 3;
  const expected = header ? `the header's ${named} fields` : width === 3 ? 'the 3 fields sector,regional,national' : 'the fields sector,regional';
  const seen = new Map<string, number>();
  const entries = body.map((r): EmploymentEntry => {
    const sector = cleanLabel(r.cells[0] ?? '');
    checkFieldCount(csv, r, width, expected, sector || undefined);
    if (sector === '') throw new InputError('employment-label', 'the sector label is empty', { file: fileName, line: r.line, column: 1 });
    const before = seen.get(sector);
    if (before !== undefined) {
      throw new InputError('employment-duplicate', `sector '${sector}' is listed twice (first on line ${before})`, { file: fileName, line: r.line, column: 1, rowLabel: sector });
    }
    seen.set(sector, r.line);
    const regional = jobs(r.cells[1], mark, { file: fileName, line: r.line, column: 2, rowLabel: sector }, 'county');
    const national = hasNational ? jobs(r.cells[2], mark, { file: fileName, line: r.line, column: 3, rowLabel: sector }, 'national') : null;
    return { sector, regional, national, line: r.line };
  });
  return { fileName, entries };
}

/**
 * A starting employment file for a table: every sector with its national jobs from the table's employment row (blank
 * when the table has none) and a blank county column for the planner to fill in.
 */
export function employmentTemplate(t: { sectors: string[]; employment: Float64Array | null }): string {
  return toCsv([['sector', 'regional', 'national'], ...t.sectors.map((s, i) => [s, null, t.employment ? t.employment[i]! : null])]);
}
