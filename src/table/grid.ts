/**
 * The text as a grid of cells (RFC 4180 records and fields), without turning every cell into an object.
 *
 * Files with a quote character are parsed by papaparse (quoted fields, doubled quotes, line breaks inside quotes).
 * Files without one — nearly every large numeric export — take a measured fast path: without quotes an RFC 4180
 * record is exactly one line and a field exactly the text between delimiters, so the grid keeps only where each line
 * starts and ends, finds a record's fields when it is first asked for them, and reads a record's numbers in one pass
 * over its characters (numbers.ts `scanPlainFields`, the same numbers `scanPlain` reads field by field).
 * A papaparse pass over a 36 MB, 2000-sector table plus Number() on each cell took 0.6–1.4 s on the development
 * machine; keeping every field's offsets cost 16 MB at 2,000 sectors and a second pass over the text; the one-pass
 * read takes a fraction of either (test/bench measures it).
 * Both grids are checked against each other by test/src/table/grid.test.ts.
 */
import Papa from 'papaparse';
import { InputError } from '../diagnostics/index.ts';
import type { Delimiter } from './text.ts';
import { scanPlain, scanPlainBytes, scanPlainFields, scanPlainFieldsBytes } from './numbers.ts';

export interface Grid {
  /** Number of records, blank lines included. */
  readonly rowCount: number;
  width(r: number): number;
  /** Field text, untrimmed ('' beyond the row's width). */
  cell(r: number, c: number): string;
  /** The field as a plain number (see scanPlain), NaN when it needs the general path. */
  plain(r: number, c: number, decimalCode: number): number;
  /** out[c] = plain(r, c, decimalCode) for every c < out.length (NaN beyond the record's width). */
  plainRow(r: number, decimalCode: number, out: Float64Array): void;
  /** True when every field of the record is empty or spaces. */
  blank(r: number): boolean;
  /** 1-based line in the file where record r starts. */
  line(r: number): number;
}

/** Rows whose field offsets are kept at a time (readers go through a record's fields, then on to the next). */
const CACHED_ROWS = 4;

/** Is the character white space as String.prototype.trim sees it (ECMAScript WhiteSpace and LineTerminator)? */
function isTrimSpace(c: number): boolean {
  return c === 32 || (c >= 9 && c <= 13) || c === 0xa0 || c === 0x1680 || (c >= 0x2000 && c <= 0x200a) || c === 0x2028 || c === 0x2029 || c === 0x202f || c === 0x205f || c === 0x3000 || c === 0xfeff;
}

/**
 * A copy of a slice of the file's text that does not keep the text alive. JavaScript engines may represent a slice
 * as a view of the string it was cut from (V8 does from 13 characters), so one kept label — a sector's name — would
 * keep the whole decoded file in memory (21 MB at 2,000 sectors) for as long as the table lives. Joining it to
 * a space and cutting that off again makes the engine copy the characters into a string of their own.
 */
function detached(s: string): string {
  return (' ' + s).slice(1);
}

