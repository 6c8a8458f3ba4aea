/**
 * A table made ready for repeated solves: coefficients, the household-closed coefficients, and factorisations.
 * Scenarios, multipliers and the UI share one PreparedModel, so a factorisation is done once per table.
 * Solves go through the functions below so the way the closed system is solved (today a second LU; bordering
 * on the open factorisation is the planned replacement) stays an internal matter.
 */
import type { IOTable } from '../table/types.ts';
import { coefficients, type Coefficients } from './coefficients.ts';
import { closeHouseholds, type ClosedCoefficients } from './closure.ts';
import { identityMinus, luFactor, luSolve, luSolveTransposed, type LU } from '../linalg/index.ts';

export interface PreparedModel {
  table: IOTable;
  coef: Coefficients;
  /** Household-closed coefficients, or null when the table has no household income or consumption. */
  closed: ClosedCoefficients | null;
  /** LU of I − A. */
  openLU: LU;
  /** LU of I − Ā (closed model), or null. */
  closedLU: LU | null;
}

export function prepareModel(table: IOTable): PreparedModel {
  const coef = coefficients(table);
  const closed = closeHouseholds(coef);
  const openLU = luFactor(identityMinus(coef.A, coef.n), coef.n);
  const closedLU = closed ? luFactor(identityMinus(closed.Abar, closed.m), closed.m) : null;
  return { table, coef, closed, openLU, closedLU };
}

/** x = (I − A)⁻¹ f. */
export function solveOpen(pm: PreparedModel, f: Float64Array): Float64Array {
  return luSolve(pm.openLU, f);
}

/** y = c (I − A)⁻¹ for a row vector c (multipliers). */
export function solveOpenTransposed(pm: PreparedModel, c: Float64Array): Float64Array {
  return luSolveTransposed(pm.openLU, c);
}

/** x̄ = (I − Ā)⁻¹ f̄ for f̄ of length n+1 (the last entry is exogenous household income). Throws when not closed. */
export function solveClosed(pm: PreparedModel, fbar: Float64Array): Float64Array {
  if (!pm.closedLU) throw new Error('the table has no household closure');
  return luSolve(pm.closedLU, fbar);
}

/** ȳ = c̄ (I − Ā)⁻¹ for a row vector c̄ of length n+1. Throws when not closed. */
export function solveClosedTransposed(pm: PreparedModel, cbar: Float64Array): Float64Array {
  if (!pm.closedLU) throw new Error('the table has no household closure');
  return luSolveTransposed(pm.closedLU, cbar);
}
