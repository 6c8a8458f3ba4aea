// Matrix–vector product and 1-norm: against mathjs (a general-purpose library from the registry) to rounding, and
// against the plain one-row-at-a-time and down-each-column loops bit for bit (the fast loops keep each sum's order).
import { describe, it, expect } from 'vitest';
import { matrix, multiply, norm } from 'mathjs';
import { matVec, norm1 } from '../../../src/linalg/index.ts';
import { randomMatrix, seeded } from '../../support/random.ts';

function plainMatVec(a: Float64Array, n: number, m: number, v: Float64Array): Float64Array {
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) { let s = 0; for (let j = 0; j < m; j++) s += a[i * m + j]! * v[j]!; y[i] = s; }
  return y;
}

function plainNorm1(a: Float64Array, n: number): number {
  let best = 0;
  for (let j = 0; j < n; j++) { let s = 0; for (let i = 0; i < n; i++) s += Math.abs(a[i * n + j]!); if (s > best) best = s; }
  return best;
}

const rowsOf = (a: Float64Array, n: number, m: number): number[][] => Array.from({ length: n }, (_, i) => Array.from(a.subarray(i * m, (i + 1) * m)));

describe('dense products', () => {
  // Sizes around the four-row blocks (remainders 0–3) and one of many blocks.
  for (const [n, m] of [[1, 1], [3, 5], [4, 4], [5, 3], [7, 9], [8, 8], [61, 37]] as const) {
    it(`A·v for ${n}×${m}: the plain loop's bits, and mathjs to rounding`, () => {
      const a = randomMatrix(n, m, 100 + n * 7 + m);
      const r = seeded(n * 31 + m);
      const v = Float64Array.from({ length: m }, () => r() * 2 - 1);
      const y = matVec(a, n, m, v);
      expect(Array.from(y)).toEqual(Array.from(plainMatVec(a, n, m, v)));
      const ref = multiply(matrix(rowsOf(a, n, m)), matrix(Array.from(v))).toArray() as number[];
      y.forEach((x, i) => expect(Math.abs(x - ref[i]!)).toBeLessThanOrEqual(1e-12 * (1 + Math.abs(ref[i]!))));
    });
  }

  for (const n of [1, 2, 6, 33]) {
    it(`‖A‖₁ for ${n}×${n}: the column walk's bits, and mathjs's norm(A, 1)`, () => {
      const a = randomMatrix(n, n, 500 + n);
      expect(norm1(a, n)).toBe(plainNorm1(a, n));
      expect(norm1(a, n)).toBeCloseTo(norm(matrix(rowsOf(a, n, n)), 1) as number, 12);
    });
  }

  it('‖A‖₁ skips a NaN column as the column walk does', () => {
    const a = Float64Array.from([1, Number.NaN, 2, 3]);
    expect(norm1(a, 2)).toBe(plainNorm1(a, 2));
  });
});
