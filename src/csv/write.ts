/**
 * CSV writing for reports: RFC 4180 quoting, CRLF line ends, and formula-injection escaping of text cells
 * (OWASP "CSV Injection": a text cell starting with =, +, -, @, tab or carriage return is prefixed with a single quote).
 * Numbers are written in the shortest form that reads back to the same double (ECMAScript Number::toString).
 */
export type Cell = string | number | null;

const FORMULA_LEAD = /^[=+\-@\t\r]/;

export function escapeText(s: string): string {
  const safe = FORMULA_LEAD.test(s) ? `'${s}` : s;
  return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
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
