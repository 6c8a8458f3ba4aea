/**
 * A table made ready for repeated solves: coefficients, the household-closed coefficients, and one factorisation.
 * Scenarios, multipliers and the UI share one PreparedModel, so a factorisation is done once per table.
 *
 * The closed (Type II) system is solved by bordering on the open factorisation, not by a second LU. I − Ā is I − A
 * bordered by the household column −c and the household row −hᵀ:
 *     I − Ā = [ B  −c ]      B = I − A,
 *             [ −hᵀ 1 ]
 * (the corner is 1 − ā_hh when households buy from themselves, as in some published closures; our closure has ā_hh = 0).
 * With u = B⁻¹c, w = B⁻ᵀh (one solve each, once per table) and the Schur complement s = 1 − ā_hh − h·u,
 * block elimination gives (Golub & Van Loan, Matrix Computations, 4th ed. 2013, §3.2.11; Miller & Blair 2009, §6.2):
 *     (I − Ā) [x; y] = [f; g]      ⇒  y = (g + w·f)/s,  x = B⁻¹f + u·y
 *     [x; y]ᵀ (I − Ā) = [c̄; d]     ⇒  y = (d + c̄·u)/s,  x = B⁻ᵀc̄ + w·y
 * so each closed solve costs one open solve plus O(n). det(I − Ā) = det(B)·s, so the closed system is singular
 * exactly when s = 0, and for a productive open model s > 0 exactly when the closed model is productive.
 */
import type { IOTable } from '../table/index.ts';
import { coefficients, type Coefficients } from './coefficients.ts';
import { closeHouseholds, householdCorner, type ClosedCoefficients } from './closure.ts';
import { identityMinusIntoMax, luFactorFrom, luSolve, luSolveTransposed, luSolveTransposedMany, type LU } from '../linalg/index.ts';

/** The bordering of I − Ā on the open factorisation (see the file comment). */
export interface ClosedBorder {
  /** The closed coefficients and open factorisation this bordering was computed from. */
  closed: ClosedCoefficients;
  openLU: LU;
  /** u = (I − A)⁻¹ c: the output needed to meet one unit of household spending. */
  u: Float64Array;
  /** w = h (I − A)⁻¹: household income generated per unit of final demand (open model), i.e. the simple income multipliers. */
  w: Float64Array;
  /** Schur complement s = 1 − ā_hh − h·u; det(I − Ā) = det(I − A)·s. */
  s: number;
}

export interface PreparedModel {
  table: IOTable;
  coef: Coefficients;
  /** Household-closed coefficients, or null when the table has no household income or consumption. */
  closed: ClosedCoefficients | null;
  /** LU of I − A. */
  openLU: LU;
  /**
   * Bordering data for the closed model, or null when there is no closure or the open system is singular. Read it
   * through `closedBorder(pm)`, which recomputes it if `closed` or `openLU` was replaced (hand-assembled models).
   */
  border: ClosedBorder | null;
}

function dot(p: Float64Array, q: Float64Array, n: number): number {
  let s = 0;
  for (let i = 0; i < n; i++) s += p[i]! * q[i]!;
  return s;
}

export interface PrepareModelOptions {
  /** Resident share of each sector's labour income (commuting; see closeHouseholds). Default: all residents. */
  residentShare?: Float64Array;
}

/** Prepare from a table; `coef` may be passed when already computed. */
export function prepareModel(table: IOTable, coef: Coefficients = coefficients(table), opts: PrepareModelOptions = {}): PreparedModel {
  const closed = closeHouseholds(coef, opts.residentShare);
  const n = coef.n;
  // I − A is formed where it is factored (no n×n copy of its own).
  const openLU = luFactorFrom(n, (w) => identityMinusIntoMax(coef.A, n, w));
  return { table, coef, closed, openLU, border: closed ? makeBorder(closed, openLU) : null };
}

function makeBorder(closed: ClosedCoefficients, openLU: LU): ClosedBorder | null {
  if (openLU.singular) return null;
  const n = openLU.n;
  const u = luSolve(openLU, closed.hc);
  const w = luSolveTransposed(openLU, closed.hr);
  const corner = householdCorner(closed);
  return { closed, openLU, u, w, s: 1 - corner - dot(closed.hr, u, n) };
}

