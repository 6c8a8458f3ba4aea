/**
 * Hawkins–Simon condition (Hawkins & Simon, "Note: some conditions of macroeconomic stability", Econometrica 17, 1949):
 * every leading principal minor of I − A is positive. Gaussian elimination without pivoting on I − A produces pivots
 * u_kk with minor_k = u_11·…·u_kk, so the condition holds exactly when every pivot is positive, and the first
 * non-positive pivot names the first failing minor. For a non-negative A it holds exactly when ρ(A) < 1.
 *
 * When partial pivoting chose no row exchange (always so when every column sum of A is below 1, because I − A is
 * then column diagonally dominant; Golub & Van Loan, Matrix Computations, 4th ed. 2013, Thm 3.4.3), the LU already
 * computed for the solves *is* the elimination without pivoting and is reused; otherwise a separate elimination runs,
 * stopping at the first non-positive pivot.
 */
import type { LU } from '../linalg/index.ts';

const UNIT_ROUNDOFF = 2 ** -53;

export interface HawkinsSimon {
  holds: boolean;
  /** The first leading principal minor that is not positive, or null when all are. */
  firstFailing: {
    /** Order k of the minor (1-based: the top-left k×k block of I − A). */
    order: number;
    /** Index of the k-th sector, whose pivot failed. */
    sector: number;
    /** The k-th elimination pivot, minor_k / minor_{k−1}. */
    pivot: number;
    /** log10 of |minor_k| (the minor itself can under- or overflow a double on large tables); null when it is 0. */
    log10AbsMinor: number | null;
  } | null;
  /**
   * True when the failing pivot, or the smallest pivot when all hold, is within rounding error of zero
   * (|pivot| ≤ n·u·(1 + ‖A‖∞)): the verdict then rests on rounding and ρ(A) is about 1.
   */
  nearZero: boolean;
  /** Smallest pivot (all pivots when the condition holds, those up to the failing one otherwise). */
  smallestPivot: number;
  /** The elimination pivots u_11 … u_kk up to the failing one (all n when the condition holds); minor_k = Π_{i≤k} u_ii. */
  pivots: Float64Array;
}

function noPivots(lu: LU): boolean {
  for (let i = 0; i < lu.n; i++) if (lu.piv[i] !== i) return false;
  return true;
}

/** The Hawkins–Simon test on I − A; `openLU` is the LU of I − A when already computed. */
export function hawkinsSimon(a: Float64Array, n: number, openLU?: LU): HawkinsSimon {
  let normA = 0;
  for (let i = 0; i < n; i++) {
    let s = 0;
    for (let j = 0; j < n; j++) s += Math.abs(a[i * n + j]!);
    if (s > normA) normA = s;
  }
  const noise = n * UNIT_ROUNDOFF * (1 + normA) * 4;
  let pivots: Float64Array;
  let failAt = -1;
  if (openLU && noPivots(openLU) && !openLU.singular) {
    pivots = new Float64Array(n);
    for (let k = 0; k < n; k++) pivots[k] = openLU.lu[k * n + k]!;
    for (let k = 0; k < n; k++) if (!(pivots[k]! > 0)) { failAt = k; break; }
  } else {
    const m = new Float64Array(n * n);
    for (let k = 0; k < n * n; k++) m[k] = -a[k]!;
    for (let i = 0; i < n; i++) m[i * n + i] = m[i * n + i]! + 1;
    pivots = new Float64Array(n);
    for (let k = 0; k < n; k++) {
      const p = m[k * n + k]!;
      pivots[k] = p;
      if (!(p > 0)) { failAt = k; break; }
      for (let i = k + 1; i < n; i++) {
        const l = m[i * n + k]! / p;
        if (l === 0) continue;
        const ri = i * n, rk = k * n;
        for (let j = k + 1; j < n; j++) m[ri + j] = m[ri + j]! - l * m[rk + j]!;
      }
    }
  }
  const last = failAt === -1 ? n : failAt + 1;
  let smallest = Number.POSITIVE_INFINITY;
  let logMinor = 0;
  for (let k = 0; k < last; k++) {
    const p = pivots[k]!;
    if (p < smallest) smallest = p;
    logMinor += Math.log10(Math.abs(p));
  }
  if (n === 0) smallest = 1;
  const firstFailing = failAt === -1 ? null : { order: failAt + 1, sector: failAt, pivot: pivots[failAt]!, log10AbsMinor: Number.isFinite(logMinor) ? logMinor : null };
  const nearZero = Math.abs(failAt === -1 ? smallest : pivots[failAt]!) <= noise;
  return { holds: failAt === -1, firstFailing, nearZero, smallestPivot: smallest, pivots: pivots.slice(0, last) };
}