/** Quote-free text: line offsets, and field offsets of the few records being read. */
class OffsetGrid implements Grid {
  private readonly text: string;
  private readonly delimiter: Delimiter;
  private readonly delimiterCode: number;
  /** Record r is text[starts[r], stops[r]) (a CR before the LF excluded). */
  private readonly starts: Int32Array;
  private readonly stops: Int32Array;
  private readonly widths: Int32Array;
  /** Field boundaries of recently read records: field c is text[b[c], b[c+1]-1). */
  private readonly cachedRow = new Int32Array(CACHED_ROWS).fill(-1);
  private readonly cachedBounds: Int32Array[] = [];
  private nextSlot = 0;
  constructor(text: string, delimiter: Delimiter) {
    this.text = text;
    this.delimiter = delimiter;
    this.delimiterCode = delimiter.charCodeAt(0);
    const lf = text.indexOf('\n') >= 0; // lone CR line ends only when the file has no LF at all
    const end = lf ? '\n' : '\r';
    let count = 0;
    for (let p = text.indexOf(end); p >= 0; p = text.indexOf(end, p + 1)) count++;
    const len = text.length;
    const rows = count + (len > 0 && text.charCodeAt(len - 1) !== end.charCodeAt(0) ? 1 : 0);
    this.starts = new Int32Array(rows);
    this.stops = new Int32Array(rows);
    let start = 0;
    for (let r = 0; r < rows; r++) {
      let e = text.indexOf(end, start);
      if (e < 0) e = len;
      let stop = e;
      if (lf && stop > start && text.charCodeAt(stop - 1) === 13) stop--;
      this.starts[r] = start;
      this.stops[r] = stop;
      start = e + 1;
    }
    this.widths = new Int32Array(rows).fill(-1);
  }
  get rowCount(): number {
    return this.starts.length;
  }
  width(r: number): number {
    let w = this.widths[r]!;
    if (w < 0) {
      const stop = this.stops[r]!;
      w = 1;
      for (let p = this.text.indexOf(this.delimiter, this.starts[r]!); p >= 0 && p < stop; p = this.text.indexOf(this.delimiter, p + 1)) w++;
      this.widths[r] = w;
    }
    return w;
  }
  private bounds(r: number): Int32Array {
    for (let k = 0; k < CACHED_ROWS; k++) if (this.cachedRow[k] === r) return this.cachedBounds[k]!;
    const w = this.width(r);
    const slot = this.nextSlot;
    this.nextSlot = (slot + 1) % CACHED_ROWS;
    let b = this.cachedBounds[slot];
    if (!b || b.length < w + 1) b = this.cachedBounds[slot] = new Int32Array(Math.max(w + 1, 2 * (b?.length ?? 0)));
    const stop = this.stops[r]!;
    b[0] = this.starts[r]!;
    let c = 1;
    for (let p = this.text.indexOf(this.delimiter, b[0]); p >= 0 && p < stop; p = this.text.indexOf(this.delimiter, p + 1)) b[c++] = p + 1;
    b[c] = stop + 1;
    this.cachedRow[slot] = r;
    return b;
  }
  cell(r: number, c: number): string {
    if (c >= this.width(r)) return '';
    if (c === 0) {
      const start = this.starts[r]!, stop = this.stops[r]!;
      const d = this.text.indexOf(this.delimiter, start);
      return detached(this.text.slice(start, d >= 0 && d < stop ? d : stop));
    }
    const b = this.bounds(r);
    return detached(this.text.slice(b[c]!, b[c + 1]! - 1));
  }
  plain(r: number, c: number, decimalCode: number): number {
    if (c >= this.width(r)) return NaN;
    const b = this.bounds(r);
    return scanPlain(this.text, b[c]!, b[c + 1]! - 1, decimalCode);
  }
  plainRow(r: number, decimalCode: number, out: Float64Array): void {
    if (decimalCode === this.delimiterCode) {
      for (let c = 0; c < out.length; c++) out[c] = this.plain(r, c, decimalCode);
      return;
    }
    scanPlainFields(this.text, this.starts[r]!, this.stops[r]!, this.delimiterCode, decimalCode, out, Math.min(out.length, this.width(r)));
    out.fill(NaN, Math.min(out.length, this.width(r)));
  }
  blank(r: number): boolean {
    const stop = this.stops[r]!;
    for (let p = this.starts[r]!; p < stop; p++) {
      const ch = this.text.charCodeAt(p);
      if (ch !== this.delimiterCode && !isTrimSpace(ch)) return false;
    }
    return true;
  }
  line(r: number): number {
    return r + 1;
  }
}

/**
 * OffsetGrid over the bytes of a file that is plain ASCII without quotes (bytes.ts decides): each byte is one
 * character of the text, so every offset, line, field and cell is OffsetGrid's for the decoded text, and the file need
 * not be decoded (21 MB of fresh memory at 2,000 sectors, the file's size again). Cells are decoded when asked for.
 */
