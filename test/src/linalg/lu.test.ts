// Blocked LU and solves against the unblocked reference (lu-reference.ts), mathjs and ml-matrix (general-purpose
// libraries from the registry) on seeded random matrices, including sizes that are not multiples of the block size.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { inv, det, matrix, multiply } from 'mathjs';
import { Matrix, LuDecomposition, inverse as mlInverse } from 'ml-matrix';
import {
  luFactor, luInverse, luDeterminant, luSolve, luSolveMany, luSolveTransposed, luSolveTransposedMany, matVec, vecMat, matMul, LU_BLOCK, eliminationPivots,
  scaledResidual, RESIDUAL_THRESHOLD, identityMinusIntoMax, luFactorFrom,
} from '../../../src/linalg/index.ts';
import {
  luFactorReference, luInverseReference, luSolveManyReference, luSolveReference, luSolveTransposedReference,
} from '../../../src/linalg/lu-reference.ts';
import { setKernelMode, type KernelMode } from '../../../src/linalg/gemm.ts';
import { OWN_STORAGE_MIN_ELEMENTS } from '../../../src/linalg/workspace.ts';
import { randomMatrix, seeded } from '../../support/random.ts';

function toRows(a: Float64Array, n: number, m = n): number[][] {
  return Array.from({ length: n }, (_, i) => Array.from(a.subarray(i * m, (i + 1) * m)));
}

/** Largest entrywise difference relative to the largest entry of the reference. */
function relDiff(ours: ArrayLike<number>, ref: ArrayLike<number>): number {
  let d = 0;
  let s = 0;
  for (let k = 0; k < ref.length; k++) {
    d = Math.max(d, Math.abs(ours[k]! - ref[k]!));
    s = Math.max(s, Math.abs(ref[k]!));
  }
  return s === 0 ? d : d / s;
}

// The last size is factored in storage of its own rather than a workspace copied out (workspace.ts factorStorage).
const SIZES = [1, 2, 3, 8, 25, LU_BLOCK - 1, LU_BLOCK, LU_BLOCK + 1, 2 * LU_BLOCK + 7, 200, Math.ceil(Math.sqrt(OWN_STORAGE_MIN_ELEMENTS)) + 3];

