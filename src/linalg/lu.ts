/**
 * LU factorisation with partial pivoting and the solves built on it, written for speed on large tables.
 *
 * Method: recursive LU with partial pivoting (Toledo, "Locality of reference in LU decomposition with partial
 * pivoting", SIAM J. Matrix Anal. Appl. 18, 1997; Gustavson 1997; LAPACK's xGETRF2): factor the left half of the
 * columns, solve for the top-right block with its unit lower triangle, subtract L21·U12 from the bottom-right block,
 * factor that. Almost all O(n³) work then happens in large C −= A·B updates (gemm.ts: tiled, with a Wasm SIMD kernel
 * where available); the recursion stops at LEAF columns, factored by the textbook algorithm (Golub & Van Loan,
 * Matrix Computations, 4th ed., alg. 3.4.1). Blocking changes only the order of floating-point sums, so the pivots
 * and factors equal those of the unblocked algorithm (lu-reference.ts) up to rounding.
 *
 * Leontief work solves against the factors instead of forming an inverse: a multiplier row vector m = c·L is one
 * transposed solve (I − A)ᵀ mᵀ = cᵀ. `luInverse` is for when the user asks to see or export the whole matrix.
 */
import { gemmSubtract } from './gemm.ts';
import { factorStorage, releaseFactorStorage, withKeptFactors, withKernel, withWorkspace } from './workspace.ts';

export interface LU {
  n: number;
  /** Packed factors: strictly lower part holds L (unit diagonal implied), upper part holds U. Row-major n×n. */
  lu: Float64Array;
  /** Row permutation: row i of P·A is row piv[i] of A. */
  piv: Int32Array;
  /** +1 or −1, the sign of the permutation (for determinants). */
  sign: number;
  /**
   * True when a pivot was zero or below n·ε·max|a_ij| (the matrix is singular or within rounding of a singular one):
   * solves must not be attempted.
   */
  singular: boolean;
}

/** Width at which the recursion stops and columns are factored (or rows solved) one at a time. */
export const LEAF = 8;
/** Column block of the explicit inverse's L⁻¹ stage (wide enough for efficient updates, small waste on zeros). */
const INVERSE_BLOCK = 256;
/** Former name of the block size, kept for callers and tests that size matrices around it. */
export const LU_BLOCK = 64;

/** Split point of a recursion over w > LEAF rows or columns: about half, a multiple of 4 so the SIMD kernel's 4×4 tiles fit. */
function half(w: number): number {
  return Math.max(4, (w >> 1) & ~3);
}

/** The factors `f` will not be used again: their storage may be reused by the next factorisation of the same size. */
export function releaseLU(f: LU): void {
  releaseFactorStorage(f.lu);
}

/** Factor an n×n matrix (the input is not modified). */
export function luFactor(a: Float64Array, n: number): LU {
  return luFactorFrom(n, (w) => w.set(a.subarray(0, n * n)));
}

/**
 * Factor the n×n matrix that `fill` writes into the (zero-filled) array it is given, row-major — so a caller forms its
 * matrix (I − A, say) straight where it is factored, with no n×n copy of its own; a fill that returns a number returns
 * the largest |entry| it wrote (NaN skipped), which is otherwise found by a pass of its own. Large factors are computed in storage
 * that they keep (workspace.ts `factorStorage`); small ones in a workspace, copied out.
 */
export function luFactorFrom(n: number, fill: (w: Float64Array) => void | number): LU {
  const piv = new Int32Array(n);
  for (let i = 0; i < n; i++) piv[i] = i;
  let swaps = 0;
  let maxAbs = 0;
  const factor = (w: Float64Array): void => {
    const largest = fill(w);
    maxAbs = typeof largest === 'number' ? largest : maxAbsOf(w, n * n);
    swaps = factorColumns(w, n, 0, n, piv);
  };
  const own = factorStorage(n * n);
  let lu: Float64Array;
  if (own !== null) {
    lu = own.view;
    withKernel(own.kernel, () => factor(lu));
  } else {
    lu = withWorkspace([n * n], ([w]) => {
      factor(w!);
      return w!.slice();
    });
  }
  // Singular: a pivot that is zero, or so small that A is within rounding of a singular matrix. Blocking computes U's
  // rows and the trailing rows by differently ordered sums, so an exactly singular input (two equal rows, say) may
  // leave a pivot of rounding size rather than an exact zero; |u_jj| ≤ n·ε·max|a_ij| catches that (setting u_jj to
  // zero moves A by at most |u_jj| per entry, since |l_ij| ≤ 1 under partial pivoting).
  const tiny = n * Number.EPSILON * maxAbs;
  let singular = false;
  for (let i = 0; i < n; i++) if (!(Math.abs(lu[i * n + i]!) > tiny)) singular = true;
  return { n, lu, piv, sign: swaps % 2 === 0 ? 1 : -1, singular };
}