/** The bordering for pm's current closure and factorisation (null without closure or when I − A is singular). */
export function closedBorder(pm: PreparedModel): ClosedBorder | null {
  if (!pm.closed) return null;
  if (pm.border && pm.border.closed === pm.closed && pm.border.openLU === pm.openLU) return pm.border;
  pm.border = makeBorder(pm.closed, pm.openLU);
  return pm.border;
}

/** x = (I − A)⁻¹ f. Throws when I − A is singular. */
export function solveOpen(pm: PreparedModel, f: Float64Array): Float64Array {
  return luSolve(pm.openLU, f);
}

/** y = c (I − A)⁻¹ for a row vector c (multipliers). Throws when I − A is singular. */
export function solveOpenTransposed(pm: PreparedModel, c: Float64Array): Float64Array {
  return luSolveTransposed(pm.openLU, c);
}

function solvableBorder(pm: PreparedModel): ClosedBorder {
  if (!pm.closed) throw new Error('the table has no household closure');
  const b = closedBorder(pm);
  if (!b || b.s === 0) throw new Error('matrix is singular: no unique solution');
  return b;
}

/** x̄ = (I − Ā)⁻¹ f̄ for f̄ of length n+1 (the last entry is exogenous household income). Throws when not closed or singular. */
export function solveClosed(pm: PreparedModel, fbar: Float64Array): Float64Array {
  return solveClosedFrom(pm, fbar, null);
}

/**
 * solveClosed(pm, f̄) when the open solve of its first n entries, (I − A)⁻¹ f, is already at hand (`openSolution`, from
 * solveOpen; null: solve it here): the same numbers without a second solve.
 */
export function solveClosedFrom(pm: PreparedModel, fbar: Float64Array, openSolution: Float64Array | null): Float64Array {
  const { u, w, s } = solvableBorder(pm);
  const n = pm.coef.n;
  const f = fbar.subarray(0, n);
  const x0 = openSolution ?? luSolve(pm.openLU, f);
  const y = (fbar[n]! + dot(w, f, n)) / s;
  const out = new Float64Array(n + 1);
  for (let i = 0; i < n; i++) out[i] = x0[i]! + u[i]! * y;
  out[n] = y;
  return out;
}

/** The same as solveOpenTransposed for each vector, bit for bit, in one pass over the factors (multipliers). */
export function solveOpenTransposedMany(pm: PreparedModel, cs: readonly Float64Array[]): Float64Array[] {
  return luSolveTransposedMany(pm.openLU, cs);
}

/** ȳ = c̄ (I − Ā)⁻¹ for a row vector c̄ of length n+1. Throws when not closed or singular. */
export function solveClosedTransposed(pm: PreparedModel, cbar: Float64Array): Float64Array {
  const b = solvableBorder(pm);
  return closedTransposedFrom(pm, b, cbar, luSolveTransposed(pm.openLU, cbar.subarray(0, pm.coef.n)));
}

/**
 * solveClosedTransposed(pm, c̄) when the open solve of its first n entries, c (I − A)⁻¹, is already at hand
 * (`openSolution`, from solveOpenTransposed or solveOpenTransposedMany): the same numbers without a second solve.
 */
export function solveClosedTransposedFrom(pm: PreparedModel, cbar: Float64Array, openSolution: Float64Array): Float64Array {
  return closedTransposedFrom(pm, solvableBorder(pm), cbar, openSolution);
}

function closedTransposedFrom(pm: PreparedModel, b: ClosedBorder, cbar: Float64Array, x0: Float64Array): Float64Array {
  const { u, w, s } = b;
  const n = pm.coef.n;
  const c = cbar.subarray(0, n);
  const y = (cbar[n]! + dot(c, u, n)) / s;
  const out = new Float64Array(n + 1);
  for (let i = 0; i < n; i++) out[i] = x0[i]! + w[i]! * y;
  out[n] = y;
  return out;
}
