// Properties that hold for every productive table (theorems of the linear model, no reference values needed):
// the mixed model agrees with the partitioned solve (mathjs), fixed outputs are exact, effects add up, and the
// model is linear in the shock.
import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import * as math from 'mathjs';
import { prepareModel } from '../../../src/model/index.ts';
import { type ScenarioLine } from '../../../src/scenario/index.ts';
import { runScenario } from '../../support/scenario.ts';
import { makeTable } from '../../support/example-tables.ts';
import { rel } from '../../support/compare.ts';

const n = 4;
const sectors = ['A', 'B', 'C', 'D'];

/** A random productive table: flows up to 60 % of each column's output, labour and household consumption positive. */
const tableArb = fc.record({
  flows: fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: n * n, maxLength: n * n }),
  x: fc.array(fc.double({ min: 100, max: 5000, noNaN: true }), { minLength: n, maxLength: n }),
  hh: fc.array(fc.double({ min: 1, max: 100, noNaN: true }), { minLength: n, maxLength: n }),
}).map(({ flows, x, hh }) => {
  const Z = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (0.6 / n) * flows[i * n + j]! * x[j]!));
  const labour = x.map((v) => 0.25 * v);
  return makeTable({ sectors, Z, x, labour, household: hh, employment: x.map((v) => v / 50) });
});

const lineArb = fc.record({
  sector: fc.constantFrom(...sectors),
  amount: fc.double({ min: -500, max: 500, noNaN: true }),
  kind: fc.constantFrom('final-demand', 'output', 'jobs'),
  localShare: fc.double({ min: 0, max: 1, noNaN: true }),
});

function consistent(lines: ScenarioLine[]): ScenarioLine[] {
  // One kind per sector (mixing fixed and final demand on a sector is refused), shares of 1 on fixed lines.
  const kindOf = new Map<string, string>();
  return lines.filter((l) => {
    const k = kindOf.get(l.sector);
    const fixed = l.kind !== 'final-demand';
    if (k !== undefined && (k === 'fixed') !== fixed) return false;
    kindOf.set(l.sector, fixed ? 'fixed' : 'fd');
    return true;
  }).map((l) => (l.kind === 'final-demand' ? l : { ...l, localShare: 1 }));
}

describe('scenario properties', () => {
  it('mixed model = partitioned solve; fixed outputs exact; direct + indirect + induced = total', () => {
    fc.assert(fc.property(tableArb, fc.array(lineArb, { minLength: 1, maxLength: 6 }), (t, raw) => {
      const lines = consistent(raw as ScenarioLine[]);
      const pm = prepareModel(t);
      const r = runScenario(pm, { name: 'p', lines });
      const fixed = r.shock.fixed;
      if (fixed.length === n) return; // nothing endogenous left to compare
      const A = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => pm.coef.A[i * n + j]!));
      const endo = [0, 1, 2, 3].filter((i) => !fixed.includes(i));
      const M = endo.map((i) => endo.map((j) => (i === j ? 1 : 0) - A[i]![j]!));
      const rhs = endo.map((i) => r.shock.df[i]! + fixed.reduce((s, j, k) => s + A[i]![j]! * r.shock.fixedOutput[k]!, 0));
      const xe = (math.lusolve(M, rhs) as number[][]).map((q) => q[0]!);
      const scale = Math.max(...xe.map(Math.abs), ...r.shock.fixedOutput.map(Math.abs));
      endo.forEach((i, k) => expect(rel(r.openOutput[i]!, xe[k]!, 1, scale)).toBeLessThan(1e-10));
      fixed.forEach((j, k) => {
        expect(r.openOutput[j]).toBe(r.shock.fixedOutput[k]);
        expect(r.closedOutput![j]).toBe(r.shock.fixedOutput[k]);
      });
      for (const v of ['output', 'valueAdded', 'income', 'employment'] as const) {
        const s = r.effects[v]!;
        for (let i = 0; i < n; i++) expect(rel(s.direct[i]! + s.indirect[i]! + s.induced![i]!, s.total[i]!, 1, scale)).toBeLessThan(1e-10);
      }
    }), { numRuns: 150 });
  });
  it('final-demand effects are linear in the shock: effect(a + b) = effect(a) + effect(b)', () => {
    fc.assert(fc.property(tableArb, fc.array(lineArb, { minLength: 1, maxLength: 4 }), fc.array(lineArb, { minLength: 1, maxLength: 4 }), (t, a, b) => {
      const fd = (ls: typeof a) => ls.map((l) => ({ ...l, kind: 'final-demand' as const }));
      const pm = prepareModel(t);
      const ra = runScenario(pm, { name: 'a', lines: fd(a) });
      const rb = runScenario(pm, { name: 'b', lines: fd(b) });
      const rab = runScenario(pm, { name: 'ab', lines: [...fd(a), ...fd(b)] });
      const scale = Math.max(1, ...Array.from(rab.closedOutput!, Math.abs), ...Array.from(ra.closedOutput!, Math.abs));
      for (let i = 0; i < n; i++) expect(rel(rab.closedOutput![i]!, ra.closedOutput![i]! + rb.closedOutput![i]!, 1, scale)).toBeLessThan(1e-12);
    }), { numRuns: 100 });
  });
});
