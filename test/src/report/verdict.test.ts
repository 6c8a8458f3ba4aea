// The verdict in words says what the analysis decided and nothing more: the Perron root as the long-run ratio of
// successive rounds (never a bound on the first rounds), the Type II reason from the analysis, and the plausibility
// findings beside the decision. Tables are small and invented; the numbers come from the analysis under test.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { analyzeTable } from '../../../src/model/index.ts';
import { importTable } from '../../../src/table/index.ts';
import { spendingRounds } from '../../../src/scenario/index.ts';
import { prepareModel, solveOpen } from '../../../src/model/index.ts';
import { verdictOf } from '../../../src/report/index.ts';

const csv = (...rows: string[]) => rows.join('\r\n') + '\r\n';

describe('the verdict in words', () => {
  it('states the Perron root as the long-run ratio, which the first rounds may exceed', () => {
    const t = importTable(readSample(), { fileName: 'county.csv' });
    const an = analyzeTable(t);
    const v = verdictOf(an);
    expect(v.productive).toBe(true);
    expect(v.say).toMatch(/^The table is productive/);
    const rate = v.detail.find((d) => d.includes('Perron root'))!;
    expect(rate).toMatch(/In the long run each round .* is about \d+\.\d % of the round before/);
    expect(rate).toMatch(/the first rounds can shrink faster or slower/);
    expect(rate).not.toMatch(/at most/);
    // The reason it may not say "at most": one unit of demand in every sector, round 1 over round 0 is above ρ here.
    const pm = prepareModel(t);
    const f = new Float64Array(t.n).fill(1);
    const r = spendingRounds(pm, f, solveOpen(pm, f));
    expect(r.ratio[1]!).toBeGreaterThan(an.viability.perronRoot);
  });

  it('names sectors with negative value added and says the multipliers need checking, beside a productive verdict', () => {
    const an = analyzeTable(importTable(csv(
      'thousand dollars,A,B,Households,Exports,Total output',
      'A,10,10,40,40,100',
      'B,120,10,35,35,200',
      'Labor income,20,100,,,',
      'Other value added,-50,80,,,',
    ), { fileName: 'loss.csv' }));
    const v = verdictOf(an);
    expect(v.productive).toBe(true);
    expect(v.detail.join('\n')).toMatch(/one sector buys more intermediate inputs and imports than its output, so its value added is negative: 'A' \(-30(\.0+)? thousand dollars\)/);
  });

  it('gives the analysis\' own reason when there is no Type II model', () => {
    // Households the only final demand and the table balanced: ρ(Ā) = 1 exactly, so no Type II model.
    const an = analyzeTable(importTable(csv(
      'dollars,A,B,Households,Total output',
      'A,20,30,50,100',
      'B,40,10,50,100',
      'Labor income,40,60,,',
    ), { fileName: 'closed.csv' }));
    const v = verdictOf(an);
    expect(an.availability.closed).not.toBe(true);
    expect(v.detail.at(-1)).toBe(`No Type II model: ${an.availability.closed as string}.`);
  });
});

function readSample(): string {
  return readFileSync('sample-data/fernhollow-county.csv', 'utf8');
}
