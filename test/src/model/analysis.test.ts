// The Analysis object as the UI's worker and the reports see it.
import { describe, it, expect } from 'vitest';
import Papa from 'papaparse';
import { analyzeTable, analyzePrepared } from '../../../src/model/analysis.ts';
import { prepareModel, solveOpen } from '../../../src/model/prepared.ts';
import { analysisJson, analysisReports } from '../../../src/report/index.ts';
import { randomEconomy, tableFromA } from '../../support/coefficient-tables.ts';

describe('Analysis', () => {
  it('survives structured clone (the UI worker boundary) unchanged', () => {
    const an = analyzeTable(randomEconomy(9, 1), { inverse: true });
    const copy = structuredClone(an);
    expect(copy).toEqual(an);
    expect(copy.coefficients.A).toBeInstanceOf(Float64Array);
  });
  it('analyzePrepared leaves the prepared model usable for scenarios', () => {
    const pm = prepareModel(randomEconomy(6, 2));
    const an = analyzePrepared(pm);
    const x = solveOpen(pm, new Float64Array(6).fill(1));
    // L·1 = row sums of L: n·forward linkage·ΣL/n
    const total = an.linkages.rowSums.reduce((p, q) => p! + q!, 0)!;
    x.forEach((v, i) => expect(Math.abs(v - (an.linkages.forward[i]! * total) / 6)).toBeLessThan(1e-12 * v));
  });
  it('JSON never carries NaN or Infinity, even for an unproductive table without closure', () => {
    for (const t of [tableFromA([[0.6, 0.7], [0.7, 0.6]]), tableFromA([[0.5, 0.5], [0.5, 0.5]]), randomEconomy(4, 3)]) {
      const text = JSON.stringify(analysisJson(analyzeTable(t)));
      expect(text).not.toMatch(/NaN|Infinity/);
      const back = JSON.parse(text);
      expect(back.sectors).toHaveLength(t.n);
    }
  });
  it('reports are rectangular and blank exactly where values are undefined', () => {
    const an = analyzeTable(tableFromA([[0.1, 0.2], [0.2, 0.1]], { labour: [0.3, 0], households: [0.2, 0.1] }), { inverse: true });
    const files = analysisReports(an, { date: '2026-01-01T00:00:00Z' });
    const mult = files.find((f) => f.name === 'multipliers.csv')!;
    const rows = Papa.parse<string[]>(mult.content, { skipEmptyLines: true }).data;
    expect(new Set(rows.map((r) => r.length)).size).toBe(1);
    const col = rows[0]!.indexOf('labour income Type I (ratio)');
    expect(rows[2]![col]).toBe(''); // sector 2 has no labour income
    expect(Number(rows[1]![col])).toBeGreaterThan(1);
    const about = files.find((f) => f.name === 'multipliers.about.txt')!.content;
    expect(about).toMatch(/income\.typeI is blank for S2/);
    expect(files.map((f) => f.name)).toContain('spectrum.csv');
  });
});
