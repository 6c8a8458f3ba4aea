/**
 * How the brief rounds what a council reads — the one rule, stated in every brief (ROUNDING_NOTE) and used by the
 * tests to find the headline numbers in the PDF's text:
 *  - jobs and full-time equivalents to whole jobs;
 *  - money to three significant figures, in the table's money unit (an input–output estimate carries no more);
 *  - shares of the county's base-year totals in per cent with one decimal ("under 0.1 %" below that);
 *  - multipliers (ratios) to two decimals.
 * Numbers are written in English style whatever the user's locale (comma thousands separator, decimal point,
 * hyphen-minus), so the same study gives the same brief on every machine. Halves round away from zero
 * (Intl.NumberFormat's default, halfExpand). Common practice, no source.
 */

// Made on first use, not at load: the first Intl.NumberFormat loads the locale data (10–50 ms), and this module is
// part of every CLI start although most runs write no brief.
const FORMATS = {
  jobs: { maximumFractionDigits: 0 },
  money: { maximumSignificantDigits: 3 },
  ratio: { minimumFractionDigits: 2, maximumFractionDigits: 2 },
  plain: { maximumFractionDigits: 6 },
} satisfies Record<string, Intl.NumberFormatOptions>;
const made = new Map<keyof typeof FORMATS, Intl.NumberFormat>();

function format(kind: keyof typeof FORMATS): Intl.NumberFormat {
  let f = made.get(kind);
  if (f === undefined) {
    f = new Intl.NumberFormat('en-US', FORMATS[kind]);
    made.set(kind, f);
  }
  return f;
}

export const ROUNDING_NOTE =
  'Rounding: jobs to whole jobs; money to three significant figures; shares of the county\'s base year in per cent to one decimal; '
  + 'multipliers to two decimals. Each figure is rounded on its own, so parts may not add up to the rounded total.';

/** No "-0": a value that rounds to zero is written "0". */
function signed(text: string): string {
  return /^-0(\.0*)?$/.test(text) ? text.slice(1) : text;
}

export type Quantity = 'jobs' | 'money' | 'ratio';

/** A value as the brief writes it; "—" for a value that is not defined. */
export function councilNumber(v: number | null, q: Quantity): string {
  if (v === null || !Number.isFinite(v)) return '—';
  return signed(format(q).format(v));
}

/** A share of a county total in per cent, one decimal: "0.7 %"; "under 0.1 %" for smaller non-zero shares. */
export function shareText(part: number | null, whole: number | null): string {
  if (part === null || whole === null || !Number.isFinite(part) || !(whole > 0)) return '—';
  const p = (part / whole) * 100;
  if (p !== 0 && Math.abs(p) < 0.05) return p > 0 ? 'under 0.1 %' : 'a fall under 0.1 %';
  return `${signed(p.toFixed(1))} %`;
}

/** A number as typed by the user (amounts, local shares): up to six decimals, thousands separated. */
export function plainNumber(v: number): string {
  return signed(format('plain').format(v));
}

const MONTHS = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December'];

/**
 * An ISO 8601 date-time as a reader writes it, in UTC so every machine gives the same text: "2 December 2026, 05:25
 * UTC" (`withTime` false: "2 December 2026"). Text that is not a date is returned as it is.
 */
export function dateText(iso: string, withTime = true): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  const day = `${d.getUTCDate()} ${MONTHS[d.getUTCMonth()]} ${d.getUTCFullYear()}`;
  const pad = (n: number) => String(n).padStart(2, '0');
  return withTime ? `${day}, ${pad(d.getUTCHours())}:${pad(d.getUTCMinutes())} UTC` : day;
}
