// validateTable applies the importer's whole-table checks to a table that did not come through the importer (a
// project file's stored table): every refusal the importer makes for such a table is made again, located by label.
import { describe, it, expect } from 'vitest';
import { importTable, validateTable, type IOTable } from '../../../src/table/index.ts';
import { formatLocated } from '../../../src/diagnostics/index.ts';
import { SAMPLE_CSV } from '../../../src/table/sample.ts';
import { refusal } from '../../support/refusal.ts';
import { BASE } from './helpers.ts';

const good = importTable(BASE, { fileName: 'base.csv' });
const copy = (t: IOTable): IOTable => ({
  ...t,
  sectors: [...t.sectors],
  Z: Float64Array.from(t.Z),
  x: Float64Array.from(t.x),
  labourIncome: t.labourIncome.map((v) => ({ label: v.label, values: Float64Array.from(v.values) })),
  employment: t.employment ? Float64Array.from(t.employment) : null,
});
const refused = (t: IOTable, opts = {}): string => formatLocated(refusal(() => validateTable(t, 'study.roundwise', opts)));

describe('validateTable', () => {
  it('accepts what the importer accepts', () => {
    expect(() => validateTable(good, 'study.roundwise')).not.toThrow();
    expect(() => validateTable(importTable(SAMPLE_CSV, { fileName: 's.csv' }), 's')).not.toThrow();
  });

  it('negative flows, unless allowed', () => {
    const t = copy(good);
    t.Z[1 * 3 + 2] = -4;
    expect(refused(t)).toBe("study.roundwise (row 'Mills', column 'Services'): negative intermediate flow -4 (allow negative flows to accept it)");
    expect(() => validateTable(t, 'study.roundwise', { allowNegative: true })).not.toThrow();
  });

  it('negative output, and zero output in a sector that buys inputs', () => {
    const t = copy(good);
    t.x[2] = -150;
    expect(refused(t)).toBe("study.roundwise (row 'Services', column 'Total output'): sector 'Services' has negative output -150");
    t.x[2] = 0;
    expect(refused(t)).toBe("study.roundwise (row 'Services', column 'Total output'): sector 'Services' has zero output but buys intermediate inputs");
  });

  it('negative jobs', () => {
    const t = copy(good);
    t.employment![1] = -30;
    expect(refused(t)).toBe("study.roundwise (row 'Employment', column 'Mills'): negative employment -30 (jobs cannot be negative)");
  });

  it('sector labels that differ only in case, spacing or Unicode form', () => {
    expect(refused({ ...copy(good), sectors: ['Farming', 'FARMING', 'Services'] })).toBe(
      "study.roundwise (row 'FARMING'): row labels 'Farming' and 'FARMING' differ only in case, spacing or invisible characters, so they would be read as one",
    );
    expect(refusal(() => validateTable({ ...copy(good), sectors: ['Caf\u00e9', 'Cafe\u0301', 'Services'] }, 'p')).code).toBe('duplicate-label');
    expect(refusal(() => validateTable({ ...copy(good), sectors: ['Farming', 'Mills', 'Imports'] }, 'p')).code).toBe('duplicate-label');
    expect(refusal(() => validateTable({ ...copy(good), sectors: ['Farming', '\u200b', 'Services'] }, 'p')).code).toBe('missing-label');
  });

  it('non-finite numbers anywhere', () => {
    const t = copy(good);
    t.labourIncome[0]!.values[1] = Number.NaN;
    expect(refused(t)).toBe("study.roundwise (row 'Compensation of employees', column 'Mills'): NaN is not a finite number");
    const u = copy(good);
    u.Z[0] = Number.POSITIVE_INFINITY;
    expect(refusal(() => validateTable(u, 'p')).code).toBe('not-finite');
  });

  it('1e308 amounts whose sums overflow', () => {
    const t = copy(good);
    t.x.set([1e308, 1e308, 1e308]);
    t.Z.fill(0);
    t.Z[0] = 1e308;
    expect(refused(t)).toBe("study.roundwise (column 'Total output'): the total of all sectors’ output overflows (numbers too large to add up)");
    const u = copy(good);
    u.Z[0] = 1e308;
    u.Z[1] = 1e308;
    expect(refused(u)).toBe("study.roundwise (row 'Farming'): the row sum overflows (numbers too large to add up)");
    // The importer refuses the same total.
    const text = BASE.replace(',100\n', ',1e308\n').replace(',200\n', ',1e308\n').replace('Farming,10,40,5,20,25', 'Farming,0,0,0,0,0');
    expect(formatLocated(refusal(() => importTable(text, { fileName: 'big.csv' })))).toBe("big.csv (column 'Total output'): the total of all sectors’ output overflows (numbers too large to add up)");
  });

  it('labour income under final demand must name a labour-income row and a final-demand column', () => {
    const t = { ...copy(good), householdIncomeFromFinalDemand: [{ row: 'Compensation of employees', column: 'Government', value: 5 }] };
    expect(refused(t)).toBe("study.roundwise (row 'Compensation of employees', column 'Government'): labour income paid by a final-demand column names a row that is not a labour-income row or a column that is not final demand");
    expect(() => validateTable({ ...t, householdIncomeFromFinalDemand: [{ row: 'Compensation of employees', column: 'Exports', value: 5 }] }, 'p')).not.toThrow();
  });

  it('vectors of the wrong length', () => {
    const t = { ...copy(good), x: Float64Array.from([1, 2]) };
    expect(refused(t)).toBe('study.roundwise: total output: expected 3 values, found 2');
  });
});
