// Labour income paid by final-demand columns (government wages, households' own staff) is household income: in the
// model closed with respect to households, total household income x_h includes it, so household consumption per unit
// of income is c_i / x_h with the larger x_h (Miller & Blair, Input–Output Analysis, 2nd ed. 2009, §2.5 — recalled
// from memory). The reference below builds the closed matrix Ā by hand and inverts I − Ā with ml-matrix.
import { describe, it, expect } from 'vitest';
import { Matrix, inverse } from 'ml-matrix';
import { importTable, previewTable, writeTableCsv } from '../../../src/table/index.ts';
import { analyzeTable } from '../../../src/model/index.ts';
import { BASE } from './helpers.ts';

/** BASE with a Government final-demand column that pays 12 of labour income and buys nothing from the sectors. */
const WITH_GOVERNMENT = BASE.trim()
  .split('\n')
  .map((line, k) => {
    const cells = line.split(',');
    const total = cells.pop()!;
    if (k === 0) return [...cells, 'Government', total].join(',');
    if (k <= 3) return [...cells, '0', total].join(',');
    if (cells[0] === 'Compensation of employees') return [...cells, '12', total].join(',');
    return [...cells, '', total].join(',');
  })
  .join('\n');

describe('labour income under final-demand columns', () => {
  it('is read into the table, said in a warning with its cell, and counted in total household income', () => {
    expect(WITH_GOVERNMENT.split('\n')[4]).toBe('Compensation of employees,30,60,50,,,12,');
    const t = importTable(WITH_GOVERNMENT, { fileName: 'gov.csv' });
    expect(t.householdIncomeFromFinalDemand).toEqual([{ row: 'Compensation of employees', column: 'Government', value: 12 }]);
    const w = t.warnings.find((x) => x.code === 'final-demand-income')!;
    expect(w.message).toBe(
      "labour income paid by final-demand columns was read into total household income: 12 from 'Government' (row 'Compensation of employees') (7.9 % of 152). In the household-closed model this income lowers household consumption per unit of income, and so the induced effects (Miller & Blair 2009, §2.5)",
    );
    expect(w.location).toEqual({ file: 'gov.csv', line: 5, column: 7, rowLabel: 'Compensation of employees', columnLabel: 'Government' });
    expect(analyzeTable(t).coefficients.householdIncomeTotal).toBe(152);
  });

  it('Type II output multipliers equal those of the hand-built closed matrix with x_h = 140 + 12', () => {
    const a = analyzeTable(importTable(WITH_GOVERNMENT, { fileName: 'gov.csv' }));
    const x = [100, 200, 150];
    const Z = [[10, 40, 5], [15, 20, 10], [5, 20, 30]];
    const wages = [30, 60, 50];
    const households = [20, 45, 60];
    const xh = 30 + 60 + 50 + 12;
    const abar = Matrix.zeros(4, 4);
    for (let i = 0; i < 3; i++) {
      for (let j = 0; j < 3; j++) abar.set(i, j, Z[i]![j]! / x[j]!);
      abar.set(i, 3, households[i]! / xh);
      abar.set(3, i, wages[i]! / x[i]!);
    }
    const Lbar = inverse(Matrix.eye(4, 4).sub(abar));
    for (let j = 0; j < 3; j++) {
      let want = 0;
      for (let i = 0; i < 3; i++) want += Lbar.get(i, j);
      expect(a.multipliers.output.typeII[j]!).toBeCloseTo(want, 12);
    }
    // Without the government wages the induced effects would be larger (x_h = 140).
    const without = analyzeTable(importTable(BASE, { fileName: 'base.csv' }));
    for (let j = 0; j < 3; j++) expect(without.multipliers.output.typeII[j]!).toBeGreaterThan(a.multipliers.output.typeII[j]!);
  });

  it('text in such a cell is refused at the cell, not ignored', () => {
    const p = previewTable(WITH_GOVERNMENT.replace(',,,12,', ',,,see note,'), { fileName: 'gov.csv' });
    expect(p.refusal?.formatted).toBe("gov.csv:5:7 (row 'Compensation of employees', column 'Government'): 'see note' is not a number");
  });

  it('the long layout reads the same pair', () => {
    const long = 'from,to,value\nA,A,10\nA,Households,90\nA,Total output,100\nWages,A,60\nWages,Government,7\nOther value added,A,30\n';
    const t = importTable(long, { fileName: 'long.csv' });
    expect(t.householdIncomeFromFinalDemand).toEqual([{ row: 'Wages', column: 'Government', value: 7 }]);
  });

  it('other cells of that corner (value added or imports under final demand) are still not read', () => {
    const t = importTable(WITH_GOVERNMENT.replace('Imports,15,20,10,,,,', 'Imports,15,20,10,,,4,'), { fileName: 'gov.csv' });
    expect(t.householdIncomeFromFinalDemand).toHaveLength(1);
  });

  it('the table writer writes it back in its cell', () => {
    const t = importTable(WITH_GOVERNMENT, { fileName: 'gov.csv' });
    const back = importTable(writeTableCsv(t), { fileName: 'w.csv' });
    expect(back.householdIncomeFromFinalDemand).toEqual(t.householdIncomeFromFinalDemand);
    expect(analyzeTable(back).multipliers.output.typeII).toEqual(analyzeTable(t).multipliers.output.typeII);
  });
});
