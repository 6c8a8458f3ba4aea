/**
 * What the raw text is before any cell is read: its size, byte-order mark and whether it is text at all.
 * Its delimiter and decimal mark are dialect.ts's.
 */
import { InputError } from '../diagnostics/index.ts';
import { fileTooLarge, MAX_OPEN_BYTES } from '../bridge/files.ts';

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

export const SAMPLE = 64 * 1024;

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
