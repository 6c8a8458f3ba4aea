/**
 * The worker's engine adapter, run in Node: what the screens get must be the engine's own numbers (compared with
 * direct engine calls), contain no NaN or Infinity, refuse bad files with a located message, and round-trip projects.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import Papa from 'papaparse';
import { reactive } from 'vue';
import { api } from '../../renderer/worker/compute.ts';
import { readRecoveryCopy, writeRecoveryCopy } from '../../renderer/state/recovery-copy.ts';
import { plain } from '../../renderer/worker/client.ts';
import { importTable, SAMPLE_CSV, SAMPLE_FILE_NAME } from '../../src/table/index.ts';
import { analyzeTable, prepareModel } from '../../src/model/index.ts';
import { runScenario, type Scenario } from '../../src/scenario/index.ts';

const FIX = fileURLToPath(new URL('../fixtures/e2e/', import.meta.url));
const text = (f: string) => readFileSync(join(FIX, f), 'utf8');

/** Every number reachable in a view, with its path. */
function numbers(v: unknown, path = '$', out: [string, number][] = []): [string, number][] {
  if (typeof v === 'number') out.push([path, v]);
  else if (ArrayBuffer.isView(v)) Array.from(v as Float64Array).forEach((x, i) => out.push([`${path}[${i}]`, x]));
  else if (Array.isArray(v)) v.forEach((x, i) => numbers(x, `${path}[${i}]`, out));
  else if (v && typeof v === 'object') for (const [k, x] of Object.entries(v)) numbers(x, `${path}.${k}`, out);
  return out;
}

const SCENARIO: Scenario = {
  name: 'Two lines',
  lines: [
    { sector: 'Cannery', amount: 500, kind: 'final-demand', localShare: 1 },
    { sector: 'Retail', amount: 200, kind: 'final-demand', localShare: 0.5 },
  ],
};

