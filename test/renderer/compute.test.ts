/**
 * The worker's engine adapter, run in Node: what the screens get must be the engine's own numbers (compared with
 * direct engine calls), contain no NaN or Infinity, refuse bad files with a located message, and round-trip projects.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { createHash } from 'node:crypto';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import Papa from 'papaparse';
import { reactive } from 'vue';
import { api } from '../../renderer/worker/compute.ts';
import { readRecoveryCopy, recoveryCopyBlob, writeRecoveryCopy } from '../../renderer/state/recovery-copy.ts';
import { plain } from '../../renderer/worker/client.ts';
import { importTable } from '../../src/table/index.ts';
import { SAMPLE_CSV, SAMPLE_FILE_NAME } from '../../src/table/index.ts';
import { analyzeTable } from '../../src/model/index.ts';
import { prepareModel } from '../../src/model/index.ts';
import { linesOf, onePhase, runScenario } from '../support/scenario.ts';
import type { Scenario } from '../../src/scenario/index.ts';
import { REPORTS } from '../../src/study/index.ts';
import type { StudyChoices } from '../../renderer/worker/protocol.ts';

const ON: StudyChoices = { closure: 'households', destination: null };
const OFF: StudyChoices = { closure: 'none', destination: null };

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

const SCENARIO: Scenario = onePhase('Two lines', [
  { sector: 'Cannery', amount: 500, kind: 'final-demand', localShare: 1 },
  { sector: 'Retail', amount: 200, kind: 'final-demand', localShare: 0.5 },
]);

describe('worker adapter over the engine', () => {
  it('opens the sample with the engine analysis, and no non-finite number reaches the screen', () => {
    const r = api.loadSample({});
    const ref = analyzeTable(importTable(SAMPLE_CSV, { fileName: SAMPLE_FILE_NAME }));
    expect(r.table.n).toBe(ref.n);
    expect(r.analysis.perron.value).toBe(ref.viability.perronRoot);
    expect(r.analysis.verdict.productive).toBe(true);
    r.analysis.multipliers.forEach((m, j) => {
      expect(m.values['output.typeI']).toBe(ref.multipliers.output.typeI[j]);
      expect(m.values['output.typeII']).toBe(ref.multipliers.output.typeII[j]);
      expect(m.values['income.total']).toBe(ref.multipliers.income.total[j]);
      expect(m.values['employment.simple']).toBe(ref.multipliers.employment.simple[j]);
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
    expect(r.analysis.reach99.value).toBeNull();
    expect(r.analysis.reach99.reason).toMatch(/not productive/);
    expect(r.analysis.multipliers.every((m) => m.values['output.typeI'] === null && m.values['linkage.backward'] === null)).toBe(true);
    expect(numbers(r.analysis).filter(([, x]) => !Number.isFinite(x))).toEqual([]);
  });

  it('gives scenario effects equal to the engine\'s runScenario', () => {
    api.loadTable({ text: text('ridgeline-test.csv'), fileName: 'ridgeline-test.csv' });
    const view = api.runScenario({ scenario: SCENARIO, choices: ON }).phases[0]!;
    const ref = runScenario(prepareModel(importTable(text('ridgeline-test.csv'), { fileName: 'ridgeline-test.csv' })), SCENARIO);
    expect(view.effects.output!.totals.total).toBe(ref.totals.output.total);
    expect(view.effects.income!.induced).toEqual(Array.from(ref.effects.income.induced!));
    const open = api.runScenario({ scenario: SCENARIO, choices: OFF }).phases[0]!;
    expect(open.effects.output!.induced).toBeNull();
    expect(open.effects.output!.totals.total).toBeCloseTo(ref.totals.output.direct + ref.totals.output.indirect, 9);
    expect(numbers(view).filter(([, x]) => !Number.isFinite(x))).toEqual([]);
  });

  it('writes the multiplier report with the engine\'s numbers, bit for bit', () => {
    api.loadTable({ text: text('ridgeline-test.csv'), fileName: 'ridgeline-test.csv' });
    const files = api.report({ kind: 'multipliers', scenarios: [], choices: ON });
    expect(files.map((f) => f.name)).toEqual(['multipliers.csv', 'multipliers.about.txt']);
    const rows = Papa.parse<string[]>(files[0]!.content.trim(), { skipEmptyLines: true }).data;
    const ref = analyzeTable(importTable(text('ridgeline-test.csv'), { fileName: 'ridgeline-test.csv' }));
    const c = rows[0]!.findIndex((h) => h.startsWith('output Type II'));
    expect(c).toBeGreaterThan(0);
    ref.sectors.forEach((s, j) => expect(Number(rows[j + 1]![c])).toBe(ref.multipliers.output.typeII[j]));
  });

  it('writes every report of the Export screen as a CSV with its .about.txt', () => {
    api.loadTable({ text: text('ridgeline-test.csv'), fileName: 'ridgeline-test.csv' });
    // The second scenario gives a displacement share, so its net effects differ from the gross ones (a net report).
    const other: Scenario = onePhase('Other', [{ ...linesOf(SCENARIO)[0]!, displacement: 0.25 }, linesOf(SCENARIO)[1]!], 'annual');
    const scenarios = [SCENARIO, other];
    expect(api.reports({ scenarios: [SCENARIO], choices: ON }).find((r) => r.kind === 'scenario-net-impact')!.unavailable).toMatch(/no line gives a displacement or deadweight share/);
    const listed = api.reports({ scenarios, choices: ON });
    expect(listed.map((r) => r.kind)).toEqual(REPORTS.map((r) => r.kind));
    expect(listed.filter((r) => r.unavailable !== null)).toEqual([]);
    for (const { kind } of listed) {
      const files = api.report({ kind, scenario: other, scenarios, choices: ON });
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

  it('reads a picked file in the worker as the window reads its text (same preview and study, the preview\'s table taken) and fingerprints the file\'s own bytes', async () => {
    const plainText = text('ridgeline-test.csv');
    const bom = new Uint8Array([0xef, 0xbb, 0xbf, ...new TextEncoder().encode(plainText)]);
    const twoBoms = new Uint8Array([0xef, 0xbb, 0xbf, ...bom]); // the text starts with U+FEFF, which the import drops
    // A byte that is not UTF-8 (0xE9, Latin-1 "é") in a row label: read as U+FFFD both ways.
    const latin1 = new TextEncoder().encode(plainText.replace('Retail', 'Retail\u0000'));
    const at = latin1.indexOf(0);
    expect(at).toBeGreaterThan(0);
    latin1[at] = 0xe9;
    let k = 0;
    for (const bytes of [new TextEncoder().encode(plainText), bom, twoBoms, latin1]) {
      const file = new Blob([bytes]);
      const asText = await file.text(); // what the window reads
      for (const waited of [false, true]) {
        const src = { file, id: `t${++k}`, fileName: 'ridgeline-test.csv' };
        const want = api.previewTable({ text: asText, fileName: 'ridgeline-test.csv' }); // first: a preview drops the one before
        expect(await api.previewFile(src)).toEqual(want);
        // Accepted at once (the preview's table taken), or after the worker has prepared the study ahead meanwhile.
        if (waited) await new Promise((r) => setTimeout(r, 50));
        const loaded = await api.loadFile(src);
        const flows = api.grid({ which: 'Z' });
        const project = api.saveProject({ name: 'Test', scenarios: [], choices: ON, active: 0 });
        // The hash Web Crypto made is the SHA-256 of the file as it is, byte order mark and all, as the CLI records
        // it (node:crypto as the outside reference); reopened, the project finds the same bytes and claims no change.
        expect(project).toContain(createHash('sha256').update(bytes).digest('hex'));
        const reopened = api.openProject({ text: project, fileName: 'test.roundwise' });
        expect(JSON.stringify(reopened)).not.toMatch(/source-changed|does not match the SHA-256/);
        expect(reopened.analysis).toEqual(loaded.analysis);
        expect(loaded).toEqual(api.loadTable({ text: asText, fileName: 'ridgeline-test.csv' }));
        expect(flows).toEqual(api.grid({ which: 'Z' }));
      }
    }
  });

  it('saves and reopens a project with the same results', () => {
    api.loadTable({ text: text('ridgeline-test.csv'), fileName: 'ridgeline-test.csv' });
    const before = api.runScenario({ scenario: SCENARIO, choices: ON });
    const saved = api.saveProject({ name: 'Test', scenarios: [SCENARIO], choices: { closure: 'households', destination: 'Retail' }, active: 0 });
    api.loadSample({});
    const opened = api.openProject({ text: saved, fileName: 'test.roundwise' });
    expect(opened.scenarios).toEqual([SCENARIO]);
    expect(opened.choices).toMatchObject({ closure: 'households', destination: 'Retail' });
    expect(api.runScenario({ scenario: opened.scenarios[0]!, choices: opened.choices })).toEqual(before);
  });

  it('will not save a scenario line whose sector is not in the table', () => {
    api.loadTable({ text: text('ridgeline-test.csv'), fileName: 'ridgeline-test.csv' });
    const wrong: Scenario = onePhase('Old', [{ sector: 'Food processing', amount: 1, kind: 'final-demand', localShare: 1 }]);
    expect(() => api.saveProject({ name: 'x', scenarios: [wrong], choices: ON, active: 0 })).toThrow(/Food processing.*not in this table/);
  });

  it('the recovery copy assembled around the worker\'s Blob is the text writeRecoveryCopy writes', async () => {
    api.loadTable({ text: text('ridgeline-test.csv'), fileName: 'ridgeline-test.csv' });
    const args = { name: 'Study', choices: { closure: 'none', destination: 'Retail' } } as const;
    const c = { savedAt: '2026-05-01T12:00:00.000Z', tableName: 'Ridgeline', projectName: null, scenarios: [SCENARIO], selected: 0 };
    const blob = recoveryCopyBlob(c, api.recoveryBaseJson({ ...args, choices: { ...args.choices } }));
    expect(await blob.text()).toBe(writeRecoveryCopy({ ...c, project: api.recoveryBase({ ...args, choices: { ...args.choices } }) }));
  });

  it('writes the recovery copy of a study a save would refuse, and it reads back to the same work', () => {
    api.loadTable({ text: text('ridgeline-test.csv'), fileName: 'ridgeline-test.csv' });
    const before = api.runScenario({ scenario: SCENARIO, choices: ON });
    const wrong: Scenario = onePhase('Old', [{ sector: 'Food processing', amount: 1, kind: 'final-demand', localShare: 1 }]);
    const scenarios = [SCENARIO, wrong];
    const base = api.recoveryBase({ name: 'Study', choices: { closure: 'none', destination: 'Retail' } });
    const copy = writeRecoveryCopy({ savedAt: '2026-05-01T12:00:00.000Z', tableName: 'Ridgeline', projectName: null, project: base, scenarios, selected: 1 });
    const back = readRecoveryCopy(copy);
    if ('damaged' in back) throw new Error(back.damaged);
    expect(back.scenarios).toEqual(scenarios); // the line the table lacks is kept as typed
    expect(back.selected).toBe(1);
    api.loadSample({});
    const opened = api.openProject({ text: back.project, fileName: 'recovered' });
    expect(opened.table.sectors).toContain('Retail');
    expect(opened.choices).toMatchObject({ closure: 'none', destination: 'Retail' });
    expect(api.runScenario({ scenario: SCENARIO, choices: ON })).toEqual(before);
  });

  it('spreads an amount by a spending mix read from a final-demand column', () => {
    const r = api.loadTable({ text: text('ridgeline-test.csv'), fileName: 'ridgeline-test.csv' });
    const pattern = r.table.mixes.find((p) => p.name === 'Table column: Households')!;
    expect(pattern.shares.reduce((a, x) => a + x.share, 0)).toBeCloseTo(1, 12);
    // Households column of the fixture: 150, 980, 120, 1990, 2760 (sum 6000).
    expect(pattern.shares.find((x) => x.sector === 'Retail')!.share).toBeCloseTo(1990 / 6000, 12);
    const lines = api.spread({ mix: pattern, amount: 600, localShare: 0.8 });
    expect(lines.reduce((a, l) => a + l.amount, 0)).toBeCloseTo(600, 9);
    expect(lines.every((l) => l.localShare === 0.8 && l.mix === 'Table column: Households')).toBe(true);
  });

  it('reads the study\'s input files and settings as the CLI does: a spending mix line, the discount rate, commuting', () => {
    api.loadTable({ text: text('ridgeline-test.csv'), fileName: 'ridgeline-test.csv' });
    const r = api.setStudyInput({ kind: 'mix', text: 'mix,sector,share\nVisitor day,Retail,0.6\nVisitor day,Cannery,0.4\n', fileName: 'mixes.csv' });
    expect(r.inputs.mix).toBe('1 mix: Visitor day');
    expect(r.table.mixes.map((m) => m.name)).toContain('Visitor day');
    const visitors: Scenario = onePhase('Visitors', [{ sector: 'Visitor day', amount: 1000, kind: 'mix', localShare: 0.9 }], 'annual');
    visitors.phases[0]!.years = 10;
    const view = api.runScenario({ scenario: visitors, choices: { ...ON, discountRate: 0.05 } }).phases[0]!;
    // The same as the mix spread into final-demand lines by hand: 600 and 400 at 90 % local.
    const ref = runScenario(prepareModel(importTable(text('ridgeline-test.csv'), { fileName: 'ridgeline-test.csv' })), onePhase('x', [
      { sector: 'Retail', amount: 600, kind: 'final-demand', localShare: 0.9 }, { sector: 'Cannery', amount: 400, kind: 'final-demand', localShare: 0.9 },
    ]));
    expect(view.effects.output!.totals.total).toBeCloseTo(ref.totals.output.total, 9);
    // Present value of 10 years at 5 %: the annuity factor (1 − 1.05^−10)/0.05 times one year's total.
    expect(view.overTime!.presentValue!.output!.total).toBeCloseTo(ref.totals.output.total * (1 - 1.05 ** -10) / 0.05, 6);
    const commuters = api.runScenario({ scenario: visitors, choices: { ...ON, commutingShare: 0.5 } }).phases[0]!;
    expect(commuters.effects.output!.totals.induced!).toBeLessThan(view.effects.output!.totals.induced!);
    // A file naming a sector the table lacks is refused with its line, and the study keeps what it had.
    expect(() => api.setStudyInput({ kind: 'mix', text: 'mix,sector,share\nBad,Mining,1\n', fileName: 'bad.csv' })).toThrow(/spending mix 'Bad' names sector 'Mining'/);
    const saved = JSON.parse(api.saveProject({ name: 'x', scenarios: [visitors], choices: { ...ON, discountRate: 0.05 }, active: 0 }));
    expect(saved.mixes.map((m: { name: string }) => m.name)).toEqual(['Visitor day']);
    expect(saved.settings.discountRate).toBe(0.05);
    expect(api.setStudyInput({ kind: 'mix', text: null, fileName: '' }).inputs.mix).toBeNull();
  });

  it('unwraps Vue proxies so they can be posted to the worker', () => {
    const state = reactive({ source: { text: 'a', roles: { rows: { x: 'ignore' } } }, list: [{ a: 1 }] });
    expect(() => structuredClone(state)).toThrow();
    expect(structuredClone(plain(state))).toEqual({ source: { text: 'a', roles: { rows: { x: 'ignore' } } }, list: [{ a: 1 }] });
  });

  describe('the screens and the exports say the same as the engine (they once disagreed)', () => {
    const FIXED: Scenario = onePhase('Fixed cannery', [
      { sector: 'Cannery', amount: 400, kind: 'output', localShare: 1 },
      { sector: 'Retail', amount: 150, kind: 'final-demand', localShare: 0.8 },
    ]);
    const csvRows = (content: string) => Papa.parse<(string | number | null)[]>(content.trim(), { dynamicTyping: true, skipEmptyLines: true }).data;

    it('paths to a sector add up to its total in the effects table, with a fixed-output line and households closed', () => {
      api.loadTable({ text: text('ridgeline-test.csv'), fileName: 'ridgeline-test.csv' });
      const choices: StudyChoices = { closure: 'households', destination: 'Orchards' };
      const view = api.runScenario({ scenario: FIXED, choices }).phases[0]!;
      const p = api.paths({ scenario: FIXED, choices });
      expect(p.destination).toBe('Orchards');
      expect(p.model).toBe('closed');
      const j = view.sectors.indexOf('Orchards');
      // The destination total is what every elementary path adds up to (Defourny & Thorbecke 1984): it must be the
      // effects table's total, not a total of the open demand padded into the closed model.
      expect(Math.abs(p.total - view.effects.output!.total[j]!)).toBeLessThan(1e-9 * Math.abs(p.total));
    });

    it('exports what the screen shows: closure off means no induced effect in the file, and the sidecar says why', () => {
      api.loadTable({ text: text('ridgeline-test.csv'), fileName: 'ridgeline-test.csv' });
      const view = api.runScenario({ scenario: FIXED, choices: OFF }).phases[0]!;
      const files = api.report({ kind: 'scenario-impact', scenario: FIXED, scenarios: [FIXED], choices: OFF });
      const rows = csvRows(files[0]!.content);
      const total = rows.at(-1)!;
      const header = rows[0]!;
      expect(total[header.indexOf('output total (thousand dollars)')]).toBe(view.effects.output!.totals.total);
      expect(total[header.indexOf('output induced (thousand dollars)')]).toBeNull();
      expect(files[1]!.content).toMatch(/Model: open \(Type I\) input-output model; no induced effects \(the household closure is switched off/);
    });

    it('the exported paths go to the sector chosen on screen, never silently to another', () => {
      api.loadTable({ text: text('ridgeline-test.csv'), fileName: 'ridgeline-test.csv' });
      const choices: StudyChoices = { closure: 'households', destination: 'Timber' };
      const files = api.report({ kind: 'scenario-paths', scenario: FIXED, scenarios: [FIXED], choices });
      expect(files[1]!.content).toMatch(/Structural paths to Timber/);
      const onScreen = api.paths({ scenario: FIXED, choices });
      expect(csvRows(files[0]!.content)[1]![9]).toBe(onScreen.paths[0]!.contribution);
    });

    it('the Overview\'s shares reached are shares of the whole open-model total, counted by round from 0', () => {
      const r = api.loadTable({ text: text('ridgeline-test.csv'), fileName: 'ridgeline-test.csv' });
      const rounds = r.analysis.rounds;
      // One unit of demand in every sector: the open-model total is Σ L·1, the sum of every entry of L (mathjs).
      const ref = analyzeTable(importTable(text('ridgeline-test.csv'), { fileName: 'ridgeline-test.csv' }), { inverse: true });
      const L = ref.leontief!;
      let total = 0;
      for (const v of L) total += v;
      let cum = 0;
      rounds.forEach((x) => {
        cum += x.added;
        expect(Math.abs(x.reached - cum / total)).toBeLessThan(1e-12);
      });
      expect(rounds.at(-1)!.reached).toBeLessThan(1);
      const k = r.analysis.reach99.value!;
      expect(rounds[k]!.reached).toBeGreaterThanOrEqual(0.99);
      expect(rounds[k - 1]!.reached).toBeLessThan(0.99);
    });

    it('a project keeps the household closure: what the command line saved opens as it ran', () => {
      api.loadTable({ text: text('ridgeline-test.csv'), fileName: 'ridgeline-test.csv' });
      const closedRun = api.runScenario({ scenario: SCENARIO, choices: ON }).phases[0]!;
      const saved = api.saveProject({ name: 'CLI-like', scenarios: [SCENARIO], choices: ON, active: 0 });
      expect(JSON.parse(saved).settings.closure).toBe('households');
      const opened = api.openProject({ text: saved, fileName: 'cli.roundwise' });
      expect(api.runScenario({ scenario: SCENARIO, choices: opened.choices }).phases[0]!.effects.output!.totals.total).toBe(closedRun.effects.output!.totals.total);
    });
  });
});

describe('what the Multipliers screen says about missing values', () => {
  const ENGINE_KEY = /\b(output|income|employment|valueAdded)\.(typeI|typeII|simple|total)\b/;
  it('names measures as the headings do, one note per reason, when a table has no household closure', () => {
    const noHouseholds = text('ridgeline-test.csv').split('\n').map((l) => { const c = l.split(','); c.splice(6, 1); return c.join(','); }).join('\n');
    const a = api.loadTable({ text: noHouseholds, fileName: 'no-households.csv' }).analysis;
    expect(a.hasTypeII).toBe(false);
    expect(a.typeIIReason).toMatch(/no labour income row or no household consumption column/);
    const closureNotes = a.notes.filter((n) => /household closure/.test(n));
    expect(closureNotes).toHaveLength(1);
    expect(closureNotes[0]).toMatch(/^Output Type II, Labour income total, .*\(all sectors\): /);
    for (const n of a.notes) expect(n).not.toMatch(ENGINE_KEY);
  });
  it('says households re-spend more than they earn when the closed model is not productive, not that the closure is missing', () => {
    // Household consumption six times as large: the household-closed model's Perron root exceeds 1 (the engine's
    // closed-model decision, checked in test/src/model); the open model stays productive.
    const respend = text('ridgeline-test.csv').split('\n').map((l, i) => { const c = l.split(','); if (i >= 1 && i <= 5) c[6] = String(Number(c[6]) * 6); return c.join(','); }).join('\n');
    const a = api.loadTable({ text: respend, fileName: 'respend.csv' }).analysis;
    expect(a.verdict.productive).toBe(true);
    expect(a.hasTypeII).toBe(false);
    expect(a.typeIIReason).toMatch(/not productive: households would re-spend more than all they earn/);
    expect(a.typeIIReason).not.toMatch(/no (household|labour) income row/);
    for (const n of a.notes) expect(n).not.toMatch(ENGINE_KEY);
  });
});

describe('grid margins around the matrix (Table screen)', () => {
  const table = importTable(SAMPLE_CSV, { fileName: SAMPLE_FILE_NAME });
  const ref = analyzeTable(table);
  const row = (g: { below: { label: string; values: Float64Array }[] }, label: string) => Array.from(g.below.find((m) => m.label === label)!.values);

  it('Leontief inverse: the column sums are the engine\'s Type I output multipliers (column sums of L, Miller & Blair 2009, ch. 6)', () => {
    api.loadSample({});
    const g = api.grid({ which: 'L' });
    const sums = row(g, 'Column sum (Type I output multiplier)');
    expect(sums).toHaveLength(ref.n);
    // The analysis' own numbers, bit for bit (not column sums of the grid, which differ in the last digits) ...
    expect(sums).toEqual(ref.multipliers.output.typeI);
    // ... and within rounding of the column sums of the L the grid shows.
    sums.forEach((v, j) => {
      let t = 0;
      for (let i = 0; i < ref.n; i++) t += g.values[i * ref.n + j]!;
      expect(v).toBeCloseTo(t, 12);
    });
  });

  it('Leontief inverse: the grid shows the numbers the Leontief-inverse report exports, bit for bit', () => {
    api.loadSample({});
    const g = api.grid({ which: 'L' });
    const files = api.report({ kind: 'leontief-inverse', scenarios: [], choices: ON });
    const rows = Papa.parse<string[]>(files[0]!.content.trim(), { skipEmptyLines: true }).data;
    expect(rows[0]!.slice(1, ref.n + 1)).toEqual(ref.sectors);
    for (let i = 0; i < ref.n; i++) {
      expect(rows[i + 1]![0]).toBe(ref.sectors[i]);
      for (let j = 0; j < ref.n; j++) expect(Number(rows[i + 1]![j + 1])).toBe(g.values[i * ref.n + j]);
    }
    // The report's total row and the grid's margin are both the analysis' Type I output multipliers.
    expect(rows[ref.n + 1]![0]).toBe('total (output multiplier)');
    expect(rows[ref.n + 1]!.slice(1, ref.n + 1).map(Number)).toEqual(row(g, 'Column sum (Type I output multiplier)'));
  });

  it('flows: final demand and total output to the right, value added, imports, total output and jobs below, as the table has them', () => {
    api.loadSample({});
    const g = api.grid({ which: 'Z' });
    expect(Array.from(g.right.at(-1)!.values)).toEqual(Array.from(table.x));
    expect(g.right.map((m) => m.label)).toEqual([...table.householdConsumption, ...table.otherFinalDemand].map((v) => v.label).concat(['Total final demand', 'Total output']));
    expect(row(g, 'Total output')).toEqual(Array.from(table.x));
    expect(row(g, 'Jobs')).toEqual(Array.from(table.employment!));
    for (const v of [...table.labourIncome, ...table.otherValueAdded, ...(table.taxes ?? []), ...table.imports]) expect(row(g, v.label)).toEqual(Array.from(v.values));
    // Accounting identity of a balanced table: a column's intermediate inputs, value added and imports add up to its output.
    const inputs = row(g, 'Intermediate inputs');
    const va = [...table.labourIncome, ...table.otherValueAdded, ...(table.taxes ?? []), ...table.imports];
    inputs.forEach((z, j) => expect(z + va.reduce((s, v) => s + v.values[j]!, 0)).toBeCloseTo(table.x[j]!, 6));
    // Rows: each sector's sales to sectors and to final demand add up to its output.
    const fdTotal = Array.from(g.right.find((m) => m.label === 'Total final demand')!.values);
    for (let i = 0; i < table.n; i++) {
      let s = fdTotal[i]!;
      for (let j = 0; j < table.n; j++) s += table.Z[i * table.n + j]!;
      expect(s).toBeCloseTo(table.x[i]!, 6);
    }
  });

  it('coefficients: column sums and the engine\'s value-added and jobs coefficients per unit of output', () => {
    api.loadSample({});
    const g = api.grid({ which: 'A' });
    const a = ref.coefficients;
    row(g, 'Column sum (intermediate inputs)').forEach((s, j) => {
      let t = 0;
      for (let i = 0; i < ref.n; i++) t += a.A[i * ref.n + j]!;
      expect(s).toBeCloseTo(t, 14);
    });
    expect(row(g, `Jobs per ${table.moneyUnit} of output`)).toEqual(Array.from(a.employment!));
    row(g, table.labourIncome[0]!.label).forEach((h, j) => expect(h).toBeCloseTo(table.labourIncome[0]!.values[j]! / table.x[j]!, 14));
    // One row of each kind in the sample: each is the analysis' coefficient vector, bit for bit.
    expect(row(g, table.labourIncome[0]!.label)).toEqual(Array.from(a.labourIncome));
    expect(row(g, table.imports[0]!.label)).toEqual(Array.from(a.imports));
  });
});
