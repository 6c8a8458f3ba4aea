// Scenario reports re-imported the way a spreadsheet-style reader does (papaparse with dynamicTyping): same numbers back,
// rectangular rows, formula-leading text escaped per OWASP "CSV Injection" guidance.
import { describe, it, expect } from 'vitest';
import Papa from 'papaparse';
import { prepareModel } from '../../../src/model/index.ts';
import { compareScenarios, spendingRounds, structuralPaths } from '../../../src/scenario/index.ts';
import { entriesOf, runScenario } from '../../support/scenario.ts';
import {
  comparisonReport, impactReport, impactRows, pathReport, roundsReport, scenarioMultiplierReport, SCENARIO_CAUTIONS,
} from '../../../src/report/scenario.ts';
import { CAUTIONS } from '../../../src/report/cautions.ts';
import type { ReportFile } from '../../../src/report/document.ts';
import { county4 } from '../../support/example-tables.ts';

const ctx = { tableName: 'Invented county (demo)', sourceFile: 'county.csv', sourceHash: 'ab'.repeat(32), date: '2026-12-01T20:00:00Z' };

function parse(file: ReportFile): unknown[][] {
  const out = Papa.parse<unknown[]>(file.content, { dynamicTyping: true, skipEmptyLines: true });
  expect(out.errors).toEqual([]);
  return out.data;
}

function tableWithTrickyLabels() {
  const t = county4();
  t.sectors = ['=SUM(A1:A9)', '-Food processing', '@Retail', 'Services, "other"'];
  return t;
}

describe('scenario reports', () => {
  const pm = prepareModel(tableWithTrickyLabels());
  const r = runScenario(pm, {
    name: 'plant + visitors',
    lines: [
      { sector: '-Food processing', amount: 300, kind: 'jobs', localShare: 1 },
      { sector: '@Retail', amount: 1234.5678, kind: 'final-demand', localShare: 0.37 },
      { sector: 'Services, "other"', amount: -1e-7, kind: 'final-demand', localShare: 1 },
    ],
  });
  const rounds = spendingRounds(pm, r.effectiveDemand, r.openOutput);

  it('impact report reads back to the same numbers, one row per sector plus a total row', () => {
    const [csv, about] = impactReport(r, ctx, 'scenario-impact');
    expect(csv!.name).toBe('scenario-impact.csv');
    expect(about!.name).toBe('scenario-impact.about.txt');
    const rows = parse(csv!);
    const expected = impactRows(r);
    expect(rows).toHaveLength(r.sectors.length + 2);
    for (const row of rows) expect(row).toHaveLength(expected[0]!.length);
    for (let i = 1; i < expected.length; i++) {
      for (let j = 1; j < expected[i]!.length; j++) {
        const want = expected[i]![j];
        expect(rows[i]![j]).toBe(typeof want === 'number' ? (Object.is(want, -0) ? 0 : want) : null);
      }
    }
    expect(rows[0]![1]).toBe('output direct (thousand dollars)');
    expect(rows[0]).toContain('employment total (jobs)');
    expect(rows.at(-1)![0]).toBe('Total');
    expect(rows.at(-1)![4]).toBe(r.totals.output.total);
  });
  it('formula-leading labels are prefixed with a quote; negative numbers stay numbers', () => {
    const rows = parse(impactReport(r, ctx, 'scenario-impact')[0]!);
    expect(rows.map((row) => row[0])).toEqual(['sector', "'=SUM(A1:A9)", "'-Food processing", "'@Retail", 'Services, "other"', 'Total']);
    const services = rows[4]!;
    expect(typeof services[1]).toBe('number');
    expect(services[1]).toBe(-1e-7);
  });
  it('sidecar names table, source, model type, date, the scenario and all cautions', () => {
    const about = impactReport(r, ctx, 'scenario-impact')[1]!.content;
    expect(about).toContain('Table: Invented county (demo)');
    expect(about).toContain('Source file: county.csv');
    expect(about).toContain(`Source SHA-256: ${'ab'.repeat(32)}`);
    expect(about).toContain('household-closed (Type II)');
    expect(about).toContain('mixed exogenous/endogenous');
    expect(about).toContain('Produced: 2026-12-01T20:00:00Z');
    expect(about).toContain('Scenario: plant + visitors');
    for (const c of [...CAUTIONS, ...SCENARIO_CAUTIONS]) expect(about).toContain(c);
  });
  it('rounds reports: by round and by sector, rectangular, same numbers back', () => {
    const files = roundsReport(r, rounds, ctx, 'scenario-rounds');
    expect(files.map((f) => f.name)).toEqual(['scenario-rounds.csv', 'scenario-rounds.about.txt', 'scenario-rounds-by-sector.csv', 'scenario-rounds-by-sector.about.txt']);
    const byRound = parse(files[0]!);
    // header, one row per round, the sum of the rounds listed, the open-model total
    expect(byRound).toHaveLength(rounds.rounds.length + 3);
    expect(byRound.at(-2)![0]).toBe('Sum of the rounds listed');
    expect(byRound.at(-1)![0]).toBe('Open-model total (all rounds)');
    expect(byRound.at(-1)![1]).toBe(r.totals.output.direct + r.totals.output.indirect);
    byRound.slice(1, -2).forEach((row, k) => {
      expect(row[0]).toBe(k);
      expect(row[1]).toBe(rounds.roundTotals[k]);
      expect(row[3]).toBe(rounds.coverage[k]);
    });
    const bySector = parse(files[2]!);
    const width = bySector[0]!.length;
    expect(width).toBe(rounds.rounds.length + 3);
    for (const row of bySector) expect(row).toHaveLength(width);
    expect(bySector[2]![width - 1]).toBe(r.openOutput[1]);
    expect(files[1]!.content).toMatch(/99\.9 % by round \d+/);
    expect(files[1]!.content).toMatch(/Round 0 is the initial demand: .*fixed from outside \(-Food processing\)/);
  });
  it('multiplier, path and comparison reports are rectangular and carry the cautions', () => {
    const mult = parse(scenarioMultiplierReport(r, ctx, 'scenario-multipliers')[0]!);
    expect(mult[1]![0]).toBe('output');
    expect(mult[1]![6]).toBe(r.multipliers.output.typeI.value);
    const pa = structuralPaths(pm, r.effectiveDemand, 0, { maxPaths: 4 });
    const paths = pathReport(r, pa, ctx, 'scenario-paths');
    const prow = parse(paths[0]!);
    expect(prow).toHaveLength(pa.paths.length + 2);
    for (const row of prow) expect(row).toHaveLength(prow[0]!.length);
    expect(prow.at(-1)![9]).toBe(pa.explained);
    const r2 = runScenario(pm, { name: 'visitors only', lines: [{ sector: '@Retail', amount: 500, kind: 'final-demand', localShare: 1 }] });
    const cmp = parse(comparisonReport(compareScenarios(entriesOf(r, r2)), r.moneyUnit, ctx, 'scenario-comparison')[0]!);
    expect(cmp).toHaveLength(r.sectors.length + 2);
    expect(cmp[1]![2]).toBe(r2.effects.output.total[0]);
    expect(cmp[1]![3]).toBe(r2.effects.output.total[0]! - r.effects.output.total[0]!);
    for (const f of [scenarioMultiplierReport(r, ctx, 'scenario-multipliers')[1]!, paths[1]!]) expect(f.content).toContain(SCENARIO_CAUTIONS[3]!);
  });
});
