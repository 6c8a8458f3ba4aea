/**
 * CSV writing for reports: RFC 4180 quoting, CRLF line ends, and formula-injection escaping of text cells
 * (OWASP "CSV Injection": a text cell starting with =, +, -, @, tab or carriage return is prefixed with a single quote;
 * so is one starting with the full-width or small forms of =, +, -, @ (U+FF1D, U+FF0B, U+FF0D, U+FF20, U+FE66,
 * U+FE62, U+FE63, U+FE6B), which spreadsheets with East Asian input settings may fold to the ASCII sign).
 * Control and bidirectional characters in text are written as visible escapes (src/diagnostics visibleText; tab,
 * CR and LF inside a quoted cell are kept), so a label cannot reverse the text of a report around it.
 * Numbers are written in the shortest form that reads back to the same double (ECMAScript Number::toString).
 */
import { visibleText } from '../diagnostics/index.ts';

export type Cell = string | number | null;

const FORMULA_LEAD = /^[=+\-@\t\r\uff1d\uff0b\uff0d\uff20\ufe66\ufe62\ufe63\ufe6b]/;

export function escapeText(s: string): string {
  const shown = visibleText(s, '\t\r\n');
  const safe = FORMULA_LEAD.test(shown) ? `'${shown}` : shown;
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
