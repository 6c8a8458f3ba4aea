/**
 * The CSV dialect of a file — its delimiter and its decimal mark — decided once, for tables and for the small CSV
 * inputs alike (shock files, employment, groups, totals), and said back to the user: which was chosen, and whether it
 * was given, read from the file or guessed.
 *
 * - An Excel "sep=;" first line (written by spreadsheets to name the delimiter) is honoured and then treated as blank.
 * - Otherwise the delimiter is guessed from the first lines (see `guessDelimiter`).
 * - The decimal mark: comma-separated files use the point (a decimal comma would split the cells). In semicolon- and
 *   tab-separated files the numbers decide when one of them can only be read one way (`markEvidence`): '12,5', '0,010',
 *   ',5', '1.234,5' or '1.234.567' prove a decimal comma; '12.5', '0.010', '.5', '1,234.5' or '1,234,567' prove a
 *   decimal point. A file whose marks are all a 1–3 digit number, one mark and exactly three digits ('12.345', '1,500')
 *   can be read either way (12345 or 12.345): the mark is then guessed — the decimal comma in semicolon files (the
 *   usual reason for choosing ';', where the point groups thousands), the point in tab files — and a warning says how
 *   the numbers were read and how to force the other reading.
 */
import { InputError, type Warning } from '../diagnostics/index.ts';
import type { DecimalMark } from './numbers.ts';
import { checkNotBinary, checkTableSize, stripBom, type Delimiter } from './text.ts';

export type { Delimiter } from './text.ts';

export interface Dialect {
  delimiter: Delimiter;
  /** 'option': given by the caller; 'sep-line': the file's "sep=" first line; 'guessed': from the first lines. */
  delimiterFrom: 'option' | 'sep-line' | 'guessed';
  decimalMark: DecimalMark;
  /**
   * 'option': given by the caller; 'delimiter': a comma-separated file; 'numbers': some number in the file can only
   * be read with this mark; 'guessed': no number decides (a warning is added when some number could be read both ways).
   */
  decimalMarkFrom: 'option' | 'delimiter' | 'numbers' | 'guessed';
  /** One sentence each on how the delimiter and the decimal mark were chosen (shown in the import preview). */
  delimiterNote: string;
  decimalMarkNote: string;
}

export const DELIMITER_NAMES: Readonly<Record<Delimiter, string>> = { ',': 'comma', ';': 'semicolon', '\t': 'tab' };

/** The first lines sampled to guess the delimiter, and the decimal-mark scan's sample of cells shown in messages. */
const SAMPLE_LINES = 50;
export const SAMPLE_CHARS = 1 << 20;

/**
 * An Excel "sep=X" first line (optionally quoted, optionally padded with delimiters). Returns the delimiter it names
 * and the text with that line blanked (its line end kept, so line numbers in messages stay the file's).
 */
export function readSepLine(text: string, fileName: string): { text: string; delimiter: Delimiter | null } {
  const m = /^"?sep=([^\r\n"]?)"?([^\r\n]*)(?=\r\n|\n|\r|$)/i.exec(text);
  if (!m) return { text, delimiter: null };
  const d = m[1]!;
  // Padding after the line is only spaces or more of the same delimiter; anything else is a cell that starts "sep=".
  if ([...m[2]!].some((c) => c !== d && c !== ' ' && c !== '\t')) return { text, delimiter: null };
  if (d !== ',' && d !== ';' && d !== '\t') {
    const shown = d === '' ? 'no character' : `'${d}'`;
    throw new InputError('bad-sep-line', `the first line '${m[0].trim()}' names ${shown} as the delimiter; Roundwise reads comma-, semicolon- or tab-separated files`, { file: fileName, line: 1 });
  }
  return { text: text.slice(m[0].length), delimiter: d };
}

