/**
 * The text as a grid of cells (RFC 4180 records and fields), without turning every cell into an object.
 *
 * Files with a quote character are parsed by papaparse (quoted fields, doubled quotes, line breaks inside quotes).
 * Files without one — nearly every large numeric export — take a measured fast path: without quotes an RFC 4180
 * record is exactly one line and a field exactly the text between delimiters, so the grid keeps only the field
 * offsets into the original string and numbers are read from it in place (see numbers.ts `scanPlain`).
 * A papaparse pass over a 36 MB, 2000-sector table plus Number() on each cell took 0.6–1.4 s on the development
 * machine; the offset scan and in-place numbers take a fraction of that (test/bench measures it).
 * Both grids are checked against each other by test/src/table/grid.test.ts.
 */
import Papa from 'papaparse';
import { InputError } from '../diagnostics/index.ts';
import type { Delimiter } from './text.ts';
import { scanPlain } from './numbers.ts';

export interface Grid {
  /** Number of records, blank lines included. */
  readonly rowCount: number;
  width(r: number): number;
  /** Field text, untrimmed ('' beyond the row's width). */
  cell(r: number, c: number): string;
  /** The field as a plain number (see scanPlain), NaN when it needs the general path. */
  plain(r: number, c: number, decimalCode: number): number;
  /** True when every field of the record is empty or spaces. */
  blank(r: number): boolean;
  /** 1-based line in the file where record r starts. */
  line(r: number): number;
}

/** Quote-free text: offsets only. */
class OffsetGrid implements Grid {
  private readonly text: string;
  /** Per record, field boundaries: field c is text[b[c], b[c+1]-1) (the −1 skips the delimiter; the last one is adjusted). */
  private readonly bounds: Int32Array[];
  constructor(text: string, delimiter: Delimiter) {
    this.text = text;
    const lineEnd = text.indexOf('\n') >= 0 ? 10 : 13; // lone CR line ends only when the file has no LF at all
    const bounds: Int32Array[] = [];
    const len = text.length;
    let start = 0;
    const scratch: number[] = [];
    let next = text.indexOf(delimiter);
    while (start < len) {
      let end = text.indexOf(lineEnd === 10 ? '\n' : '\r', start);
      if (end < 0) end = len;
      let stop = end;
      if (lineEnd === 10 && stop > start && text.charCodeAt(stop - 1) === 13) stop--;
      scratch.length = 0;
      scratch.push(start);
      // indexOf is the engine's native search, several times faster than a charCodeAt loop on long lines.
      // `next` is kept across lines so that every character is searched once, also in a file with few delimiters.
      if (next >= 0 && next < start) next = text.indexOf(delimiter, start);
      while (next >= 0 && next < stop) {
        scratch.push(next + 1);
        next = text.indexOf(delimiter, next + 1);
      }
      scratch.push(stop + 1);
      bounds.push(Int32Array.from(scratch));
      start = end + 1;
    }
    this.bounds = bounds;
  }
  get rowCount(): number {
    return this.bounds.length;
  }
  width(r: number): number {
    return this.bounds[r]!.length - 1;
  }
  cell(r: number, c: number): string {
    const b = this.bounds[r]!;
    if (c + 1 >= b.length) return '';
    return this.text.slice(b[c]!, b[c + 1]! - 1);
  }
  plain(r: number, c: number, decimalCode: number): number {
    const b = this.bounds[r]!;
    if (c + 1 >= b.length) return NaN;
    return scanPlain(this.text, b[c]!, b[c + 1]! - 1, decimalCode);
  }
  blank(r: number): boolean {
    const b = this.bounds[r]!;
    const w = b.length - 1;
    for (let c = 0; c < w; c++) if (this.text.slice(b[c]!, b[c + 1]! - 1).trim() !== '') return false;
    return true;
  }
  line(r: number): number {
    return r + 1;
  }
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
