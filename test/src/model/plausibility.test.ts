// Economically impossible or implausible tables are named, with their numbers, beside the productivity verdict:
// negative value added (sectors and their value added) and output multipliers above the plausibility threshold.
import { describe, expect, it } from 'vitest';
import { analyzeTable } from '../../../src/model/analysis.ts';
import { MULTIPLIER_PLAUSIBILITY } from '../../../src/model/plausibility.ts';
import { analysisJson } from '../../../src/report/index.ts';
import { importTable } from '../../../src/table/index.ts';

const csv = (...rows: string[]) => rows.join('\r\n') + '\r\n';

describe('plausibility findings', () => {
  it('a sector buying more than it makes: productive all the same, with one finding naming the sector and its value added, and no contradicting import note', () => {
    // A = [[0.1, 0.05], [1.2, 0.05]]: column A sums to 1.3, yet ρ(A) = 0.075 + √(0.075² + 0.055) ≈ 0.3212 (eigenvalues of a
    // 2×2 from its trace 0.15 and determinant −0.055). Value added of A = 100 − 130 = −30 (recorded as 20 − 50).
    const t = importTable(csv(
      'thousand dollars,A,B,Households,Exports,Total output',
      'A,10,10,40,40,100',
      'B,120,10,35,35,200',
      'Labor income,20,100,,,',
      'Other value added,-50,80,,,',
    ), { fileName: 'loss.csv' });
    const importNote = t.warnings.find((w) => w.code === 'inputs-exceed-output');
    expect(importNote?.message).toBe("intermediate inputs exceed output in 'A': value added there is negative (the analysis lists each such sector with its value added)");
    const an = analyzeTable(t);
    expect(an.viability.productive).toBe(true);
    expect(an.viability.perronRoot).toBeCloseTo(0.075 + Math.sqrt(0.075 ** 2 + 0.055), 10);
    expect(an.viability.negativeValueAdded).toEqual([{ sector: 0, label: 'A', output: 100, intermediateInputs: 130, imports: 0, valueAdded: expect.closeTo(-30, 9) }]);
    const codes = an.warnings.map((w) => w.code);
    expect(codes).toContain('negative-value-added');
    expect(codes).not.toContain('inputs-exceed-output'); // one finding, the analysis's
    expect(an.warnings.find((w) => w.code === 'negative-value-added')!.message).toMatch(/^negative value added in 1 sector: 'A' -30 thousand dollars \(output 100, intermediate inputs 130, imports 0\)/);
    expect(analysisJson(an).viability).toMatchObject({ negativeValueAdded: [{ sector: 'A', valueAdded: expect.closeTo(-30, 9) }] });
  });

  it('a balanced table has no negative value added (a column that balances exactly is not flagged by rounding)', () => {
    const an = analyzeTable(importTable(csv(
      'thousand dollars,A,B,Households,Exports,Total output',
      'A,10.1,20.3,30.7,38.9,100',
      'B,20.2,10.1,30.3,39.4,100',
      'Labor income,40.4,39.9,,,', 'Other value added,29.3,29.7,,,',
    ), { fileName: 'ok.csv' }));
    expect(an.viability.negativeValueAdded).toEqual([]);
    expect(an.implausibleMultipliers).toEqual([]);
  });

  it('Type I output multipliers of 10 are flagged above the threshold of 4', () => {
    // Every column of A sums to 0.9, so 1ᵀA^k = 0.9^k·1ᵀ and each column of L = Σ A^k sums to 1/(1 − 0.9) = 10.
    const an = analyzeTable(importTable(csv(
      'thousand dollars,A,B,Exports,Total output',
      'A,50,40,10,100', 'B,40,50,10,100', 'Other value added,10,10,,',
    ), { fileName: 'dense.csv' }));
    expect(MULTIPLIER_PLAUSIBILITY.outputTypeI).toBe(4);
    const [flag] = an.implausibleMultipliers;
    expect(flag).toMatchObject({ measure: 'output.typeI', threshold: 4 });
    expect(flag!.sectors.map((s) => s.label).sort()).toEqual(['A', 'B']);
    for (const s of flag!.sectors) expect(s.value).toBeCloseTo(10, 10);
    expect(an.warnings.find((w) => w.code === 'implausible-multiplier')!.message).toMatch(/^Type I output multipliers above 4 \(our plausibility threshold; county and state tables rarely exceed 3\) in 2 sectors: 'A' 10; 'B' 10/);
  });

  it('a Type II output multiplier of 100 is flagged above the threshold of 6', () => {
    // A = 0, labour income h = 0.9 per unit of output, households buy c = 99/180 = 0.55 per unit of income in each
    // sector (1.1 times their labour income in all): s = 1 − h·c = 1 − 0.99 = 0.01 and, since the first n rows of
    // (I − Ā)⁻¹ are I + c·hᵀ/s, each Type II output multiplier is 1 + (Σc)·h/s = 1 + 0.99/0.01 = 100.
    const an = analyzeTable(importTable(csv(
      'thousand dollars,A,B,Households,Exports,Total output',
      'A,0,0,99,1,100', 'B,0,0,99,1,100',
      'Labor income,90,90,,,', 'Other value added,10,10,,,',
    ), { fileName: 'respend.csv' }));
    expect(an.viability.closedProductive).toBe(true);
    const flag = an.implausibleMultipliers.find((f) => f.measure === 'output.typeII');
    expect(flag?.threshold).toBe(MULTIPLIER_PLAUSIBILITY.outputTypeII);
    for (const s of flag!.sectors) expect(s.value).toBeCloseTo(100, 8);
    expect(an.implausibleMultipliers.some((f) => f.measure === 'output.typeI')).toBe(false);
    expect(an.warnings.map((w) => w.message).join('\n')).toMatch(/Type II output multipliers above 6 .* 'A' 100; 'B' 100/);
    expect(analysisJson(an).implausibleMultipliers).toEqual([{ measure: 'output.typeII', threshold: 6, sectors: [{ sector: 'A', value: expect.closeTo(100, 8) }, { sector: 'B', value: expect.closeTo(100, 8) }] }]);
  });
});
