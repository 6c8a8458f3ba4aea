// CV files: cells, rows and columns with their own coefficient of variation, applied in order; bad lines refused
// at their line and column.
import { describe, expect, it } from 'vitest';
import { SAMPLE_CSV, importTable, formatLocated } from '../../../src/study/index.ts';
import { parseCvCsv, sigmaOf } from '../../../src/uncertainty/index.ts';
import { sigmaPlan } from '../../../src/uncertainty/cv.ts';

const t = importTable(SAMPLE_CSV, { fileName: 'sample.csv' });
const n = t.n;

function refusal(text: string): string {
  try {
    sigmaPlan(t, 0.1, parseCvCsv(text, 'cv.csv'));
  } catch (e) {
    return formatLocated(e as never);
  }
  return 'accepted';
}

describe('CV files', () => {
  it('apply cells, rows and columns in file order over the --cv value', () => {
    const rules = parseCvCsv('row,column,cv\n*,*,0\nFarming,*,0.2\nFarming,Utilities,0.05\n*,Households,0.3\n', 'cv.csv');
    const p = sigmaPlan(t, 0.1, rules);
    const z = p.z as Float64Array;
    expect(z[0 * n + 0]).toBe(sigmaOf(0.2));
    expect(z[0 * n + 3]).toBe(sigmaOf(0.05));
    expect(z[1 * n + 0]).toBe(0);
    expect((p.household[0] as Float64Array)[5]).toBe(sigmaOf(0.3));
    expect((p.labour[0] as Float64Array)[0]).toBe(0);
    expect(p.perturbed).toBe(true);
  });

  it('perturb nothing when every CV is 0', () => {
    expect(sigmaPlan(t, 0, parseCvCsv('*,*,0\n', 'cv.csv')).perturbed).toBe(false);
    expect(sigmaPlan(t, 0, []).perturbed).toBe(false);
  });

  it('refuse unknown labels, bad numbers and CVs out of range where they were read', () => {
    expect(refusal('row,column,cv\nFarmin,*,0.1\n')).toMatch(/^cv\.csv:2:1 .*no sector or labour-income row 'Farmin'/);
    expect(refusal('Farming,Nowhere,0.1\n')).toMatch(/^cv\.csv:1:2 .*no sector or household-consumption column 'Nowhere'/);
    expect(refusal('Farming,*,0.1\nFarming,*,ten\n')).toMatch(/^cv\.csv:2:3 .*the cv 'ten' is not a number/);
    expect(refusal('row,column,cv\nFarming,*,3\n')).toMatch(/^cv\.csv:2:3 .*must be a number from 0 to 2/);
    expect(refusal('Farming,*\n')).toMatch(/^cv\.csv:1/);
  });
});
