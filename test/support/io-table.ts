// One builder for IOTables made in code by the tests (no import, no checks: the engine must cope with what it is
// given). Each test area keeps its own wrapper with its own labels and unit, so its tables read as before.
import type { IOTable, LabelledVector, RoleMap } from '../../src/table/index.ts';

export interface TableParts {
  name?: string;
  sectors?: string[];
  Z: number[][];
  x: number[];
  labour?: number[];
  otherVA?: number[];
  imports?: number[];
  employment?: number[] | null;
  households?: number[];
  otherFD?: number[];
}

export interface TableStyle {
  name: string;
  labourLabel: string;
  otherFDLabel: string;
  moneyUnit: string;
  roles?: RoleMap;
}

export function tableFromParts(p: TableParts, style: TableStyle): IOTable {
  const n = p.x.length;
  const Z = new Float64Array(n * n);
  p.Z.forEach((row, i) => row.forEach((v, j) => { Z[i * n + j] = v; }));
  const vec = (label: string, v: number[] | undefined): LabelledVector[] => (v ? [{ label, values: Float64Array.from(v) }] : []);
  return {
    name: p.name ?? style.name,
    sectors: p.sectors ?? Array.from({ length: n }, (_, i) => `S${i + 1}`),
    n,
    Z,
    x: Float64Array.from(p.x),
    labourIncome: vec(style.labourLabel, p.labour),
    otherValueAdded: vec('Other value added', p.otherVA),
    imports: vec('Imports', p.imports),
    employment: p.employment ? Float64Array.from(p.employment) : null,
    householdConsumption: vec('Households', p.households),
    otherFinalDemand: vec(style.otherFDLabel, p.otherFD),
    moneyUnit: style.moneyUnit,
    layout: 'matrix',
    roles: style.roles ?? { rows: {}, columns: {} },
    warnings: [],
  };
}