/** Field delimiters outside double quotes on each of the first non-blank lines. */
function delimiterCounts(text: string): { ',': number; ';': number; '\t': number }[] {
  const lines: { ',': number; ';': number; '\t': number }[] = [];
  let cur = { ',': 0, ';': 0, '\t': 0 };
  let inQuotes = false;
  let content = false;
  const end = Math.min(text.length, SAMPLE_CHARS);
  for (let i = 0; i < end && lines.length < SAMPLE_LINES; i++) {
    const ch = text[i]!;
    if (ch === '"') {
      inQuotes = !inQuotes;
      content = true;
    } else if (!inQuotes && (ch === '\n' || ch === '\r')) {
      if (content) lines.push(cur);
      cur = { ',': 0, ';': 0, '\t': 0 };
      content = false;
    } else if (!inQuotes && (ch === ',' || ch === ';' || ch === '\t')) {
      cur[ch]++;
      content = true;
    } else if (ch !== ' ') content = true;
  }
  if (content && lines.length < SAMPLE_LINES) lines.push(cur);
  return lines;
}

/**
 * Guess the delimiter from the first (up to 50) non-blank lines. Candidates are comma, semicolon and tab found on the
 * first line outside quotes. The candidate that splits the most sampled lines into as many fields as the first line
 * wins (a semicolon file whose labels hold commas splits evenly at ';' only); a tie goes to the most frequent on the
 * first line, then comma before semicolon before tab.
 */
export function guessDelimiter(text: string): { delimiter: Delimiter; note: string } {
  const lines = delimiterCounts(text);
  const first = lines[0];
  const all: Delimiter[] = [',', ';', '\t'];
  const candidates = first ? all.filter((d) => first[d] > 0) : [];
  if (candidates.length === 0) return { delimiter: ',', note: 'no comma, semicolon or tab on the first line: read as comma-separated' };
  const even = (d: Delimiter) => lines.filter((l) => l[d] === first![d]).length;
  let best = candidates[0]!;
  for (const d of candidates.slice(1)) {
    const e = even(d);
    const b = even(best);
    if (e > b || (e === b && first![d] > first![best])) best = d;
  }
  const fields = first![best] + 1;
  const agree = even(best);
  const how = lines.length > 1 ? `${agree} of the first ${lines.length} lines have ${fields} fields` : `the first line has ${fields} fields`;
  return { delimiter: best, note: `guessed ${DELIMITER_NAMES[best]}-separated (${how})` };
}

/** What one cell says about the decimal mark. */
type Evidence = { proves: DecimalMark } | { ambiguous: true } | null;

const isDigit = (c: number): boolean => c >= 48 && c <= 57;
/** Spaces, no-break spaces, apostrophes and quotes: grouping or quoting, no evidence either way. */
const isFiller = (c: number): boolean => c === 32 || c === 9 || c === 13 || c === 34 || c === 39 || c === 0xa0 || c === 0x202f;

/**
 * Evidence from the cell text[start, end) (spaces and apostrophes, which only group digits, and quotes are ignored; a
 * sign and an exponent are allowed). Thousands groups have 1–3 digits, not starting with 0, before the first separator
 * and exactly three after each; anything else shows the mark is a decimal mark. Reads char codes in place: a large
 * file with a mark in every cell is scanned without making a string per cell.
 */
