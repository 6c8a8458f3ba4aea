/**
 * Numbers in table cells. Two paths that give bit-identical results:
 * - `scanPlain` reads a plain decimal (optional sign, digits, one decimal mark, optional exponent) straight from the
 *   text without making a substring. With at most 15 significant digits and a power of ten ≤ 22 it computes
 *   m × 10^k or m / 10^k in one IEEE operation on exact operands, which is correctly rounded and so equals
 *   Number() (Clinger, "How to read floating point numbers accurately", PLDI 1990 — the classic fast path).
 *   Anything else returns NaN and the caller falls back to the general path.
 * - `parseNumberText` handles the rest: surrounding spaces, thousands separators in groups of three (after a first
 *   group of 1–3 digits that does not start with 0), the decimal
 *   comma, a Unicode minus sign; and classifies what cannot be read.
 */

export type DecimalMark = '.' | ',';

const POW10 = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22];

/**
 * The value the last `scanNumber` read. scanNumber returns where it stopped (a small integer) and leaves the number
 * here: a double returned from a function the compiler does not inline is boxed, one heap object per cell — 64 MB of
 * garbage and a dozen young-generation collections for a 2,000-sector table (test/bench).
 */
const scanned = new Float64Array(1);

/** Plain number in s[start, end), or NaN when the cell is not a plain number (or needs the slow path). */
export function scanPlain(s: string, start: number, end: number, decimalCode: number): number {
  return scanNumber(s, start, end, decimalCode) === end ? scanned[0]! : NaN;
}

/**
 * Read fields start.. of one record whose text ends at `stop` (its delimiters are `delimiterCode`) as plain numbers,
 * into out[0..count), in one pass over the characters: the same numbers `scanPlain` reads from each field, NaN where a
 * field is not a plain number (the caller reads those through the general path). Fields the record lacks are NaN.
 * The decimal mark must differ from the delimiter (the dialect never pairs them).
 */
export function scanPlainFields(s: string, start: number, stop: number, delimiterCode: number, decimalCode: number, out: Float64Array, count: number): void {
  let p = start;
  let c = 0;
  for (; c < count && p <= stop; c++) {
    // The common field, [sign] digits [mark digits] up to the delimiter, read here with scanNumber's own arithmetic
    // (the same digits into m, the same scale, the same one operation): no call per cell. Anything else (an
    // exponent, a 16th significant digit, no digit, other characters) is read again by scanNumber from the start.
    let q = p;
    let ch = q < stop ? s.charCodeAt(q) : -1;
    let neg = false;
    if (ch === 45 /* - */ || ch === 43 /* + */) {
      neg = ch === 45;
      ch = ++q < stop ? s.charCodeAt(q) : -1;
    }
    let m = 0;
    let sig = 0;
    let scale = 0;
    let anyDigit = false;
    let common = true;
    while (ch >= 48 && ch <= 57) {
      anyDigit = true;
      if (m !== 0 || ch !== 48) {
        if (sig >= 15) { common = false; break; }
        m = m * 10 + (ch - 48);
        sig++;
      }
      ch = ++q < stop ? s.charCodeAt(q) : -1;
    }
    if (common && ch === decimalCode) {
      ch = ++q < stop ? s.charCodeAt(q) : -1;
      while (ch >= 48 && ch <= 57) {
        anyDigit = true;
        if (m !== 0 || ch !== 48) {
          if (sig >= 15) { common = false; break; }
          m = m * 10 + (ch - 48);
          sig++;
        }
        scale--;
        ch = ++q < stop ? s.charCodeAt(q) : -1;
      }
    }
    if (common && anyDigit && scale >= -22 && (q >= stop || ch === delimiterCode)) {
      const v = m === 0 ? 0 : scale === 0 ? m : m / POW10[-scale]!;
      out[c] = neg ? -v : v;
      p = q + 1;
      continue;
    }
    const at = scanNumber(s, p, stop, decimalCode);
    if (at === stop || s.charCodeAt(at) === delimiterCode) {
      out[c] = scanned[0]!;
      p = at + 1;
    } else {
      // Not a plain number: the field runs to the next delimiter.
      out[c] = NaN;
      const next = s.indexOf(String.fromCharCode(delimiterCode), at);
      p = next < 0 || next > stop ? stop + 1 : next + 1;
    }
  }
  for (; c < count; c++) out[c] = NaN;
}

