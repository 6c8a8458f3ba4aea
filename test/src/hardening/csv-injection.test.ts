/**
 * CSV injection end to end (OWASP "CSV Injection": a cell beginning with =, +, -, @, tab or carriage return may be run
 * as a formula by a spreadsheet). A table whose labels are formulas is imported from a file, analysed and shocked, and
 * every cell of every CSV report is checked: text that begins with one of those characters must carry the leading
 * quote; only numbers may begin with '-' or '+'.
 */
import { describe, expect, it } from 'vitest';
import { importTable } from '../../../src/table/index.ts';
import { writeTableCsv } from '../../../src/table/index.ts';
import { prepareModel } from '../../../src/model/index.ts';
import { compareScenarios, spendingRounds, structuralPaths } from '../../../src/scenario/index.ts';
import { entriesOf, runScenario } from '../../support/scenario.ts';
import { comparisonReport, impactReport, pathReport, roundsReport, scenarioMultiplierReport } from '../../../src/report/index.ts';
import type { ReportFile } from '../../../src/report/index.ts';
import { FORMULA_LABELS, formulaTableCsv, unsafeCells } from './csv-safety.ts';

describe('CSV injection, end to end through the engine', () => {
  const table = importTable(formulaTableCsv(), { fileName: 'formulas.csv' });
  const pm = prepareModel(table);
  const ctx = { tableName: '=cmd', sourceFile: '@formulas.csv', date: '2026-12-01T21:00:00Z' };

  it('the probe finds an unescaped formula and passes numbers', () => {
    expect(unsafeCells('a,b\r\n=1+1,-2.5\r\n"\'=1+1",+3e5\r\n')).toEqual(['row 2, field 1: =1+1']);
  });

  it('the formula labels are imported as sector labels', () => {
    expect(table.sectors).toEqual(FORMULA_LABELS.slice(0, 3));
  });

  it('every scenario report and the written table escape every formula-leading text cell', () => {
    const s1 = runScenario(pm, { name: '=cmd scenario', lines: [{ sector: FORMULA_LABELS[0]!, amount: 300, kind: 'final-demand', localShare: 0.9 }, { sector: FORMULA_LABELS[2]!, amount: -50, kind: 'final-demand', localShare: 1 }] });
    const s2 = runScenario(pm, { name: '@other', lines: [{ sector: FORMULA_LABELS[1]!, amount: 25, kind: 'jobs', localShare: 1 }] });
    const rounds = spendingRounds(pm, s1.effectiveDemand, s1.openOutput);
    const paths = structuralPaths(pm, s1.effectiveDemand, 1);
    const files: ReportFile[] = [
      ...impactReport(s1, ctx, 'impact'), ...roundsReport(s1, rounds, ctx, 'rounds'), ...scenarioMultiplierReport(s1, ctx, 'implied-multipliers'), ...pathReport(s1, paths, ctx, 'paths'),
      ...comparisonReport(compareScenarios(entriesOf(s1, s2)), table.moneyUnit, ctx, 'comparison'),
      { name: 'table.csv', content: writeTableCsv(table) },
    ];
    const csvs = files.filter((f) => f.name.endsWith('.csv'));
    expect(csvs.length).toBeGreaterThanOrEqual(6);
    for (const f of csvs) {
      expect(unsafeCells(f.content), f.name).toEqual([]);
    }
    // The labels are there, escaped, so the check above looked at them.
    const all = csvs.map((f) => f.content).join('\n');
    for (const l of [...FORMULA_LABELS.slice(0, 3), '=cmd|']) expect(all).toContain(`'${l.replace(/"/g, '""')}`);
    expect(impactReport(s1, ctx, 'impact')[0]!.content).toContain("'-2+3");
    // The written table reads back to the same labels (the importer removes the escaping quote).
    expect(importTable(writeTableCsv(table), { fileName: 'again.csv' }).sectors).toEqual(table.sectors);
  });
});
