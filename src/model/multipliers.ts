/**
 * Multipliers and linkages for every sector j (Miller & Blair, Input–Output Analysis, 2nd ed. 2009, ch. 6, and
 * Rasmussen, Studies in Inter-Sectoral Relations, 1956, for the linkage indices), open model L = (I − A)⁻¹ and
 * household-closed model L̄ = (I − Ā)⁻¹:
 *   output      typeI = column sums of L; typeII = column sums of the first n rows of L̄ (production sectors only)
 *   income      simple = (h·L)_j; typeI = simple/h_j; total = (h·L̄[1..n,·])_j; typeII = total/h_j
 *   employment  simple = (e·L)_j; typeI = simple/e_j; total = (e·L̄[1..n,·])_j; typeII = total/e_j
 *   valueAdded  v = labour income + other value added + taxes less subsidies per unit output (imports excluded):
 *               simple = (v·L)_j; total = (v·L̄[1..n,·])_j
 *   taxes       t = taxes less subsidies per unit output: simple = (t·L)_j; total = (t·L̄[1..n,·])_j (when the table has them)
 *   fte         as employment, with full-time equivalents per unit output (when the table has them)
 * Income "total" is labour income in the sectors, (h·L̄[1..n,·])_j: it equals L̄(n+1, j) when every sector's income
 * re-enters household spending, and stays the sectors' labour income when commuting leaks part of it out.
 *   linkages    backward_j = n·colsum_j(L)/ΣL; forward_i = n·rowsum_i(L)/ΣL; key sectors have both above 1.
 * Every multiplier row vector is one transposed solve against the factorisation; no inverse is formed.
 * A value that cannot be defined is null, with the reason in `notes`, never NaN or Infinity.
 */
import { solveClosedTransposedFrom, solveOpen, solveOpenTransposedMany, type PreparedModel } from './prepared.ts';
import { valueAddedPerUnit } from './coefficients.ts';

export type Values = (number | null)[];

export interface NullNote {
  /** Dotted name of the measure, e.g. "income.typeI". */
  measure: string;
  /** Sector indices whose value is null, or "all". */
  sectors: number[] | 'all';
  reason: string;
}

export interface Multipliers {
  output: { typeI: Values; typeII: Values };
  income: { simple: Values; typeI: Values; total: Values; typeII: Values };
  employment: { simple: Values; typeI: Values; total: Values; typeII: Values };
  valueAdded: { simple: Values; total: Values };
  /** Null when the table has no taxes row. */
  taxes: { simple: Values; total: Values } | null;
  /** Null when the table has no full-time-equivalents row. */
  fte: { simple: Values; typeI: Values; total: Values; typeII: Values } | null;
  notes: NullNote[];
}

export interface Linkages {
  /** Rasmussen backward linkage (power of dispersion). */
  backward: Values;
  /** Rasmussen forward linkage (sensitivity of dispersion). */
  forward: Values;
  /** Indices of key sectors: both linkages above 1. */
  keySectors: number[];
  /** Row sums of L (output of each sector needed when every sector's final demand rises by one unit), or null. */
  rowSums: Values;
  notes: NullNote[];
}

export interface Availability {
  /** Open model usable: productive and factorisation non-singular. Else the reason. */
  open: true | string;
  /** Closed model usable. Else the reason. */
  closed: true | string;
}

function nulls(n: number): Values {
  return new Array<number | null>(n).fill(null);
}

function toValues(v: Float64Array, n: number): Values {
  const out: Values = new Array(n);
  for (let i = 0; i < n; i++) {
    const x = v[i]!;
    out[i] = Number.isFinite(x) ? x : null;
  }
  return out;
}

/** r_j = num_j / den_j, null where den_j = 0 (recorded in notes). */
function ratio(num: Values, den: Float64Array, measure: string, what: string, notes: NullNote[]): Values {
  const zero: number[] = [];
  const out = num.map((x, j) => {
    if (x === null) return null;
    const d = den[j]!;
    if (d === 0) { zero.push(j); return null; }
    const r = x / d;
    return Number.isFinite(r) ? r : null;
  });
  if (zero.length) notes.push({ measure, sectors: zero, reason: `${what} is zero in these sectors, so the ratio is undefined` });
  return out;
}

function firstN(v: Float64Array, n: number): Float64Array {
  return v.subarray(0, n);
}

function extend(v: Float64Array, n: number, last: number): Float64Array {
  const out = new Float64Array(n + 1);
  out.set(v);
  out[n] = last;
  return out;
}

