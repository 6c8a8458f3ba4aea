// Reference LU against mathjs (a general-purpose library from the registry) on seeded random matrices.
import { describe, it, expect } from 'vitest';
import { inv, det, matrix } from 'mathjs';
import { luFactor, luInverse, luDeterminant, luSolve, luSolveTransposed, matVec, vecMat } from '../../../src/linalg/index.ts';

function seeded(seed: number): () => number {
  let s = seed >>> 0;
  return () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32);
}

function randomMatrix(n: number, seed: number): Float64Array {
  const r = seeded(seed);
  const a = new Float64Array(n * n);
  for (let k = 0; k < n * n; k++) a[k] = r() * 2 - 1;
  for (let i = 0; i < n; i++) a[i * n + i] = a[i * n + i]! + n / 4; // keep it comfortably non-singular
  return a;
}

function toRows(a: Float64Array, n: number): number[][] {
  return Array.from({ length: n }, (_, i) => Array.from(a.subarray(i * n, (i + 1) * n)));
}

describe('LU against mathjs', () => {
  for (const n of [1, 3, 8, 25]) {
    it(`inverse and determinant agree at n=${n}`, () => {
      const a = randomMatrix(n, 1000 + n);
      const f = luFactor(a, n);
      const ours = luInverse(f);
      const ref = inv(matrix(toRows(a, n))).toArray() as number[][];
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) expect(ours[i * n + j]).toBeCloseTo(ref[i]![j]!, 10);
      const d = det(matrix(toRows(a, n))) as number;
      expect(Math.abs(luDeterminant(f) - d) / Math.abs(d)).toBeLessThan(1e-9);
    });
  }
  it('solve and transposed solve reproduce the right-hand side', () => {
    const n = 12;
    const a = randomMatrix(n, 7);
    const f = luFactor(a, n);
    const b = Float64Array.from({ length: n }, (_, i) => i - 3);
    const x = luSolve(f, b);
    const back = matVec(a, n, n, x);
    const y = luSolveTransposed(f, b);
    const backT = vecMat(y, a, n, n);
    for (let i = 0; i < n; i++) {
      expect(back[i]).toBeCloseTo(b[i]!, 11);
      expect(backT[i]).toBeCloseTo(b[i]!, 11);
    }
  });
});