function evidenceAt(text: string, start: number, end: number): Evidence {
  let a = start;
  let b = end;
  while (a < b && isFiller(text.charCodeAt(a))) a++;
  while (b > a && isFiller(text.charCodeAt(b - 1))) b--;
  const s0 = text.charCodeAt(a);
  if (s0 === 43 || s0 === 45 || s0 === 0x2212) a++;
  // An exponent at the end: "1.5e3", "2,5E-2".
  let e = b - 1;
  while (e > a && isDigit(text.charCodeAt(e))) e--;
  if (e < b - 1) {
    let m = e;
    const sign = text.charCodeAt(m);
    if ((sign === 43 || sign === 45) && m > a) m--;
    const ch = text.charCodeAt(m);
    if ((ch === 101 || ch === 69) && m > a) b = m;
  }
  if (a >= b || !isDigit(text.charCodeAt(b - 1))) return null;
  let points = 0;
  let commas = 0;
  let lastPoint = -1;
  let lastComma = -1;
  let intDigits = 0; // digits before the first mark
  let firstDigit = -1;
  let fracDigits = 0; // digits after the last mark
  for (let i = a; i < b; i++) {
    const c = text.charCodeAt(i);
    if (isDigit(c)) {
      if (points + commas === 0) {
        if (firstDigit < 0) firstDigit = c;
        intDigits++;
      } else fracDigits++;
    } else if (c === 46) {
      points++;
      lastPoint = i;
      fracDigits = 0;
    } else if (c === 44) {
      commas++;
      lastComma = i;
      fracDigits = 0;
    } else if (c !== 32 && c !== 39 && c !== 0xa0 && c !== 0x202f) return null;
  }
  if (points === 0 && commas === 0) return null;
  if (points > 0 && commas > 0) return { proves: lastPoint > lastComma ? '.' : ',' };
  const mark: DecimalMark = points > 0 ? '.' : ',';
  if (points + commas > 1) return { proves: mark === '.' ? ',' : '.' }; // two separators of one kind: thousands groups
  if (intDigits === 0 || fracDigits !== 3 || intDigits > 3 || firstDigit === 48) return { proves: mark };
  return { ambiguous: true };
}

/** Evidence from one cell's text (see evidenceAt). */
export function markEvidence(cell: string): Evidence {
  return evidenceAt(cell, 0, cell.length);
}

export interface MarkGuess {
  mark: DecimalMark;
  from: Dialect['decimalMarkFrom'];
  note: string;
  /** The first cell that reads both ways when no cell decided: its text, file line and 1-based field. */
  ambiguous: { text: string; line: number; field: number } | null;
}

/** File line and 1-based field of a character offset (counted once, for a message). */
function place(text: string, offset: number, delimiter: string, eol: string): { line: number; field: number } {
  let line = 1;
  for (let i = text.indexOf(eol); i >= 0 && i < offset; i = text.indexOf(eol, i + 1)) line++;
  const lineStart = text.lastIndexOf(eol, offset - 1) + 1;
  let field = 1;
  for (let i = text.indexOf(delimiter, lineStart); i >= 0 && i < offset; i = text.indexOf(delimiter, i + 1)) field++;
  return { line, field };
}

const cellText = (text: string, start: number, end: number): string => text.slice(start, end).trim().replace(/^"|"$/g, '');

/**
 * Decimal mark of a file with the given delimiter (see the file comment). Only cells holding a point or a comma can
 * decide, so the scan jumps from mark to mark (native indexOf) and stops at the first cell that decides.
 */
export function guessDecimalMark(text: string, delimiter: Delimiter): MarkGuess {
  if (delimiter === ',') return { mark: '.', from: 'delimiter', note: 'decimal point (the file is comma-separated)', ambiguous: null };
  const fallback: DecimalMark = delimiter === ';' ? ',' : '.';
  const eol = text.indexOf('\n') >= 0 ? '\n' : '\r'; // lone CR line ends only in a file without LF (as grid.ts)
  let ambiguousAt = -1;
  let ambiguousEnd = -1;
  const len = text.length;
  let nextPoint = text.indexOf('.');
  let nextComma = text.indexOf(',');
  let pos = 0;
  // The line holding the current mark, [lineStart, lineEnd): found once per line, not once per cell.
  let lineStart = 0;
  let lineEnd = -1;
  for (;;) {
    if (nextPoint >= 0 && nextPoint < pos) nextPoint = text.indexOf('.', pos);
    if (nextComma >= 0 && nextComma < pos) nextComma = text.indexOf(',', pos);
    const at = nextPoint < 0 ? nextComma : nextComma < 0 ? nextPoint : Math.min(nextPoint, nextComma);
    if (at < 0) break;
    if (at > lineEnd) {
      lineStart = text.lastIndexOf(eol, at) + 1;
      lineEnd = text.indexOf(eol, at);
      if (lineEnd < 0) lineEnd = len;
    }
    const start = Math.max(text.lastIndexOf(delimiter, at) + 1, lineStart);
    let end = text.indexOf(delimiter, at);
    if (end < 0 || end > lineEnd) end = lineEnd;
    const e = evidenceAt(text, start, end);
    if (e && 'proves' in e) {
      const name = e.proves === ',' ? 'decimal comma' : 'decimal point';
      return { mark: e.proves, from: 'numbers', note: `${name}: '${cellText(text, start, end)}' (line ${place(text, start, delimiter, eol).line}) can only be read with a ${name}`, ambiguous: null };
    }
    if (e && ambiguousAt < 0) {
      ambiguousAt = start;
      ambiguousEnd = end;
    }
    pos = end + 1;
  }
  const name = fallback === ',' ? 'decimal comma' : 'decimal point';
  const why = delimiter === ';' ? 'usual in semicolon-separated files' : 'usual in tab-separated files';
  if (ambiguousAt < 0) return { mark: fallback, from: 'guessed', note: `${name} (${why}; no number in the file has a decimal mark)`, ambiguous: null };
  const ambiguous = { text: cellText(text, ambiguousAt, ambiguousEnd), ...place(text, ambiguousAt, delimiter, eol) };
  return { mark: fallback, from: 'guessed', note: `guessed ${name} (${why}): no number shows which mark is meant, and '${ambiguous.text}' (line ${ambiguous.line}) reads both ways`, ambiguous };
}

