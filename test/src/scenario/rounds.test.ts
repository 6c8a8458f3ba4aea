import { describe, it, expect } from 'vitest';
import * as math from 'mathjs';
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { prepareModel } from '../../../src/model/index.ts';
import { matVec } from '../../../src/linalg/index.ts';
import { spendingRounds } from '../../../src/scenario/index.ts';
import { runScenario } from '../../support/scenario.ts';
import { county4 } from '../../support/example-tables.ts';

describe('spending rounds', () => {
  const t = county4();
  const pm = prepareModel(t);
  const r = runScenario(pm, {
    name: 'plant',
    lines: [
      { sector: 'Food processing', amount: 200, kind: 'output', localShare: 1 },
      { sector: 'Retail', amount: 80, kind: 'final-demand', localShare: 0.75 },
    ],
  });
  const rounds = spendingRounds(pm, r.effectiveDemand, r.openOutput);
  const n = 4;
  const A = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => t.Z[i * n + j]! / t.x[j]!));

  it('rounds given as already formed products are the same rounds; products of the wrong length are formed again', () => {
    const known: Float64Array[] = [];
    let v: Float64Array = r.effectiveDemand;
    for (let k = 0; k < 3; k++) known.push((v = matVec(pm.coef.A, n, n, v)));
    const given = spendingRounds(pm, r.effectiveDemand, r.openOutput, { products: known });
    expect(given).toEqual(rounds);
    const wrong = spendingRounds(pm, r.effectiveDemand, r.openOutput, { products: [new Float64Array(0), new Float64Array(n + 1)] });
    expect(wrong).toEqual(rounds);
    expect(given.rounds[1]).not.toBe(known[0]); // a copy: the result never shares the remembered products
  });

  it('round 0 is the shock and round k+1 = A·round k (mathjs)', () => {
    expect(Array.from(rounds.rounds[0]!)).toEqual(Array.from(r.effectiveDemand));
    const next = math.multiply(A, Array.from(rounds.rounds[2]!)) as number[];
    for (let i = 0; i < n; i++) expect(rounds.rounds[3]![i]).toBeCloseTo(next[i]!, 12);
  });
  it('the rounds sum to L·Δf within the stated bound ‖A‖₁^(K+1)/(1−‖A‖₁)·‖Δf‖₁ (Neumann series)', () => {
    const L = math.inv(math.subtract(math.identity(n), math.matrix(A)) as math.Matrix);
    const x = (math.multiply(L, Array.from(r.effectiveDemand)) as math.Matrix).toArray() as number[];
    const S = new Array<number>(n).fill(0);
    for (const round of rounds.rounds) for (let i = 0; i < n; i++) S[i] = S[i]! + round[i]!;
    const gap = S.reduce((s, v, i) => s + Math.abs(x[i]! - v), 0);
    expect(rounds.normA).toBeLessThan(1);
    expect(rounds.remainderBound).not.toBeNull();
    expect(gap).toBeLessThanOrEqual(rounds.remainderBound! * (1 + 1e-12));
    expect(Math.abs(gap - rounds.remainder)).toBeLessThan(1e-9);
    // And the sum reached 99.9 % of the open total.
    expect(rounds.coverage.at(-1)!).toBeGreaterThanOrEqual(0.999);
  });
  it('each coverage target is reached by the first round whose cumulative coverage passes it (round 0 = the demand)', () => {
    for (const { target, round: k } of rounds.reach) {
      expect(k).not.toBeNull();
      expect(rounds.coverage[k!]!).toBeGreaterThanOrEqual(target);
      if (k! >= 1) expect(rounds.coverage[k! - 1]!).toBeLessThan(target);
    }
    expect(rounds.reach[0]!.round!).toBeLessThanOrEqual(rounds.reach[2]!.round!);
  });
  it('the ratio of successive rounds approaches the Perron root of A (ml-matrix eigenvalues)', () => {
    const eig = new EigenvalueDecomposition(new Matrix(A));
    const rho = Math.max(...eig.realEigenvalues.map((v, k) => Math.hypot(v, eig.imaginaryEigenvalues[k]!)));
    const long = spendingRounds(pm, r.effectiveDemand, r.openOutput, { maxRounds: 60 });
    // The series stops at 99.9 %; the power method run further here shows the limit of the ratio is ρ.
    let v = Float64Array.from(r.effectiveDemand);
    let ratio = 0;
    for (let k = 0; k < 80; k++) {
      const w = math.multiply(A, Array.from(v)) as number[];
      ratio = w.reduce((s, q) => s + Math.abs(q), 0) / v.reduce((s, q) => s + Math.abs(q), 0);
      v = Float64Array.from(w);
    }
    expect(Math.abs(ratio - rho)).toBeLessThan(1e-9);
    const last = long.ratio.at(-1)!;
    expect(last).not.toBeNull();
    // Within the rounds actually shown, the ratio has moved close to ρ (power method, geometric convergence).
    expect(Math.abs(last! - rho) / rho).toBeLessThan(0.05);
    expect(Math.abs(last! - rho)).toBeLessThan(Math.abs(long.ratio[1]! - rho) + 1e-15);
  });
  it('maxRounds stops the series and leaves unreached targets null', () => {
    const short = spendingRounds(pm, r.effectiveDemand, r.openOutput, { maxRounds: 1 });
    expect(short.rounds).toHaveLength(1);
    expect(short.reach[2]!.round).toBeNull();
  });
});
