/**
 * What the CLI prints: text with every acting character from a file (terminal escapes, bidi controls) shown as an
 * escape (src/diagnostics visibleText), fixed-width tables that stay aligned because labels are escaped before
 * they are measured, and JSON whose strings cannot act on a terminal either.
 */
import { visibleText } from '../diagnostics/index.ts';

/** Text for the terminal: only its own line breaks act. */
export function terminalText(s: string): string {
  return visibleText(s, '\n');
}

/** Characters jsonText writes as \u escapes (a DEL, C1 and bidi controls, line and paragraph separators, BOM). */
const UNSAFE_IN_JSON = /[\u007f-\u009f\u061c\u200b\u200e\u200f\u2028\u2029\u202a-\u202e\u2066-\u2069\ufeff]/;
const UNSAFE_IN_JSON_ALL = new RegExp(UNSAFE_IN_JSON.source, 'g');

/**
 * JSON for stdout. JSON.stringify escapes C0 controls but not DEL, C1 controls or bidi controls; those are written as
 * \u escapes too, which any JSON reader turns back into the same characters (RFC 8259 §7), so nothing is lost.
 */
export function jsonText(value: unknown): string {
  const text = JSON.stringify(value);
  // Looked for first: nearly every output has none, and a replace with a callback over a megabyte of numbers cost
  // 6–35 ms even when it replaced nothing (a 2,000-sector analysis's 0.7 MB on the development machine).
  return `${text.search(UNSAFE_IN_JSON) < 0 ? text : text.replace(UNSAFE_IN_JSON_ALL, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`)}\n`;
}

/** A number for a summary: 6 significant digits, exponent form for very large or small values, '—' if undefined. */
export function num(v: number, digits = 6): string {
  if (!Number.isFinite(v)) return '—';
  return Math.abs(v) >= 1e6 || (v !== 0 && Math.abs(v) < 1e-3) ? v.toExponential(digits - 1) : String(Number(v.toPrecision(digits)));
}

/** A total in a scenario summary: whole units from 1,000 up, four significant digits below; n/a for none. */
export function summaryNumber(v: number | null | undefined): string {
  return v === null || v === undefined ? 'n/a' : Math.abs(v) >= 1000 ? v.toFixed(0) : v.toPrecision(4);
}

/** Fixed-width text table: first column left-aligned, the rest right-aligned; cells escaped before measuring. */
export function textTable(header: string[], rows: string[][]): string {
  const safe = (r: string[]) => r.map((c) => visibleText(c));
  const head = safe(header);
  const body = rows.map(safe);
  const widths = head.map((h, k) => Math.max(h.length, ...body.map((r) => (r[k] ?? '').length)));
  const line = (r: string[]) => r.map((c, k) => (k === 0 ? c.padEnd(widths[k]!) : c.padStart(widths[k]!))).join('  ');
  return [line(head), ...body.map(line)].join('\n');
}
