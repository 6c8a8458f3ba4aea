/**
 * Small CSV files with a header row naming their columns (shock, mix, activity, margins, price-index and commuting
 * files): read with the tables' dialect rules (src/table readSmallCsv), columns in any order and case, unknown or
 * repeated columns refused, values beyond the header refused, and every cell located by file line and field.
 */
import { InputError, type Location } from '../diagnostics/index.ts';
import { checkFieldCount, cleanLabel, numberCell, readSmallCsv, type SmallCsv, type SmallCsvRow } from '../table/index.ts';
import type { LineOrigin } from './types.ts';

export interface HeaderRow<C extends string> {
  row: SmallCsvRow;
  line: number;
  /** The cell of a column ('' when the file has no such column or the cell is blank). */
  cell(c: C): string;
  has(c: C): boolean;
  /** Where a cell is: file, line, field, the column's name, and the row's label when given. */
  at(c: C, rowLabel?: string): Location;
  /** A number cell (refused, located, when it is not one); `undefined` when blank. */
  number(c: C, what: string, rowLabel?: string): number | undefined;
  origin(): LineOrigin;
}

export interface HeaderCsv<C extends string> {
  csv: SmallCsv;
  fileName: string;
  /** Columns present, with their 1-based field. */
  columns: Partial<Record<C, number>>;
  headerLine: number;
  rows: HeaderRow<C>[];
}

/**
 * Read a file whose first row names its columns. `columns` lists every allowed column (lower case), `required` the
 * ones it must have; `describe` is the header as the help gives it ("sector,amount[,kind]…"), used in messages.
 */
export function readHeaderCsv<C extends string>(text: string, fileName: string, columns: readonly C[], required: readonly C[], describe: string, what: string, emptyCode: 'empty' | 'empty-scenario' = 'empty'): HeaderCsv<C> {
  const csv = readSmallCsv(text, fileName);
  const rows = csv.rows;
  if (rows.length === 0) throw new InputError(emptyCode, `the ${what} is empty (expected a header ${describe})`, { file: fileName });
  const head = rows[0]!;
  const header = head.cells.map((c) => cleanLabel(c).toLowerCase().replace(/[\s-]+/g, '_'));
  let width = header.length;
  while (width > 0 && header[width - 1] === '') width--;
  const pos: Partial<Record<C, number>> = {};
  header.slice(0, width).forEach((h, k) => {
    if (h === '') return;
    if (!(columns as readonly string[]).includes(h)) {
      throw new InputError('bad-header', `unknown column '${head.cells[k]}'; the header is ${describe}`, { file: fileName, line: head.line, column: k + 1 });
    }
    if (pos[h as C] !== undefined) throw new InputError('bad-header', `column '${h}' appears twice`, { file: fileName, line: head.line, column: k + 1 });
    pos[h as C] = k;
  });
  for (const r of required) {
    if (pos[r] === undefined) throw new InputError('bad-header', `the header needs a '${r}' column (${describe})`, { file: fileName, line: head.line });
  }
  const mark = csv.dialect.decimalMark;
  const fields: Record<string, number> = {};
  for (const [c, k] of Object.entries(pos) as [string, number][]) fields[c] = k + 1;
  const body = rows.slice(1).map((row): HeaderRow<C> => {
    const cell = (c: C): string => (pos[c] !== undefined ? (row.cells[pos[c]] ?? '') : '');
    const at = (c: C, rowLabel?: string): Location => ({
      file: fileName, line: row.line, ...(pos[c] !== undefined ? { column: pos[c] + 1 } : {}), ...(rowLabel ? { rowLabel } : {}), columnLabel: c,
    });
    // The row is named by its first required column (the sector of a shock line, the item of an activity…).
    const label = required[0] !== undefined ? cleanLabel(cell(required[0])) : '';
    checkFieldCount(csv, row, width, `the header's ${width} fields`, label || undefined);
    const unnamed = header.slice(0, width).findIndex((h, k) => h === '' && (row.cells[k] ?? '') !== '');
    if (unnamed >= 0) {
      throw new InputError('extra-field', `row has a value in field ${unnamed + 1} ('${row.cells[unnamed]}'), whose column has no header`, { file: fileName, line: row.line, column: unnamed + 1, ...(label ? { rowLabel: label } : {}) });
    }
    return {
      row,
      line: row.line,
      cell,
      has: (c) => pos[c] !== undefined,
      at,
      number: (c, what2, rowLabel) => {
        const t = cell(c);
        return t === '' ? undefined : numberCell(t, mark, what2, 'bad-number', at(c, rowLabel));
      },
      origin: () => ({ file: fileName, line: row.line, columns: fields }),
    };
  });
  return { csv, fileName, columns: Object.fromEntries(Object.entries(pos).map(([c, k]) => [c, (k as number) + 1])) as Partial<Record<C, number>>, headerLine: head.line, rows: body };
}

/** A share in [0, 1], or a located refusal. */
export function shareCell<C extends string>(r: HeaderRow<C>, c: C, what: string, code: 'local-share-range' | 'additionality-range' | 'commuting-range' | 'margins-exceed', rowLabel?: string): number | undefined {
  const v = r.number(c, what, rowLabel);
  if (v !== undefined && (v < 0 || v > 1)) throw new InputError(code, `${what} ${r.cell(c)} is outside [0, 1]`, r.at(c, rowLabel));
  return v;
}

/** A whole year (e.g. 2024), or a located refusal. */
export function yearCell<C extends string>(r: HeaderRow<C>, c: C, what: string, rowLabel?: string): number | undefined {
  const v = r.number(c, what, rowLabel);
  if (v !== undefined && (!Number.isInteger(v) || v < 1000 || v > 9999)) throw new InputError('bad-year', `${what} '${r.cell(c)}' is not a four-digit year`, r.at(c, rowLabel));
  return v;
}

/** The name of a scenario, mix or activity taken from a file name: the base name without its extension. */
export function nameFromFile(fileName: string): string {
  return fileName.replace(/^.*[\\/]/, '').replace(/\.[^.]*$/, '');
}
