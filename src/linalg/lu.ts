/**
 * LU factorisation with partial pivoting and the solves built on it, cache-blocked for speed on large tables.
 *
 * Method: the right-looking blocked LU of LAPACK's xGETRF (Golub & Van Loan, Matrix Computations, 4th ed., §3.2.11 and
 * alg. 3.4.1 for the pivoting): factor a panel of LU_BLOCK columns with partial pivoting, solve for the matching block
 * row of U with the panel's unit lower triangle, then subtract L21·U12 from the trailing matrix with the tiled kernel
 * in gemm.ts, where nearly all the O(n³) work happens. Blocking changes only the order of the floating-point sums,
 * so results equal the textbook algorithm (lu-reference.ts) to rounding.
 *
 * Leontief work solves against the factors instead of forming an inverse: a multiplier row vector m = c·L is one
 * transposed solve (I − A)ᵀ mᵀ = cᵀ. `luInverse` is for when the user asks to see or export the whole matrix.
 */
import { gemmSubtract } from './gemm.ts';

export interface LU {
  n: number;
  /** Packed factors: strictly lower part holds L (unit diagonal implied), upper part holds U. Row-major n×n. */
  lu: Float64Array;
  /** Row permutation: row i of P·A is row piv[i] of A. */
  piv: Int32Array;
  /** +1 or −1, the sign of the permutation (for determinants). */
  sign: number;
  /** True when a zero pivot was met: the matrix is singular and solves must not be attempted. */
  singular: boolean;
}

/** Panel width of the blocked factorisation and block height of the blocked solves (tuned in test/bench). */
export const LU_BLOCK = 64;

/** Factor an n×n matrix (the input is not modified). */
export function luFactor(a: Float64Array, n: number): LU {
  const lu = Float64Array.from(a.subarray(0, n * n));
  const piv = new Int32Array(n);
  for (let i = 0; i < n; i++) piv[i] = i;
  let sign = 1;
  for (let k0 = 0; k0 < n; k0 += LU_BLOCK) {
    const kb = Math.min(LU_BLOCK, n - k0);
    const k1 = k0 + kb;
    if (factorPanel(lu, n, k0, kb, piv) % 2 === 1) sign = -sign;
    if (k1 < n) {
      // U12 = L11⁻¹·A12 (unit lower triangle), row by row.
      for (let i = 1; i < kb; i++) {
        gemmSubtract(lu, (k0 + i) * n + k1, n, lu, (k0 + i) * n + k0, n, lu, k0 * n + k1, n, 1, n - k1, i);
      }
      // A22 −= L21·U12.
      gemmSubtract(lu, k1 * n + k1, n, lu, k1 * n + k0, n, lu, k0 * n + k1, n, n - k1, n - k1, kb);
    }
  }
  // A zero pivot stays on U's diagonal: rows above the current one are never touched again.
  let singular = false;
  for (let i = 0; i < n; i++) if (lu[i * n + i] === 0) singular = true;
  return { n, lu, piv, sign, singular };
}

/**
 * Unblocked LU with partial pivoting of the panel lu[k0.., k0..k0+kb): whole rows are swapped, so the L columns to
 * the left and the not-yet-updated columns to the right carry the same permutation. A zero pivot (the column is zero
 * from the diagonal down) is left in place and its column skipped, as in the reference. Returns the number of row swaps.
 */
function factorPanel(lu: Float64Array, n: number, k0: number, kb: number, piv: Int32Array): number {
  const k1 = k0 + kb;
  let swaps = 0;
  for (let j = k0; j < k1; j++) {
    let p = j;
    let best = Math.abs(lu[j * n + j]!);
    for (let i = j + 1; i < n; i++) {
      const v = Math.abs(lu[i * n + j]!);
      if (v > best) { best = v; p = i; }
    }
    if (p !== j) {
      const rj = j * n;
      const rp = p * n;
      for (let c = 0; c < n; c++) {
        const t = lu[rj + c]!;
        lu[rj + c] = lu[rp + c]!;
        lu[rp + c] = t;
      }
      const t = piv[j]!; piv[j] = piv[p]!; piv[p] = t;
      swaps++;
    }
    const pivot = lu[j * n + j]!;
    if (pivot === 0) continue;
    const rj = j * n;
    for (let i = j + 1; i < n; i++) {
      const ri = i * n;
      const l = lu[ri + j]! / pivot;
      lu[ri + j] = l;
      if (l === 0) continue;
      for (let c = j + 1; c < k1; c++) lu[ri + c] = lu[ri + c]! - l * lu[rj + c]!;
    }
  }
  return swaps;
}

function assertSolvable(f: LU): void {
  if (f.singular) throw new Error('matrix is singular: no unique solution');
}

/** Solve A·x = b. O(n²), rows of the factors read contiguously. */
export function luSolve(f: LU, b: Float64Array): Float64Array {
  assertSolvable(f);
  const { n, lu, piv } = f;
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) x[i] = b[piv[i]!]!;
  for (let i = 0; i < n; i++) {
    let s = x[i]!;
    const row = i * n;
    for (let j = 0; j < i; j++) s -= lu[row + j]! * x[j]!;
    x[i] = s;
  }
  for (let i = n - 1; i >= 0; i--) {
    let s = x[i]!;
    const row = i * n;
    for (let j = i + 1; j < n; j++) s -= lu[row + j]! * x[j]!;
    x[i] = s / lu[row + i]!;
  }
  return x;
}

