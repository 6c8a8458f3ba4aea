// The long and coefficients layouts of one table import to the same table as its labelled matrix.
// Coefficients a_ij = z_ij / x_j (Miller & Blair, Input–Output Analysis, 2nd ed. 2009, eq. 2.4), so flows read back as
// a_ij·x_j agree with the matrix to rounding (relative 1e-12), not bit for bit.
import { describe, it, expect } from 'vitest';
import { importTable, previewTable, type IOTable } from '../../../src/table/index.ts';
import { SAMPLE_CSV } from '../../../src/table/sample.ts';
import { toCsv, type Cell } from '../../../src/csv/index.ts';

const m = importTable(SAMPLE_CSV, { fileName: 'sample.csv' });
const { n, sectors } = m;

function longText(t: IOTable): string {
  const rows: Cell[][] = [['from', 'to', 'value (thousand dollars)']];
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) rows.push([sectors[i]!, sectors[j]!, t.Z[i * n + j]!]);
    for (const v of [...t.householdConsumption, ...t.otherFinalDemand]) rows.push([sectors[i]!, v.label, v.values[i]!]);
    rows.push([sectors[i]!, 'Total output', t.x[i]!]);
  }
  for (const v of [...t.labourIncome, ...t.otherValueAdded, ...t.imports]) for (let j = 0; j < n; j++) rows.push([v.label, sectors[j]!, v.values[j]!]);
  for (let j = 0; j < n; j++) rows.push(['Employment', sectors[j]!, t.employment![j]!]);
  return toCsv(rows);
}

function coefficientText(t: IOTable, corner: string): string {
  const fd = [...t.householdConsumption, ...t.otherFinalDemand];
  const rows: Cell[][] = [[corner, ...sectors, ...fd.map((v) => v.label), 'Total output']];
  for (let i = 0; i < n; i++) rows.push([sectors[i]!, ...sectors.map((_, j) => t.Z[i * n + j]! / t.x[j]!), ...fd.map((v) => v.values[i]!), t.x[i]!]);
  for (const v of [...t.labourIncome, ...t.otherValueAdded, ...t.imports]) rows.push([v.label, ...sectors.map((_, j) => v.values[j]! / t.x[j]!), ...fd.map(() => null), null]);
  rows.push(['Employment', ...sectors.map((_, j) => t.employment![j]! / t.x[j]!), ...fd.map(() => null), null]);
  return toCsv(rows);
}

function close(a: ArrayLike<number>, b: ArrayLike<number>, rel: number): void {
  expect(a.length).toBe(b.length);
  for (let k = 0; k < a.length; k++) expect(Math.abs(a[k]! - b[k]!)).toBeLessThanOrEqual(rel * Math.max(Math.abs(b[k]!), 1e-300));
}

function sameTable(t: IOTable, rel: number): void {
  expect(t.sectors).toEqual(m.sectors);
  close(t.Z, m.Z, rel);
  close(t.x, m.x, 0);
  for (const k of ['labourIncome', 'otherValueAdded', 'imports', 'householdConsumption', 'otherFinalDemand'] as const) {
    // Same vectors by label (in the long layout their order follows first appearance in the file).
    expect(t[k].map((v) => v.label).sort()).toEqual(m[k].map((v) => v.label).sort());
    for (const v of t[k]) close(v.values, m[k].find((w) => w.label === v.label)!.values, k === 'householdConsumption' || k === 'otherFinalDemand' ? 0 : rel);
  }
  close(t.employment!, m.employment!, rel);
}

describe('layouts', () => {
  it('long layout is detected and equals the matrix exactly', () => {
    const t = importTable(longText(m), { fileName: 'long.csv' });
    expect(t.layout).toBe('long');
    expect(t.moneyUnit).toBe('thousand dollars');
    sameTable(t, 0);
    expect(t.warnings).toEqual([]);
  });
  it('long layout with the fields in another order and pairs shuffled', () => {
    const lines = longText(m).trimEnd().split('\r\n').slice(1).map((l) => l.split(','));
    // Value-added rows first, and each `from` group's pairs reversed: the order of records must not matter
    // (sector order follows the first appearance of each sector as `from`).
    const groups = new Map<string, string[][]>();
    for (const rec of lines) groups.set(rec[0]!, [...(groups.get(rec[0]!) ?? []), rec]);
    const order = [...groups.keys()].sort((a, b) => Number(sectors.includes(a)) - Number(sectors.includes(b)));
    const body = order.flatMap((k) => groups.get(k)!.reverse()).map(([f, t, v]) => [v, t, f].join(','));
    const text = ['amount,to,from', ...body].join('\n');
    const t = importTable(text, { fileName: 'long2.csv' });
    sameTable(t, 0);
  });
  it('coefficients layout is detected from the numbers and equals the matrix', () => {
    const text = coefficientText(m, 'thousand dollars');
    const p = previewTable(text, { fileName: 'coef.csv' });
    expect(p.layout).toBe('coefficients');
    sameTable(p.table!, 1e-12);
  });
  it('coefficients layout is detected from the corner cell', () => {
    const text = coefficientText(m, 'Technical coefficients');
    expect(importTable(text, { fileName: 'coef.csv' }).layout).toBe('coefficients');
  });
  it('a forced layout wins over detection', () => {
    const text = coefficientText(m, 'thousand dollars');
    const asMatrix = importTable(text, { fileName: 'coef.csv', layout: 'matrix' });
    expect(asMatrix.layout).toBe('matrix');
    expect(asMatrix.Z[0]).toBe(m.Z[0]! / m.x[0]!);
    expect(importTable(SAMPLE_CSV, { fileName: 's.csv', layout: 'coefficients' }).layout).toBe('coefficients');
  });
  it('a flow table is not taken for coefficients', () => {
    expect(m.layout).toBe('matrix');
  });
});
