// Location quotients against their published definitions on a case small enough to check by hand, and the
// inequalities that follow from those definitions, with fast-check.
import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { simpleLQ, crossIndustryLQ, flqLambda, flegg, quotientMatrix, regionalCoefficients } from '../../../src/regional/index.ts';
import { expectClose } from './build-table.ts';

// County jobs 20, 10, 70 (total 100); national 100, 200, 700 (total 1000).
const ER = Float64Array.from([20, 10, 70]);
const EN = Float64Array.from([100, 200, 700]);

describe('simple location quotient', () => {
  it('SLQ_i = (E_i^R/E^R)/(E_i^N/E^N) (Miller & Blair 2009, §8.3.1): by hand 0.2/0.1, 0.1/0.2, 0.7/0.7', () => {
    expectClose(simpleLQ(ER, EN), [2, 0.5, 1]);
  });
  it('r_ij = a_ij·min(SLQ_i, 1): a sector at or above the national share keeps its coefficients', () => {
    const A = Float64Array.from([0.1, 0.2, 0.3, 0.4, 0.1, 0.2, 0.05, 0.1, 0.1]);
    const r = regionalCoefficients(A, quotientMatrix('slq', simpleLQ(ER, EN), 1));
    expectClose(r, [0.1, 0.2, 0.3, 0.2, 0.05, 0.1, 0.05, 0.1, 0.1]);
  });
});

describe('cross-industry location quotient', () => {
  it('CILQ_ij = SLQ_i/SLQ_j off the diagonal, SLQ_i on it (Smith & Morrison 1974, recalled from memory): by hand', () => {
    // SLQ = (2, 0.5, 1): row 1 = 2, 2/0.5, 2/1; row 2 = 0.5/2, 0.5, 0.5/1; row 3 = 1/2, 1/0.5, 1
    expectClose(crossIndustryLQ(Float64Array.from([2, 0.5, 1])), [2, 4, 2, 0.25, 0.5, 0.5, 0.5, 2, 1]);
  });
  it('an absent buying sector (SLQ_j = 0) leaves min(CILQ, 1) = 1, an absent selling sector gives 0', () => {
    const q = crossIndustryLQ(Float64Array.from([0, 1.5]));
    expect(Math.min(q[1]!, 1)).toBe(0); // row of the absent sector
    expect(Math.min(q[2]!, 1)).toBe(1); // sector 2 selling to the absent sector 1
  });
});

describe("Flegg's location quotient", () => {
  it('λ* = [log2(1 + E^R/E^N)]^δ (Flegg, Webber & Elliott 1995): E^R/E^N = 0.1, δ = 0.3', () => {
    // log2(1.1) = 0.137503523749935; 0.137503523749935^0.3 = 0.5514347723323603 (Python math.log2 and **, an independent evaluation)
    expect(flqLambda(100, 1000, 0.3)).toBeCloseTo(0.5514347723323603, 14);
  });
  it('λ* = 1 when δ = 0 (FLQ reduces to CILQ) and when the region is the nation (log2 2 = 1)', () => {
    expect(flqLambda(100, 1000, 0)).toBe(1);
    expect(flqLambda(1000, 1000, 0.3)).toBe(1);
  });
  it('FLQ_ij = λ*·CILQ_ij off the diagonal and λ*·SLQ_i on it (Flegg & Webber 1997)', () => {
    const slq = Float64Array.from([2, 0.5, 1]);
    const l = 0.55;
    expectClose(flegg(slq, l), [2, 4, 2, 0.25, 0.5, 0.5, 0.5, 2, 1].map((v) => v * l));
  });
});

const jobs = fc.array(fc.tuple(fc.integer({ min: 0, max: 10_000 }), fc.integer({ min: 1, max: 100_000 })), { minLength: 1, maxLength: 12 })
  .map((pairs) => pairs.map(([r, n]) => [Math.min(r, n), n] as const))
  .filter((pairs) => pairs.some(([r]) => r > 0));

describe('properties that follow from the definitions', () => {
  it('r_ij ≤ a_ij for every method, and FLQ ≤ CILQ, and λ* lies in (0, 1]', () => {
    fc.assert(
      fc.property(jobs, fc.double({ min: 0, max: 1, noNaN: true }), fc.integer({ min: 1, max: 2 ** 30 }), (pairs, delta, seed) => {
        const n = pairs.length;
        const er = Float64Array.from(pairs.map((p) => p[0]));
        const en = Float64Array.from(pairs.map((p) => p[1]));
        let tr = 0;
        let tn = 0;
        for (let i = 0; i < n; i++) { tr += er[i]!; tn += en[i]!; }
        const lambda = flqLambda(tr, tn, delta);
        expect(lambda).toBeGreaterThan(0);
        expect(lambda).toBeLessThanOrEqual(1);
        const slq = simpleLQ(er, en);
        const A = Float64Array.from({ length: n * n }, (_, k) => ((seed * (k + 7)) % 1000) / 4000);
        const cilq = crossIndustryLQ(slq);
        const flq = flegg(slq, lambda);
        for (let k = 0; k < n * n; k++) expect(flq[k]!).toBeLessThanOrEqual(cilq[k]!);
        for (const m of ['slq', 'cilq', 'flq'] as const) {
          const r = regionalCoefficients(A, quotientMatrix(m, slq, lambda));
          for (let k = 0; k < n * n; k++) {
            expect(r[k]!).toBeLessThanOrEqual(A[k]!);
            expect(r[k]!).toBeGreaterThanOrEqual(0);
          }
        }
      }),
      { numRuns: 300 },
    );
  });
});
