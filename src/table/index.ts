/**
 * Table import: CSV text → validated IOTable, and a preview of the same import that never throws (for the UI's
 * "accept this table?" step). Formats are described in README (section "CSV formats"). Also the folder's other
 * public parts: the small-CSV reader for shock, employment, group and totals files (same dialect rules), the table
 * writer, and `validateTable` for tables that did not come through the importer.
 */
import { formatLocated, InputError, isInputError, type Location, type Warning } from '../diagnostics/index.ts';
import type { ColumnRole, IOTable, Layout, RoleMap, RowRole } from './types.ts';
import { buildGrid, ByteGrid } from './grid.ts';
import { plainHead, type PlainBytes } from './bytes.ts';
import { contentRows, readMatrix, type ReadOptions } from './matrix.ts';
import { longHeader, readLong } from './long.ts';
import { finishTable, looksLikeCoefficients, scaleCoefficients, type BalanceReport } from './finish.ts';
import { checkTableSize, type Delimiter } from './text.ts';
import { delimiterHint, openTableText, type Dialect } from './dialect.ts';
import type { DecimalMark } from './numbers.ts';
import type { LabelRole, RawTable } from './structure.ts';
import type { Grid } from './grid.ts';

export type { IOTable, Layout, RoleMap, RowRole, ColumnRole, LabelledVector, FinalDemandIncome } from './types.ts';
export type { BalanceReport } from './finish.ts';
export type { LabelRole } from './structure.ts';
export type { Delimiter } from './text.ts';
export type { Dialect } from './dialect.ts';
export type { DecimalMark, ParsedNumber } from './numbers.ts';
export { MAX_TABLE_BYTES, checkTableSize, checkNotBinary } from './text.ts';
export { parseNumberText, showNumber } from './numbers.ts';
export { cleanLabel, matchKey } from './labels.ts';
export { suggestRoles, suggestRowRole, suggestColumnRole, isKnownLabel, parseRoleMap, normaliseLabel, ROW_ROLES, COLUMN_ROLES, ROW_LABELS, COLUMN_LABELS } from './roles.ts';
export { validateTable, moneyRows, type ValidateOptions } from './validate.ts';
export { readSmallCsv, checkFieldCount, readNumberCell, numberCell, type SmallCsv, type SmallCsvRow, type SmallCsvOptions } from './small-csv.ts';
export { writeTableCsv, writtenRoleMap } from './write.ts';
export { readLabelledGrid, type LabelledGrid, type GridLabel, type LabelledGridOptions } from './labelled-grid.ts';
export { SAMPLE_CSV, SAMPLE_FILE_NAME, SAMPLE_NOTE } from './sample.ts';

/** Rows and fields of the file that the preview returns as parsed (the UI shows them as "the file as read"). */
export const PREVIEW_ROWS = 12;
export const PREVIEW_COLUMNS = 10;

export interface ImportOptions {
  /** Shown in messages ("county.csv:12:4 …"). */
  fileName: string;
  /** Layout; detected when omitted. */
  layout?: Layout;
  /** Overrides of the suggested roles (CLI --map, or the UI's role editor). */
  roles?: Partial<RoleMap>;
  /** Accept negative intermediate flows (some tables carry them for stock changes or scrap). */
  allowNegative?: boolean;
  /** Relative tolerance for the balance check, default 0.001 (0.1 %). */
  balanceTolerance?: number;
  /** Table name; defaults to the file name without extension. */
  name?: string;
  /** Field delimiter; from an Excel "sep=" first line, or guessed from the first lines, when omitted (dialect.ts). */
  delimiter?: Delimiter;
  /** Decimal mark; decided by the file's numbers, or guessed with a warning, when omitted (dialect.ts). */
  decimalMark?: DecimalMark;
  /** Money unit; defaults to the corner cell's text. */
  moneyUnit?: string;
}

/** What the preview learns, stage by stage; filled as far as the import gets. */
interface Progress {
  delimiter: Delimiter | null;
  decimalMark: DecimalMark | null;
  dialect: Dialect | null;
  cells: string[][];
  warnings: Warning[];
  layout: Layout | null;
  sectors: string[];
  rows: LabelRole<RowRole>[];
  columns: LabelRole<ColumnRole>[];
  balance: BalanceReport | null;
}

function baseName(fileName: string): string {
  const f = fileName.split(/[\\/]/).pop() ?? fileName;
  return f.replace(/\.[^.]*$/, '') || f;
}

