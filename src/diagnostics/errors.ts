/**
 * Refusals and warnings that reach the user. Every refusal carries a location so the message can say
 * where in the file (line, column) and where in the table (row and column labels) the problem is.
 * No stack trace is ever shown for an InputError: the CLI and the UI print `formatLocated(err)` only.
 */

export interface Location {
  file?: string;
  /** 1-based line in the source file. */
  line?: number;
  /** 1-based column (field index) in the source file. */
  column?: number;
  rowLabel?: string;
  columnLabel?: string;
}

export class InputError extends Error {
  readonly code: string;
  readonly location: Location;
  constructor(code: string, message: string, location: Location = {}) {
    super(message);
    this.name = 'InputError';
    this.code = code;
    this.location = location;
  }
}

export interface Warning {
  code: string;
  message: string;
  location?: Location;
}

export function formatLocation(loc: Location): string {
  const parts: string[] = [];
  let where = loc.file ?? '';
  if (loc.line !== undefined) where += `${where ? ':' : 'line '}${loc.line}`;
  if (loc.column !== undefined) where += `:${loc.column}`;
  if (where) parts.push(where);
  const labels: string[] = [];
  if (loc.rowLabel !== undefined) labels.push(`row '${loc.rowLabel}'`);
  if (loc.columnLabel !== undefined) labels.push(`column '${loc.columnLabel}'`);
  if (labels.length) parts.push(`(${labels.join(', ')})`);
  return parts.join(' ');
}

/**
 * Control characters from a file (a CR inside a label, a NUL in a cell) shown escaped, so a message stays readable.
 * Labels are escaped entirely; a message keeps its own line breaks (a usage hint on a second line) but nothing else.
 */
function escapeControls(s: string, keepNewline: boolean): string {
  return s.replace(/[\u0000-\u001f\u007f]/g, (c) => (keepNewline && c === '\n' ? c : JSON.stringify(c).slice(1, -1)));
}

/** One line for the user: "county.csv:12:4 (row 'Farming', column 'Mining'): negative intermediate flow -3.2". */
export function formatLocated(err: { message: string; location?: Location }): string {
  const where = err.location ? escapeControls(formatLocation(err.location), false) : '';
  // Text quoted from the file ('…') is escaped entirely; only the message's own line breaks, outside quotes, stay.
  const message = err.message.split("'").map((part, k) => escapeControls(part, k % 2 === 0)).join("'");
  return where ? `${where}: ${message}` : message;
}

export function isInputError(e: unknown): e is InputError {
  return e instanceof InputError;
}