export function computeMultipliers(pm: PreparedModel, avail: Availability): Multipliers {
  const { n, h, e, fte, taxes } = pm.coef;
  const notes: NullNote[] = [];
  const all = (measure: string, reason: string): Values => {
    notes.push({ measure, sectors: 'all', reason });
    return nulls(n);
  };
  const ones = new Float64Array(n).fill(1);
  const va = valueAddedPerUnit(pm.coef);
  const open = avail.open === true;
  const closed = avail.closed === true;
  const openWhy = avail.open === true ? '' : avail.open;
  const closedWhy = avail.closed === true ? '' : avail.closed;

  // Every row vector's open solve c (I − A)⁻¹ in one pass over the factors; a closed (Type II) multiplier is that
  // solve bordered (prepared.ts), so each vector is solved once for both.
  const rows = [ones, h, va, ...(e ? [e] : []), ...(fte ? [fte] : []), ...(taxes ? [taxes] : [])];
  const solved = open || closed ? solveOpenTransposedMany(pm, rows) : [];
  const openOf = (c: Float64Array): Float64Array => solved[rows.indexOf(c)]!;
  const closedOf = (c: Float64Array): Float64Array => firstN(solveClosedTransposedFrom(pm, extend(c, n, 0), openOf(c)), n);

  const outputI = open ? toValues(openOf(ones), n) : all('output.typeI', openWhy);
  const outputII = closed ? toValues(closedOf(ones), n) : all('output.typeII', closedWhy);

  const incomeSimple = open ? toValues(openOf(h), n) : all('income.simple', openWhy);
  const incomeI = open ? ratio(incomeSimple, h, 'income.typeI', 'labour income per unit of output (h_j)', notes) : all('income.typeI', openWhy);
  const incomeTotal = closed ? toValues(closedOf(h), n) : all('income.total', closedWhy);
  const incomeII = closed ? ratio(incomeTotal, h, 'income.typeII', 'labour income per unit of output (h_j)', notes) : all('income.typeII', closedWhy);

  /** Simple, Type I, total and Type II of a per-unit-output row (jobs, FTE). */
  const headcount = (group: string, c: Float64Array, what: string) => {
    const simple = open ? toValues(openOf(c), n) : all(`${group}.simple`, openWhy);
    const typeI = open ? ratio(simple, c, `${group}.typeI`, what, notes) : all(`${group}.typeI`, openWhy);
    const total = closed ? toValues(closedOf(c), n) : all(`${group}.total`, closedWhy);
    const typeII = closed ? ratio(total, c, `${group}.typeII`, what, notes) : all(`${group}.typeII`, closedWhy);
    return { simple, typeI, total, typeII };
  };
  let employment: Multipliers['employment'];
  if (!e) {
    const why = 'the table has no employment row';
    employment = { simple: all('employment.simple', why), typeI: all('employment.typeI', why), total: all('employment.total', why), typeII: all('employment.typeII', why) };
  } else {
    employment = headcount('employment', e, 'jobs per unit of output (e_j)');
  }
  const fteOut = fte ? headcount('fte', fte, 'full-time equivalents per unit of output') : null;
  const taxesOut = taxes ? {
    simple: open ? toValues(openOf(taxes), n) : all('taxes.simple', openWhy),
    total: closed ? toValues(closedOf(taxes), n) : all('taxes.total', closedWhy),
  } : null;

  const vaSimple = open ? toValues(openOf(va), n) : all('valueAdded.simple', openWhy);
  const vaTotal = closed ? toValues(closedOf(va), n) : all('valueAdded.total', closedWhy);

  return {
    output: { typeI: outputI, typeII: outputII },
    income: { simple: incomeSimple, typeI: incomeI, total: incomeTotal, typeII: incomeII },
    employment,
    valueAdded: { simple: vaSimple, total: vaTotal },
    taxes: taxesOut,
    fte: fteOut,
    notes,
  };
}

/** Rasmussen linkages from the column sums of L (the Type I output multipliers) and the row sums L·1 (one solve). */
export function computeLinkages(pm: PreparedModel, columnSums: Values, avail: Availability): Linkages {
  const n = pm.coef.n;
  if (avail.open !== true || columnSums.some((x) => x === null)) {
    const reason = avail.open === true ? 'the Leontief column sums are not all defined' : avail.open;
    return {
      backward: nulls(n), forward: nulls(n), keySectors: [], rowSums: nulls(n),
      notes: [{ measure: 'linkages', sectors: 'all', reason }],
    };
  }
  const rowSums = solveOpen(pm, new Float64Array(n).fill(1));
  let total = 0;
  for (let i = 0; i < n; i++) total += rowSums[i]!;
  if (!(total > 0) || !Number.isFinite(total)) {
    return {
      backward: nulls(n), forward: nulls(n), keySectors: [], rowSums: toValues(rowSums, n),
      notes: [{ measure: 'linkages', sectors: 'all', reason: 'the sum of all entries of the Leontief inverse is not positive' }],
    };
  }
  const backward = columnSums.map((c) => (n * c!) / total);
  const forward = Array.from(rowSums, (r) => (n * r) / total);
  const keySectors: number[] = [];
  for (let j = 0; j < n; j++) if (backward[j]! > 1 && forward[j]! > 1) keySectors.push(j);
  return { backward, forward, keySectors, rowSums: toValues(rowSums, n), notes: [] };
}
