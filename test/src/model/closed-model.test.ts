// The household-closed (Type II) model is used only when its Schur complement s is clear of rounding: one decision,
// made by the analysis, read by every scenario on the same prepared table.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { inv } from 'mathjs';
import { analyzePrepared, analyzeTable } from '../../../src/model/analysis.ts';
import { closedModelDecision, decideClosedModel, schurRoundingBound } from '../../../src/model/closed-model.ts';
import { closedBorder, prepareModel } from '../../../src/model/prepared.ts';
import { onePhase, runScenario } from '../../support/scenario.ts';
import { prepareStudy, runStudyScenario, studyOfTable } from '../../../src/study/index.ts';
import { makeTable } from '../../support/coefficient-tables.ts';
import { seeded } from '../../support/random.ts';

/**
 * A balanced random economy whose final demand is household consumption plus a share `exportShare` of exports.
 * With exportShare = 0, x̄ = (x, total labour income) solves Ā·x̄ = x̄ exactly, so ρ(Ā) = 1 (the Collatz–Wielandt
 * bounds with v = x̄ are both 1; Horn & Johnson, Matrix Analysis, 2nd ed. 2013, Thm 8.1.26) and s = 0 exactly.
 */
function householdsEconomy(n: number, seed: number, exportShare: number) {
  const r = seeded(seed);
  const scale = 10 ** Math.floor(r() * 8 - 2);
  const Z = Array.from({ length: n }, () => Array.from({ length: n }, () => (r() < 0.7 ? r() * 100 * scale : 0)));
  const rowSum = Z.map((row) => row.reduce((p, q) => p + q, 0));
  const maxRow = Math.max(...rowSum);
  const labour: number[] = [], otherVA: number[] = [];
  for (let j = 0; j < n; j++) {
    const va = (1 + r()) * maxRow + scale;
    const share = 0.3 + 0.6 * r();
    labour.push(va * share);
    otherVA.push(va * (1 - share));
  }
  const x = Z.map((_, j) => Z.reduce((p, row) => p + row[j]!, 0) + labour[j]! + otherVA[j]!);
  const fd = x.map((xi, i) => xi - rowSum[i]!);
  return makeTable({
    Z, x, labour, otherVA,
    households: fd.map((f) => f * (1 - exportShare)),
    otherFD: fd.map((f) => f * exportShare),
    employment: x.map((v) => v / 40),
  });
}

const shock = onePhase('s', [{ sector: 'S1', amount: 100, kind: 'final-demand' as const, localShare: 1 }]);