/**
 * `scanPlainFields` over the bytes of a file that is plain ASCII (bytes.ts: each byte one character, so offsets are
 * the text's): the same fast loop with the same arithmetic, so the same numbers bit for bit; a field it does not read
 * (an exponent, a 16th significant digit, anything else) is decoded on its own and read by `scanPlain`, which is
 * what the text version's fallback computes for it (a number never runs over a delimiter: the dialect never makes the
 * decimal mark the delimiter). A copy rather than one function for both: V8 compiles the loop for one kind of input.
 */
export function scanPlainFieldsBytes(s: Uint8Array, start: number, stop: number, delimiterCode: number, decimalCode: number, out: Float64Array, count: number): void {
  let p = start;
  let c = 0;
  for (; c < count && p <= stop; c++) {
    let q = p;
    let ch = q < stop ? s[q]! : -1;
    let neg = false;
    if (ch === 45 /* - */ || ch === 43 /* + */) {
      neg = ch === 45;
      ch = ++q < stop ? s[q]! : -1;
    }
    let m = 0;
    let sig = 0;
    let scale = 0;
    let anyDigit = false;
    let common = true;
    while (ch >= 48 && ch <= 57) {
      anyDigit = true;
      if (m !== 0 || ch !== 48) {
        if (sig >= 15) { common = false; break; }
        m = m * 10 + (ch - 48);
        sig++;
      }
      ch = ++q < stop ? s[q]! : -1;
    }
    if (common && ch === decimalCode) {
      ch = ++q < stop ? s[q]! : -1;
      while (ch >= 48 && ch <= 57) {
        anyDigit = true;
        if (m !== 0 || ch !== 48) {
          if (sig >= 15) { common = false; break; }
          m = m * 10 + (ch - 48);
          sig++;
        }
        scale--;
        ch = ++q < stop ? s[q]! : -1;
      }
    }
    if (common && anyDigit && scale >= -22 && (q >= stop || ch === delimiterCode)) {
      const v = m === 0 ? 0 : scale === 0 ? m : m / POW10[-scale]!;
      out[c] = neg ? -v : v;
      p = q + 1;
      continue;
    }
    let end = q;
    while (end < stop && s[end] !== delimiterCode) end++;
    out[c] = scanPlainBytes(s, p, end, decimalCode);
    p = end + 1;
  }
  for (; c < count; c++) out[c] = NaN;
}

const asciiText = new TextDecoder('utf-8');

/** `scanPlain` of the ASCII bytes s[start, end). */
export function scanPlainBytes(s: Uint8Array, start: number, end: number, decimalCode: number): number {
  const cell = asciiText.decode(s.subarray(start, end));
  return scanPlain(cell, 0, cell.length, decimalCode);
}

