// The bundled sample county (invented; demo data, never a reference value): reproducible from its seeded generator,
// identical in its three shipped forms, balanced to the cent, and economically plausible.
import { describe, it, expect } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { eigs, matrix } from 'mathjs';
import { importTable } from '../../../src/table/index.ts';
import { writeTableCsv } from '../../../src/table/write.ts';
import { SAMPLE_CSV, SAMPLE_FILE_NAME, SAMPLE_NOTE } from '../../../src/table/sample.ts';
import { buildFernhollow } from '../../fixtures/table/fernhollow.ts';
import { ABOUT_TEXT, sampleModuleText } from '../../fixtures/table/make-sample.ts';

const root = fileURLToPath(new URL('../../../', import.meta.url));
const read = (p: string): string => readFileSync(root + p, 'utf8');

/** Exact hundredths from the text of a cell ("37645.2" → 3764520), refusing more than two decimals. */
function cents(s: string): number {
  if (s === '') return 0;
  const m = /^(-?)(\d+)(?:\.(\d{1,2}))?$/.exec(s);
  if (!m) throw new Error(`not a money amount with at most two decimals: '${s}'`);
  const v = Number(m[2]) * 100 + Number((m[3] ?? '').padEnd(2, '0'));
  expect(Number.isSafeInteger(v)).toBe(true);
  return m[1] ? -v : v;
}

describe('sample county: Fernhollow County (invented)', () => {
  const rows = SAMPLE_CSV.trimEnd().split('\r\n').map((l) => l.split(','));
  const header = rows[0]!;
  const t = importTable(SAMPLE_CSV, { fileName: SAMPLE_FILE_NAME });
  const n = t.n;

  it('is reproducible and shipped identically as CSV, sidecar and module', () => {
    const csv = writeTableCsv(buildFernhollow());
    expect(read('sample-data/fernhollow-county.csv')).toBe(csv);
    expect(SAMPLE_CSV).toBe(csv);
    expect(read('src/table/sample.ts')).toBe(sampleModuleText(csv));
    expect(read('sample-data/fernhollow-county.about.txt')).toBe(ABOUT_TEXT);
  });

  it('says it is invented, in the sidecar, the module and the README files', () => {
    expect(ABOUT_TEXT).toMatch(/Fernhollow County is an invented county/);
    expect(SAMPLE_NOTE).toMatch(/invented/);
    expect(read('sample-data/README.md')).toMatch(/Everything here is invented/);
    expect(read('README.md')).toMatch(/Fernhollow County[^\n]*invented/);
  });

  it('has the stated layout: 16 sectors, the final-demand columns and the value-added, import, jobs and total rows', () => {
    expect(n).toBe(16);
    expect(t.sectors[0]).toBe('Farming');
    expect(t.sectors[15]).toBe('Public administration and education');
    expect(header[0]).toBe('thousand dollars');
    expect(header.slice(17)).toEqual(['Households', 'Exports', 'Other final demand', 'Total output']);
    expect(rows.slice(17).map((r) => r[0])).toEqual(['Compensation of employees', 'Other value added', 'Imports', 'Employment (jobs)', 'Total input']);
    expect(t.warnings).toEqual([]);
    expect(t.labourIncome.map((v) => v.label)).toEqual(['Compensation of employees']);
    expect(t.householdConsumption.map((v) => v.label)).toEqual(['Households']);
  });

  it('balances to the cent (exact integer arithmetic on the printed hundredths)', () => {
    const money = rows.slice(1).filter((r) => r[0] !== 'Employment (jobs)');
    const c = money.map((r) => r.slice(1).map(cents));
    const width = header.length - 1; // 16 sectors + 3 final-demand + total output
    for (let i = 0; i < n; i++) {
      const row = c[i]!;
      const sales = row.slice(0, width - 1).reduce((a, b) => a + b, 0);
      expect(sales).toBe(row[width - 1]); // sales = total output
      let purchases = 0;
      for (let k = 0; k < n + 3; k++) purchases += c[k]![i]!; // sectors, compensation, other value added, imports
      expect(purchases).toBe(row[width - 1]); // purchases = total output
      expect(c[n + 3]![i]).toBe(row[width - 1]); // total input row = total output
    }
    // Totals row under final demand and total output: column sums; final demand = value added + imports.
    for (let k = n; k < width; k++) expect(c[n + 3]![k]).toBe(c.slice(0, n).reduce((a, r) => a + r[k]!, 0));
    const fd = c.slice(0, n).reduce((a, r) => a + r[n]! + r[n + 1]! + r[n + 2]!, 0);
    const va = [n, n + 1, n + 2].reduce((a, k) => a + c[k]!.slice(0, n).reduce((x, y) => x + y, 0), 0);
    expect(fd).toBe(va);
    const jobs = rows.find((r) => r[0] === 'Employment (jobs)')!.slice(1, n + 1).map(Number);
    for (const j of jobs) expect(Number.isInteger(j) && j > 0).toBe(true);
  });

  it('is plausible: inputs 30–65 % and compensation 20–50 % of output; ρ(A) well below 1', () => {
    let maxColumnSum = 0;
    const A: number[][] = Array.from({ length: n }, () => new Array<number>(n).fill(0));
    for (let j = 0; j < n; j++) {
      let s = 0;
      for (let i = 0; i < n; i++) {
        A[i]![j] = t.Z[i * n + j]! / t.x[j]!;
        s += A[i]![j]!;
      }
      expect(s).toBeGreaterThanOrEqual(0.3 - 1e-6);
      expect(s).toBeLessThanOrEqual(0.65 + 1e-6);
      maxColumnSum = Math.max(maxColumnSum, s);
      const labour = t.labourIncome[0]!.values[j]! / t.x[j]!;
      expect(labour).toBeGreaterThanOrEqual(0.2 - 1e-6);
      expect(labour).toBeLessThanOrEqual(0.5 + 1e-6);
    }
    // ρ(A) ≤ ‖A‖₁ = largest column sum (any induced norm bounds the spectral radius; Horn & Johnson, Matrix Analysis, Thm 5.6.9).
    expect(maxColumnSum).toBeLessThanOrEqual(0.65 + 1e-6);
    // And the spectrum itself, from mathjs (a reference library from the registry).
    const values = (eigs(matrix(A)).values as unknown as { toArray(): (number | { re: number; im: number })[] }).toArray();
    const rho = Math.max(...values.map((v) => (typeof v === 'number' ? Math.abs(v) : Math.hypot(v.re, v.im))));
    expect(rho).toBeGreaterThan(0.3);
    expect(rho).toBeLessThan(0.5);
  });
});
