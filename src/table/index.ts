/**
 * Table import: CSV text → validated IOTable, and a preview of the same import that never throws (for the UI's
 * "accept this table?" step). Formats are described in README (section "CSV formats").
 */
import { formatLocated, InputError, isInputError, type Location, type Warning } from '../diagnostics/index.ts';
import type { ColumnRole, IOTable, Layout, RoleMap, RowRole } from './types.ts';
import { buildGrid } from './grid.ts';
import { contentRows, readMatrix, type ReadOptions } from './matrix.ts';
import { longHeader, readLong } from './long.ts';
import { finishTable, looksLikeCoefficients, scaleCoefficients, type BalanceReport } from './finish.ts';
import { checkNotBinary, checkTableSize, detectDecimalMark, detectDelimiter, stripBom, type Delimiter } from './text.ts';
import type { DecimalMark } from './numbers.ts';
import type { LabelRole } from './structure.ts';

export type { IOTable, Layout, RoleMap, RowRole, ColumnRole, LabelledVector } from './types.ts';
export type { BalanceReport } from './finish.ts';
export type { LabelRole } from './structure.ts';
export type { Delimiter } from './text.ts';
export type { DecimalMark } from './numbers.ts';
export { MAX_TABLE_BYTES, checkTableSize } from './text.ts';
export { suggestRoles, suggestRowRole, suggestColumnRole, parseRoleMap, normaliseLabel, ROW_ROLES, COLUMN_ROLES, ROW_LABELS, COLUMN_LABELS } from './roles.ts';

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
  /** Field delimiter; detected from the first line when omitted. */
  delimiter?: Delimiter;
  /** Decimal mark; ',' for semicolon-delimited files and '.' otherwise when omitted (see text.ts). */
  decimalMark?: DecimalMark;
  /** Money unit; defaults to the corner cell's text. */
  moneyUnit?: string;
}

/** What the preview learns, stage by stage; filled as far as the import gets. */
interface Progress {
  delimiter: Delimiter | null;
  decimalMark: DecimalMark | null;
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

function run(text: string, opts: ImportOptions, p: Progress): IOTable {
  const file = opts.fileName;
  checkTableSize(text.length, file);
  const body = stripBom(text);
  if (!/\S/.test(body)) throw new InputError('empty', 'the file is empty', { file });
  checkNotBinary(body, file);
  const delimiter = (p.delimiter = opts.delimiter ?? detectDelimiter(body));
  const decimalMark = (p.decimalMark = opts.decimalMark ?? detectDecimalMark(body, delimiter));
  const grid = buildGrid(body, delimiter, file);
  const rows = contentRows(grid);
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
  const raw = isLong ? readLong(grid, rows, read) : readMatrix(grid, rows, read, opts.layout === 'coefficients' ? 'coefficients' : 'matrix');
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
  // A flow table whose flows are all under 1 % of output reads the same way: say what was assumed, so it can be undone.
  if (guessedFromNumbers) {
    table.warnings.push({ code: 'coefficients-guessed', message: 'the block was read as technical coefficients (every column sums to at most 1, far below total output); if these are flows, import it with the matrix layout', location: { file } });
  }
  return table;
}

function emptyProgress(): Progress {
  return { delimiter: null, decimalMark: null, layout: null, sectors: [], rows: [], columns: [], balance: null };
}

/** Import a table or throw an InputError with a located message. */
export function importTable(text: string, opts: ImportOptions): IOTable {
  return run(text, opts, emptyProgress());
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
  /** Sector labels (the inter-industry block), in row order. */
  sectors: string[];
  /** Every row label with its role ('sector' for block rows), in file order. */
  rows: LabelRole<RowRole>[];
  /** Every column label with its role, in file order. */
  columns: LabelRole<ColumnRole>[];
  balance: BalanceReport | null;
  warnings: Warning[];
  refusal: Refusal | null;
  /** The imported table when ok. */
  table: IOTable | null;
}

/** The import as a preview: what was detected and suggested, the balance report, and the refusal if any. Never throws. */
export function previewTable(text: string, opts: ImportOptions): TablePreview {
  const p = emptyProgress();
  try {
    const table = run(text, opts, p);
    return { ok: true, ...p, warnings: table.warnings, refusal: null, table };
  } catch (e) {
    const err = isInputError(e)
      ? e
      : new InputError('internal', `the table could not be read (${e instanceof Error ? e.message.split('\n')[0] : String(e)})`, { file: opts.fileName });
    return {
      ok: false,
      ...p,
      warnings: [],
      refusal: { code: err.code, message: err.message, formatted: formatLocated(err), location: err.location },
      table: null,
    };
  }
}

export { checkNotBinary } from './text.ts';
export { recordStartLines } from './grid.ts';
export { writeTableCsv, writtenRoleMap } from './write.ts';
export { SAMPLE_CSV, SAMPLE_FILE_NAME, SAMPLE_NOTE } from './sample.ts';