/** The number an ambiguous cell becomes with each mark ("12.345" → 12345 or 12.345), for messages. */
function readings(cell: string): { comma: string; point: string } {
  const s = cell.replace(/[\s\u00a0\u202f']/g, '').replace(/^\u2212/, '-');
  const sep = s.search(/[.,]/);
  const asDecimal = String(Number(`${s.slice(0, sep)}.${s.slice(sep + 1)}`));
  const digits = String(Number(s.replace(/[.,]/g, '')));
  return s[sep] === '.' ? { point: asDecimal, comma: digits } : { comma: asDecimal, point: digits };
}

/** How an ambiguous cell was read and what the other reading would give, for messages. */
function ambiguity(g: MarkGuess): { cell: string; sep: string; role: string; value: string; otherValue: string; otherMark: string } {
  const cell = g.ambiguous!.text;
  const r = readings(cell);
  const sep = cell[cell.search(/[.,]/)]!;
  return {
    cell,
    sep,
    role: (sep === '.') === (g.mark === '.') ? 'decimal mark' : 'thousands separator',
    value: g.mark === ',' ? r.comma : r.point,
    otherValue: g.mark === ',' ? r.point : r.comma,
    otherMark: g.mark === ',' ? "'.'" : "','",
  };
}

/** The warning for a guessed decimal mark that changes numbers (null when the guess could not change any). */
export function guessedMarkWarning(g: MarkGuess, fileName: string): Warning | null {
  if (g.from !== 'guessed' || g.ambiguous === null) return null;
  const a = ambiguity(g);
  return {
    code: 'decimal-mark-guessed',
    message:
      `the decimal mark was guessed: no number in the file shows whether '${a.sep}' is a decimal mark or groups thousands, ` +
      `so '${a.sep}' was read as a ${a.role} ('${a.cell}' is ${a.value}); if '${a.cell}' means ${a.otherValue}, import again with the decimal mark ${a.otherMark} ` +
      `(command line: --decimal-mark ${a.otherMark === "'.'" ? 'point' : 'comma'})`,
    location: { file: fileName, line: g.ambiguous.line, column: g.ambiguous.field },
  };
}

/**
 * The refusal for the same case in a small hand-made input (shock, employment, groups, totals), which has no place
 * for a warning: a number that reads two ways is not guessed.
 */
export function ambiguousMarkRefusal(g: MarkGuess, fileName: string): InputError {
  const a = ambiguity(g);
  const r = readings(a.cell);
  const grouped = a.sep === '.' ? r.comma : r.point; // the reading with the separator grouping thousands
  const decimal = (a.sep === '.' ? r.point : r.comma).replace('.', a.sep);
  return new InputError(
    'decimal-mark-ambiguous',
    `'${a.cell}' could be ${grouped} or ${decimal.replace(',', '.')}: no number in the file shows whether '${a.sep}' is a decimal mark or groups thousands; write ${grouped} or ${decimal}, whichever is meant`,
    { file: fileName, line: g.ambiguous!.line, column: g.ambiguous!.field },
  );
}

/**
 * Appended to a refusal about field counts when the delimiter was guessed and `sample` (the offending record, or the
 * header and it) holds another candidate delimiter: what was assumed and how to force the other one. Tables can also
 * be given the delimiter when imported (`table`); small input files only by their "sep=" line.
 */
export function delimiterHint(d: Dialect | null, sample: string, table = false): string {
  if (!d || d.delimiterFrom !== 'guessed') return '';
  const others = ([',', ';', '\t'] as const).filter((x) => x !== d.delimiter && sample.includes(x));
  if (others.length === 0) return '';
  const force = others.map((x) => (x === '\t' ? 'sep= followed by a tab' : `sep=${x}`)).join(' or ');
  const names = others.map((x) => `'${x === '\t' ? 'tab' : x}'`).join(' or ');
  const option = table ? `, or choose the delimiter when importing (command line: --delimiter ${others.map((x) => DELIMITER_NAMES[x]).join(' or ')})` : '';
  return ` (fields were split at each ${DELIMITER_NAMES[d.delimiter]}, the delimiter guessed from the first lines; if the file uses ${names}, make its first line ${force}${option})`;
}

export interface DialectOptions {
  delimiter?: Delimiter | undefined;
  decimalMark?: DecimalMark | undefined;
}

/**
 * The dialect of a file's text (BOM already removed): honours a "sep=" line (returned text has it blanked), then the
 * options, then the guesses above. `guess` is the decimal-mark guess (null when the mark was given).
 */
export function resolveDialect(body: string, opts: DialectOptions, fileName: string): { text: string; dialect: Dialect; guess: MarkGuess | null } {
  const sep = readSepLine(body, fileName);
  const text = sep.text;
  let delimiter: Delimiter;
  let delimiterFrom: Dialect['delimiterFrom'];
  let delimiterNote: string;
  if (opts.delimiter !== undefined) {
    delimiter = opts.delimiter;
    delimiterFrom = 'option';
    delimiterNote = `${DELIMITER_NAMES[delimiter]}-separated (as chosen)`;
  } else if (sep.delimiter !== null) {
    delimiter = sep.delimiter;
    delimiterFrom = 'sep-line';
    delimiterNote = `${DELIMITER_NAMES[delimiter]}-separated (the file's first line says sep=${delimiter === '\t' ? '<tab>' : delimiter})`;
  } else {
    const g = guessDelimiter(text);
    delimiter = g.delimiter;
    delimiterFrom = 'guessed';
    delimiterNote = g.note;
  }
  if (opts.decimalMark !== undefined) {
    const name = opts.decimalMark === ',' ? 'decimal comma' : 'decimal point';
    return { text, dialect: { delimiter, delimiterFrom, delimiterNote, decimalMark: opts.decimalMark, decimalMarkFrom: 'option', decimalMarkNote: `${name} (as chosen)` }, guess: null };
  }
  const g = guessDecimalMark(text, delimiter);
  return { text, dialect: { delimiter, delimiterFrom, delimiterNote, decimalMark: g.mark, decimalMarkFrom: g.from, decimalMarkNote: g.note }, guess: g };
}

/**
 * The common opening of a table-like file (a table, a labelled grid): refused, located, when over the size limit,
 * empty or binary; then its dialect resolved, with the warning for a guessed decimal mark when it was guessed.
 */
export function openTableText(text: string, opts: DialectOptions, file: string): { text: string; dialect: Dialect; guessed: Warning | null } {
  checkTableSize(text.length, file);
  const body = stripBom(text);
  if (!/\S/.test(body)) throw new InputError('empty', 'the file is empty', { file });
  checkNotBinary(body, file);
  const d = resolveDialect(body, opts, file);
  return { text: d.text, dialect: d.dialect, guessed: d.guess ? guessedMarkWarning(d.guess, file) : null };
}
