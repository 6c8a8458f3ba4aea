/**
 * Percentiles and means of the draws. Percentiles are the linear interpolation between order statistics that
 * Hyndman & Fan ("Sample quantiles in statistical packages", The American Statistician 50(4), 1996 — recalled from
 * memory) call definition 7, the default of R, numpy and mathjs: for p in [0, 1] and sorted x₀ ≤ … ≤ x_{N−1},
 * h = (N − 1)·p, Q(p) = x_⌊h⌋ + (h − ⌊h⌋)·(x_⌊h⌋+1 − x_⌊h⌋). When every draw gives the same value, every percentile
 * and the mean are that value exactly (the mean is taken about the first value, so no rounding enters).
 */

export interface Band {
  p5: number;
  p50: number;
  p95: number;
  mean: number;
}

/** Q(p) of values already sorted ascending (definition 7). */
export function quantileSorted(sorted: ArrayLike<number>, p: number): number {
  const n = sorted.length;
  if (n === 0) throw new Error('quantile of no values');
  const h = (n - 1) * p;
  const lo = Math.floor(h);
  const hi = Math.min(n - 1, lo + 1);
  const a = sorted[lo]!;
  const b = sorted[hi]!;
  return a === b ? a : a + (h - lo) * (b - a);
}

/** Mean about the first value: exact when all values are equal. */
export function meanOf(values: ArrayLike<number>): number {
  const n = values.length;
  if (n === 0) throw new Error('mean of no values');
  const x0 = values[0]!;
  let s = 0;
  for (let i = 0; i < n; i++) s += values[i]! - x0;
  return x0 + s / n;
}

/** The band of a sample (sorted in place). */
export function bandOf(values: Float64Array): Band {
  const mean = meanOf(values);
  values.sort();
  return { p5: quantileSorted(values, 0.05), p50: quantileSorted(values, 0.5), p95: quantileSorted(values, 0.95), mean };
}