export class ByteGrid implements Grid {
  private readonly bytes: Uint8Array;
  private readonly delimiterCode: number;
  private readonly starts: Int32Array;
  private readonly stops: Int32Array;
  private readonly widths: Int32Array;
  private readonly words: ByteWords;
  private readonly cachedRow = new Int32Array(CACHED_ROWS).fill(-1);
  private readonly cachedBounds: Int32Array[] = [];
  private nextSlot = 0;
  /** `bytes` must hold a line feed (bytes.ts: a file without one is read as text). */
  constructor(bytes: Uint8Array, delimiter: Delimiter) {
    this.bytes = bytes;
    this.delimiterCode = delimiter.charCodeAt(0);
    let count = 0;
    for (let p = bytes.indexOf(10); p >= 0; p = bytes.indexOf(10, p + 1)) count++;
    const len = bytes.length;
    const rows = count + (len > 0 && bytes[len - 1] !== 10 ? 1 : 0);
    this.starts = new Int32Array(rows);
    this.stops = new Int32Array(rows);
    let start = 0;
    for (let r = 0; r < rows; r++) {
      let e = bytes.indexOf(10, start);
      if (e < 0) e = len;
      let stop = e;
      if (stop > start && bytes[stop - 1] === 13) stop--;
      this.starts[r] = start;
      this.stops[r] = stop;
      start = e + 1;
    }
    this.widths = new Int32Array(rows).fill(-1);
    this.words = byteWords(bytes);
  }
  get rowCount(): number {
    return this.starts.length;
  }
  width(r: number): number {
    let w = this.widths[r]!;
    if (w < 0) {
      const stop = this.stops[r]!;
      w = 1 + countByte(this.bytes, this.words, this.delimiterCode, this.starts[r]!, stop);
      this.widths[r] = w;
    }
    return w;
  }
  private bounds(r: number): Int32Array {
    for (let k = 0; k < CACHED_ROWS; k++) if (this.cachedRow[k] === r) return this.cachedBounds[k]!;
    const w = this.width(r);
    const slot = this.nextSlot;
    this.nextSlot = (slot + 1) % CACHED_ROWS;
    let b = this.cachedBounds[slot];
    if (!b || b.length < w + 1) b = this.cachedBounds[slot] = new Int32Array(Math.max(w + 1, 2 * (b?.length ?? 0)));
    const stop = this.stops[r]!;
    b[0] = this.starts[r]!;
    let c = 1;
    const bytes = this.bytes, d = this.delimiterCode;
    for (let p = b[0]; p < stop; p++) if (bytes[p] === d) b[c++] = p + 1;
    b[c] = stop + 1;
    this.cachedRow[slot] = r;
    return b;
  }
  cell(r: number, c: number): string {
    if (c >= this.width(r)) return '';
    if (c === 0) {
      const start = this.starts[r]!, stop = this.stops[r]!;
      let d = start;
      while (d < stop && this.bytes[d] !== this.delimiterCode) d++;
      return asciiText.decode(this.bytes.subarray(start, d));
    }
    const b = this.bounds(r);
    return asciiText.decode(this.bytes.subarray(b[c]!, b[c + 1]! - 1));
  }
  plain(r: number, c: number, decimalCode: number): number {
    if (c >= this.width(r)) return NaN;
    const b = this.bounds(r);
    return scanPlainBytes(this.bytes, b[c]!, b[c + 1]! - 1, decimalCode);
  }
  plainRow(r: number, decimalCode: number, out: Float64Array): void {
    if (decimalCode === this.delimiterCode) {
      for (let c = 0; c < out.length; c++) out[c] = this.plain(r, c, decimalCode);
      return;
    }
    scanPlainFieldsBytes(this.bytes, this.starts[r]!, this.stops[r]!, this.delimiterCode, decimalCode, out, Math.min(out.length, this.width(r)));
    out.fill(NaN, Math.min(out.length, this.width(r)));
  }
  blank(r: number): boolean {
    const stop = this.stops[r]!;
    for (let p = this.starts[r]!; p < stop; p++) {
      const ch = this.bytes[p]!;
      if (ch !== this.delimiterCode && !isTrimSpace(ch)) return false;
    }
    return true;
  }
  line(r: number): number {
    return r + 1;
  }
}

const asciiText = new TextDecoder('utf-8');

/** `bytes` as whole aligned 32-bit words where it has them: word w holds bytes[4w − lead, 4w − lead + 4). */
export interface ByteWords {
  words: Uint32Array;
  /** Bytes before the first whole word (0–3). */
  lead: number;
}

export function byteWords(bytes: Uint8Array): ByteWords {
  const lead = (4 - (bytes.byteOffset & 3)) & 3;
  const count = Math.max(0, (bytes.length - lead) >> 2);
  return { words: count > 0 ? new Uint32Array(bytes.buffer, bytes.byteOffset + lead, count) : new Uint32Array(0), lead };
}

/**
 * How many bytes in bytes[from, to) equal `code`: four at a time in whole words (a byte b of w ^ (code·0x01010101)
 * is zero exactly when ((b & 0x7f) + 0x7f | b) has its high bit clear; the usual exact zero-byte test, Warren,
 * Hacker's Delight 2nd ed. 2013, §6-1, recalled from memory), the ends byte by byte. Not indexOf: a typed array's
 * indexOf is a call into the runtime, and a record of 2,000 fields took 2,000 of them. Byte by byte it took 45–58 ms
 * over a 2,000-sector file.
 */
export function countByte(bytes: Uint8Array, bw: ByteWords, code: number, from: number, to: number): number {
  let k = 0;
  let p = from;
  for (; p < to && ((p - bw.lead) & 3) !== 0; p++) if (bytes[p] === code) k++;
  const words = bw.words;
  const pattern = Math.imul(code, 0x01010101);
  const wEnd = Math.min(words.length, (to - bw.lead) >> 2);
  for (let w = (p - bw.lead) >> 2; w < wEnd; w++, p += 4) {
    const x = words[w]! ^ pattern;
    const zeros = ~((((x & 0x7f7f7f7f) + 0x7f7f7f7f) | x) | 0x7f7f7f7f);
    k += Math.imul(zeros >>> 7, 0x01010101) >>> 24;
  }
  for (; p < to; p++) if (bytes[p] === code) k++;
  return k;
}

