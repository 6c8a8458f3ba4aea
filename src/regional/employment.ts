/**
 * Employment by sector for regionalization: a CSV `sector,regional,national` (jobs in the county and in the nation).
 * The national column may be left out when the national table has an employment row; the table's row is used then.
 */
import { InputError, type Location } from '../diagnostics/index.ts';
import { readCsvRows, parseNumberCell, isHeaderRow } from './csv-input.ts';
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

function jobs(cell: string | undefined, loc: Location, what: string): number {
  const c = cell ?? '';
  if (c === '') throw new InputError('employment-missing', `${what} jobs are missing`, loc);
  const v = parseNumberCell(c);
  if (v === null) throw new InputError('employment-not-numeric', `${what} jobs '${c}' are not a number`, loc);
  if (v < 0) throw new InputError('employment-negative', `${what} jobs must not be negative (${c})`, loc);
  return v;
}

/** Parse the employment CSV. A header row is optional; it is recognised by non-numeric job cells. */
export function parseEmploymentCsv(text: string, fileName: string): EmploymentInput {
  const rows = readCsvRows(text, fileName);
  const first = rows[0]!;
  const header = isHeaderRow(first, [1, 2]);
  const body = header ? rows.slice(1) : rows;
  const width = header ? first.cells.length : Math.max(...rows.map((r) => r.cells.length));
  if (width < 2) {
    throw new InputError('employment-columns', 'expected the columns sector,regional,national (jobs in the county and in the nation)', { file: fileName, line: first.line });
  }
  if (body.length === 0) throw new InputError('empty', 'the file has a header but no sectors', { file: fileName });
  const hasNational = width >= 3;
  const seen = new Map<string, number>();
  const entries = body.map((r): EmploymentEntry => {
    const sector = r.cells[0] ?? '';
    if (sector === '') throw new InputError('employment-label', 'the sector label is empty', { file: fileName, line: r.line, column: 1 });
    const before = seen.get(sector);
    if (before !== undefined) {
      throw new InputError('employment-duplicate', `sector '${sector}' is listed twice (first on line ${before})`, { file: fileName, line: r.line, column: 1, rowLabel: sector });
    }
    seen.set(sector, r.line);
    const regional = jobs(r.cells[1], { file: fileName, line: r.line, column: 2, rowLabel: sector }, 'county');
    const national = hasNational ? jobs(r.cells[2], { file: fileName, line: r.line, column: 3, rowLabel: sector }, 'national') : null;
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
