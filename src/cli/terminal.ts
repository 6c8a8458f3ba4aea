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

/**
 * JSON for stdout. JSON.stringify escapes C0 controls but not DEL, C1 controls or bidi controls; those are written as
 * \u escapes too, which any JSON reader turns back into the same characters (RFC 8259 §7), so nothing is lost.
 */
export function jsonText(value: unknown): string {
  return `${JSON.stringify(value).replace(/[\u007f-\u009f\u061c\u200b\u200e\u200f\u2028\u2029\u202a-\u202e\u2066-\u2069\ufeff]/g, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`)}\n`;
}

/** A number for a summary: 6 significant digits, exponent form for very large or small values, '—' if undefined. */
export function num(v: number, digits = 6): string {
  if (!Number.isFinite(v)) return '—';
  return Math.abs(v) >= 1e6 || (v !== 0 && Math.abs(v) < 1e-3) ? v.toExponential(digits - 1) : String(Number(v.toPrecision(digits)));
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