describe('closed-model decision', () => {
  it('households the only final demand (ρ(Ā) = 1 exactly): never usable, s within its rounding bound, analysis and scenario agree', () => {
    let worst = 0;
    fc.assert(fc.property(fc.integer({ min: 2, max: 14 }), fc.integer({ min: 0, max: 1e6 }), (n, seed) => {
      const t = householdsEconomy(n, seed, 0);
      const b = closedBorder(prepareModel(t))!;
      const bound = schurRoundingBound(b);
      worst = Math.max(worst, Math.abs(b.s) / bound);
      // a scenario on a fresh prepared table, then the analysis on another: the same decision
      const fresh = runScenario(prepareModel(t), shock);
      expect(fresh.closure).toBe('none');
      expect(fresh.effects.output.induced).toBeNull();
      const an = analyzeTable(t);
      expect(an.viability.closedProductive).toBe(false);
      expect(an.viability.closedModel.status).toBe('within-rounding');
      expect(an.warnings.map((w) => w.code)).toContain('closed-not-productive');
      expect(an.multipliers.output.typeII.every((m) => m === null)).toBe(true);
    }), { numRuns: 150, seed: 20261202 });
    // the bound has room to spare: rounding never came near it
    expect(worst).toBeLessThan(0.1);
  });

  it('the same tables with 1–50 % of final demand exported: usable, and Type II multipliers equal column sums of (I − Ā)⁻¹ from mathjs', () => {
    fc.assert(fc.property(fc.integer({ min: 2, max: 10 }), fc.integer({ min: 0, max: 1e6 }), fc.double({ min: 0.01, max: 0.5, noNaN: true }), (n, seed, e) => {
      const t = householdsEconomy(n, seed, e);
      const pm = prepareModel(t);
      const an = analyzePrepared(pm);
      expect(an.viability.closedModel).toMatchObject({ usable: true, status: 'usable', accuracyNote: null });
      const m = n + 1;
      const abar = pm.closed!.Abar;
      const Lbar = inv(Array.from({ length: m }, (_, i) => Array.from({ length: m }, (_, j) => (i === j ? 1 : 0) - abar[i * m + j]!)));
      for (let j = 0; j < n; j++) {
        let col = 0;
        for (let i = 0; i < n; i++) col += Lbar[i]![j]!;
        expect(Math.abs(an.multipliers.output.typeII[j]! - col)).toBeLessThan(1e-9 * col);
      }
      const r = runScenario(pm, shock);
      expect(r.closure).toBe('household');
    }), { numRuns: 60, seed: 5 });
  });

  it('s barely clear of its bound (exports 1e-10 of final demand): used, with a note that induced effects may have lost digits', () => {
    const t = householdsEconomy(4, 99, 1e-10);
    const pm = prepareModel(t);
    const an = analyzePrepared(pm);
    const cm = an.viability.closedModel;
    expect(cm.usable).toBe(true);
    expect(cm.schur!).toBeGreaterThan(cm.schurRoundingBound!);
    expect(cm.accuracyNote).toMatch(/nearly singular .* induced effects may have lost most of their digits/);
    expect(an.warnings.map((w) => w.code)).toContain('closed-ill-conditioned');
    // the scenario says it beside its numbers (the study adds the analysis' warnings to every scenario's notes)
    expect(runStudyScenario(prepareStudy(studyOfTable(t)), shock).phases[0]!.notes.join('\n')).toMatch(/nearly singular/);
  });

  it('a nearly periodic Ā whose power iteration stalls (bounds 0.01–1.0): s = 0.99 settles it, usable in both analysis and scenario', () => {
    // A = 0 except a subnormal a_44, h = 0.25, c = 0.01: s = 1 − 4·0.25·0.01 = 0.99 (Schur complement, by hand)
    const t = makeTable({
      sectors: ['S1', 'S2', 'S3', 'S4'],
      Z: [[0, 0, 0, 0], [0, 0, 0, 0], [0, 0, 0, 0], [0, 0, 0, 4.94e-322]],
      x: [100, 100, 100, 100], labour: [25, 25, 25, 25], households: [1, 1, 1, 1], employment: [2, 2, 2, 2],
    });
    expect(closedModelDecision(prepareModel(t))).toMatchObject({ usable: true, schur: 0.99 });
    const an = analyzeTable(t);
    expect(an.viability.closedProductive).toBe(true);
    expect(runScenario(prepareModel(t), shock).closure).toBe('household');
  });

  it('decideClosedModel: negative s or ρ(Ā) ≥ 1 certified → not productive; no closure or unproductive open model → said so', () => {
    const t = householdsEconomy(3, 1, 0.2);
    const border = closedBorder(prepareModel(t))!;
    const input = { hasClosure: true, openProductive: true, border, closedBounds: [0.5, 0.6] as [number, number], negativeFlows: false };
    expect(decideClosedModel(input).status).toBe('usable');
    expect(decideClosedModel({ ...input, closedBounds: [1.01, 1.02] }).status).toBe('not-productive');
    expect(decideClosedModel({ ...input, border: { ...border, s: -0.3 } }).status).toBe('not-productive');
    expect(decideClosedModel({ ...input, border: { ...border, s: 1e-17 } }).status).toBe('within-rounding');
    expect(decideClosedModel({ ...input, hasClosure: false }).reason).toMatch(/no household income row or no household consumption column/);
    expect(decideClosedModel({ ...input, openProductive: false }).status).toBe('open-not-productive');
  });
});