// Every test runs twice: with the Wasm SIMD kernel (the default where the engine has it) and the JavaScript one.
for (const mode of ['auto', 'js'] as KernelMode[]) {
describe(`kernel mode ${mode}`, () => {
  beforeAll(() => setKernelMode(mode));
  afterAll(() => setKernelMode('auto'));
  describe('blocked LU against the unblocked reference', () => {
    for (const n of SIZES) {
      it(`same pivots, factors, solves and inverse at n=${n}`, () => {
        const a = randomMatrix(n, n, 500 + n); // plain random (no dominance): pivoting matters
        const f = luFactor(a, n);
        const g = luFactorReference(a, n);
        expect(Array.from(f.piv)).toEqual(Array.from(g.piv));
        expect(f.sign).toBe(g.sign);
        expect(f.singular).toBe(false);
        expect(relDiff(f.lu, g.lu)).toBeLessThan(1e-11);
        const b = Float64Array.from({ length: n }, (_, i) => Math.cos(i + 1));
        expect(relDiff(luSolve(f, b), luSolveReference(g, b))).toBeLessThan(1e-10);
        expect(relDiff(luSolveTransposed(f, b), luSolveTransposedReference(g, b))).toBeLessThan(1e-10);
        // Several transposed solves in one pass: each vector bit for bit what its own solve gives (a zero vector and
        // one with zeros in it take the solve's skip of zero entries).
        // Six vectors: four solved together, two alone.
        const cs = [b, randomMatrix(1, n, 31 + n), new Float64Array(n), Float64Array.from(b, (v, i) => (i % 3 === 0 ? 0 : v)), randomMatrix(1, n, 41 + n), Float64Array.from(b, (v) => -v)];
        const many = luSolveTransposedMany(f, cs);
        expect(many).toHaveLength(cs.length);
        many.forEach((y, r) => expect(Array.from(y)).toEqual(Array.from(luSolveTransposed(f, cs[r]!))));
        expect(luSolveTransposedMany(f, [])).toEqual([]);
        const m = 5;
        const bm = randomMatrix(n, m, 77 + n);
        expect(relDiff(luSolveMany(f, bm, m), luSolveManyReference(g, bm, m))).toBeLessThan(1e-10);
        const x = luInverse(f);
        expect(relDiff(x, luInverseReference(g))).toBeLessThan(1e-10);
        expect(scaledResidual(a, x, n)).toBeLessThan(RESIDUAL_THRESHOLD);
      });
    }
    it('does not modify its input', () => {
      const a = randomMatrix(70, 70, 3);
      const copy = Float64Array.from(a);
      luFactor(a, 70);
      expect(Array.from(a)).toEqual(Array.from(copy));
    });
  });

  describe('LU against mathjs and ml-matrix', () => {
    for (const n of [1, 3, 8, 25, 67, 130]) {
      it(`inverse and determinant agree with mathjs at n=${n}`, () => {
        const a = randomMatrix(n, n, 1000 + n, n / 4);
        const f = luFactor(a, n);
        const ref = (inv(matrix(toRows(a, n))).toArray() as number[][]).flat();
        expect(relDiff(luInverse(f), ref)).toBeLessThan(1e-12);
        // Determinant of the matrix scaled to unit diagonal dominance, so it stays far from overflow at every n.
        const s = new Float64Array(n * n).map((_, k) => a[k]! / (1 + n / 4));
        const d = det(matrix(toRows(s, n))) as number;
        expect(Math.abs(luDeterminant(luFactor(s, n)) - d) / Math.abs(d)).toBeLessThan(1e-9);
      });
    }
    for (const n of [5, 64, 150]) {
      it(`factors, inverse and solve agree with ml-matrix at n=${n}`, () => {
        const a = randomMatrix(n, n, 2000 + n);
        const ml = new LuDecomposition(new Matrix(toRows(a, n)));
        const f = luFactor(a, n);
        // ml-matrix stores LAPACK-style P·A = L·U with the same partial pivoting rule (largest magnitude, first wins).
        expect(Array.from(f.piv)).toEqual(ml.pivotPermutationVector);
        const mlU = ml.upperTriangularMatrix.to1DArray();
        const ours = new Float64Array(n * n);
        for (let i = 0; i < n; i++) for (let j = i; j < n; j++) ours[i * n + j] = f.lu[i * n + j]!;
        expect(relDiff(ours, mlU)).toBeLessThan(1e-10);
        expect(relDiff(luInverse(f), mlInverse(new Matrix(toRows(a, n))).to1DArray())).toBeLessThan(1e-9);
        const b = Float64Array.from({ length: n }, (_, i) => i % 7 - 3);
        expect(relDiff(luSolve(f, b), ml.solve(Matrix.columnVector(Array.from(b))).to1DArray())).toBeLessThan(1e-10);
      });
    }
    it('solve and transposed solve reproduce the right-hand side', () => {
      const n = 140;
      const a = randomMatrix(n, n, 7);
      const f = luFactor(a, n);
      const b = Float64Array.from({ length: n }, (_, i) => i - 3);
      const back = matVec(a, n, n, luSolve(f, b));
      const backT = vecMat(luSolveTransposed(f, b), a, n, n);
      expect(relDiff(back, b)).toBeLessThan(1e-11);
      expect(relDiff(backT, b)).toBeLessThan(1e-11);
    });
  });

  describe('singular matrices', () => {
    const cases: Array<[string, number, (a: Float64Array, n: number) => void]> = [
      ['zero matrix', 3, (a) => a.fill(0)],
      ['a zero row at n=1', 1, (a) => a.fill(0)],
      ['a zero column', 70, (a, n) => { for (let i = 0; i < n; i++) a[i * n + 5] = 0; }],
      ['two equal rows', 130, (a, n) => { a.copyWithin(100 * n, 3 * n, 4 * n); }],
      ['a column that is the sum of two others (beyond the first panel)', 150, (a, n) => {
        for (let i = 0; i < n; i++) a[i * n + 140] = a[i * n + 1]! + a[i * n + 2]!;
      }],
    ];
    it('keeps a badly scaled but comfortably invertible matrix non-singular', () => {
      const d = Float64Array.from([1e-8, 0, 0, 1]); // κ = 1e8, far below 1/(nε)
      expect(luFactor(d, 2).singular).toBe(false);
    });
    for (const [name, n, spoil] of cases) {
      it(`flags ${name} (n=${n}) and refuses to solve`, () => {
        const a = randomMatrix(n, n, 9 + n);
        spoil(a, n);
        const f = luFactor(a, n);
        // Blocked sums may leave a pivot of rounding size where the textbook order gives an exact zero: the flag
        // (zero or below n·ε·max|a_ij|) must catch both.
        expect(f.singular).toBe(true);
        expect(() => luSolve(f, new Float64Array(n))).toThrow(/singular/);
        expect(() => luSolveTransposed(f, new Float64Array(n))).toThrow(/singular/);
        expect(() => luSolveTransposedMany(f, [new Float64Array(n)])).toThrow(/singular/);
        expect(() => luSolveMany(f, new Float64Array(n * 2), 2)).toThrow(/singular/);
        expect(() => luInverse(f)).toThrow(/singular/);
        // |det| is at most the product of |u_jj| with one factor below n·ε·max|a| (definition of the flag).
        expect(Math.abs(luDeterminant(f))).toBeLessThan(1e-10 * Math.abs(luDeterminant(luFactor(randomMatrix(n, n, 9 + n), n))));
      });
    }
  });
});
}

