// Accuracy checks and the condition estimator, against exact values from mathjs (a general-purpose library from the registry).
import { describe, it, expect } from 'vitest';
import { inv, matrix } from 'mathjs';
import {
  conditionEstimate1, inverseNormEstimate1, scaledResidual, solveResidual, luFactor, luInverse, luSolve, norm1,
  RESIDUAL_THRESHOLD, UNIT_ROUNDOFF,
} from '../../../src/linalg/index.ts';
import { seeded } from '../../support/random.ts';

function toRows(a: Float64Array, n: number): number[][] {
  return Array.from({ length: n }, (_, i) => Array.from(a.subarray(i * n, (i + 1) * n)));
}

function fromRows(rows: number[][]): Float64Array {
  return Float64Array.from(rows.flat());
}

/** Exact 1-norm of the inverse, computed by mathjs (independent of our LU). */
function exactInverseNorm1(a: Float64Array, n: number): number {
  return norm1(fromRows(inv(matrix(toRows(a, n))).toArray() as number[][]), n);
}

type Kind = 'diagonally dominant' | 'plain random' | 'graded' | 'Leontief-like';

function testMatrix(kind: Kind, n: number, seed: number): Float64Array {
  const r = seeded(seed);
  const a = new Float64Array(n * n);
  for (let k = 0; k < n * n; k++) a[k] = r() * 2 - 1;
  if (kind === 'diagonally dominant') for (let i = 0; i < n; i++) a[i * n + i] = a[i * n + i]! + n / 4;
  if (kind === 'graded') for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) a[i * n + j] = a[i * n + j]! * 10 ** (-6 * j / Math.max(1, n - 1));
  if (kind === 'Leontief-like') {
    // I − A with A non-negative and column sums below one (a productive economy).
    for (let j = 0; j < n; j++) {
      let s = 0;
      for (let i = 0; i < n; i++) { a[i * n + j] = r(); s += a[i * n + j]!; }
      const target = 0.3 + 0.65 * r();
      for (let i = 0; i < n; i++) a[i * n + j] = (i === j ? 1 : 0) - (a[i * n + j]! / s) * target;
    }
  }
  return a;
}

describe('scaledResidual (LAPACK xGET03 ratio)', () => {
  it('is small for an inverse from our LU and large for a perturbed one', () => {
    for (const n of [1, 5, 40, 130]) {
      const a = testMatrix('plain random', n, 31 + n);
      const x = luInverse(luFactor(a, n));
      const good = scaledResidual(a, x, n);
      expect(good).toBeLessThan(RESIDUAL_THRESHOLD);
      // Spoil one entry by 1e-6 relative: the ratio must jump far past the threshold.
      const bad = Float64Array.from(x);
      bad[0] = bad[0]! * (1 + 1e-6);
      expect(scaledResidual(a, bad, n)).toBeGreaterThan(1000);
    }
  });
  it('matches the definition computed entrywise on a small case', () => {
    // M = [[2,1],[1,3]] and a deliberately inexact X (the exact inverse is [[0.6,-0.2],[-0.2,0.4]]).
    const m = Float64Array.from([2, 1, 1, 3]);
    const x = Float64Array.from([0.6, -0.2, -0.2, 0.41]);
    // M·X − I by hand: [[0, 0.01], [0, 0.03]]; ‖·‖₁ = 0.04; ‖M‖₁ = 4; ‖X‖₁ = 0.8.
    const expected = 0.04 / (4 * 0.8 * 2 * UNIT_ROUNDOFF);
    expect(Math.abs(scaledResidual(m, x, 2) / expected - 1)).toBeLessThan(1e-12);
  });
  it('returns Infinity (not NaN) for a zero matrix and 0 for n = 0', () => {
    expect(scaledResidual(new Float64Array(4), new Float64Array(4), 2)).toBe(Number.POSITIVE_INFINITY);
    expect(scaledResidual(new Float64Array(0), new Float64Array(0), 0)).toBe(0);
  });
});

describe('solveResidual (LAPACK xGET02 ratio)', () => {
  it('is small for our solve and large for a wrong answer', () => {
    const n = 60;
    const a = testMatrix('plain random', n, 5);
    const b = Float64Array.from({ length: n }, (_, i) => Math.sin(i));
    const x = luSolve(luFactor(a, n), b);
    expect(solveResidual(a, n, x, b)).toBeLessThan(RESIDUAL_THRESHOLD);
    x[3] = x[3]! + 1e-7;
    expect(solveResidual(a, n, x, b)).toBeGreaterThan(1000);
  });
});

describe('conditionEstimate1 (Hager 1984 / Higham 1988, LAPACK xLACN2/xGECON)', () => {
  const kinds: Kind[] = ['diagonally dominant', 'plain random', 'graded', 'Leontief-like'];
  it('is a lower bound within a factor of 3 of the exact κ₁ from mathjs, and usually equal to it', () => {
    let exactCount = 0;
    let cases = 0;
    for (const kind of kinds) {
      for (const n of [2, 3, 7, 16, 33, 64]) {
        for (let seed = 1; seed <= 4; seed++) {
          const a = testMatrix(kind, n, 1000 * seed + n);
          const f = luFactor(a, n);
          const anorm = norm1(a, n);
          const exact = anorm * exactInverseNorm1(a, n);
          const est = conditionEstimate1(f, anorm);
          expect(est, `${kind} n=${n} seed=${seed}`).toBeLessThanOrEqual(exact * (1 + 1e-9));
          expect(est, `${kind} n=${n} seed=${seed}`).toBeGreaterThanOrEqual(exact / 3);
          cases++;
          if (Math.abs(est - exact) <= 1e-9 * exact) exactCount++;
        }
      }
    }
    // "Usually equal": Higham (1988) finds the estimate exact in most random cases. Strongly diagonally dominant
    // matrices, whose inverse columns have nearly equal norms, are the common exception (estimate 0.7–1 of exact).
    expect(exactCount / cases).toBeGreaterThan(0.5);
  });
  it('is exact for n = 1 and a diagonal matrix', () => {
    const one = luFactor(Float64Array.from([-4]), 1);
    expect(conditionEstimate1(one, 4)).toBe(1);
    const d = Float64Array.from([2, 0, 0, 0, 0.5, 0, 0, 0, -8]);
    // κ₁ = ‖D‖₁·‖D⁻¹‖₁ = 8 · 2 = 16 (definition).
    expect(conditionEstimate1(luFactor(d, 3), norm1(d, 3))).toBeCloseTo(16, 12);
    expect(inverseNormEstimate1(luFactor(d, 3))).toBeCloseTo(2, 12);
  });
  it('grows with near-singularity and is Infinity for a singular factorisation', () => {
    const near = (eps: number): Float64Array => Float64Array.from([1, 1, 1, 1 + eps]);
    const k1 = conditionEstimate1(luFactor(near(1e-3), 2), norm1(near(1e-3), 2));
    const k2 = conditionEstimate1(luFactor(near(1e-9), 2), norm1(near(1e-9), 2));
    expect(k2).toBeGreaterThan(k1 * 1e5);
    const sing = Float64Array.from([1, 2, 2, 4]);
    expect(conditionEstimate1(luFactor(sing, 2), norm1(sing, 2))).toBe(Number.POSITIVE_INFINITY);
  });
});