/** Quoted text: papaparse records as string arrays; record start lines found by a quote-aware scan when first asked. */
class PapaGrid implements Grid {
  private readonly rows: string[][];
  private readonly text: string;
  private starts: number[] | null = null;
  constructor(text: string, rows: string[][]) {
    this.text = text;
    this.rows = rows;
  }
  get rowCount(): number {
    return this.rows.length;
  }
  width(r: number): number {
    return this.rows[r]!.length;
  }
  cell(r: number, c: number): string {
    return this.rows[r]![c] ?? '';
  }
  plain(r: number, c: number, decimalCode: number): number {
    const s = this.rows[r]![c];
    return s === undefined ? NaN : scanPlain(s, 0, s.length, decimalCode);
  }
  plainRow(r: number, decimalCode: number, out: Float64Array): void {
    for (let c = 0; c < out.length; c++) out[c] = this.plain(r, c, decimalCode);
  }
  blank(r: number): boolean {
    return this.rows[r]!.every((s) => s.trim() === '');
  }
  line(r: number): number {
    if (!this.starts) this.starts = recordStartLines(this.text);
    return this.starts[r] ?? this.starts[this.starts.length - 1] ?? 1;
  }
}

/** Line on which each record starts: line ends (LF, or CR in a file without LF) outside double quotes end a record. */
export function recordStartLines(text: string): number[] {
  const end = text.indexOf('\n') >= 0 ? 10 : 13;
  const starts = [1];
  let line = 1;
  let inQuotes = false;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 34) inQuotes = !inQuotes;
    else if (c === end) {
      line++;
      if (!inQuotes) starts.push(line);
    }
  }
  return starts;
}

export function buildGrid(source: string, delimiter: Delimiter, fileName: string, forcePapa = false): Grid {
  if (!forcePapa && source.indexOf('"') < 0) {
    return new OffsetGrid(source, delimiter);
  }
  // papaparse is told the line end rather than left to guess, with the fast grid's rule: LF ends a record (a CR
  // before it is dropped), a lone CR is text — except in a file with no LF at all, where CR ends records. Line ends
  // inside quotes are cell text and are left alone (spreadsheets put LF inside cells of CRLF files). When CRLF and
  // LF both end records, CRLF is made LF first; the count of lines is unchanged, so locations still hold.
  const ends = recordEnds(source);
  let text = source;
  let newline: '\r\n' | '\n' | '\r';
  if (ends.crlf > 0 && ends.lf > 0) {
    text = source.replace(/\r\n/g, '\n');
    newline = '\n';
  } else newline = ends.crlf > 0 ? '\r\n' : ends.lf > 0 ? '\n' : ends.cr > 0 ? '\r' : '\n';
  const res = papa(text, delimiter, newline);
  // A final line break yields one empty record at the end; drop it so both grids agree.
  const rows = res.data;
  const last = rows[rows.length - 1];
  if (rows.length > 1 && last && last.length === 1 && last[0] === '' && /[\r\n]$/.test(text)) rows.pop();
  const grid = new PapaGrid(text, rows);
  const bad = res.errors.find((e) => e.type === 'Quotes');
  if (bad) {
    const r = typeof bad.row === 'number' ? bad.row : 0;
    throw new InputError('bad-quotes', 'a quoted cell is not closed or a quote is misplaced (RFC 4180 §2)', { file: fileName, line: grid.line(r) });
  }
  return grid;
}

function papa(text: string, delimiter: Delimiter, newline: '\r\n' | '\n' | '\r'): Papa.ParseResult<string[]> {
  return Papa.parse<string[]>(text, { delimiter, newline, quoteChar: '"', escapeChar: '"', skipEmptyLines: false, header: false, dynamicTyping: false });
}

/** Line ends outside double quotes, by kind. */
function recordEnds(text: string): { crlf: number; lf: number; cr: number } {
  let crlf = 0;
  let lf = 0;
  let cr = 0;
  let inQuotes = false;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 34) inQuotes = !inQuotes;
    else if (inQuotes) continue;
    else if (c === 10) lf++;
    else if (c === 13) {
      if (text.charCodeAt(i + 1) === 10) {
        crlf++;
        i++;
      } else cr++;
    }
  }
  return { crlf, lf, cr };
}
