// Small IOTables built in code for the regional tests (the numbers are invented and balanced by hand).
import type { IOTable, LabelledVector } from '../../../src/table/types.ts';

export interface TableSpec {
  name?: string;
  sectors: string[];
  Z: number[][];
  x: number[];
  labour?: number[];
  otherVA?: number[];
  imports?: number[];
  employment?: number[] | null;
  households?: number[];
  otherFD?: number[];
}

const vec = (label: string, v: number[] | undefined): LabelledVector[] => (v ? [{ label, values: Float64Array.from(v) }] : []);

export function buildTable(s: TableSpec): IOTable {
  const n = s.sectors.length;
  return {
    name: s.name ?? 'test',
    sectors: s.sectors,
    n,
    Z: Float64Array.from(s.Z.flat()),
    x: Float64Array.from(s.x),
    labourIncome: vec('Compensation of employees', s.labour),
    otherValueAdded: vec('Other value added', s.otherVA),
    imports: vec('Imports', s.imports),
    employment: s.employment ? Float64Array.from(s.employment) : null,
    householdConsumption: vec('Households', s.households),
    otherFinalDemand: vec('Other final demand', s.otherFD),
    moneyUnit: 'million dollars',
    layout: 'matrix',
    roles: {
      rows: { 'Compensation of employees': 'labourIncome', 'Other value added': 'otherValueAdded', Imports: 'imports' },
      columns: { Households: 'householdConsumption', 'Other final demand': 'otherFinalDemand' },
    },
    warnings: [],
  };
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
