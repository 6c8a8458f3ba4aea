/**
 * Accuracy checks on a factorisation and its results, in the style of LAPACK's test programs, and a 1-norm
 * condition-number estimate.
 *
 * - `scaledResidual`: ‖M·X − I‖₁ / (‖M‖₁·‖X‖₁·n·ε), the ratio LAPACK's xGET03 computes for an inverse. A backward-stable
 *   factorisation gives a ratio of order 1; LAPACK's test programs flag a ratio above 30 (`RESIDUAL_THRESHOLD`).
 * - `solveResidual`: ‖b − M·x‖₁ / (‖M‖₁·‖x‖₁·n·ε), the ratio of xGET02 for one solve; O(n²), so cheap enough to run on
 *   every factorisation, whereas `scaledResidual` costs a matrix product (O(n³)).
 * - `conditionEstimate1`: κ₁(M) ≈ ‖M‖₁·‖M⁻¹‖₁ with ‖M⁻¹‖₁ estimated from a handful of solves against the LU
 *   (Hager, "Condition estimates", SIAM J. Sci. Stat. Comput. 5, 1984; Higham, "FORTRAN codes for estimating the one-norm
 *   of a real or complex matrix", ACM TOMS 14, 1988 — the algorithm of LAPACK's xLACN2 as driven by xGECON).
 */
import { matMul, norm1 } from './dense.ts';
import { luSolve, luSolveTransposed, type LU } from './lu.ts';

/** Unit roundoff used by LAPACK's test ratios (xLAMCH('Epsilon') = 2⁻⁵³ for rounding to nearest). */
export const UNIT_ROUNDOFF = 2 ** -53;

/** LAPACK's test programs report a test ratio at or above this as a failure. */
export const RESIDUAL_THRESHOLD = 30;

/** Rows of M multiplied at a time in `scaledResidual`, so the product never needs a full n×n buffer. */
const RESIDUAL_ROW_BLOCK = 64;

/**
 * ‖M·X − I‖₁ / (‖M‖₁·‖X‖₁·n·ε) for n×n row-major M and X (X is meant to be M⁻¹).
 * Returns 0 for n = 0 and Infinity when M or X is zero (no inverse can be that), never NaN.
 */
export function scaledResidual(m: Float64Array, x: Float64Array, n: number): number {
  if (n === 0) return 0;
  const colAbs = new Float64Array(n);
  for (let i0 = 0; i0 < n; i0 += RESIDUAL_ROW_BLOCK) {
    const rows = Math.min(RESIDUAL_ROW_BLOCK, n - i0);
    const block = matMul(m.subarray(i0 * n, (i0 + rows) * n), x, rows, n, n);
    for (let r = 0; r < rows; r++) {
      const base = r * n;
      block[base + i0 + r] = block[base + i0 + r]! - 1;
      for (let j = 0; j < n; j++) colAbs[j] = colAbs[j]! + Math.abs(block[base + j]!);
    }
  }
  let resid = 0;
  for (let j = 0; j < n; j++) if (colAbs[j]! > resid) resid = colAbs[j]!;
  const denom = norm1(m, n) * norm1(x, n) * n * UNIT_ROUNDOFF;
  if (!(denom > 0)) return Number.POSITIVE_INFINITY;
  return resid / denom;
}

/**
 * ‖b − M·x‖₁ / (‖M‖₁·‖x‖₁·n·ε) for one right-hand side (LAPACK xGET02 with one column). Returns 0 when the residual
 * is exactly zero, Infinity when M or x is zero but b is not.
 */
export function solveResidual(m: Float64Array, n: number, x: Float64Array, b: Float64Array): number {
  if (n === 0) return 0;
  let resid = 0;
  let xnorm = 0;
  for (let i = 0; i < n; i++) {
    let s = b[i]!;
    const row = i * n;
    for (let j = 0; j < n; j++) s -= m[row + j]! * x[j]!;
    resid += Math.abs(s);
    xnorm += Math.abs(x[i]!);
  }
  if (resid === 0) return 0;
  const denom = norm1(m, n) * xnorm * n * UNIT_ROUNDOFF;
  if (!(denom > 0)) return Number.POSITIVE_INFINITY;
  return resid / denom;
}

