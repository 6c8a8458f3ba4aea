// The worker's "How sure?" operations against the study called directly: draws taken in uneven ranges give exactly
// the bands of one studyBands run with the same seed (what the CLI's --draws prints), and a run replaced by a newer
// one refuses further steps instead of mixing draws of two runs.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { api } from '../../renderer/worker/compute.ts';
import { bandsView } from '../../renderer/worker/uncertainty.ts';
import { buildRegional } from '../../renderer/worker/regional.ts';
import { bandAt } from '../../renderer/charts/bands.ts';
import { readWorkbook, sampleWithTaxesAndFte } from '../support/deliverables.ts';
import { linesOf, onePhase } from '../support/scenario.ts';
import { runCli } from '../support/cli.ts';
import {
  beginStudyBands, defaultUncertaintySettings, EMPLOYMENT_SAMPLE_CSV, EMPLOYMENT_SAMPLE_FILE_NAME, flqOriginOf, NATIONAL_SAMPLE_CSV, NATIONAL_SAMPLE_FILE_NAME, parseMarginsCsv, prepareStudy,
  SAMPLE_CSV, SAMPLE_FILE_NAME, studyBands, studyFromTableFile, studySensitivity, utf8Bytes, type Scenario,
} from '../../src/study/index.ts';

const choices = { closure: 'households' as const, destination: null };
const settings = { draws: 45, seed: 21, cv: 0.15, localShareRange: 0.1 };
const scenario: Scenario = onePhase('Visitors', [{ sector: 'Accommodation and food service', amount: 2000, kind: 'final-demand', localShare: 0.7 }, { sector: '', amount: 0, kind: 'final-demand', localShare: 1 }]);

