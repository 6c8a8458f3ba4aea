/**
 * A labelled grid: a CSV whose first record holds column labels after a corner cell and whose every other record
 * starts with a row label — the shape of the labelled-matrix table and of supply and use tables — read with the
 * importer's dialect, labels and numbers (text.ts, dialect.ts, grid.ts, labels.ts, numbers.ts) but without deciding
 * what the labels mean. Callers that are not symmetric tables (src/sut) decide roles themselves and read the numbers
 * they need, each refusal located at its cell.
 */
import { InputError, type Location, type Warning } from '../diagnostics/index.ts';
import { delimiterHint, openTableText, type Dialect, type DialectOptions } from './dialect.ts';
import { buildGrid } from './grid.ts';
import { cleanLabel, matchKey } from './labels.ts';
import { checkWidth, contentRows, headerWidth, readCell } from './matrix.ts';

export interface GridLabel {
  /** As kept (labels.ts: NFC, no invisible characters, single spaces). */
  label: string;
  /** Where the label is in the file. */
  location: Location;
}

export interface LabelledGrid {
  fileName: string;
  /** The corner cell, cleaned (usually the money unit). */
  corner: string;
  dialect: Dialect;
  /** A guessed decimal mark that changes numbers (the importer's warning). */
  warnings: Warning[];
  /** Column labels after the corner, in file order. */
  columns: GridLabel[];
  /** Row labels of the records below the header, in file order. */
  rows: GridLabel[];
  /**
   * The number in data row `r` and column `c` (0-based among `rows` and `columns`); a blank cell is 0. Text, NaN,
   * infinite or overflowing numbers are refused at the cell with both labels.
   */
  number(r: number, c: number): number;
  /** Location of a cell, with its row and column labels. */
  at(r: number, c: number): Location;
}

export type LabelledGridOptions = DialectOptions & { fileName: string };

/**
 * Read a labelled grid. Refused, located: over the size limit, binary or UTF-16, empty, a header without rows, a
 * missing or repeated label (after cleaning, case ignored), a record with more or fewer fields than the header.
 */
export function readLabelledGrid(text: string, opts: LabelledGridOptions): LabelledGrid {
  const file = opts.fileName;
  const d = openTableText(text, opts, file);
  const warnings: Warning[] = d.guessed ? [d.guessed] : [];
  const grid = buildGrid(d.text, d.dialect.delimiter, file);
  const records = contentRows(grid);
  if (records.length === 0) throw new InputError('empty', 'the file has no cells', { file });
  if (records.length === 1) throw new InputError('header-only', 'the file has a header but no rows of numbers', { file, line: grid.line(records[0]!) });
  const hr = records[0]!;
  const width = headerWidth(grid, hr);
  const columns: GridLabel[] = [];
  const colFirst = new Map<string, number>();
  for (let c = 1; c < width; c++) {
    const label = cleanLabel(grid.cell(hr, c));
    const location = { file, line: grid.line(hr), column: c + 1 };
    if (label === '') throw new InputError('missing-label', 'column has no label', location);
    const first = colFirst.get(matchKey(label));
    if (first !== undefined) throw new InputError('duplicate-label', `duplicate column label '${label}' (also in field ${first + 1})`, { ...location, columnLabel: label });
    colFirst.set(matchKey(label), c);
    columns.push({ label, location: { ...location, columnLabel: label } });
  }
  const dataRows = records.slice(1);
  const rows: GridLabel[] = [];
  const rowFirst = new Map<string, number>();
  for (const r of dataRows) {
    const label = cleanLabel(grid.cell(r, 0));
    try {
      checkWidth(grid, r, width, file, label || undefined);
    } catch (e) {
      // A wrong delimiter guess shows as a ragged row: say what was assumed and how to force another (as the importer).
      if (e instanceof InputError && e.code === 'ragged-row') {
        const cells = (k: number) => Array.from({ length: grid.width(k) }, (_, c) => grid.cell(k, c)).join(' ');
        throw new InputError(e.code, e.message + delimiterHint(d.dialect, `${cells(hr)} ${cells(r)}`, true), e.location, e.hint);
      }
      throw e;
    }
    const location = { file, line: grid.line(r), column: 1 };
    if (label === '') throw new InputError('missing-label', 'row has numbers but no label', location);
    const first = rowFirst.get(matchKey(label));
    if (first !== undefined) throw new InputError('duplicate-label', `duplicate row label '${label}' (also on line ${grid.line(first)})`, { ...location, rowLabel: label });
    rowFirst.set(matchKey(label), r);
    rows.push({ label, location: { ...location, rowLabel: label } });
  }
  const mark = d.dialect.decimalMark;
  const dc = mark.charCodeAt(0);
  const at = (r: number, c: number): Location => ({ file, line: grid.line(dataRows[r]!), column: c + 2, rowLabel: rows[r]!.label, columnLabel: columns[c]!.label });
  return {
    fileName: file,
    corner: cleanLabel(grid.cell(hr, 0)),
    dialect: d.dialect,
    warnings,
    columns,
    rows,
    number: (r, c) => readCell(grid, dataRows[r]!, c + 1, dc, mark, false, () => at(r, c)),
    at,
  };
}