/** max |w_k| over the first `len` entries (a loop of its own: a variable the closure above captured ran slower). */
function maxAbsOf(w: Float64Array, len: number): number {
  let best = 0;
  for (let k = 0; k < len; k++) { const v = Math.abs(w[k]!); if (v > best) best = v; }
  return best;
}

/** Factor columns [c0, c1) of rows [c0, n), all earlier updates applied. Returns the number of row swaps. */
function factorColumns(lu: Float64Array, n: number, c0: number, c1: number, piv: Int32Array): number {
  const w = c1 - c0;
  if (w <= LEAF) return factorPanel(lu, n, c0, w, piv);
  const mid = c0 + half(w);
  let swaps = factorColumns(lu, n, c0, mid, piv);
  solveUnitLower(lu, n, c0, mid, lu, n, mid, c1 - mid);
  gemmSubtract(lu, mid * n + mid, n, lu, mid * n + c0, n, lu, c0 * n + mid, n, n - mid, c1 - mid, mid - c0);
  swaps += factorColumns(lu, n, mid, c1, piv);
  return swaps;
}

/**
 * Unblocked LU with partial pivoting of the panel lu[k0.., k0..k0+kb): whole rows are swapped, so the L columns to
 * the left and the not-yet-updated columns to the right carry the same permutation. A zero pivot (the column is zero
 * from the diagonal down) is left in place and its column skipped, as in the reference. Returns the number of row swaps.
 * The next column's pivot is searched for while this column's elimination updates it (one walk down the rows instead
 * of two; the same comparisons in the same order as a search of its own).
 */
function factorPanel(lu: Float64Array, n: number, k0: number, kb: number, piv: Int32Array): number {
  const k1 = k0 + kb;
  let swaps = 0;
  let p = pivotRow(lu, n, k0);
  for (let j = k0; j < k1; j++) {
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
    const next = j + 1;
    const pivot = lu[j * n + j]!;
    if (pivot === 0) {
      if (next < k1) p = pivotRow(lu, n, next);
      continue;
    }
    const rj = j * n;
    const search = next < k1;
    p = next;
    let best = 0;
    for (let i = next; i < n; i++) {
      const ri = i * n;
      const l = lu[ri + j]! / pivot;
      lu[ri + j] = l;
      if (l !== 0) for (let c = next; c < k1; c++) lu[ri + c] = lu[ri + c]! - l * lu[rj + c]!;
      if (search) {
        const v = Math.abs(lu[ri + next]!);
        if (i === next) best = v;
        else if (v > best) { best = v; p = i; }
      }
    }
  }
  return swaps;
}

/** The row of the largest |lu[i, j]| for i ≥ j (the first of equals; row j when the column holds NaN there). */
function pivotRow(lu: Float64Array, n: number, j: number): number {
  let p = j;
  let best = Math.abs(lu[j * n + j]!);
  for (let i = j + 1; i < n; i++) {
    const v = Math.abs(lu[i * n + j]!);
    if (v > best) { best = v; p = i; }
  }
  return p;
}

/** Result of Gaussian elimination without pivoting (see `eliminationPivots`). */
export interface EliminationPivots {
  /** Pivots u_11 … u_kk up to and including the first that is not positive (all n when every pivot is positive). */
  pivots: Float64Array;
  /** 0-based index of the first pivot that is not positive, or −1. Leading principal minor k+1 = u_11·…·u_(k+1)(k+1). */
  firstNonPositive: number;
}

