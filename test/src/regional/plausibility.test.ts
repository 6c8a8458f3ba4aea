// An estimated county table is never used without a word: every estimate says how its average Type I output
// multiplier compares with the national table's and with a plausible county range, and warns outside that range.
// RAS that stops at its cap is refused by the engine itself, so the CLI and the app refuse it alike.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { inv } from 'mathjs';
import { isInputError } from '../../../src/diagnostics/index.ts';
import { coefficients } from '../../../src/model/index.ts';
import {
  balanceTable, COUNTY_TYPE_I_RANGE, EMPLOYMENT_SAMPLE_CSV, EMPLOYMENT_SAMPLE_FILE_NAME, NATIONAL_SAMPLE_CSV, NATIONAL_SAMPLE_FILE_NAME,
  compareEstimate, parseEmploymentCsv, RasConvergenceError, regionalize,
} from '../../../src/regional/index.ts';
import { prepareStudy, studyOfTable } from '../../../src/study/index.ts';
import { buildTable } from './build-table.ts';
import { importTable, type IOTable } from '../../../src/table/index.ts';
import { buildRegional } from '../../../renderer/worker/regional.ts';
import { runCli } from '../../support/cli.ts';

const nationalTable = () => importTable(NATIONAL_SAMPLE_CSV, { fileName: NATIONAL_SAMPLE_FILE_NAME });
const employment = () => parseEmploymentCsv(EMPLOYMENT_SAMPLE_CSV, EMPLOYMENT_SAMPLE_FILE_NAME);

/** Type I output multipliers as column sums of (I − A)⁻¹ from mathjs (independent of the engine's solver). */
function typeI(t: IOTable): number[] {
  const { A, n } = coefficients(t);
  const L = inv(Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (i === j ? 1 : 0) - A[i * n + j]!)));
  return Array.from({ length: n }, (_, j) => L.reduce((s, row) => s + row[j]!, 0));
}
const mean = (v: number[]) => v.reduce((a, b) => a + b, 0) / v.length;