/** What openTableText makes of a text. */
type Opened = ReturnType<typeof openTableText>;

/**
 * The import of `text`, or of `bytes.bytes` when given (a plain file, `text` then its head: see importTableBytes):
 * the same steps, the grid made over the bytes instead of the text. `opened` is openTableText's result for `text`
 * when the caller has it already (its delimiter guess reads up to a MiB: 8–15 ms).
 */
function run(text: string, opts: ImportOptions, p: Progress, bytes?: PlainBytes, opened?: Opened): IOTable {
  const file = opts.fileName;
  const d = opened ?? openTableText(text, opts, file);
  p.dialect = d.dialect;
  const delimiter = (p.delimiter = d.dialect.delimiter);
  const decimalMark = (p.decimalMark = d.dialect.decimalMark);
  if (d.guessed) p.warnings.push(d.guessed);
  const grid = bytes ? new ByteGrid(bytes.bytes, delimiter) : buildGrid(d.text, delimiter, file);
  const rows = contentRows(grid);
  p.cells = firstCells(grid, rows);
  if (rows.length === 0) throw new InputError('empty', 'the file has no cells', { file });
  if (rows.length === 1) throw new InputError('header-only', 'the file has a header but no rows of numbers', { file, line: grid.line(rows[0]!) });
  const isLong = opts.layout === 'long' || (opts.layout === undefined && longHeader(grid, rows[0]!) !== null);
  p.layout = isLong ? 'long' : (opts.layout ?? 'matrix');
  const read: ReadOptions = {
    fileName: file,
    decimalMark,
    allowNegative: opts.allowNegative ?? false,
    ...(opts.roles ? { roles: opts.roles } : {}),
    onStructure: (c) => {
      p.sectors = c.sectors;
      p.rows = c.rows;
      p.columns = c.columns;
    },
  };
  let raw: RawTable;
  try {
    raw = isLong ? readLong(grid, rows, read) : readMatrix(grid, rows, read, opts.layout === 'coefficients' ? 'coefficients' : 'matrix');
  } catch (e) {
    // A row with the wrong number of fields is often a wrong delimiter guess: say what was assumed and how to force it.
    if (isInputError(e) && e.code === 'ragged-row') {
      const whole = bytes ? bytes.text() : d.text;
      const sample = `${lineAt(whole, grid.line(rows[0]!))}\n${lineAt(whole, e.location.line ?? 0)}`;
      throw new InputError(e.code, e.message + delimiterHint(p.dialect, sample, true), e.location, e.hint);
    }
    throw e;
  }
  let guessedFromNumbers = false;
  if (opts.layout === undefined && raw.layout === 'matrix' && looksLikeCoefficients(raw)) {
    raw.layout = 'coefficients';
    guessedFromNumbers = !/coefficient|per unit/i.test(raw.corner);
  }
  p.layout = raw.layout;
  if (raw.layout === 'coefficients') scaleCoefficients(raw);
  const table = finishTable(
    raw,
    { name: opts.name ?? baseName(file), tolerance: opts.balanceTolerance ?? 0.001, ...(opts.moneyUnit !== undefined ? { moneyUnit: opts.moneyUnit } : {}) },
    (b) => (p.balance = b),
  );
  p.sectors = table.sectors;
  table.warnings.unshift(...p.warnings);
  // A flow table whose flows are all under 1 % of output reads the same way: say what was assumed, so it can be undone.
  if (guessedFromNumbers) {
    table.warnings.push({ code: 'coefficients-guessed', message: 'the block was read as technical coefficients (every column sums to at most 1, far below total output); if these are flows, import it with the matrix layout', location: { file } });
  }
  return table;
}

function emptyProgress(): Progress {
  return { delimiter: null, decimalMark: null, dialect: null, cells: [], warnings: [], layout: null, sectors: [], rows: [], columns: [], balance: null };
}

/** Text of a 1-based line ('' when there is none). */
function lineAt(text: string, line: number): string {
  let start = 0;
  for (let k = 1; k < line; k++) {
    start = text.indexOf('\n', start) + 1;
    if (start === 0) return '';
  }
  const end = text.indexOf('\n', start);
  return text.slice(start, end < 0 ? text.length : end);
}

/** The first records and fields exactly as the grid parsed them (quotes removed, decimal commas inside cells). */
function firstCells(grid: Grid, rows: number[]): string[][] {
  return rows.slice(0, PREVIEW_ROWS).map((r) => {
    const w = Math.min(grid.width(r), PREVIEW_COLUMNS);
    const out: string[] = [];
    for (let c = 0; c < w; c++) out.push(grid.cell(r, c));
    return out;
  });
}