/**
 * Solve Aᵀ·y = c (equivalently y·A = c for a row vector y). The column-oriented form of the substitutions, so the
 * row-major factors are still read along rows (a strided column walk is several times slower at large n).
 */
export function luSolveTransposed(f: LU, c: Float64Array): Float64Array {
  assertSolvable(f);
  const { n, lu, piv } = f;
  const z = Float64Array.from(c.subarray(0, n));
  // Uᵀ z = c: once z_i is known, remove its contribution U[i, j]·z_i from every later equation j > i.
  for (let i = 0; i < n; i++) {
    const row = i * n;
    const zi = z[i]! / lu[row + i]!;
    z[i] = zi;
    if (zi === 0) continue;
    for (let j = i + 1; j < n; j++) z[j] = z[j]! - lu[row + j]! * zi;
  }
  // Lᵀ w = z, from the bottom up.
  for (let i = n - 1; i > 0; i--) {
    const row = i * n;
    const zi = z[i]!;
    if (zi === 0) continue;
    for (let j = 0; j < i; j++) z[j] = z[j]! - lu[row + j]! * zi;
  }
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) y[piv[i]!] = z[i]!;
  return y;
}

/** Solve A·X = B for B of n rows and m columns (row-major); blocked forward and back substitution. */
export function luSolveMany(f: LU, b: Float64Array, m: number): Float64Array {
  assertSolvable(f);
  const { n, piv } = f;
  const x = new Float64Array(n * m);
  for (let i = 0; i < n; i++) x.set(b.subarray(piv[i]! * m, piv[i]! * m + m), i * m);
  forwardUnitLower(f, x, m);
  backwardUpper(f, x, m);
  return x;
}

/** X ← L⁻¹X in place (L unit lower, X n×m): each block row first takes the GEMM update from the rows above it. */
function forwardUnitLower(f: LU, x: Float64Array, m: number): void {
  const { n, lu } = f;
  for (let i0 = 0; i0 < n; i0 += LU_BLOCK) {
    const i1 = Math.min(n, i0 + LU_BLOCK);
    gemmSubtract(x, i0 * m, m, lu, i0 * n, n, x, 0, m, i1 - i0, m, i0);
    for (let i = i0 + 1; i < i1; i++) gemmSubtract(x, i * m, m, lu, i * n + i0, n, x, i0 * m, m, 1, m, i - i0);
  }
}

/** X ← U⁻¹X in place (U upper, X n×m), block rows from the bottom. */
function backwardUpper(f: LU, x: Float64Array, m: number): void {
  const { n, lu } = f;
  const top = Math.floor((n - 1) / LU_BLOCK) * LU_BLOCK;
  for (let i0 = top; i0 >= 0; i0 -= LU_BLOCK) {
    const i1 = Math.min(n, i0 + LU_BLOCK);
    gemmSubtract(x, i0 * m, m, lu, i0 * n + i1, n, x, i1 * m, m, i1 - i0, m, n - i1);
    for (let i = i1 - 1; i >= i0; i--) {
      gemmSubtract(x, i * m, m, lu, i * n + i + 1, n, x, (i + 1) * m, m, 1, m, i1 - i - 1);
      const d = lu[i * n + i]!;
      const row = i * m;
      for (let j = 0; j < m; j++) x[row + j] = x[row + j]! / d;
    }
  }
}

/**
 * Explicit inverse, A⁻¹ = U⁻¹·L⁻¹·P. Only for when the user asks to see or export the whole matrix.
 * L⁻¹ is built by blocked forward substitution that skips the zero upper triangle (n³/3 flops), then U⁻¹ is applied
 * by blocked back substitution (n³), then the columns are permuted: 4n³/3 flops after the factorisation, as LAPACK's
 * xGETRI, instead of 2n³ for solving against the identity.
 */
export function luInverse(f: LU): Float64Array {
  assertSolvable(f);
  const { n, lu, piv } = f;
  const w = new Float64Array(n * n);
  // W = L⁻¹, lower triangular with unit diagonal.
  for (let i0 = 0; i0 < n; i0 += LU_BLOCK) {
    const i1 = Math.min(n, i0 + LU_BLOCK);
    for (let i = i0; i < i1; i++) w[i * n + i] = 1;
    // W[I, c0..c1) −= L[I, c0..i0)·W[c0..i0, c0..c1): W[p, c] is zero for p < c, so each column tile starts its
    // sum at p = c0.
    for (let c0 = 0; c0 < i0; c0 += LU_BLOCK) {
      const c1 = Math.min(i0, c0 + LU_BLOCK);
      gemmSubtract(w, i0 * n + c0, n, lu, i0 * n + c0, n, w, c0 * n + c0, n, i1 - i0, c1 - c0, i0 - c0);
    }
    for (let i = i0 + 1; i < i1; i++) gemmSubtract(w, i * n, n, lu, i * n + i0, n, w, i0 * n, n, 1, i, i - i0);
  }
  // X = U⁻¹W in place.
  backwardUpper(f, w, n);
  // A⁻¹ = X·P: column piv[i] of the inverse is column i of X.
  const out = new Float64Array(n * n);
  for (let r = 0; r < n; r++) {
    const row = r * n;
    for (let i = 0; i < n; i++) out[row + piv[i]!] = w[row + i]!;
  }
  return out;
}

export function luDeterminant(f: LU): number {
  let d = f.sign;
  for (let i = 0; i < f.n; i++) d *= f.lu[i * f.n + i]!;
  return d;
}
