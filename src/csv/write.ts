/**
 * CSV writing for reports: RFC 4180 quoting, CRLF line ends, and formula-injection escaping of text cells
 * (OWASP "CSV Injection": a text cell starting with =, +, -, @, tab or carriage return is prefixed with a single quote;
 * so is one starting with the full-width or small forms of =, +, -, @ (U+FF1D, U+FF0B, U+FF0D, U+FF20, U+FE66,
 * U+FE62, U+FE63, U+FE6B), which spreadsheets with East Asian input settings may fold to the ASCII sign).
 * Control and bidirectional characters in text are written as visible escapes (src/diagnostics visibleText; tab,
 * CR and LF inside a quoted cell are kept), so a label cannot reverse the text of a report around it.
 * Numbers are written in the shortest form that reads back to the same double (ECMAScript Number::toString).
 * Files are written UTF-8 with a byte-order mark by default (csvFileText): without it a common spreadsheet program on
 * Windows reads UTF-8 as the system code page and garbles "–", "−" and "Ā".
 */
import { visibleText } from '../diagnostics/index.ts';

export type Cell = string | number | null;

const FORMULA_LEAD = /^[=+\-@\t\r\uff1d\uff0b\uff0d\uff20\ufe66\ufe62\ufe63\ufe6b]/;

/**
 * Text as a spreadsheet cell may hold it: control and bidi characters as visible escapes (tab, CR and LF kept) and a
 * formula lead behind a single quote. The one rule for CSV cells and workbook text cells.
 */
export function safeText(s: string): string {
  const shown = visibleText(s, '\t\r\n');
  return FORMULA_LEAD.test(shown) ? `'${shown}` : shown;
}

export function escapeText(s: string): string {
  const safe = safeText(s);
  return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

/** The reader's side of the escaping above: the apostrophe put before a formula lead is removed. */
export function unescapeFormulaLead(s: string): string {
  return s.startsWith("'") && FORMULA_LEAD.test(s.slice(1)) ? s.slice(1) : s;
}

export function formatCell(c: Cell): string {
  if (c === null) return '';
  if (typeof c === 'number') {
    if (!Number.isFinite(c)) return '';
    return Object.is(c, -0) ? '0' : String(c);
  }
  return escapeText(c);
}

export function toCsv(rows: readonly (readonly Cell[])[]): string {
  return rows.map((r) => r.map(formatCell).join(',')).join('\r\n') + '\r\n';
}

/** The UTF-8 byte-order mark, U+FEFF. */
export const UTF8_BOM = '\ufeff';

/** A CSV file's text as written to disk: with the byte-order mark unless `bom` is false. */
export function csvFileText(csv: string, opts: { bom: boolean } = { bom: true }): string {
  const body = csv.startsWith(UTF8_BOM) ? csv.slice(1) : csv;
  return opts.bom ? UTF8_BOM + body : body;
}