/**
 * Gaussian elimination without pivoting on an n×n matrix (input not modified), stopping at the first pivot that is not
 * positive — the elimination behind the Hawkins–Simon test, where the k-th leading principal minor is the product of
 * the first k pivots. Same recursive blocking (and speed) as `luFactor`; pivots equal those of the textbook loop up to
 * rounding.
 */
export function eliminationPivots(a: Float64Array, n: number): EliminationPivots {
  let fail = -1;
  const diag = withWorkspace([n * n], ([w]) => {
    w!.set(a.subarray(0, n * n));
    fail = eliminateColumns(w!, n, 0, n);
    const last = fail < 0 ? n : fail + 1;
    const d = new Float64Array(last);
    for (let k = 0; k < last; k++) d[k] = w![k * n + k]!;
    return d;
  });
  return { pivots: diag, firstNonPositive: fail };
}

/** Columns [c0, c1) of the elimination without pivoting; returns the first non-positive pivot's index or −1. */
function eliminateColumns(m: Float64Array, n: number, c0: number, c1: number): number {
  const w = c1 - c0;
  if (w <= LEAF) {
    for (let j = c0; j < c1; j++) {
      const rj = j * n;
      const pivot = m[rj + j]!;
      if (!(pivot > 0)) return j;
      for (let i = j + 1; i < n; i++) {
        const ri = i * n;
        const l = m[ri + j]! / pivot;
        m[ri + j] = l;
        if (l === 0) continue;
        for (let c = j + 1; c < c1; c++) m[ri + c] = m[ri + c]! - l * m[rj + c]!;
      }
    }
    return -1;
  }
  const mid = c0 + half(w);
  const failed = eliminateColumns(m, n, c0, mid);
  if (failed >= 0) return failed;
  solveUnitLower(m, n, c0, mid, m, n, mid, c1 - mid);
  gemmSubtract(m, mid * n + mid, n, m, mid * n + c0, n, m, c0 * n + mid, n, n - mid, c1 - mid, mid - c0);
  return eliminateColumns(m, n, mid, c1);
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
  for (let i = 0; i < n; i++) x[i] = x[i]! - dot(lu, i * n, x, 0, i);
  for (let i = n - 1; i >= 0; i--) {
    const row = i * n;
    x[i] = (x[i]! - dot(lu, row + i + 1, x, i + 1, n - i - 1)) / lu[row + i]!;
  }
  return x;
}

/**
 * Σ a[ao+q]·x[xo+q] for q < len, with four partial sums: one running sum makes each step wait for the previous
 * addition, four let the additions overlap (about three times faster at large n).
 */