/** Iteration limit of xLACN2 (ITMAX = 5). */
const ESTIMATOR_MAX_ITERATIONS = 5;

function sumAbs(v: Float64Array): number {
  let s = 0;
  for (let i = 0; i < v.length; i++) s += Math.abs(v[i]!);
  return s;
}

function argMaxAbs(v: Float64Array): number {
  let j = 0;
  let best = -1;
  for (let i = 0; i < v.length; i++) {
    const a = Math.abs(v[i]!);
    if (a > best) { best = a; j = i; }
  }
  return j;
}

/**
 * Lower bound for ‖M⁻¹‖₁ from the LU of M (xLACN2: Hager's method with Higham's refinements — a sign-vector
 * iteration of at most five steps plus the alternating-sign test vector that guards against the method's known
 * counterexamples). Exact in practice for most matrices, and never more than ‖M⁻¹‖₁ up to rounding.
 */
export function inverseNormEstimate1(lu: LU): number {
  const n = lu.n;
  if (n === 0) return 0;
  if (lu.singular) return Number.POSITIVE_INFINITY;

  // Start from x = (1/n, …, 1/n).
  let y = luSolve(lu, new Float64Array(n).fill(1 / n));
  if (n === 1) return Math.abs(y[0]!);
  let est = sumAbs(y);
  const sign = new Int8Array(n);
  const xi = new Float64Array(n);
  for (let i = 0; i < n; i++) { sign[i] = y[i]! >= 0 ? 1 : -1; xi[i] = sign[i]!; }
  let z = luSolveTransposed(lu, xi);
  let j = argMaxAbs(z);

  for (let iter = 2; ; iter++) {
    const ej = new Float64Array(n);
    ej[j] = 1;
    y = luSolve(lu, ej);
    const estOld = est;
    est = sumAbs(y);
    let changed = false;
    for (let i = 0; i < n; i++) if ((y[i]! >= 0 ? 1 : -1) !== sign[i]) { changed = true; break; }
    // Repeated sign vector, or no increase: the iteration has converged (xLACN2 labels 90/120).
    if (!changed || est <= estOld) { est = Math.max(est, estOld); break; }
    for (let i = 0; i < n; i++) { sign[i] = y[i]! >= 0 ? 1 : -1; xi[i] = sign[i]!; }
    z = luSolveTransposed(lu, xi);
    const jLast = j;
    j = argMaxAbs(z);
    if (!(z[jLast] !== Math.abs(z[j]!) && iter < ESTIMATOR_MAX_ITERATIONS)) break;
  }

  // Alternating-sign test vector x_i = (−1)^i (1 + i/(n−1)); its 1-norm is 3n/2.
  const alt = new Float64Array(n);
  for (let i = 0; i < n; i++) alt[i] = (i % 2 === 0 ? 1 : -1) * (1 + i / (n - 1));
  const temp = (2 * sumAbs(luSolve(lu, alt))) / (3 * n);
  return temp > est ? temp : est;
}

/**
 * Estimated 1-norm condition number κ₁(M) = ‖M‖₁·‖M⁻¹‖₁ from the LU of M and ‖M‖₁ (pass `norm1(M, n)`), as LAPACK's
 * xGECON does. A lower bound on the true value, usually equal to it. Infinity for a singular factorisation; 0 for n = 0.
 */
export function conditionEstimate1(lu: LU, anorm1: number): number {
  if (lu.n === 0) return 0;
  if (lu.singular) return Number.POSITIVE_INFINITY;
  if (anorm1 === 0) return Number.POSITIVE_INFINITY;
  return anorm1 * inverseNormEstimate1(lu);
}
