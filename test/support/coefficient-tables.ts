// IOTables built in code from their parts or their coefficient matrix, and seeded random economies, for the model,
// scenario and uncertainty tests (values are either from a named source or seeded random, never a reference).
import type { IOTable } from '../../src/table/index.ts';
import { tableFromParts, type TableParts } from './io-table.ts';
import { randomEconomyParts } from './random-tables.ts';

export type { TableParts };

/** A validated-looking IOTable from its parts (no import, no checks: the model must cope with what it is given). */
export function makeTable(p: TableParts): IOTable {
  return tableFromParts(p, { name: 'test table', labourLabel: 'Labour income', otherFDLabel: 'Exports', moneyUnit: 'money' });
}

/** A table whose coefficient matrix is exactly `a` (x = 1 in every sector, so Z = A), with household rows and columns. */
export function tableFromA(a: number[][], extra: Partial<TableParts> = {}): IOTable {
  const n = a.length;
  const x = new Array<number>(n).fill(1);
  return makeTable({ Z: a, x, ...extra });
}

/** A seeded random economy of n sectors as a model-test table (see randomEconomyParts in test/support). */
export function randomEconomy(n: number, seed: number, density = 0.6): IOTable {
  return makeTable(randomEconomyParts(n, seed, density));
}

export function toRows(a: Float64Array, n: number): number[][] {
  return Array.from({ length: n }, (_, i) => Array.from(a.subarray(i * n, (i + 1) * n)));
}