describe('How sure? worker operations', () => {
  api.loadSample({});
  const ps = prepareStudy(studyFromTableFile(utf8Bytes(SAMPLE_CSV), SAMPLE_FILE_NAME));

  it('give the study\'s bands for the same seed, however the draws are split', () => {
    const start = api.bandsStart({ choices, settings, scenario });
    expect(start.total).toBe(45);
    for (const [from, to] of [[0, 1], [1, 17], [17, 44], [44, 45]] as const) api.bandsStep({ id: start.id, from, to });
    const view = api.bandsFinish({ id: start.id });
    const ref = studyBands(ps, { settings: defaultUncertaintySettings(settings), multipliers: false, scenarios: [onePhase(scenario.name, linesOf(scenario).slice(0, 1))] })!;
    expect(view).toEqual(bandsView(ref, 'scenario', ps.study.table.moneyUnit));
    expect(view.totals!.find((t) => t.variable === 'output')!.band!.point).toBe(api.runScenario({ scenario, choices }).phases[0]!.effects.output!.totals.total);
  });

  it('name each total and give its unit as the reports do, taxes and full-time equivalents included', () => {
    api.loadTable({ text: sampleWithTaxesAndFte().text, fileName: 'taxes-fte.csv' });
    try {
      const start = api.bandsStart({ choices, settings, scenario });
      api.bandsStep({ id: start.id, from: 0, to: 45 });
      const rows = api.bandsFinish({ id: start.id }).totals!.filter((t) => t.band !== null).map((t) => [t.label, t.unit]);
      expect(rows).toEqual([
        ['Output', 'thousand dollars'], ['Value added', 'thousand dollars'], ['Labour income', 'thousand dollars'],
        ['Employment', 'jobs'], ['Taxes less subsidies', 'thousand dollars'], ['Full-time equivalents', 'FTE'],
      ]);
    } finally {
      api.loadSample({});
    }
  });

  it('refuse steps of a run that a newer one replaced', () => {
    const first = api.bandsStart({ choices, settings: { ...settings, localShareRange: 0 }, scenario: null });
    const second = api.bandsStart({ choices, settings: { ...settings, localShareRange: 0 }, scenario: null });
    expect(() => api.bandsStep({ id: first.id, from: 0, to: 45 })).toThrow(/replaced by a newer computation/);
    api.bandsStep({ id: second.id, from: 0, to: 45 });
    expect(api.bandsFinish({ id: second.id }).multipliers).not.toBeNull();
  });

  it('refuse settings out of range with the engine\'s words', () => {
    expect(() => api.bandsStart({ choices, settings: { ...settings, draws: 3 }, scenario })).toThrow(/number of draws must be a whole number from 20/);
  });

  it('put the bands into the workbook of the same scenario, and only of that scenario as it stands', async () => {
    const start = api.bandsStart({ choices, settings, scenario });
    api.bandsStep({ id: start.id, from: 0, to: 45 });
    api.bandsFinish({ id: start.id });
    api.sensitivity({ choices, scenario, step: 0.1 });
    const wb = readWorkbook((await api.workbook({ scenario, scenarios: [scenario], choices })).xlsx);
    expect(wb.names).toEqual(expect.arrayContaining(['Uncertainty bands', 'Sensitivity']));
    const changed = onePhase(scenario.name, [{ ...linesOf(scenario)[0]!, amount: 3000 }]);
    expect(readWorkbook((await api.workbook({ scenario: changed, scenarios: [changed], choices })).xlsx).names).not.toContain('Uncertainty bands');
    expect(readWorkbook((await api.workbook({ scenario, scenarios: [scenario], choices: { ...choices, closure: 'none' } })).xlsx).names).not.toContain('Uncertainty bands');
  });

  it('show the margins of purchaser-price lines in the sensitivity, as the study computes them', () => {
    const text = 'sector,retail,wholesale,transport\nmargin sector,Wholesale and retail trade,Wholesale and retail trade,Transport and warehousing\nlocal share,0.5,0.5,1\nFood processing,0.2,0.1,0.05\n';
    api.setStudyInput({ kind: 'margins', text, fileName: 'margins.csv' });
    try {
      const bought: Scenario = onePhase('Groceries', [{ sector: 'Food processing', amount: 1000, kind: 'final-demand', localShare: 1, prices: 'purchaser' }]);
      const view = api.sensitivity({ choices, scenario: bought, step: 0.1 });
      const ref = studySensitivity(prepareStudy({ ...ps.study, margins: parseMarginsCsv(text, 'margins.csv') }), bought, 0.1)[0]!;
      expect(view.items.map((i) => [i.kind, i.assumption, i.swing.output])).toEqual(ref.items.map((i) => [i.kind, i.assumption, i.swing.output]));
      expect(view.items.filter((i) => i.kind === 'margin-share')).toHaveLength(3);
      expect(view.items.filter((i) => i.kind === 'margin-local-share')).toHaveLength(3);
    } finally {
      api.setStudyInput({ kind: 'margins', text: null, fileName: '' });
    }
  });

  it('vary FLQ δ on a table taken from the Larger-table screen, as the study does with the estimate\'s inputs; refuse them for another table', () => {
    const national = { text: NATIONAL_SAMPLE_CSV, fileName: NATIONAL_SAMPLE_FILE_NAME };
    const employment = { text: EMPLOYMENT_SAMPLE_CSV, fileName: EMPLOYMENT_SAMPLE_FILE_NAME };
    const inputs = { national, employment, delta: 0.3 };
    const range: [number, number] = [0.2, 0.45];
    const bytes = (f: { text: string; fileName: string }) => ({ bytes: utf8Bytes(f.text), fileName: f.fileName });
    // The sample county is not that estimate: refused with the study's words, as the CLI refuses it.
    expect(() => api.sensitivity({ choices, scenario, step: 0.1, flq: { inputs, range } })).toThrow(/is not the FLQ estimate \(δ = 0\.3\)/);
    const est = buildRegional({ national, employment, method: 'flq', delta: 0.3, balance: null, groups: null, bridge: null });
    api.loadTable({ text: est.result.csv, fileName: est.result.fileName });
    try {
      const county = prepareStudy(studyFromTableFile(utf8Bytes(est.result.csv), est.result.fileName));
      const s0 = county.study.table.sectors;
      const visitors = onePhase('Visitors', [{ sector: s0[0]!, amount: 2000, kind: 'final-demand', localShare: 0.7 }, { sector: s0[3]!, amount: 500, kind: 'final-demand', localShare: 1 }]);
      const view = api.sensitivity({ choices, scenario: visitors, step: 0.1, flq: { inputs, range } });
      const origin = flqOriginOf(county.study.table, bytes(national), bytes(employment), 0.3);
      const ref = studySensitivity(county, visitors, 0.1, { flq: { origin, range } })[0]!;
      const delta = view.items.find((i) => i.kind === 'flq-delta')!;
      expect(delta.low.setting).toBe(ref.items.find((i) => i.kind === 'flq-delta')!.low.setting);
      expect(view.items.map((i) => [i.kind, i.assumption, i.swing.output, i.low.totals, i.high.totals])).toEqual(ref.items.map((i) => [i.kind, i.assumption, i.swing.output, i.low.totals, i.high.totals]));
      // FLQ scales coefficients by λ^δ with λ < 1 (Flegg & Tohmo 2013): a larger δ buys less locally, so output falls.
      expect(delta.swing.output).toBeLessThan(0);
    } finally {
      api.loadSample({});
    }
  });

  it('draw FLQ δ on a table taken from the Larger-table screen as the CLI\'s --draws with --delta-range does, same seed, same bands', async () => {
    const national = { text: NATIONAL_SAMPLE_CSV, fileName: NATIONAL_SAMPLE_FILE_NAME };
    const employment = { text: EMPLOYMENT_SAMPLE_CSV, fileName: EMPLOYMENT_SAMPLE_FILE_NAME };
    const inputs = { national, employment, delta: 0.3 };
    const range: [number, number] = [0.2, 0.45];
    const drawn = { draws: 40, seed: 11, cv: 0.05, localShareRange: 0.1 };
    // The sample county is not that estimate: refused before any draw, with the study's words.
    expect(() => api.bandsStart({ choices, settings: drawn, scenario, flq: { inputs, range } })).toThrow(/is not the FLQ estimate \(δ = 0\.3\)/);
    const est = buildRegional({ national, employment, method: 'flq', delta: 0.3, balance: null, groups: null, bridge: null });
    api.loadTable({ text: est.result.csv, fileName: est.result.fileName });
    const dir = mkdtempSync(join(tmpdir(), 'roundwise-delta-draws-'));
    try {
      const s0 = prepareStudy(studyFromTableFile(utf8Bytes(est.result.csv), est.result.fileName)).study.table.sectors;
      const visitors = onePhase('visitors', [{ sector: s0[0]!, amount: 2000, kind: 'final-demand', localShare: 0.7 }, { sector: s0[3]!, amount: 500, kind: 'final-demand', localShare: 1 }]);
      // A δ range outside 0–1 is refused with the engine's words (the panel shows the same rule).
      expect(() => api.bandsStart({ choices, settings: drawn, scenario: visitors, flq: { inputs, range: [0.5, 0.2] } })).toThrow(/FLQ δ range must be two numbers/);
      const start = api.bandsStart({ choices, settings: drawn, scenario: visitors, flq: { inputs, range } });
      for (const [from, to] of [[0, 7], [7, 40]] as const) api.bandsStep({ id: start.id, from, to });
      const view = api.bandsFinish({ id: start.id });
      expect(view.delta).toMatchObject({ range, draws: 40 });

      // The CLI on the same table, shock and seed (the estimate's inputs as files).
      const file = (name: string, text: string) => { const f = join(dir, name); writeFileSync(f, text); return f; };
      const q = (x: string) => `"${x.replace(/"/g, '""')}"`;
      const table = file(est.result.fileName, est.result.csv);
      const shock = file('visitors.csv', `sector,amount,kind,local_share\n${q(s0[0]!)},2000,final-demand,0.7\n${q(s0[3]!)},500,final-demand,1\n`);
      const r = await runCli(['scenario', table, '--shock', shock, '--json', '--draws', '40', '--seed', '11', '--cv', '0.05', '--share-range', '0.1',
        '--flq-national', file(national.fileName, national.text), '--flq-employment', file(employment.fileName, employment.text), '--flq-delta', '0.3', '--delta-range', '0.2,0.45']);
      expect(r.code, r.err).toBe(0);
      const cli = JSON.parse(r.out).uncertainty;
      expect(cli.deltaRange).toEqual(range);
      expect([cli.deltaDraws, cli.deltaDrawn, cli.accepted, cli.rejected]).toEqual([view.delta!.draws, view.delta!.drawn, view.accepted, view.rejected]);
      expect(view.totals!.filter((t) => t.band !== null).map((t) => t.variable)).toEqual(expect.arrayContaining(['output', 'employment']));
      for (const t of view.totals!) expect(t.band, t.variable).toEqual(cli.totals[t.variable] ?? null); // the CLI leaves out rows the table lacks
      expect(s0.map((_, j) => bandAt(view.sectorOutput!, j))).toEqual(cli.sectors.output);
      // δ drawn widens the bands: the same run without it is narrower in output (FLQ δ moves every coefficient).
      const plain = api.bandsStart({ choices, settings: drawn, scenario: visitors });
      api.bandsStep({ id: plain.id, from: 0, to: 40 });
      const without = api.bandsFinish({ id: plain.id });
      expect(without.delta).toBeNull();
      const width = (v: typeof view) => { const b = v.totals!.find((t) => t.variable === 'output')!.band!; return b.p95 - b.p5; };
      expect(width(view)).toBeGreaterThan(width(without));

      // The multipliers too, as the study layer gives them with the estimate's origin.
      const m = api.bandsStart({ choices, settings: { ...drawn, localShareRange: 0 }, scenario: null, flq: { inputs, range } });
      api.bandsStep({ id: m.id, from: 0, to: 40 });
      const mv = api.bandsFinish({ id: m.id });
      const county = prepareStudy(studyFromTableFile(utf8Bytes(est.result.csv), est.result.fileName));
      const bytes = (f: { text: string; fileName: string }) => ({ bytes: utf8Bytes(f.text), fileName: f.fileName });
      const run = beginStudyBands(county, { settings: defaultUncertaintySettings({ ...drawn, localShareRange: 0, deltaRange: range }), multipliers: true, scenarios: [] }, flqOriginOf(county.study.table, bytes(national), bytes(employment), 0.3));
      run.step(0, 40);
      expect(mv).toEqual(bandsView(run.finish(), 'multipliers', county.study.table.moneyUnit));
    } finally {
      rmSync(dir, { recursive: true, force: true });
      api.loadSample({});
    }
  }, 120_000);
});
