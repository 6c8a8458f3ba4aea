/**
 * A seeded invented input–output table of n sectors for the benchmark (invented numbers, no real economy): flows
 * Z = A·diag(x) from inventedCoefficients, rounded to cents, balanced so that every row and column total equals
 * total output; labour income, other value added, imports, household consumption, other final demand, employment.
 */
import type { IOTable } from '../../src/table/index.ts';
import { luFactor, luSolve, identityMinus } from '../../src/linalg/index.ts';
import { inventedCoefficients, seeded } from './matrices.ts';

const cents = (v: number): number => Math.round(v * 100) / 100;

export function inventedTable(n: number): IOTable {
  const r = seeded(7 + n);
  const a = inventedCoefficients(n);
  // x = (I − A)⁻¹ f with positive final demand f, so that every row leaves room for final demand.
  const f = Float64Array.from({ length: n }, () => 1000 + 99000 * r() ** 2);
  const x0 = luSolve(luFactor(identityMinus(a, n), n), f);
  const Z = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) Z[i * n + j] = cents(a[i * n + j]! * x0[j]!);
  const hc = new Float64Array(n);
  const ofd = new Float64Array(n);
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let s = 0;
    for (let j = 0; j < n; j++) s += Z[i * n + j]!;
    const fd = Math.max(1, x0[i]! - s);
    hc[i] = cents(fd * (0.2 + 0.5 * r()));
    ofd[i] = cents(fd - hc[i]!);
    x[i] = cents(s + hc[i]! + ofd[i]!);
  }
  const labour = new Float64Array(n);
  const imports = new Float64Array(n);
  const otherVA = new Float64Array(n);
  const jobs = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    let s = 0;
    for (let i = 0; i < n; i++) s += Z[i * n + j]!;
    const va = x[j]! - s;
    labour[j] = cents(va * (0.35 + 0.3 * r()));
    imports[j] = cents(va * (0.05 + 0.15 * r()));
    otherVA[j] = cents(va - labour[j]! - imports[j]!);
    jobs[j] = Math.round((x[j]! / 1000) * (2 + 10 * r()));
  }
  const sectors = Array.from({ length: n }, (_, i) => `Invented sector ${i + 1}`);
  return {
    name: `invented-${n}`, sectors, n, Z, x,
    labourIncome: [{ label: 'Labour income', values: labour }],
    otherValueAdded: [{ label: 'Other value added', values: otherVA }],
    imports: [{ label: 'Imports', values: imports }],
    employment: jobs,
    householdConsumption: [{ label: 'Households', values: hc }],
    otherFinalDemand: [{ label: 'Exports and other final demand', values: ofd }],
    moneyUnit: 'thousand (invented)',
    layout: 'matrix',
    roles: { rows: {}, columns: {} },
    warnings: [],
  };
}