/** Read the number at s[start..) as far as it is a plain number (at most `end`) into `scanned` (NaN when it is none); returns where it stopped. */
function scanNumber(s: string, start: number, end: number, decimalCode: number): number {
  let p = start;
  scanned[0] = NaN;
  if (p >= end) return p;
  let neg = false;
  let c = s.charCodeAt(p);
  if (c === 45 /* - */ || c === 43 /* + */) {
    neg = c === 45;
    if (++p >= end) return p;
  }
  let m = 0;
  let sig = 0; // significant digits accumulated into m
  let anyDigit = false;
  let scale = 0; // power of ten to apply to m
  // integer part
  while (p < end) {
    c = s.charCodeAt(p);
    if (c < 48 || c > 57) break;
    anyDigit = true;
    if (m !== 0 || c !== 48) {
      if (sig >= 15) return p;
      m = m * 10 + (c - 48);
      sig++;
    }
    p++;
  }
  if (p < end && c === decimalCode) {
    p++;
    while (p < end) {
      c = s.charCodeAt(p);
      if (c < 48 || c > 57) break;
      anyDigit = true;
      if (m !== 0 || c !== 48) {
        if (sig >= 15) return p;
        m = m * 10 + (c - 48);
        sig++;
      }
      scale--;
      p++;
    }
  }
  if (!anyDigit) return p;
  if (p < end && (c === 101 || c === 69) /* e E */) {
    p++;
    if (p >= end) return p;
    let eneg = false;
    c = s.charCodeAt(p);
    if (c === 45 || c === 43) {
      eneg = c === 45;
      p++;
    }
    let e = 0;
    let eDigits = 0;
    while (p < end) {
      c = s.charCodeAt(p);
      if (c < 48 || c > 57) break;
      e = e * 10 + (c - 48);
      if (++eDigits > 4) return p;
      p++;
    }
    if (eDigits === 0) return p;
    scale += eneg ? -e : e;
  }
  let v: number;
  if (m === 0) v = 0;
  else if (scale === 0) v = m;
  else if (scale > 0 && scale <= 22) v = m * POW10[scale]!;
  else if (scale < 0 && scale >= -22) v = m / POW10[-scale]!;
  else return p;
  scanned[0] = neg ? -v : v;
  return p;
}

export type NumberProblem = 'blank' | 'non-numeric' | 'not-finite' | 'overflow';

export interface ParsedNumber {
  value: number;
  problem: NumberProblem | null;
}

const SPACES = /^[\s\u00a0\u202f]+|[\s\u00a0\u202f]+$/g;
// ∞ written as an escape: the CLI bundle is kept ASCII (src/cli/bundle.mjs).
const NOT_FINITE = /^[+-]?(nan|inf|infinity|\u221e)$/i;

/** Group separators allowed with each decimal mark (the other mark, spaces, apostrophe). */
function groupPattern(decimal: DecimalMark): RegExp {
  const sep = decimal === '.' ? "[, \\u00a0\\u202f']" : "[. \\u00a0\\u202f']";
  const dec = decimal === '.' ? '\\.' : ',';
  // Either plain digits, or 1–3 digits (not starting with 0: '0.010' is no thousands grouping) followed by groups of
  // three joined by one separator kind.
  return new RegExp(`^(\\d+|[1-9]\\d{0,2}(${sep})\\d{3}(?:\\2\\d{3})*)(?:${dec}(\\d*))?(?:[eE]([+-]?\\d+))?$|^${dec}(\\d+)(?:[eE]([+-]?\\d+))?$`);
}

const GROUPED: Record<DecimalMark, RegExp> = { '.': groupPattern('.'), ',': groupPattern(',') };

/** The general path: read a cell's text as a number with the file's decimal mark. */
export function parseNumberText(raw: string, decimal: DecimalMark): ParsedNumber {
  const s = raw.replace(SPACES, '');
  if (s === '') return { value: 0, problem: 'blank' };
  let body = s;
  let neg = false;
  const c0 = body.charCodeAt(0);
  if (c0 === 45 || c0 === 43 || c0 === 0x2212) {
    neg = c0 !== 43;
    body = body.slice(1);
  }
  if (NOT_FINITE.test(s)) return { value: NaN, problem: 'not-finite' };
  const m = GROUPED[decimal].exec(body);
  if (!m) return { value: NaN, problem: 'non-numeric' };
  let normal: string;
  if (m[1] !== undefined) {
    const intPart = m[1].replace(/[^0-9]/g, '');
    normal = intPart + (m[3] !== undefined && m[3] !== '' ? '.' + m[3] : '') + (m[4] !== undefined ? 'e' + m[4] : '');
  } else {
    normal = '0.' + m[5]! + (m[6] !== undefined ? 'e' + m[6] : '');
  }
  const v = Number(normal);
  if (!Number.isFinite(v)) return { value: NaN, problem: 'overflow' };
  return { value: neg ? -v : v, problem: null };
}

/** A number for a message: short, never "NaN". */
export function showNumber(v: number): string {
  if (!Number.isFinite(v)) return String(v);
  return Math.abs(v) >= 1e-4 && Math.abs(v) < 1e15 ? String(Number(v.toPrecision(10))) : v.toExponential(4);
}
