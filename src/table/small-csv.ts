/**
 * The one reader for small CSV inputs — shock files (src/scenario), employment, sector groups, totals and plain
 * matrices (src/regional) — with the tables' dialect rules: the same size limit, byte-order mark, binary and UTF-16
 * refusal, Excel "sep=" line, delimiter guess, decimal-mark decision (dialect.ts), RFC 4180 quotes and number reading
 * (thousands separators, decimal comma, Unicode minus; numbers.ts). Rows keep their file line for located messages.
 *
 * One difference from tables: when no number decides the decimal mark and some number reads two ways ('1.500' in a
 * semicolon file), a small file is refused at that number rather than read with a warning — these files are typed by
 * hand, the fix is one keystroke, and a scenario or employment file has no place to show a warning.
 */
import { InputError, type ErrorCode, type Location } from '../diagnostics/index.ts';
import { ambiguousMarkRefusal, delimiterHint, resolveDialect, type Dialect, type DialectOptions } from './dialect.ts';
import { buildGrid } from './grid.ts';
import { parseNumberText, showNumber, type DecimalMark } from './numbers.ts';
import { checkNotBinary, checkTableSize, stripBom } from './text.ts';

export interface SmallCsvRow {
  /** Field texts, trimmed (quotes removed). */
  cells: string[];
  /** 1-based line in the file where the record starts. */
  line: number;
}

export interface SmallCsv {
  fileName: string;
  /** Non-blank records in file order (an empty file gives none: the caller says what it expected). */
  rows: SmallCsvRow[];
  dialect: Dialect;
}

export type SmallCsvOptions = DialectOptions;

export function readSmallCsv(text: string, fileName: string, opts: SmallCsvOptions = {}): SmallCsv {
  checkTableSize(text.length, fileName);
  const body = stripBom(text);
  checkNotBinary(body, fileName);
  const d = resolveDialect(body, opts, fileName);
  const grid = buildGrid(d.text, d.dialect.delimiter, fileName);
  const rows: SmallCsvRow[] = [];
  for (let r = 0; r < grid.rowCount; r++) {
    if (grid.blank(r)) continue;
    const cells: string[] = [];
    for (let c = 0; c < grid.width(r); c++) cells.push(grid.cell(r, c).trim());
    rows.push({ cells, line: grid.line(r) });
  }
  if (d.guess && d.guess.from === 'guessed' && d.guess.ambiguous) throw ambiguousMarkRefusal(d.guess, fileName);
  return { fileName, rows, dialect: d.dialect };
}

/**
 * Refuse a value in a field beyond the expected ones (`expected` says which, e.g. "the header's 4 fields"): a stray
 * delimiter inside a number ("1,000" unquoted in a comma file) must not quietly drop the rest of the number.
 */
export function checkFieldCount(csv: SmallCsv, row: SmallCsvRow, width: number, expected: string, rowLabel?: string): void {
  for (let c = width; c < row.cells.length; c++) {
    if (row.cells[c] !== '') {
      const sample = [...(csv.rows[0]?.cells ?? []), ...row.cells].join(' ');
      throw new InputError('extra-field', `row has a value in field ${c + 1} ('${row.cells[c]}'), beyond ${expected}${delimiterHint(csv.dialect, sample)}`, {
        file: csv.fileName, line: row.line, column: c + 1, ...(rowLabel ? { rowLabel } : {}),
      });
    }
  }
}

/** A cell as a number with the file's decimal mark, or null when it is not one (blank, text, not finite). */
export function readNumberCell(cell: string, mark: DecimalMark): number | null {
  const p = parseNumberText(cell, mark);
  return p.problem === null ? p.value : null;
}

/**
 * A cell as a finite number, or a located refusal naming what it should be (`what`: "amount", "county jobs" …).
 * Blank cells are refused too; callers that allow them check first.
 */
export function numberCell(cell: string, mark: DecimalMark, what: string, code: ErrorCode, where: Location): number {
  const p = parseNumberText(cell, mark);
  if (p.problem === null) return p.value;
  const shown = cell.length > 24 ? `${cell.slice(0, 24)}…` : cell;
  switch (p.problem) {
    case 'blank':
      throw new InputError(code, `${what} is missing`, where);
    case 'not-finite':
      throw new InputError(code, `${what} '${shown}' is not a finite number`, where);
    case 'overflow':
      throw new InputError(code, `${what} '${shown}' is too large for a number (above ${showNumber(Number.MAX_VALUE)})`, where);
    default:
      throw new InputError(code, `${what} '${shown}' is not a number${mark === ',' ? ' (decimal comma expected)' : ''}`, where);
  }
}
