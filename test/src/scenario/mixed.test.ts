// Mixed exogenous/endogenous model (Miller & Blair 2009 §13.1, recalled from memory) against a direct solve of the
// partitioned system (I − A_ee)·x_e = f_e + A_ex·x_x with mathjs.
import { describe, it, expect } from 'vitest';
import * as math from 'mathjs';
import { prepareModel } from '../../../src/model/index.ts';
import { runScenario } from '../../support/scenario.ts';
import type { IOTable } from '../../../src/table/index.ts';
import { county4 } from '../../support/example-tables.ts';
import { rel } from '../../support/compare.ts';

function fullMatrix(t: IOTable, closed: boolean): number[][] {
  const n = t.n;
  const lab = t.labourIncome[0]!.values;
  const xh = Array.from(lab).reduce((a, b) => a + b, 0);
  const m = closed ? n + 1 : n;
  return Array.from({ length: m }, (_, i) => Array.from({ length: m }, (_, j) => {
    if (i < n && j < n) return t.Z[i * n + j]! / t.x[j]!;
    if (i < n && j === n) return t.householdConsumption[0]!.values[i]! / xh;
    if (i === n && j < n) return lab[j]! / t.x[j]!;
    return 0;
  }));
}

/** Partitioned solve: returns the full output vector with x_x = targets. */
function partitionedSolve(A: number[][], f: number[], fixed: number[], targets: number[]): number[] {
  const m = A.length;
  const endo = [...Array(m).keys()].filter((i) => !fixed.includes(i));
  const Aee = endo.map((i) => endo.map((j) => (i === j ? 1 : 0) - A[i]![j]!));
  const rhs = endo.map((i) => f[i]! + fixed.reduce((s, j, r) => s + A[i]![j]! * targets[r]!, 0));
  const xe = (math.lusolve(Aee, rhs) as number[][]).map((r) => r[0]!);
  const x = new Array<number>(m).fill(0);
  endo.forEach((i, k) => { x[i] = xe[k]!; });
  fixed.forEach((j, r) => { x[j] = targets[r]!; });
  return x;
}

describe('mixed model', () => {
  const t = county4();
  const pm = prepareModel(t);
  const ePerUnit = t.employment![1]! / t.x[1]!;
  const scenario = {
    name: 'new food plant',
    lines: [
      { sector: 'Food processing', amount: 300, kind: 'jobs' as const, localShare: 1, note: 'plant opens' },
      { sector: 'Services', amount: 50, kind: 'output' as const, localShare: 1 },
      { sector: 'Retail', amount: 20, kind: 'final-demand' as const, localShare: 0.5 },
    ],
  };
  const r = runScenario(pm, scenario);
  const fixed = [1, 3];
  const targets = [300 / ePerUnit, 50];
  const f = [0, 0, 10, 0];

  it('open model matches the partitioned solve, fixed outputs exactly', () => {
    const ref = partitionedSolve(fullMatrix(t, false), f, fixed, targets);
    for (let i = 0; i < 4; i++) expect(rel(r.openOutput[i]!, ref[i]!)).toBeLessThan(1e-12);
    expect(r.openOutput[1]).toBe(300 / ePerUnit);
    expect(r.openOutput[3]).toBe(50);
  });
  it('closed model matches the partitioned solve with households endogenous, fixed outputs exactly', () => {
    const ref = partitionedSolve(fullMatrix(t, true), [...f, 0], fixed, targets);
    for (let i = 0; i < 4; i++) expect(rel(r.closedOutput![i]!, ref[i]!)).toBeLessThan(1e-12);
    expect(rel(r.closedHouseholdIncome!, ref[4]!)).toBeLessThan(1e-12);
    expect(r.closedOutput![1]).toBe(300 / ePerUnit);
    expect(r.closedOutput![3]).toBe(50);
  });
  it('the jobs line yields exactly its jobs as direct employment, with no indirect or induced output in that sector', () => {
    expect(r.effects.employment!.direct[1]).toBeCloseTo(300, 9);
    expect(r.effects.output.indirect[1]).toBe(0);
    expect(r.effects.output.induced![1]).toBe(0);
    expect(r.notes.some((s) => s.includes('Food processing'))).toBe(true);
  });
  it('the effective demand reproduces the mixed solution in the full open model', () => {
    const A = fullMatrix(t, false);
    const IminusA = A.map((row, i) => row.map((a, j) => (i === j ? 1 : 0) - a));
    const x = (math.lusolve(IminusA, Array.from(r.effectiveDemand)) as number[][]).map((q) => q[0]!);
    for (let i = 0; i < 4; i++) expect(rel(x[i]!, r.openOutput[i]!)).toBeLessThan(1e-12);
  });
});
