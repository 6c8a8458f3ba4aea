/** Dense row-major Float64Array helpers. A matrix of n rows and m columns stores entry (i, j) at i*m + j. */
import { gemmSubtract } from './gemm.ts';

export function identity(n: number): Float64Array {
  const out = new Float64Array(n * n);
  for (let i = 0; i < n; i++) out[i * n + i] = 1;
  return out;
}

/** I − A for a square n×n matrix. */
export function identityMinus(a: Float64Array, n: number): Float64Array {
  const out = new Float64Array(n * n);
  identityMinusIntoMax(a, n, out);
  return out;
}

/**
 * out ← I − A (n×n; `out` may be a factorisation's storage), returning the largest |entry| of I − A (NaN skipped): a
 * fill for luFactorFrom that saves it a pass over the matrix.
 */
export function identityMinusIntoMax(a: Float64Array, n: number, out: Float64Array): number {
  let best = 0;
  for (let i = 0; i < n; i++) {
    const row = i * n;
    best = negatedMax(a, out, row, row + i, best);
    const d = -a[row + i]! + 1;
    out[row + i] = d;
    if (Math.abs(d) > best) best = Math.abs(d);
    best = negatedMax(a, out, row + i + 1, row + n, best);
  }
  return best;
}

/** out[k] ← −a[k] for from ≤ k < to; returns the larger of `best` and every |out[k]| (NaN skipped, as `>` skips it). */
function negatedMax(a: Float64Array, out: Float64Array, from: number, to: number, best: number): number {
  for (let k = from; k < to; k++) {
    const v = -a[k]!;
    out[k] = v;
    const m = Math.abs(v);
    if (m > best) best = m;
  }
  return best;
}

/** y = A·v for A of n rows and m columns. */
export function matVec(a: Float64Array, n: number, m: number, v: Float64Array): Float64Array {
  const y = new Float64Array(n);
  const n4 = n - (n % 4);
  for (let i = 0; i < n4; i += 4) rowsDot4(a, m, i, v, y);
  for (let i = n4; i < n; i++) {
    let s = 0;
    const row = i * m;
    for (let j = 0; j < m; j++) s += a[row + j]! * v[j]!;
    y[i] = s;
  }
  return y;
}

/**
 * y[i..i+3] = rows i..i+3 of A times v. Each row's sum is formed in the same order as a row of its own (the same bits);
 * the four sums are independent, so the processor overlaps them instead of waiting on one addition at a time (a
 * 2,000-sector product took 7.1 ms one row at a time).
 */
function rowsDot4(a: Float64Array, m: number, i: number, v: Float64Array, y: Float64Array): void {
  const r0 = i * m, r1 = r0 + m, r2 = r1 + m, r3 = r2 + m;
  let s0 = 0, s1 = 0, s2 = 0, s3 = 0;
  for (let j = 0; j < m; j++) {
    const vj = v[j]!;
    s0 += a[r0 + j]! * vj;
    s1 += a[r1 + j]! * vj;
    s2 += a[r2 + j]! * vj;
    s3 += a[r3 + j]! * vj;
  }
  y[i] = s0; y[i + 1] = s1; y[i + 2] = s2; y[i + 3] = s3;
}

/** y = v·A (row vector times matrix) for A of n rows and m columns. */
export function vecMat(v: Float64Array, a: Float64Array, n: number, m: number): Float64Array {
  const y = new Float64Array(m);
  for (let i = 0; i < n; i++) {
    const vi = v[i]!;
    if (vi === 0) continue;
    const row = i * m;
    for (let j = 0; j < m; j++) y[j] = y[j]! + vi * a[row + j]!;
  }
  return y;
}

/** C = A·B with A n×k and B k×m, through the tiled kernel (C = −(0 − A·B)). */
export function matMul(a: Float64Array, b: Float64Array, n: number, k: number, m: number): Float64Array {
  const c = new Float64Array(n * m);
  gemmSubtract(c, 0, m, a, 0, k, b, 0, m, n, m, k);
  for (let q = 0; q < n * m; q++) c[q] = c[q] === 0 ? 0 : -c[q]!;
  return c;
}

/** Matrix 1-norm (maximum absolute column sum) of an n×n matrix. */
export function norm1(a: Float64Array, n: number): number {
  // Row by row into the column sums (each column summed top to bottom, as a walk down it would, the same bits): a
  // walk down each column touched a new cache line at every entry.
  const s = new Float64Array(n);
  for (let i = 0; i < n; i++) addAbsRow(a, i * n, n, s);
  let best = 0;
  for (let j = 0; j < n; j++) if (s[j]! > best) best = s[j]!;
  return best;
}

function addAbsRow(a: Float64Array, row: number, n: number, s: Float64Array): void {
  for (let j = 0; j < n; j++) s[j] = s[j]! + Math.abs(a[row + j]!);
}

export function columnSums(a: Float64Array, n: number, m: number): Float64Array {
  const s = new Float64Array(m);
  for (let i = 0; i < n; i++) for (let j = 0; j < m; j++) s[j] = s[j]! + a[i * m + j]!;
  return s;
}

export function rowSums(a: Float64Array, n: number, m: number): Float64Array {
  const s = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let t = 0;
    for (let j = 0; j < m; j++) t += a[i * m + j]!;
    s[i] = t;
  }
  return s;
}