/** Import a table or throw an InputError with a located message. */
export function importTable(text: string, opts: ImportOptions): IOTable {
  return run(text, opts, emptyProgress());
}

const utf8 = new TextDecoder('utf-8');

/**
 * `importTable` of the file's bytes read as UTF-8 text: the same table, warnings and refusals. A file of plain ASCII
 * without quotes (nearly every large numeric export; bytes.ts `plainHead`) is read from its bytes instead of its
 * decoded text, which at 2,000 sectors is 21 MB of fresh memory written and read once (README "Performance"): its
 * dialect is found in its head, which holds every character the dialect rules look at, and its grid is a ByteGrid.
 * Anything else, or a head that does not settle the dialect as the whole text would, is decoded and imported as text.
 */
export function importTableBytes(bytes: Uint8Array, opts: ImportOptions): IOTable {
  return runBytes(bytes, opts, emptyProgress());
}

/** `run` of the file's bytes read as UTF-8 text, from the bytes themselves where they are plain (importTableBytes). */
function runBytes(bytes: Uint8Array, opts: ImportOptions, p: Progress): IOTable {
  const head = plainHead(bytes);
  if (head !== null) {
    checkTableSize(bytes.length, opts.fileName);
    const d = openTableText(head, opts, opts.fileName);
    // A mark guessed for want of a deciding number in the head might be decided by one further on: read as text.
    if (d.text === head && d.dialect.decimalMarkFrom !== 'guessed') {
      return run(head, opts, p, { bytes, text: () => utf8.decode(bytes) }, d);
    }
  }
  return run(utf8.decode(bytes), opts, p);
}

export interface Refusal {
  code: string;
  message: string;
  /** `formatLocated` of the refusal: "county.csv:12:4 (row 'Farming', column 'Mining'): …". */
  formatted: string;
  location: Location;
}

/** Everything the UI shows before the user accepts a table. */
export interface TablePreview {
  ok: boolean;
  /** Detected (or forced) layout; null when the import stopped before it was known. */
  layout: Layout | null;
  delimiter: Delimiter | null;
  decimalMark: DecimalMark | null;
  /**
   * How the delimiter and decimal mark were chosen (given, from a "sep=" line, proved by the numbers, or guessed) with
   * a sentence for each; null when the import stopped before they were known.
   */
  dialect: Dialect | null;
  /** The first 12 non-blank records, up to 10 fields each, exactly as parsed (for "the file as read"). */
  cells: string[][];
  /** Sector labels (the inter-industry block), in row order. */
  sectors: string[];
  /** Every row label with its role ('sector' for block rows), in file order. */
  rows: LabelRole<RowRole>[];
  /** Every column label with its role, in file order. */
  columns: LabelRole<ColumnRole>[];
  balance: BalanceReport | null;
  /** The table's warnings; for a refused file, those found before the refusal (a guessed decimal mark). */
  warnings: Warning[];
  refusal: Refusal | null;
  /** The imported table when ok. */
  table: IOTable | null;
}

/** The import as a preview: what was detected and suggested, the balance report, and the refusal if any. Never throws. */
export function previewTable(text: string, opts: ImportOptions): TablePreview {
  return previewOf((p) => run(text, opts, p), opts);
}

/**
 * `previewTable` of a file's bytes read as UTF-8 text: what `importTableBytes` reads from them (the same table,
 * warnings and refusal), so a front end that previews a file, then imports it, reads it one way.
 */
export function previewTableBytes(bytes: Uint8Array, opts: ImportOptions): TablePreview {
  return previewOf((p) => runBytes(bytes, opts, p), opts);
}

function previewOf(read: (p: Progress) => IOTable, opts: ImportOptions): TablePreview {
  const p = emptyProgress();
  try {
    const table = read(p);
    return { ok: true, ...p, warnings: table.warnings, refusal: null, table };
  } catch (e) {
    const err = isInputError(e)
      ? e
      : new InputError('internal', `the table could not be read (${e instanceof Error ? e.message.split('\n')[0] : String(e)})`, { file: opts.fileName });
    return {
      ok: false,
      ...p,
      refusal: { code: err.code, message: err.message, formatted: formatLocated(err), location: err.location },
      table: null,
    };
  }
}
