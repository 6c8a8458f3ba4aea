/**
 * Two example IOTables built in code, for the scenario, report and project tests. The Miller & Blair two-sector table is their §2.3 example
 * (Input–Output Analysis, 2nd ed. 2009; recalled from memory). `county4` is invented (demo data, not a reference).
 */
import type { IOTable } from '../../src/table/index.ts';
import { tableFromParts, type TableParts } from './io-table.ts';

export type TableSpec = Omit<TableParts, 'households'> & { sectors: string[]; household?: number[] };

export function makeTable(s: TableSpec): IOTable {
  const { household, ...rest } = s;
  return tableFromParts({ ...rest, ...(household ? { households: household } : {}) }, {
    name: 'test table', labourLabel: 'Compensation of employees', otherFDLabel: 'Other final demand', moneyUnit: 'thousand dollars',
  });
}

/** Miller & Blair 2009 §2.3: Z = [[150, 500], [200, 100]], x = [1000, 2000], value added [650, 1400] (recalled from memory). */
export function millerBlair2(): IOTable {
  return makeTable({
    name: 'Miller & Blair two-sector example',
    sectors: ['Agriculture', 'Manufacturing'],
    Z: [[150, 500], [200, 100]],
    x: [1000, 2000],
    labour: [300, 500],
    otherVA: [350, 900],
    household: [90, 50],
    otherFD: [260, 1650],
    employment: [20, 30],
  });
}

/** Invented four-sector county (demo data): with employment, household closure and imports. */
export function county4(): IOTable {
  const Z = [
    [120, 40, 10, 30],
    [60, 200, 50, 80],
    [30, 90, 40, 60],
    [20, 70, 30, 100],
  ];
  const x = [800, 1500, 600, 1100];
  const labour = [200, 400, 250, 450];
  const imports = [150, 300, 80, 120];
  const otherVA = x.map((xj, j) => xj - Z.reduce((s, r) => s + r[j]!, 0) - labour[j]! - imports[j]!);
  return makeTable({
    name: 'Invented county (demo)',
    sectors: ['Farms', 'Food processing', 'Retail', 'Services'],
    Z,
    x,
    labour,
    otherVA,
    imports,
    employment: [40, 25, 30, 35],
    household: [50, 250, 300, 500],
    otherFD: [550, 865, 80, 390],
  });
}
