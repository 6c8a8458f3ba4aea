/**
 * Reading the small label-and-number CSV files of this folder (employment by sector, sector groups, totals,
 * a plain labelled matrix) with papaparse, keeping the 1-based file line of every row for located messages.
 */
import Papa from 'papaparse';
import { InputError } from '../diagnostics/index.ts';
import { checkTableSize } from '../table/index.ts';

export interface CsvRow {
  /** Trimmed cells. */
  cells: string[];
  /** 1-based line in the file where the row starts. */
  line: number;
}

/** Rows of a CSV text (comma, semicolon or tab; UTF-8 BOM and CRLF accepted); blank lines are skipped. */
export function readCsvRows(text: string, fileName: string): CsvRow[] {
  checkTableSize(text.length, fileName);
  // one line-end convention, so files mixing CRLF and LF still split into lines
  const body = (text.charCodeAt(0) === 0xfeff ? text.slice(1) : text).replace(/\r\n?/g, '\n');
  if (/\u0000/.test(body)) throw new InputError('binary', 'this is not a text CSV file (it contains binary data)', { file: fileName });
  const rows: CsvRow[] = [];
  let start = 0;
  let line = 1;
  let counted = 0; // text[0, counted) has been scanned for line ends
  let badQuoteLine: number | null = null;
  Papa.parse<string[]>(body, {
    header: false,
    skipEmptyLines: false,
    newline: '\n',
    delimitersToGuess: [',', ';', '\t'],
    step: (res) => {
      for (; counted < start; counted++) if (body.charCodeAt(counted) === 10) line++;
      if (badQuoteLine === null && res.errors.some((e) => e.type === 'Quotes')) badQuoteLine = line;
      const cells = res.data.map((c) => String(c).trim());
      if (cells.some((c) => c !== '')) rows.push({ cells, line });
      start = res.meta.cursor;
      // the cursor stops before the line end; step over it so the next row starts on the next line
      if (body.charCodeAt(start) === 10) start++;
    },
  });
  // An unclosed quote would swallow the rest of the file into one cell (as the table importer, refuse it).
  if (badQuoteLine !== null) throw new InputError('bad-quotes', 'a quoted cell is not closed or a quote is misplaced (RFC 4180 §2)', { file: fileName, line: badQuoteLine });
  if (rows.length === 0) throw new InputError('empty', 'the file is empty', { file: fileName });
  return rows;
}

const PLAIN = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;
const THOUSANDS = /^[+-]?\d{1,3}(,\d{3})+(\.\d+)?$/;

/** A finite number from a cell ("1234", "1,234.5", "1.5e3"); null when the cell is not a number. */
export function parseNumberCell(cell: string): number | null {
  const s = cell.replace(/[\s\u00a0]/g, '');
  let v: number;
  if (PLAIN.test(s)) v = Number(s);
  else if (THOUSANDS.test(s)) v = Number(s.replace(/,/g, ''));
  else if (/^[+-]?\d+,\d+$/.test(s)) v = Number(s.replace(',', '.')); // decimal comma (semicolon-separated files)
  else return null;
  return Number.isFinite(v) ? v : null;
}

/**
 * True when the first row looks like a header: none of the cells where numbers belong is a number. A data row with
 * one bad number among good ones is therefore kept as data, and refused at its own line.
 */
export function isHeaderRow(row: CsvRow, numericColumns: number[]): boolean {
  const cells = numericColumns.map((k) => row.cells[k] ?? '').filter((c) => c !== '');
  return cells.length > 0 && cells.every((c) => parseNumberCell(c) === null);
}
