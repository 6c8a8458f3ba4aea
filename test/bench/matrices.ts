/**
 * Seeded invented matrices for the benchmark: M = I − A with A non-negative and column sums between 0.3 and 0.95,
 * the shape of a productive economy's Leontief matrix (invented numbers, no real table).
 */
import { seeded } from '../support/random.ts';

export { seeded };

/** Invented technical coefficients: most of each column's inputs come from a few sectors, as in real tables. */
export function inventedCoefficients(n: number, seed = 20261201 + n): Float64Array {
  const r = seeded(seed);
  const a = new Float64Array(n * n);
  for (let j = 0; j < n; j++) {
    let s = 0;
    for (let i = 0; i < n; i++) {
      const u = r();
      const v = u * u * u * u; // skewed: a few large inputs per column
      a[i * n + j] = v;
      s += v;
    }
    const target = 0.3 + 0.65 * r();
    for (let i = 0; i < n; i++) a[i * n + j] = (a[i * n + j]! / s) * target;
  }
  return a;
}

export function leontiefMatrix(n: number): Float64Array {
  const a = inventedCoefficients(n);
  for (let k = 0; k < n * n; k++) a[k] = -a[k]!;
  for (let i = 0; i < n; i++) a[i * n + i] = a[i * n + i]! + 1;
  return a;
}
