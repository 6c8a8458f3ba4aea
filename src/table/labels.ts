/**
 * Row and column labels as the importer keeps them and as it matches them.
 *
 * A label is kept in Unicode normalisation form C (Unicode Standard Annex #15), without invisible format and control
 * characters (general categories Cf and Cc: zero-width space U+200B, zero-width joiners, soft hyphen, byte-order mark,
 * bidirectional controls, NUL …), with every run of white space (line breaks and no-break spaces included) made one
 * space, and trimmed. So "Café" typed as e + combining accent, or "Trade" with a zero-width space pasted from a web
 * page, is the same label as the plain spelling, and the sector keeps a name a shock file can spell.
 *
 * A trailing " (sector)" remark marks a label as a sector whatever its words (the remark is not part of the name):
 * the table writer uses it for sectors whose names the role rules would otherwise read as something else
 * ("Import services", a group called "Households and personal services").
 */
import { unescapeFormulaLead } from '../csv/index.ts';

const INVISIBLE = /[\p{Cf}\p{Cc}]/gu;
const SPACES = /[\t\n\v\f\r \u0085\u00a0\u1680\u2000-\u200a\u2028\u2029\u202f\u205f\u3000]+/g;

/**
 * Printable ASCII words separated by single spaces — nearly every label — which normaliseText returns as they are
 * (ASCII is its own NFC; no Cf or Cc character, no run of white space, nothing to trim): tested first, as the full
 * form costs about 20 µs a label, 80 ms for the 4,000 labels of a 2,000-sector table.
 */
const PLAIN = /^[!-~]+(?: [!-~]+)*$/;

/** NFC, invisible characters removed, white-space runs made one space, trimmed. (U+FEFF is invisible, not a space, as in JavaScript's \s.) */
export function normaliseText(s: string): string {
  if (PLAIN.test(s)) return s;
  // White space first (tabs and line breaks are Cc, and must separate words rather than vanish).
  return s.normalize('NFC').replace(SPACES, ' ').replace(INVISIBLE, '').replace(SPACES, ' ').trim();
}

/**
 * A label as kept: normalised (above), and without the leading apostrophe that CSV-injection escaping puts before a
 * formula-leading character (src/csv/write.ts, which also undoes it).
 */
export function cleanLabel(s: string): string {
  return unescapeFormulaLead(normaliseText(s));
}

/**
 * Key for matching a row label to a column label, and for duplicates: after cleanLabel, case does not count (Unicode
 * default case folding approximated by toLowerCase), so a column "Real Estate" meets the row "Real estate" (the
 * sector keeps the row's spelling).
 */
export function matchKey(label: string): string {
  return cleanLabel(label).toLowerCase();
}

const SECTOR_MARK = /\s*\(\s*sector\s*\)$/i;

/** The trailing remark that marks a label as a sector. */
export const SECTOR_MARK_TEXT = ' (sector)';

/** A cleaned label without its " (sector)" mark, and whether it had one. */
export function splitSectorMark(label: string): { label: string; marked: boolean } {
  const m = SECTOR_MARK.exec(label);
  if (!m || m.index === 0) return { label, marked: false };
  return { label: label.slice(0, m.index), marked: true };
}
