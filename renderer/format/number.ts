/**
 * Numbers for the screen: the user's locale (Intl.NumberFormat), thousands separators, units beside the value.
 * A value that is missing or not finite is never shown as NaN or Infinity: it becomes "—" with a reason for the tooltip.
 */
export const DASH = '—';

export interface Shown {
  text: string;
  /** Why the value is missing, for a title attribute or a footnote; undefined when a number is shown. */
  reason?: string;
}

const cache = new Map<string, Intl.NumberFormat>();
/** One formatter per set of options; `key` names them without serialising them on every call (a table's redraw formats hundreds of cells). */
function nf(opts: Intl.NumberFormatOptions, key = JSON.stringify(opts)): Intl.NumberFormat {
  let f = cache.get(key);
  if (!f) {
    f = new Intl.NumberFormat(undefined, opts);
    cache.set(key, f);
  }
  return f;
}

export function isShowable(v: unknown): v is number {
  return typeof v === 'number' && Number.isFinite(v);
}

/** Fixed number of decimals, grouped. */
export function fmtFixed(v: number | null | undefined, digits: number, reason = 'not available'): Shown {
  if (!isShowable(v)) return { text: DASH, reason: v === null || v === undefined ? reason : 'not a finite number' };
  return { text: nf({ minimumFractionDigits: digits, maximumFractionDigits: digits }, `fixed${digits}`).format(Object.is(v, -0) ? 0 : v) };
}

/** Money in the table's unit: grouped, one decimal, so a column of values lines up. */
export function fmtMoney(v: number | null | undefined, reason?: string): Shown {
  return fmtFixed(v, 1, reason);
}

/** Multipliers and coefficients: four decimals. */
export function fmtRatio(v: number | null | undefined, reason?: string): Shown {
  return fmtFixed(v, 4, reason);
}

/** Jobs: one decimal (jobs per unit output can be fractional). */
export function fmtJobs(v: number | null | undefined, reason?: string): Shown {
  return fmtFixed(v, 1, reason);
}

export function fmtPercent(v: number | null | undefined, digits = 1, reason?: string): Shown {
  if (!isShowable(v)) return fmtFixed(v, 0, reason);
  return { text: nf({ style: 'percent', minimumFractionDigits: digits, maximumFractionDigits: digits }).format(v) };
}

export function fmtInt(v: number | null | undefined, reason?: string): Shown {
  return fmtFixed(v, 0, reason);
}

/**
 * Short form for chart axes: 12.3K, 4.5M, 0.004 in the user's locale. Significant digits rather than decimals, so
 * ticks of small ratios (jobs per thousand dollars) stay distinct instead of all rounding to 0.
 */
export function fmtCompact(v: number): string {
  if (!Number.isFinite(v)) return DASH;
  return nf({ notation: 'compact', maximumSignificantDigits: 3 }).format(Object.is(v, -0) ? 0 : v);
}

/** Four significant digits, for small per-unit values such as jobs per thousand dollars. */
export function fmtSig(v: number | null | undefined, reason?: string): Shown {
  if (!isShowable(v)) return fmtFixed(v, 0, reason);
  return { text: nf({ maximumSignificantDigits: 4 }).format(v) };
}

export type NumberStyle = 'money' | 'ratio' | 'jobs' | 'percent' | 'int' | 'sig';

export function fmt(style: NumberStyle, v: number | null | undefined, reason?: string): Shown {
  switch (style) {
    case 'money': return fmtMoney(v, reason);
    case 'ratio': return fmtRatio(v, reason);
    case 'jobs': return fmtJobs(v, reason);
    case 'percent': return fmtPercent(v, 1, reason);
    case 'int': return fmtInt(v, reason);
    case 'sig': return fmtSig(v, reason);
  }
}