const dir = mkdtempSync(join(tmpdir(), 'roundwise-regional-plausibility-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('regional estimate plausibility', () => {
  it.each(['slq', 'cilq', 'flq'] as const)('%s: the comparison matches mathjs, and no county multiplier exceeds the national one', (method) => {
    const national = nationalTable();
    const res = regionalize(national, employment(), { method, delta: 0.3 });
    const nat = typeI(national);
    const est = typeI(res.table);
    // r_ij ≤ a_ij and L = Σ A^k is monotone in A ≥ 0, so every county multiplier is at most the national one
    est.forEach((m, j) => expect(m).toBeLessThanOrEqual(nat[j]! + 1e-12));
    const c = res.comparison;
    expect(c.sectors).toBe(16); // no absent sectors in the sample
    expect(Math.abs(c.nationalAverageTypeI! - mean(nat))).toBeLessThan(1e-9);
    expect(Math.abs(c.estimateAverageTypeI! - mean(est))).toBeLessThan(1e-9);
    expect(c.indirectShareKept!).toBeCloseTo((mean(est) - 1) / (mean(nat) - 1), 9);
    expect(c.plausibleRange).toEqual([...COUNTY_TYPE_I_RANGE]);
    expect(res.notes).toContain(c.note);
    expect(c.note).toMatch(new RegExp(`^Average Type I output multiplier over the 16 sectors present in the county: ${mean(est).toFixed(2)} in the estimate against ${mean(nat).toFixed(2)} in the national table`));
  });

  it('an estimate is compared only when the study\'s verdict calls it productive, and the note gives the verdict\'s reason', () => {
    // Invented 2×2 tables (value added and final demand left out: only A matters here). Column sums of A: 0.4 and 0.3
    // (productive); 1.1 (not productive, Perron root 1.1); 1 with A = 0.5 everywhere (Perron root exactly 1, I − A
    // singular). The reasons are the study's own (`models.open`), so one verdict and one wording decide both.
    const two = (z: number[][]) => buildTable({ sectors: ['A', 'B'], Z: z, x: [100, 100] });
    const productive = two([[10, 20], [30, 10]]);
    for (const estimate of [productive, two([[60, 50], [50, 60]]), two([[50, 50], [50, 50]])]) {
      const ps = prepareStudy(studyOfTable(estimate), { spectrum: false });
      const { comparison: c } = compareEstimate(productive, estimate, [true, true]);
      expect(c.estimateAverageTypeI === null).toBe(ps.verdict.productive !== true);
      if (ps.models.open === true) {
        const m = ps.analysis.multipliers.output.typeI as number[];
        expect(c.estimateAverageTypeI).toBe((m[0]! + m[1]!) / 2);
      } else {
        expect(c.note).toBe(`The estimate's Type I output multipliers are not defined, so it cannot be compared with the national table: ${ps.models.open}.`);
      }
    }
    expect(compareEstimate(two([[60, 50], [50, 60]]), productive, [true, true]).comparison.note).toMatch(/against none in the national table, whose multipliers are not defined: the table is not productive/);
  });

  it('FLQ on the sample county keeps a tenth of the national indirect effect (1.06 against 1.64): warned with the numbers; SLQ and CILQ are not', () => {
    const flq = regionalize(nationalTable(), employment(), { method: 'flq', delta: 0.3 });
    expect(flq.comparison.plausible).toBe(false);
    const w = flq.warnings.find((x) => x.code === 'regional-implausible-multipliers');
    expect(w?.message).toMatch(/^the estimate looks implausible: its average Type I output multiplier is 1\.06 against 1\.64 nationally, below the plausible county range 1\.20–2\.50; it sends nearly all local purchasing out of the county/);
    for (const method of ['slq', 'cilq'] as const) {
      const r = regionalize(nationalTable(), employment(), { method });
      expect(r.comparison.plausible, method).toBe(true);
      expect(r.warnings.map((x) => x.code)).not.toContain('regional-implausible-multipliers');
    }
  });

  it('the app\'s "Larger table" view and the CLI show the same comparison and warning', async () => {
    const v = buildRegional({ national: { text: NATIONAL_SAMPLE_CSV, fileName: NATIONAL_SAMPLE_FILE_NAME }, employment: { text: EMPLOYMENT_SAMPLE_CSV, fileName: EMPLOYMENT_SAMPLE_FILE_NAME }, method: 'flq', delta: 0.3 });
    const res = regionalize(nationalTable(), employment(), { method: 'flq', delta: 0.3 });
    expect(v.notes).toContain(res.comparison.note);
    expect(v.warnings.some((x) => x.includes('the estimate looks implausible'))).toBe(true);
    const nat = join(dir, 'national.csv');
    const emp = join(dir, 'employment.csv');
    writeFileSync(nat, NATIONAL_SAMPLE_CSV);
    writeFileSync(emp, EMPLOYMENT_SAMPLE_CSV);
    const summary = await runCli(['regionalize', nat, '--employment', emp, '--method', 'flq']);
    expect(summary.code, summary.err).toBe(0);
    expect(summary.out).toContain('Average Type I output multiplier over the 16 sectors present in the county: 1.06 in the estimate against 1.64');
    expect(summary.out).toMatch(/the estimate looks implausible/);
    const json = await runCli(['regionalize', nat, '--employment', emp, '--method', 'flq', '--json']);
    expect((JSON.parse(json.out) as { comparison: { plausible: boolean } }).comparison.plausible).toBe(false);
  });

  it('RAS that stops at its cap is refused by the engine with its report, and the app refuses it the same way', () => {
    // Z⁰ = [[1, 1], [1, 0]] with sales and purchases (1, 1): the only solution has x₁₁ = 0 although Z⁰₁₁ > 0, so RAS
    // approaches it like 1/k (Bacharach 1970: convergence is slow when the totals force a cell to zero) and 10 000
    // iterations leave a gap far above 1e-10.
    const nationalCsv = [
      'million dollars,A,B,Households,Exports,Total output',
      'A,10,10,30,50,100', 'B,10,0,40,50,100',
      'Compensation of employees,40,50,,,', 'Other value added,40,40,,,', 'Employment (jobs),100,100,,,',
    ].join('\r\n') + '\r\n';
    const employmentCsv = 'sector,regional,national\r\nA,10,100\r\nB,10,100\r\n';
    const totals = 'sector,total\r\nA,1\r\nB,1\r\n';
    const county = regionalize(importTable(nationalCsv, { fileName: 'n.csv' }), parseEmploymentCsv(employmentCsv, 'e.csv'), { method: 'slq' }).table;
    expect(Array.from(county.Z)).toEqual([1, 1, 1, 0]); // SLQ = 1: r = a, and county output 10 per sector
    let caught: unknown = null;
    try {
      balanceTable(county, { sales: Float64Array.of(1, 1), purchases: Float64Array.of(1, 1), fileName: 'rows.csv' });
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(RasConvergenceError);
    const report = (caught as RasConvergenceError).report;
    expect(report.iterations).toBe(10_000);
    expect(Math.max(report.rowGap, report.columnGap)).toBeGreaterThan(1e-10);
    let app: unknown = null;
    try {
      buildRegional({
        national: { text: nationalCsv, fileName: 'n.csv' }, employment: { text: employmentCsv, fileName: 'e.csv' }, method: 'slq', delta: 0.3,
        balance: { rows: { text: totals, fileName: 'rows.csv' }, columns: { text: totals, fileName: 'cols.csv' } },
      });
    } catch (e) {
      app = e;
    }
    expect(isInputError(app)).toBe(true);
    expect((app as RasConvergenceError).code).toBe('ras-not-converged');
    expect((app as Error).message).toMatch(/^RAS did not converge within 10000 iterations/);
  });
});
