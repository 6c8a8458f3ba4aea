// IOTables built in code for the model tests (values are either from a named source or seeded random, never a reference).
import type { IOTable } from '../../../src/table/index.ts';
import { tableFromParts, type TableParts } from '../../support/io-table.ts';

export function seeded(seed: number): () => number {
  let s = seed >>> 0;
  return () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32);
}

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

/**
 * A seeded random economy of n sectors, balanced: column sums of A are below 1 with the rest split between
 * labour income, other value added and imports; households buy a share of household income.
 */
export function randomEconomy(n: number, seed: number, density = 0.6): IOTable {
  const r = seeded(seed);
  const x = Array.from({ length: n }, () => 50 + 950 * r());
  const Z: number[][] = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  const labour: number[] = [], otherVA: number[] = [], imports: number[] = [], employment: number[] = [];
  for (let j = 0; j < n; j++) {
    const w = Array.from({ length: n }, () => (r() < density ? r() : 0));
    const s = w.reduce((p, q) => p + q, 0) || 1;
    const inter = 0.2 + 0.5 * r(); // share of output bought from other local sectors
    for (let i = 0; i < n; i++) Z[i]![j] = (w[i]! / s) * inter * x[j]!;
    const rest = (1 - inter) * x[j]!;
    labour.push(rest * (0.3 + 0.3 * r()));
    imports.push(rest * 0.2 * r());
    otherVA.push(rest - labour[j]! - imports[j]!);
    employment.push(x[j]! * (0.002 + 0.01 * r()));
  }
  const income = labour.reduce((p, q) => p + q, 0);
  const hw = Array.from({ length: n }, () => r());
  const hs = hw.reduce((p, q) => p + q, 0);
  const households = hw.map((v) => (v / hs) * income * (0.3 + 0.4 * r()));
  return makeTable({ Z, x, labour, otherVA, imports, employment, households });
}

export function toRows(a: Float64Array, n: number): number[][] {
  return Array.from({ length: n }, (_, i) => Array.from(a.subarray(i * n, (i + 1) * n)));
}