describe('worker adapter over the engine', () => {
  it('opens the sample with the engine analysis, and no non-finite number reaches the screen', () => {
    const r = api.loadSample({});
    const ref = analyzeTable(importTable(SAMPLE_CSV, { fileName: SAMPLE_FILE_NAME }));
    expect(r.table.n).toBe(ref.n);
    expect(r.analysis.perron.value).toBe(ref.viability.perronRoot);
    expect(r.analysis.verdict.productive).toBe(true);
    r.analysis.multipliers.forEach((m, j) => {
      expect(m.output).toBe(ref.multipliers.output.typeI[j]);
      expect(m.outputII).toBe(ref.multipliers.output.typeII[j]);
      expect(m.employment).toBe(ref.multipliers.employment.simple[j]);
    });
    const bad = numbers(r.analysis).filter(([, x]) => !Number.isFinite(x));
    expect(bad).toEqual([]);
  });

  it('describes a table that is not productive in words, with no number made up', () => {
    const r = api.loadTable({ text: text('not-productive.csv'), fileName: 'not-productive.csv' });
    expect(r.analysis.verdict.productive).toBe(false);
    expect(r.analysis.verdict.say).toMatch(/not productive/);
    // A = [[0.6, 0.5], [0.5, 0.6]] has Perron root 1.1 (its largest eigenvalue, 0.6 + 0.5; hand computation).
    expect(r.analysis.perron.value).toBeCloseTo(1.1, 12);
    expect(r.analysis.rounds99.value).toBeNull();
    expect(r.analysis.rounds99.reason).toMatch(/not productive/);
    expect(r.analysis.multipliers.every((m) => m.output === null && m.backward === null)).toBe(true);
    expect(numbers(r.analysis).filter(([, x]) => !Number.isFinite(x))).toEqual([]);
  });

  it('gives scenario effects equal to the engine\'s runScenario', () => {
    api.loadTable({ text: text('ridgeline-test.csv'), fileName: 'ridgeline-test.csv' });
    const view = api.runScenario({ scenario: SCENARIO, closure: true });
    const ref = runScenario(prepareModel(importTable(text('ridgeline-test.csv'), { fileName: 'ridgeline-test.csv' })), SCENARIO);
    expect(view.effects.output!.totals.total).toBe(ref.totals.output.total);
    expect(view.effects.income!.induced).toEqual(Array.from(ref.effects.income.induced!));
    const open = api.runScenario({ scenario: SCENARIO, closure: false });
    expect(open.effects.output!.induced).toBeNull();
    expect(open.effects.output!.totals.total).toBeCloseTo(ref.totals.output.direct + ref.totals.output.indirect, 9);
    expect(numbers(view).filter(([, x]) => !Number.isFinite(x))).toEqual([]);
  });

  it('writes the multiplier report with the engine\'s numbers, bit for bit', () => {
    api.loadTable({ text: text('ridgeline-test.csv'), fileName: 'ridgeline-test.csv' });
    const files = api.report({ kind: 'multipliers' });
    expect(files.map((f) => f.name)).toEqual(['multipliers.csv', 'multipliers.about.txt']);
    const rows = Papa.parse<string[]>(files[0]!.content.trim(), { skipEmptyLines: true }).data;
    const ref = analyzeTable(importTable(text('ridgeline-test.csv'), { fileName: 'ridgeline-test.csv' }));
    const c = rows[0]!.findIndex((h) => h.startsWith('output Type II'));
    expect(c).toBeGreaterThan(0);
    ref.sectors.forEach((s, j) => expect(Number(rows[j + 1]![c])).toBe(ref.multipliers.output.typeII[j]));
  });

  it('writes every report of the Export screen as a CSV with its .about.txt', () => {
    api.loadTable({ text: text('ridgeline-test.csv'), fileName: 'ridgeline-test.csv' });
    const kinds = ['multipliers', 'coefficients', 'leontief-inverse', 'viability', 'spectrum', 'perron-vectors', 'scenario-impact', 'scenario-multipliers', 'scenario-rounds', 'scenario-paths', 'comparison'] as const;
    for (const kind of kinds) {
      const files = api.report({ kind, scenario: SCENARIO, scenarios: [SCENARIO, { ...SCENARIO, name: 'Other' }], closure: true });
      expect(files.length, kind).toBeGreaterThanOrEqual(2);
      // Every CSV comes with its sidecar of the same base name, which carries the cautions.
      for (const f of files.filter((x) => x.name.endsWith('.csv'))) {
        const about = files.find((x) => x.name === f.name.replace(/\.csv$/, '.about.txt'));
        expect(about?.content, f.name).toMatch(/Cautions/);
      }
    }
  });

  it('refuses a malformed file with its location in the preview, and follows a changed role', () => {
    const bad = api.previewTable({ text: text('malformed.csv'), fileName: 'malformed.csv' });
    expect(bad.refusal).toMatch(/^malformed\.csv:4:3 /);
    const good = api.previewTable({ text: text('ridgeline-test.csv'), fileName: 'ridgeline-test.csv' });
    expect(good.refusal).toBeNull();
    expect(good.balanced).toBe(true);
    const changed = api.previewTable({ text: text('ridgeline-test.csv'), fileName: 'ridgeline-test.csv', roles: { rows: { 'Other value added': 'ignore' } } });
    expect(changed.rows.find((r) => r.label === 'Other value added')?.role).toBe('ignore');
    expect(changed.balanced).toBe(false);
  });

  it('saves and reopens a project with the same results', () => {
    api.loadTable({ text: text('ridgeline-test.csv'), fileName: 'ridgeline-test.csv' });
    const before = api.runScenario({ scenario: SCENARIO, closure: true });
    const saved = api.saveProject({ name: 'Test', scenarios: [SCENARIO], closure: true, active: 0 });
    api.loadSample({});
    const opened = api.openProject({ text: saved, fileName: 'test.roundwise' });
    expect(opened.scenarios).toEqual([SCENARIO]);
    expect(opened.closure).toBe(true);
    expect(api.runScenario({ scenario: opened.scenarios[0]!, closure: true })).toEqual(before);
  });

  it('will not save a scenario line whose sector is not in the table', () => {
    api.loadTable({ text: text('ridgeline-test.csv'), fileName: 'ridgeline-test.csv' });
    const wrong: Scenario = { name: 'Old', lines: [{ sector: 'Food processing', amount: 1, kind: 'final-demand', localShare: 1 }] };
    expect(() => api.saveProject({ name: 'x', scenarios: [wrong], closure: true, active: 0 })).toThrow(/Food processing.*not in this table/);
  });

  it('writes the recovery copy of a study a save would refuse, and it reads back to the same work', () => {
    api.loadTable({ text: text('ridgeline-test.csv'), fileName: 'ridgeline-test.csv' });
    const before = api.runScenario({ scenario: SCENARIO, closure: true });
    const wrong: Scenario = { name: 'Old', lines: [{ sector: 'Food processing', amount: 1, kind: 'final-demand', localShare: 1 }] };
    const scenarios = [SCENARIO, wrong];
    const base = api.recoveryBase({ name: 'Study', closure: false });
    const copy = writeRecoveryCopy({ savedAt: '2026-05-01T12:00:00.000Z', tableName: 'Ridgeline', projectName: null, project: base, scenarios, selected: 1 });
    const back = readRecoveryCopy(copy);
    if ('damaged' in back) throw new Error(back.damaged);
    expect(back.scenarios).toEqual(scenarios); // the line the table lacks is kept as typed
    expect(back.selected).toBe(1);
    api.loadSample({});
    const opened = api.openProject({ text: back.project, fileName: 'recovered' });
    expect(opened.table.sectors).toContain('Retail');
    expect(opened.closure).toBe(false);
    expect(api.runScenario({ scenario: SCENARIO, closure: true })).toEqual(before);
  });

  it('spreads an amount by a pattern read from a final-demand column', () => {
    const r = api.loadTable({ text: text('ridgeline-test.csv'), fileName: 'ridgeline-test.csv' });
    const pattern = r.table.patterns.find((p) => p.name === 'Like Households')!;
    expect(pattern.shares.reduce((a, x) => a + x.share, 0)).toBeCloseTo(1, 12);
    // Households column of the fixture: 150, 980, 120, 1990, 2760 (sum 6000).
    expect(pattern.shares.find((x) => x.sector === 'Retail')!.share).toBeCloseTo(1990 / 6000, 12);
    const lines = api.spread({ pattern, amount: 600, localShare: 0.8 });
    expect(lines.reduce((a, l) => a + l.amount, 0)).toBeCloseTo(600, 9);
    expect(lines.every((l) => l.localShare === 0.8 && l.pattern === 'Like Households')).toBe(true);
  });

  it('unwraps Vue proxies so they can be posted to the worker', () => {
    const state = reactive({ source: { text: 'a', roles: { rows: { x: 'ignore' } } }, list: [{ a: 1 }] });
    expect(() => structuredClone(state)).toThrow();
    expect(structuredClone(plain(state))).toEqual({ source: { text: 'a', roles: { rows: { x: 'ignore' } } }, list: [{ a: 1 }] });
  });
});