function dot(a: Float64Array, ao: number, x: Float64Array, xo: number, len: number): number {
  let s0 = 0, s1 = 0, s2 = 0, s3 = 0;
  let q = 0;
  for (; q + 3 < len; q += 4) {
    s0 += a[ao + q]! * x[xo + q]!;
    s1 += a[ao + q + 1]! * x[xo + q + 1]!;
    s2 += a[ao + q + 2]! * x[xo + q + 2]!;
    s3 += a[ao + q + 3]! * x[xo + q + 3]!;
  }
  for (; q < len; q++) s0 += a[ao + q]! * x[xo + q]!;
  return (s0 + s1) + (s2 + s3);
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

/**
 * Solve Aᵀ·y = c for several right-hand sides at once: `luSolveTransposed` of each, bit for bit (every vector sees
 * the same operations in the same order), but with one pass over the factors for all of them instead of one each,
 * four vectors updated together from each loaded factor entry.
 * At 2,000 sectors the factors are 32 MB, read from memory at every pass; the k vectors stay in cache.
 */
export function luSolveTransposedMany(f: LU, cs: readonly Float64Array[]): Float64Array[] {
  assertSolvable(f);
  const { n, lu, piv } = f;
  const zs = cs.map((c) => Float64Array.from(c.subarray(0, n)));
  const k = zs.length;
  const k4 = k - (k % 4);
  for (let i = 0; i < n; i++) {
    const row = i * n;
    const d = lu[row + i]!;
    for (let r = 0; r < k4; r += 4) upperStep4(lu, row, i, n, d, zs[r]!, zs[r + 1]!, zs[r + 2]!, zs[r + 3]!);
    for (let r = k4; r < k; r++) {
      const z = zs[r]!;
      const zi = z[i]! / d;
      z[i] = zi;
      if (zi === 0) continue;
      for (let j = i + 1; j < n; j++) z[j] = z[j]! - lu[row + j]! * zi;
    }
  }
  for (let i = n - 1; i > 0; i--) {
    const row = i * n;
    for (let r = 0; r < k4; r += 4) lowerStep4(lu, row, i, zs[r]!, zs[r + 1]!, zs[r + 2]!, zs[r + 3]!);
    for (let r = k4; r < k; r++) {
      const z = zs[r]!;
      const zi = z[i]!;
      if (zi === 0) continue;
      for (let j = 0; j < i; j++) z[j] = z[j]! - lu[row + j]! * zi;
    }
  }
  return zs.map((z) => {
    const y = new Float64Array(n);
    for (let i = 0; i < n; i++) y[piv[i]!] = z[i]!;
    return y;
  });
}

/**
 * Row i of Uᵀz = c for four vectors: each z_i divided by the pivot, then U[i, j]·z_i removed from every later z_j.
 * A vector whose z_i is 0 is skipped as luSolveTransposed skips it (so even the sign of a zero stays the same).
 */
function upperStep4(lu: Float64Array, row: number, i: number, n: number, d: number, z0: Float64Array, z1: Float64Array, z2: Float64Array, z3: Float64Array): void {
  const a = z0[i]! / d, b = z1[i]! / d, c = z2[i]! / d, e = z3[i]! / d;
  z0[i] = a; z1[i] = b; z2[i] = c; z3[i] = e;
  if (a === 0 || b === 0 || c === 0 || e === 0) {
    for (const [z, zi] of [[z0, a], [z1, b], [z2, c], [z3, e]] as const) {
      if (zi === 0) continue;
      for (let j = i + 1; j < n; j++) z[j] = z[j]! - lu[row + j]! * zi;
    }
    return;
  }
  for (let j = i + 1; j < n; j++) {
    const l = lu[row + j]!;
    z0[j] = z0[j]! - l * a;
    z1[j] = z1[j]! - l * b;
    z2[j] = z2[j]! - l * c;
    z3[j] = z3[j]! - l * e;
  }
}

/** Row i of Lᵀw = z for four vectors (see upperStep4): L[i, j]·z_i removed from every earlier z_j. */
function lowerStep4(lu: Float64Array, row: number, i: number, z0: Float64Array, z1: Float64Array, z2: Float64Array, z3: Float64Array): void {
  const a = z0[i]!, b = z1[i]!, c = z2[i]!, e = z3[i]!;
  if (a === 0 || b === 0 || c === 0 || e === 0) {
    for (const [z, zi] of [[z0, a], [z1, b], [z2, c], [z3, e]] as const) {
      if (zi === 0) continue;
      for (let j = 0; j < i; j++) z[j] = z[j]! - lu[row + j]! * zi;
    }
    return;
  }
  for (let j = 0; j < i; j++) {
    const l = lu[row + j]!;
    z0[j] = z0[j]! - l * a;
    z1[j] = z1[j]! - l * b;
    z2[j] = z2[j]! - l * c;
    z3[j] = z3[j]! - l * e;
  }
}

/**
 * X ← L⁻¹X for rows [r0, r1) (L the unit lower triangle of the n×n factors, X the rows r0..r1 of x with leading
 * dimension ldx, columns xc..xc+cols), recursively so the work is in large updates.
 */
function solveUnitLower(lu: Float64Array, n: number, r0: number, r1: number, x: Float64Array, ldx: number, xc: number, cols: number): void {
  if (r1 - r0 <= LEAF) {
    for (let i = r0 + 1; i < r1; i++) gemmSubtract(x, i * ldx + xc, ldx, lu, i * n + r0, n, x, r0 * ldx + xc, ldx, 1, cols, i - r0);
    return;
  }
  const mid = r0 + half(r1 - r0);
  solveUnitLower(lu, n, r0, mid, x, ldx, xc, cols);
  gemmSubtract(x, mid * ldx + xc, ldx, lu, mid * n + r0, n, x, r0 * ldx + xc, ldx, r1 - mid, cols, mid - r0);
  solveUnitLower(lu, n, mid, r1, x, ldx, xc, cols);
}

/** X ← U⁻¹X for rows [r0, r1) (U the upper triangle of the factors), bottom half first. */
function solveUpper(lu: Float64Array, n: number, r0: number, r1: number, x: Float64Array, ldx: number, xc: number, cols: number): void {
  if (r1 - r0 <= LEAF) {
    for (let i = r1 - 1; i >= r0; i--) {
      gemmSubtract(x, i * ldx + xc, ldx, lu, i * n + i + 1, n, x, (i + 1) * ldx + xc, ldx, 1, cols, r1 - i - 1);
      const d = lu[i * n + i]!;
      const row = i * ldx + xc;
      for (let j = 0; j < cols; j++) x[row + j] = x[row + j]! / d;
    }
    return;
  }
  const mid = r0 + half(r1 - r0);
  solveUpper(lu, n, mid, r1, x, ldx, xc, cols);
  gemmSubtract(x, r0 * ldx + xc, ldx, lu, r0 * n + mid, n, x, mid * ldx + xc, ldx, mid - r0, cols, r1 - mid);
  solveUpper(lu, n, r0, mid, x, ldx, xc, cols);
}

/** Solve A·X = B for B of n rows and m columns (row-major); recursive blocked forward and back substitution. */
export function luSolveMany(f: LU, b: Float64Array, m: number): Float64Array {
  assertSolvable(f);
  const { n, piv } = f;
  const solve = (lu: Float64Array, x: Float64Array): Float64Array => {
    for (let i = 0; i < n; i++) x.set(b.subarray(piv[i]! * m, piv[i]! * m + m), i * m);
    solveUnitLower(lu, n, 0, n, x, m, 0, m);
    solveUpper(lu, n, 0, n, x, m, 0, m);
    return x.slice();
  };
  // Factors kept in the kernel's memory are solved against where they are; others are copied into a workspace.
  return withKeptFactors(f.lu, [n * m], (lu, [x]) => solve(lu, x!)) ?? withWorkspace([n * n, n * m], ([lu, x]) => {
    lu!.set(f.lu);
    return solve(lu!, x!);
  });
}

/**
 * Explicit inverse, A⁻¹ = U⁻¹·L⁻¹·P. Only for when the user asks to see or export the whole matrix.
 * L⁻¹ is built block column by block column, each solve starting at its first non-zero row (≈ n³/3 flops), then U⁻¹
 * is applied by recursive back substitution (n³) and the columns permuted: 4n³/3 flops after the factorisation, as
 * LAPACK's xGETRI, instead of 2n³ for solving against the identity.
 */
export function luInverse(f: LU): Float64Array {
  assertSolvable(f);
  const { n, piv } = f;
  return withWorkspace([n * n, n * n], ([lu, w]) => {
    lu!.set(f.lu);
    for (let c0 = 0; c0 < n; c0 += INVERSE_BLOCK) {
      const c1 = Math.min(n, c0 + INVERSE_BLOCK);
      for (let i = c0; i < c1; i++) w![i * n + i] = 1;
      solveUnitLower(lu!, n, c0, n, w!, n, c0, c1 - c0);
    }
    solveUpper(lu!, n, 0, n, w!, n, 0, n);
    // A⁻¹ = X·P: column piv[i] of the inverse is column i of X.
    const out = new Float64Array(n * n);
    for (let r = 0; r < n; r++) {
      const row = r * n;
      for (let i = 0; i < n; i++) out[row + piv[i]!] = w![row + i]!;
    }
    return out;
  });
}

export function luDeterminant(f: LU): number {
  let d = f.sign;
  for (let i = 0; i < f.n; i++) d *= f.lu[i * f.n + i]!;
  return d;
}
