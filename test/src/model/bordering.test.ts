// Type II by bordering on the open factorisation, checked against a direct LU of I − Ā (and mathjs's inverse).
import { describe, it, expect } from 'vitest';
import { inv } from 'mathjs';
import { identityMinus, luFactor, luSolve, luSolveTransposed } from '../../../src/linalg/index.ts';
import { analyzeTable } from '../../../src/model/analysis.ts';
import {
  closedBorder, prepareModel, solveClosed, solveClosedTransposed, solveClosedTransposedFrom, solveOpen, solveOpenTransposed, solveOpenTransposedMany,
} from '../../../src/model/prepared.ts';
import { randomEconomy, tableFromA, toRows } from '../../support/coefficient-tables.ts';
import { seeded } from '../../support/random.ts';
import { rel } from '../../support/compare.ts';

describe('closed-model solves by bordering', () => {
  for (const n of [1, 3, 10, 40]) {
    it(`match a direct LU of I − Ā at n=${n}`, () => {
      const pm = prepareModel(randomEconomy(n, 300 + n));
      const { m, Abar } = pm.closed!;
      const direct = luFactor(identityMinus(Abar, m), m);
      const r = seeded(n);
      for (let trial = 0; trial < 3; trial++) {
        const f = Float64Array.from({ length: m }, () => r() * 10 - 2);
        const a = solveClosed(pm, f), b = luSolve(direct, f);
        const at = solveClosedTransposed(pm, f), bt = luSolveTransposed(direct, f);
        for (let i = 0; i < m; i++) {
          expect(rel(a[i]!, b[i]!, 1e-12)).toBeLessThan(1e-9);
          expect(rel(at[i]!, bt[i]!, 1e-12)).toBeLessThan(1e-9);
        }
        // From an open solve already at hand (the multipliers' batch): the same bits as the closed solve itself.
        const [open] = solveOpenTransposedMany(pm, [f.subarray(0, n)]);
        expect(Array.from(open!)).toEqual(Array.from(solveOpenTransposed(pm, f.subarray(0, n))));
        expect(Array.from(solveClosedTransposedFrom(pm, f, open!))).toEqual(Array.from(at));
      }
      // and the whole closed inverse against mathjs
      const Lbar = inv(toRows(identityMinus(Abar, m), m)) as number[][];
      for (let j = 0; j < m; j++) {
        const e = new Float64Array(m); e[j] = 1;
        const col = solveClosed(pm, e);
        for (let i = 0; i < m; i++) expect(rel(col[i]!, Lbar[i]![j]!, 1e-12)).toBeLessThan(1e-9);
      }
    });
  }

  it('the analysis checks the bordered closed solve with the LAPACK-style residual', () => {
    for (const n of [3, 30]) {
      const an = analyzeTable(randomEconomy(n, 50 + n));
      expect(an.checks.closedSolveResidual).not.toBeNull();
      expect(an.checks.closedSolveResidual!).toBeLessThan(30);
      expect(an.checks.solveResidual!).toBeLessThan(30);
    }
  });

  it('keeps the open solve unchanged and the Schur complement equals det(I − Ā)/det(I − A)', () => {
    const pm = prepareModel(randomEconomy(6, 11));
    const direct = luFactor(identityMinus(pm.closed!.Abar, 7), 7);
    const openDet = Array.from({ length: 6 }, (_, i) => pm.openLU.lu[i * 6 + i]!).reduce((p, q) => p * q, pm.openLU.sign);
    const closedDet = Array.from({ length: 7 }, (_, i) => direct.lu[i * 7 + i]!).reduce((p, q) => p * q, direct.sign);
    expect(rel(closedBorder(pm)!.s, closedDet / openDet, 1e-12)).toBeLessThan(1e-12);
    const f = Float64Array.of(1, 2, 3, 4, 5, 6);
    const x = solveOpen(pm, f);
    expect(x.length).toBe(6);
  });

  it('handles households buying from themselves (ā_hh ≠ 0) and a hand-replaced closure', () => {
    // Ā of Miller & Blair 2009 §2.5 (recalled from memory) has ā_hh = 0.05; L̄'s first column is (1.3651, 0.5273, 0.5698).
    const base = prepareModel(tableFromA([[0.15, 0.25], [0.2, 0.05]]));
    const Abar = Float64Array.from([0.15, 0.25, 0.05, 0.2, 0.05, 0.4, 0.3, 0.25, 0.05]);
    const pm = { ...base, closed: { m: 3, Abar, hc: Float64Array.of(0.05, 0.4), hr: Float64Array.of(0.3, 0.25) } };
    const direct = luFactor(identityMinus(Abar, 3), 3);
    const e1 = Float64Array.of(1, 0, 0);
    const a = solveClosed(pm, e1), b = luSolve(direct, e1);
    for (let i = 0; i < 3; i++) expect(rel(a[i]!, b[i]!, 1e-12)).toBeLessThan(1e-12);
    expect(Array.from(a, (v) => Number(v.toFixed(4)))).toEqual([1.3651, 0.5273, 0.5698]);
    const at = solveClosedTransposed(pm, Float64Array.of(1, 1, 0)), bt = luSolveTransposed(direct, Float64Array.of(1, 1, 0));
    for (let i = 0; i < 3; i++) expect(rel(at[i]!, bt[i]!, 1e-12)).toBeLessThan(1e-12);
  });

  it('refuses to solve without a closure or when the closed system is singular', () => {
    const noHouseholds = prepareModel(tableFromA([[0.1, 0.2], [0.3, 0.1]]));
    expect(noHouseholds.closed).toBeNull();
    expect(() => solveClosed(noHouseholds, new Float64Array(3))).toThrow(/no household closure/);
    // households earn 0.5 per unit and spend all of it on sector 1 while A = 0: s = 1 − h·c = 1 − 1 = 0
    const t = tableFromA([[0, 0], [0, 0]], { labour: [1, 1], households: [2, 0] });
    const pm = prepareModel(t);
    expect(closedBorder(pm)!.s).toBeCloseTo(0, 15);
    expect(() => solveClosed(pm, new Float64Array(3))).toThrow(/singular/);
  });
});
