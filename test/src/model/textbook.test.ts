// Miller & Blair, Input–Output Analysis: Foundations and Extensions, 2nd ed., Cambridge University Press 2009, ch. 2,
// the two-sector numerical example (§2.3): Z = [[150, 500], [200, 100]], x = (1000, 2000), f = (350, 1700),
// value added (650, 1400). A, L and the output multipliers below are the book's figures to its printed digits,
// RECALLED FROM MEMORY (page numbers not quoted): A = [[.15, .25], [.20, .05]], L = [[1.254, .330], [.264, 1.122]],
// output multipliers 1.518 and 1.452, and for the new final demand f = (600, 1500): x = (1247.52, 1841.58).
import { describe, it, expect } from 'vitest';
import { analyzeTable } from '../../../src/model/analysis.ts';
import { prepareModel, solveOpen } from '../../../src/model/prepared.ts';
import { makeTable } from '../../support/coefficient-tables.ts';

const table = makeTable({
  Z: [[150, 500], [200, 100]],
  x: [1000, 2000],
  otherVA: [650, 1400],
  otherFD: [350, 1700],
  sectors: ['Sector 1', 'Sector 2'],
});

const printed = (x: number, digits: number) => Number(x.toFixed(digits));

describe('Miller & Blair 2009, ch. 2 two-sector example (recalled from memory)', () => {
  const an = analyzeTable(table, { inverse: true });
  it('technical coefficients A', () => {
    expect(Array.from(an.coefficients.A)).toEqual([0.15, 0.25, 0.2, 0.05]);
  });
  it('Leontief inverse to the printed three decimals', () => {
    const L = an.leontief!;
    expect([L[0], L[1], L[2], L[3]].map((v) => printed(v!, 3))).toEqual([1.254, 0.33, 0.264, 1.122]);
    // and exactly (1/0.7575)·[[.95, .25], [.20, .85]], the adjugate over det(I − A) = 0.85·0.95 − 0.25·0.20
    const exact = [0.95, 0.25, 0.2, 0.85].map((v) => v / 0.7575);
    for (let k = 0; k < 4; k++) expect(Math.abs(L[k]! - exact[k]!) / exact[k]!).toBeLessThan(1e-14);
  });
  it('output multipliers 1.518 and 1.452', () => {
    const m = an.multipliers.output.typeI as number[];
    expect(m.map((v) => printed(v, 3))).toEqual([1.518, 1.452]);
    expect(Math.abs(m[0]! - 1.15 / 0.7575)).toBeLessThan(1e-14);
    expect(Math.abs(m[1]! - 1.1 / 0.7575)).toBeLessThan(1e-14);
  });
  it('new final demand (600, 1500) gives output (1247.52, 1841.58)', () => {
    const x = solveOpen(prepareModel(table), Float64Array.of(600, 1500));
    expect(Array.from(x, (v) => printed(v, 2))).toEqual([1247.52, 1841.58]);
  });
  it('is viable by both tests', () => {
    expect(an.viability.hawkinsSimon).toBe(true);
    expect(an.viability.productive).toBe(true);
    expect(an.viability.irreducible).toBe(true);
    // ρ(A) for a 2×2: (tr + sqrt(tr² − 4 det))/2 with tr = 0.2, det = 0.15·0.05 − 0.25·0.2 = −0.0425 (closed form, no source needed)
    const rho = (0.2 + Math.sqrt(0.04 + 4 * 0.0425)) / 2;
    const [lo, hi] = an.viability.perronRootBounds;
    expect(lo).toBeLessThanOrEqual(rho);
    expect(hi).toBeGreaterThanOrEqual(rho);
    expect(hi - lo).toBeLessThan(1e-12);
    expect(an.warnings).toEqual([]);
  });
});
