/**
 * Reference (unblocked) LU factorisation with partial pivoting (Golub & Van Loan, Matrix Computations, 4th ed.,
 * alg. 3.4.1) and the solves built on it, kept as the textbook yardstick the blocked kernels in lu.ts are tested
 * against. Not for production use: it is several times slower at large n.
 */
import type { LU } from './lu.ts';

/** Factor an n×n matrix (the input is not modified). */
export function luFactorReference(a: Float64Array, n: number): LU {
  const lu = Float64Array.from(a);
  const piv = new Int32Array(n);
  for (let i = 0; i < n; i++) piv[i] = i;
  let sign = 1;
  let singular = false;
  for (let k = 0; k < n; k++) {
    let p = k;
    let best = Math.abs(lu[k * n + k]!);
    for (let i = k + 1; i < n; i++) {
      const v = Math.abs(lu[i * n + k]!);
      if (v > best) { best = v; p = i; }
    }
    if (p !== k) {
      for (let j = 0; j < n; j++) {
        const t = lu[k * n + j]!;
        lu[k * n + j] = lu[p * n + j]!;
        lu[p * n + j] = t;
      }
      const t = piv[k]!; piv[k] = piv[p]!; piv[p] = t;
      sign = -sign;
    }
    const pivot = lu[k * n + k]!;
    if (pivot === 0) { singular = true; continue; }
    for (let i = k + 1; i < n; i++) {
      const l = lu[i * n + k]! / pivot;
      lu[i * n + k] = l;
      if (l === 0) continue;
      for (let j = k + 1; j < n; j++) lu[i * n + j] = lu[i * n + j]! - l * lu[k * n + j]!;
    }
  }
  return { n, lu, piv, sign, singular };
}

function assertSolvable(f: LU): void {
  if (f.singular) throw new Error('matrix is singular: no unique solution');
}

/** Solve A·x = b. */
export function luSolveReference(f: LU, b: Float64Array): Float64Array {
  assertSolvable(f);
  const { n, lu, piv } = f;
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) x[i] = b[piv[i]!]!;
  for (let i = 0; i < n; i++) {
    let s = x[i]!;
    for (let j = 0; j < i; j++) s -= lu[i * n + j]! * x[j]!;
    x[i] = s;
  }
  for (let i = n - 1; i >= 0; i--) {
    let s = x[i]!;
    for (let j = i + 1; j < n; j++) s -= lu[i * n + j]! * x[j]!;
    x[i] = s / lu[i * n + i]!;
  }
  return x;
}

/** Solve Aᵀ·y = c (equivalently y·A = c for a row vector y). */
export function luSolveTransposedReference(f: LU, c: Float64Array): Float64Array {
  assertSolvable(f);
  const { n, lu, piv } = f;
  const z = Float64Array.from(c);
  // Uᵀ z = c
  for (let i = 0; i < n; i++) {
    let s = z[i]!;
    for (let j = 0; j < i; j++) s -= lu[j * n + i]! * z[j]!;
    z[i] = s / lu[i * n + i]!;
  }
  // Lᵀ w = z
  for (let i = n - 1; i >= 0; i--) {
    let s = z[i]!;
    for (let j = i + 1; j < n; j++) s -= lu[j * n + i]! * z[j]!;
    z[i] = s;
  }
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) y[piv[i]!] = z[i]!;
  return y;
}

/** Solve A·X = B for B of n rows and m columns (row-major). */
export function luSolveManyReference(f: LU, b: Float64Array, m: number): Float64Array {
  const { n } = f;
  const out = new Float64Array(n * m);
  const col = new Float64Array(n);
  for (let j = 0; j < m; j++) {
    for (let i = 0; i < n; i++) col[i] = b[i * m + j]!;
    const x = luSolveReference(f, col);
    for (let i = 0; i < n; i++) out[i * m + j] = x[i]!;
  }
  return out;
}

/** Explicit inverse. Only for when the user asks to see or export the whole matrix. */
export function luInverseReference(f: LU): Float64Array {
  const n = f.n;
  const eye = new Float64Array(n * n);
  for (let i = 0; i < n; i++) eye[i * n + i] = 1;
  return luSolveManyReference(f, eye, n);
}

export function luDeterminantReference(f: LU): number {
  let d = f.sign;
  for (let i = 0; i < f.n; i++) d *= f.lu[i * f.n + i]!;
  return d;
}
