// Small IOTables built in code for the regional tests (the numbers are invented and balanced by hand).
import type { IOTable } from '../../../src/table/index.ts';
import { tableFromParts, type TableParts } from '../../support/io-table.ts';

export type TableSpec = TableParts & { sectors: string[] };

export function buildTable(s: TableSpec): IOTable {
  return tableFromParts(s, {
    name: 'test',
    labourLabel: 'Compensation of employees',
    otherFDLabel: 'Other final demand',
    moneyUnit: 'million dollars',
    roles: {
      rows: { 'Compensation of employees': 'labourIncome', 'Other value added': 'otherValueAdded', Imports: 'imports' },
      columns: { Households: 'householdConsumption', 'Other final demand': 'otherFinalDemand' },
    },
  });
}

/**
 * Three sectors, balanced by hand: column sums of Z + labour + other VA + imports = x, and row sums of Z +
 * households + other final demand = x.
 */
export const THREE = buildTable({
  name: 'three-sector nation',
  sectors: ['Farming', 'Making', 'Services'],
  Z: [
    [10, 20, 30],
    [40, 10, 20],
    [20, 30, 40],
  ],
  x: [200, 300, 400],
  labour: [60, 120, 150],
  otherVA: [50, 80, 100],
  imports: [20, 40, 60],
  employment: [100, 200, 700],
  households: [80, 100, 150],
  otherFD: [60, 130, 160],
});

export function rows(a: Float64Array, n: number): number[][] {
  return Array.from({ length: a.length / n }, (_, i) => Array.from(a.subarray(i * n, (i + 1) * n)));
}

export function expectClose(actual: ArrayLike<number>, expected: ArrayLike<number>, rel = 1e-12): void {
  if (actual.length !== expected.length) throw new Error(`length ${actual.length} ≠ ${expected.length}`);
  for (let k = 0; k < actual.length; k++) {
    const a = actual[k]!;
    const e = expected[k]!;
    if (!(Math.abs(a - e) <= rel * Math.max(1, Math.abs(e)))) throw new Error(`entry ${k}: ${a} ≠ ${e}`);
  }
}