describe('dense products against mathjs', () => {
  for (const [n, k, m] of [[1, 1, 1], [3, 5, 2], [70, 130, 9], [130, 600, 520]] as const) {
    it(`matMul, matVec, vecMat at ${n}×${k}·${k}×${m}`, () => {
      const a = randomMatrix(n, k, n * 31 + k);
      const b = randomMatrix(k, m, m * 17 + k);
      const ref = (multiply(matrix(toRows(a, n, k)), matrix(toRows(b, k, m))).toArray() as number[][]).flat();
      expect(relDiff(matMul(a, b, n, k, m), ref)).toBeLessThan(1e-13);
      const v = randomMatrix(1, k, 5);
      const mv = (multiply(matrix(toRows(a, n, k)), Array.from(v)) as unknown as { toArray(): number[] }).toArray();
      expect(relDiff(matVec(a, n, k, v), mv)).toBeLessThan(1e-13);
      const w = randomMatrix(1, k, 6);
      const vm = (multiply(Array.from(w), matrix(toRows(b, k, m))) as unknown as { toArray(): number[] }).toArray();
      expect(relDiff(vecMat(w, b, k, m), vm)).toBeLessThan(1e-13);
    });
  }
});

describe('I − A written where it is factored', () => {
  it('identityMinusIntoMax writes I − A and returns its largest |entry|; the factors are those of luFactor', () => {
    const n = 37;
    const a = randomMatrix(n, n, 4242);
    a[5 * n + 5] = 3; // a diagonal entry whose |1 − a| is the largest
    const out = new Float64Array(n * n);
    const largest = identityMinusIntoMax(a, n, out);
    // I − A by its definition (common practice, no source): −a off the diagonal, 1 − a on it, computed as −a + 1.
    const want = Float64Array.from(a, (v, k) => (k % (n + 1) === 0 ? -v + 1 : -v));
    expect(Array.from(out)).toEqual(Array.from(want));
    expect(largest).toBe(Math.max(...Array.from(want, Math.abs)));
    const f = luFactorFrom(n, (w) => identityMinusIntoMax(a, n, w));
    const g = luFactor(want, n);
    expect(Array.from(f.lu)).toEqual(Array.from(g.lu));
    expect(f.singular).toBe(g.singular);
  });
});

describe('eliminationPivots (elimination without pivoting, for Hawkins–Simon)', () => {
  /** The textbook loop (Golub & Van Loan alg. 3.2.1, no pivoting), stopping at the first non-positive pivot. */
  function textbook(a: Float64Array, n: number): { pivots: number[]; fail: number } {
    const m = Float64Array.from(a);
    const pivots: number[] = [];
    for (let k = 0; k < n; k++) {
      const p = m[k * n + k]!;
      pivots.push(p);
      if (!(p > 0)) return { pivots, fail: k };
      for (let i = k + 1; i < n; i++) {
        const l = m[i * n + k]! / p;
        for (let j = k + 1; j < n; j++) m[i * n + j] = m[i * n + j]! - l * m[k * n + j]!;
      }
    }
    return { pivots, fail: -1 };
  }
  function leontief(n: number, seed: number, colSum: number): Float64Array {
    const r = seeded(seed);
    const m = new Float64Array(n * n);
    for (let j = 0; j < n; j++) {
      let s = 0;
      for (let i = 0; i < n; i++) { m[i * n + j] = r(); s += m[i * n + j]!; }
      for (let i = 0; i < n; i++) m[i * n + j] = (i === j ? 1 : 0) - (m[i * n + j]! / s) * colSum;
    }
    return m;
  }
  for (const n of [1, 7, 9, 64, 133]) {
    it(`matches the textbook loop on a productive I − A (n=${n})`, () => {
      const m = leontief(n, 300 + n, 0.8);
      const ours = eliminationPivots(m, n);
      const ref = textbook(m, n);
      expect(ours.firstNonPositive).toBe(-1);
      expect(relDiff(ours.pivots, ref.pivots)).toBeLessThan(1e-12);
    });
  }
  it('leading principal minors equal mathjs determinants of the leading blocks (n=12)', () => {
    const n = 12;
    const m = leontief(n, 5, 0.9);
    const { pivots } = eliminationPivots(m, n);
    let prod = 1;
    for (let k = 1; k <= n; k++) {
      prod *= pivots[k - 1]!;
      const block = Array.from({ length: k }, (_, i) => Array.from(m.subarray(i * n, i * n + k)));
      const d = det(matrix(block)) as number;
      expect(Math.abs(prod - d) / Math.abs(d)).toBeLessThan(1e-12);
    }
  });
  it('stops at the first non-positive pivot, also past the first recursion leaf', () => {
    // Column sums above one make I − A fail Hawkins–Simon somewhere; the textbook loop says where.
    for (const [n, colSum] of [[40, 1.3], [150, 1.05], [3, 2.5]] as const) {
      const m = leontief(n, 11 + n, colSum);
      const ours = eliminationPivots(m, n);
      const ref = textbook(m, n);
      expect(ours.firstNonPositive).toBe(ref.fail);
      expect(ours.firstNonPositive).toBeGreaterThanOrEqual(0);
      expect(ours.pivots.length).toBe(ref.fail + 1);
      expect(relDiff(ours.pivots, ref.pivots)).toBeLessThan(1e-9);
    }
  });
});
