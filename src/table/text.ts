/**
 * What the raw text is before any cell is read: its size, byte-order mark, whether it is text at all,
 * its delimiter and its decimal mark.
 */
import { InputError } from '../diagnostics/index.ts';
import { fileTooLarge, MAX_OPEN_BYTES } from '../bridge/files.ts';
import type { DecimalMark } from './numbers.ts';

/** Largest table accepted, refused before parsing: the product's one file-size limit (200 MiB). */
export const MAX_TABLE_BYTES = MAX_OPEN_BYTES;

export type Delimiter = ',' | ';' | '\t';

/** Refuse a file by its size before reading or parsing it (UI and CLI call this with the byte size). */
export function checkTableSize(bytes: number, fileName: string): void {
  if (bytes > MAX_TABLE_BYTES) throw fileTooLarge(bytes, fileName, 'it was not imported');
}

/** The UTF-8 byte-order mark decodes to U+FEFF at the start of the text (Unicode Standard §23.8); it is not part of the first label. */
export function stripBom(text: string): string {
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}

/** Line and column (1-based, in characters) of a character offset. */
export function lineColumnAt(text: string, offset: number): { line: number; column: number } {
  let line = 1;
  let lineStart = 0;
  for (let i = text.indexOf('\n'); i >= 0 && i < offset; i = text.indexOf('\n', i + 1)) {
    line++;
    lineStart = i + 1;
  }
  return { line, column: offset - lineStart + 1 };
}

const SAMPLE = 64 * 1024;

/**
 * Binary content: any NUL character, or more than 1 % control characters (other than tab, line ends and form feed)
 * or U+FFFD replacement characters (bytes that were not UTF-8) among the first 64 Ki characters.
 */
export function checkNotBinary(text: string, fileName: string): void {
  // UTF-16 ("Unicode text" exports) read as UTF-8: the byte-order mark FF FE or FE FF becomes two U+FFFD, and every
  // ASCII character comes with a NUL beside it. Say so rather than call the file binary.
  if (/^(\ufffd\ufffd)?(?:(?:[^\u0000]\u0000){4}|(?:\u0000[^\u0000]){4})/.test(text)) {
    throw new InputError('utf16', 'the file is UTF-16 text; save it as UTF-8 (in a spreadsheet: "CSV UTF-8")', { file: fileName });
  }
  const nul = text.indexOf('\u0000');
  if (nul >= 0) throw new InputError('binary', 'the file holds binary data (NUL bytes), not CSV text', { file: fileName, ...lineColumnAt(text, nul) });
  const n = Math.min(text.length, SAMPLE);
  let odd = 0;
  for (let i = 0; i < n; i++) {
    const c = text.charCodeAt(i);
    if ((c < 32 && c !== 9 && c !== 10 && c !== 13 && c !== 12) || c === 0x7f || c === 0xfffd) odd++;
  }
  if (odd > 0.01 * n) throw new InputError('binary', 'the file looks like binary data, not CSV text', { file: fileName });
}

/** Delimiter of the first non-blank line: the most frequent of comma, semicolon and tab outside quotes (ties go to comma, then semicolon). */
export function detectDelimiter(text: string): Delimiter {
  const counts = { ',': 0, ';': 0, '\t': 0 };
  let inQuotes = false;
  let seen = false;
  for (let i = 0; i < text.length; i++) {
    const ch = text[i]!;
    if (ch === '"') inQuotes = !inQuotes;
    else if (!inQuotes && (ch === '\n' || ch === '\r')) {
      if (seen) break;
    } else if (!inQuotes && (ch === ',' || ch === ';' || ch === '\t')) {
      counts[ch]++;
      seen = true;
    } else if (ch.trim() !== '') seen = true;
  }
  if (counts['\t'] > counts[','] && counts['\t'] > counts[';']) return '\t';
  if (counts[';'] > counts[',']) return ';';
  return ',';
}

/**
 * Decimal mark. Comma-delimited and tab-delimited files use a point. Semicolon-delimited files use the decimal comma
 * (the usual reason for choosing ';'), unless no comma stands between digits anywhere (commas in labels do not count)
 * and some point is followed by other than a group of exactly three digits — then the points can only be decimal points.
 */
export function detectDecimalMark(text: string, delimiter: Delimiter): DecimalMark {
  if (delimiter !== ';') return '.';
  if (/\d,\d/.test(text)) return ',';
  const re = /\d\.(\d*)/g;
  let m: RegExpExecArray | null;
  while ((m = re.exec(text)) !== null) {
    if (m[1]!.length !== 3) return '.';
    const next = text[m.index + 2 + m[1]!.length];
    if (next !== undefined && next >= '0' && next <= '9') return '.';
  }
  return ',';
}
