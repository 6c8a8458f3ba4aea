// Percentiles of the draws against an independent quantile computation (mathjs quantileSeq, linear interpolation
// between order statistics — Hyndman & Fan definition 7).
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { quantileSeq, mean as mathMean } from 'mathjs';
import { bandOf, quantileSorted } from '../../../src/uncertainty/index.ts';

describe('percentiles and means', () => {
  it('match mathjs quantileSeq and mean on random samples', () => {
    fc.assert(fc.property(fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { minLength: 1, maxLength: 60 }), (xs) => {
      const b = bandOf(Float64Array.from(xs));
      for (const [p, got] of [[0.05, b.p5], [0.5, b.p50], [0.95, b.p95]] as const) {
        const ref = quantileSeq(xs, p) as number;
        expect(Math.abs(got - ref)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(ref)));
      }
      expect(Math.abs(b.mean - (mathMean(xs) as number))).toBeLessThanOrEqual(1e-9 * Math.max(1, ...xs.map(Math.abs)));
    }), { seed: 15, numRuns: 200 });
  });

  it('interpolate between order statistics (hand-sorted list)', () => {
    // 1…21: h = 20p, so p5 = x₁ = 2, p50 = x₁₀ = 11, p95 = x₁₉ = 20; of 1…10: h = 9·0.05 = 0.45 → 1.45.
    const s = Float64Array.from({ length: 21 }, (_, i) => i + 1);
    expect([quantileSorted(s, 0.05), quantileSorted(s, 0.5), quantileSorted(s, 0.95)]).toEqual([2, 11, 20]);
    expect(quantileSorted(Float64Array.from({ length: 10 }, (_, i) => i + 1), 0.05)).toBeCloseTo(1.45, 14);
  });

  it('give the value itself, exactly, when every draw is the same', () => {
    const v = 1.2345678901234567;
    const b = bandOf(new Float64Array(1000).fill(v));
    expect(b).toEqual({ p5: v, p50: v, p95: v, mean: v });
  });
});
