// The invented sample files: reproducible from their seeded generator, exactly balanced, and usable together.
import { describe, it, expect } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { nationalTableCsv, employmentCsv, SECTORS } from '../../../sample-data/generate-national-table.ts';
import { parseLabelledMatrix, parseEmploymentCsv, parseGroupMapping, regionalize, aggregateTable } from '../../../src/regional/index.ts';
import { buildTable } from './build-table.ts';

const SAMPLE = join(import.meta.dirname, '../../../sample-data');
const read = (name: string) => readFileSync(join(SAMPLE, name), 'utf8');

/** The national file read as a plain labelled matrix (blank = 0), for checks that do not depend on the table importer. */
function nationalFromFile() {
  const m = parseLabelledMatrix(read('national-table.csv'), 'national-table.csv');
  const n = SECTORS.length;
  const cell = (r: string, c: string) => m.values[m.rowLabels.indexOf(r) * m.columns + m.columnLabels.indexOf(c)]!;
  const row = (r: string) => SECTORS.map((s) => cell(r, s));
  const col = (c: string) => SECTORS.map((s) => cell(s, c));
  return { m, n, cell, row, col };
}

describe('sample data', () => {
  it('national-table.csv and fernhollow-employment.csv are the output of their seeded generator', () => {
    expect(read('national-table.csv')).toBe(nationalTableCsv());
    expect(read('fernhollow-employment.csv')).toBe(employmentCsv());
    expect(read('national-table.csv').split('\n')[0]).toBe('million dollars,Farming,Forestry and logging,Mining and quarrying,Utilities,Construction,Food processing,Wood and paper products,Metal and machinery,Wholesale and retail trade,Transport and warehousing,Information and finance,Real estate,Professional services,Health and social care,Accommodation and food service,Public administration and education,Households,Exports,Other final demand,Total output\r');
  });

  it('the national table balances exactly: every row and column of a sector sums to its total output', () => {
    const { row, col, cell } = nationalFromFile();
    SECTORS.forEach((s, i) => {
      const x = cell(s, 'Total output');
      expect(cell('Total input', s)).toBe(x);
      const sales = SECTORS.reduce((a, t) => a + cell(s, t), 0) + cell(s, 'Households') + cell(s, 'Exports') + cell(s, 'Other final demand');
      const cost = col(s).reduce((a, v) => a + v, 0) + row('Compensation of employees')[i]! + row('Other value added')[i]! + row('Imports')[i]!;
      expect(sales).toBe(x);
      expect(cost).toBe(x);
    });
  });

  it('the employment file and the sector groups cover the national sectors; FLQ gives a balanced county table', () => {
    const { row, col, cell } = nationalFromFile();
    const t = buildTable({
      sectors: [...SECTORS],
      Z: SECTORS.map((s) => SECTORS.map((c) => cell(s, c))),
      x: col('Total output'),
      labour: row('Compensation of employees'), otherVA: row('Other value added'), imports: row('Imports'),
      employment: row('Employment (jobs)'), households: col('Households'),
      otherFD: SECTORS.map((s) => cell(s, 'Exports') + cell(s, 'Other final demand')),
    });
    const res = regionalize(t, parseEmploymentCsv(read('fernhollow-employment.csv'), 'fernhollow-employment.csv'), { method: 'flq' });
    expect(res.absent).toEqual([]);
    // the FLQ estimate keeps only a tenth of the national indirect effect (λ* is small for a county this size): warned
    expect(res.warnings.map((w) => w.code)).toEqual(['regional-implausible-multipliers']);
    expect(res.lambda!).toBeGreaterThan(0);
    expect(res.lambda!).toBeLessThan(1);
    for (const v of res.table.otherFinalDemand[0]!.values) expect(v).toBeGreaterThanOrEqual(0);
    const agg = aggregateTable(res.table, parseGroupMapping(read('fernhollow-groups.csv'), 'fernhollow-groups.csv'));
    expect(agg.groups).toHaveLength(6);
  });
});
