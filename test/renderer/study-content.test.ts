/**
 * The app's editors of spending mixes, activities and margins send the study's content to the worker
 * (`setStudyContent`); the worker checks it with the study layer's one check (`checkStudyInputs`). The same content
 * written as a file and read by the CSV readers is refused with the same rule (error code) and message, and what is
 * accepted gives the same numbers as the file. The mix export (`mixFile`) is the engine's mix file and reads back.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { api } from '../../renderer/worker/compute.ts';
import type { StudyContent } from '../../renderer/worker/protocol.ts';
import type { StudyChoices } from '../../renderer/worker/protocol.ts';
import { formatLocated, parseMarginsCsv, parseShockCsv, SAMPLE_SHOCK_CSV, SAMPLE_SHOCK_FILE_NAME, parseMixCsv, writeActivityCsv, writeMarginsCsv, writeMixCsv, type Activity, type Margins, type SpendingMix } from '../../src/study/index.ts';
import { onePhase } from '../support/scenario.ts';
import { refusal } from '../support/refusal.ts';

const ON: StudyChoices = { closure: 'households', destination: null };
const TABLE = readFileSync(fileURLToPath(new URL('../fixtures/e2e/ridgeline-test.csv', import.meta.url)), 'utf8');
const EMPTY: StudyContent = { mixes: [], activities: [], margins: null, priceIndex: null, commuting: [] };

const refusalOf = refusal;

/** Refused by the editor's path and by the file's path (content written by the engine's writer, read by its reader, then checked against the table as the worker does). */
function bothRefuse(content: Partial<StudyContent>, file: () => void): void {
  const editor = refusalOf(() => api.setStudyContent({ ...EMPTY, ...content }));
  const read = refusalOf(file);
  expect(editor.code).toBe(read.code);
  expect(editor.message).toBe(read.message);
}

describe('study content from the app\'s editors', () => {
  api.loadTable({ text: TABLE, fileName: 'ridgeline-test.csv' });

  it('refuses a mix, an activity or margins with the same rule and message as their files', () => {
    const notOne: SpendingMix = { name: 'Visitor day', shares: [{ sector: 'Retail', share: 0.6 }, { sector: 'Cannery', share: 0.3 }] };
    bothRefuse({ mixes: [notOne] }, () => api.setStudyInput({ kind: 'mix', text: writeMixCsv([notOne]), fileName: 'm.csv' }));
    const twice: SpendingMix = { name: 'Visitor day', shares: [{ sector: 'Retail', share: 0.5 }, { sector: 'Retail', share: 0.5 }] };
    bothRefuse({ mixes: [twice] }, () => api.setStudyInput({ kind: 'mix', text: writeMixCsv([twice]), fileName: 'm.csv' }));
    const unknown: SpendingMix = { name: 'Visitor day', shares: [{ sector: 'Mining', share: 1 }] };
    bothRefuse({ mixes: [unknown] }, () => api.setStudyInput({ kind: 'mix', text: writeMixCsv([unknown]), fileName: 'm.csv' }));
    const greedy: Activity = { name: 'Research station', output: 100, purchases: [{ sector: 'Retail', amount: 70, localShare: 1 }, { sector: 'Cannery', amount: 40, localShare: 1 }] };
    bothRefuse({ activities: [greedy] }, () => api.setStudyInput({ kind: 'activity', text: writeActivityCsv([greedy]), fileName: 'a.csv' }));
    const wide: Margins = { sectors: { retail: 'Retail', wholesale: 'Retail', transport: null }, localShare: { retail: 1, wholesale: 1, transport: 1 }, rows: [{ sector: 'Cannery', shares: { retail: 0.7, wholesale: 0.4, transport: 0 } }] };
    bothRefuse({ margins: wide }, () => api.setStudyInput({ kind: 'margins', text: writeMarginsCsv(wide), fileName: 'g.csv' }));
    // The file's refusal names its line and field; the editor's names the row and column labels.
    const e = refusalOf(() => api.setStudyContent({ ...EMPTY, margins: wide }));
    expect(e.location).toMatchObject({ rowLabel: 'Cannery', columnLabel: 'wholesale' });
    expect(refusalOf(() => parseMarginsCsv(writeMarginsCsv(wide), 'g.csv')).location).toMatchObject({ file: 'g.csv', line: 4, rowLabel: 'Cannery', columnLabel: 'wholesale' });
  });

  it('accepts content that gives the same results as the same content read from files', () => {
    const mix: SpendingMix = { name: 'Visitor day', shares: [{ sector: 'Retail', share: 0.6 }, { sector: 'Health care', share: 0.4 }] };
    const station: Activity = { name: 'Research station', output: 500, jobs: 12, labourIncome: 240, purchases: [{ sector: 'Retail', amount: 80, localShare: 0.5 }, { sector: 'Timber', amount: 30, localShare: 1 }] };
    const margins: Margins = { sectors: { retail: 'Retail', wholesale: null, transport: null }, localShare: { retail: 0.9, wholesale: 1, transport: 1 }, rows: [{ sector: 'Cannery', shares: { retail: 0.25, wholesale: 0, transport: 0 } }] };
    const edited = api.setStudyContent({ ...EMPTY, mixes: [mix], activities: [station], margins });
    expect(edited.content).toEqual({ ...EMPTY, mixes: [mix], activities: [station], margins });
    expect(edited.table.mixes.map((m) => m.name)).toContain('Visitor day');
    expect(edited.table.activities).toEqual(['Research station']);
    const scenario = onePhase('Three kinds', [
      { sector: 'Visitor day', amount: 1000, kind: 'mix', localShare: 0.8 },
      { sector: 'Research station', amount: 1, kind: 'activity', localShare: 1 },
      { sector: 'Cannery', amount: 200, kind: 'final-demand', localShare: 1, prices: 'purchaser' },
    ]);
    const byEditor = api.runScenario({ scenario, choices: ON }).phases[0]!;
    api.setStudyContent(EMPTY);
    api.setStudyInput({ kind: 'mix', text: writeMixCsv([mix]), fileName: 'm.csv' });
    api.setStudyInput({ kind: 'activity', text: writeActivityCsv([station]), fileName: 'a.csv' });
    const byFiles = api.setStudyInput({ kind: 'margins', text: writeMarginsCsv(margins), fileName: 'g.csv' });
    expect(byFiles.content).toEqual(edited.content);
    expect(api.runScenario({ scenario, choices: ON }).phases[0]!.effects).toEqual(byEditor.effects);
  });

  it('exports mixes as a mix file that the mix reader reads back as they were', () => {
    const mixes: SpendingMix[] = [
      { name: 'Visitor day', shares: [{ sector: 'Retail', share: 0.6 }, { sector: 'Health care', share: 0.4 }] },
      { name: 'Festival, "summer"', shares: [{ sector: 'Orchards', share: 1 / 3 }, { sector: 'Retail', share: 2 / 3 }] },
    ];
    api.setStudyContent({ ...EMPTY, mixes });
    const all = api.mixFile({ names: null });
    expect(all.name).toMatch(/\.csv$/);
    expect(parseMixCsv(all.text, all.name).map((m) => ({ name: m.name, shares: m.shares.map((s) => ({ sector: s.sector, share: s.share })) }))).toEqual(mixes);
    // A mix read from the table's final-demand columns can be exported on its own.
    const tableMix = api.setStudyContent({ ...EMPTY, mixes }).table.mixes.find((m) => !mixes.some((x) => x.name === m.name))!;
    const one = api.mixFile({ names: [tableMix.name] });
    expect(parseMixCsv(one.text, one.name)[0]!.shares.map((s) => s.share)).toEqual(tableMix.shares.map((s) => s.share));
    expect(() => api.mixFile({ names: ['No such mix'] })).toThrow(/no spending mix 'No such mix'/);
    api.setStudyContent(EMPTY);
    expect(() => api.mixFile({ names: null })).toThrow(/no spending mixes of its own/);
  });

  it('two mixes or activities of one name are refused', () => {
    const m: SpendingMix = { name: 'Visitor day', shares: [{ sector: 'Retail', share: 1 }] };
    expect(() => api.setStudyContent({ ...EMPTY, mixes: [m, m] })).toThrow(/two of the study's spending mixes are named 'Visitor day'/);
    const a: Activity = { name: 'Station', output: 10, purchases: [] };
    expect(() => api.setStudyContent({ ...EMPTY, activities: [a, { ...a }] })).toThrow(/two of the study's activities are named 'Station'/);
    expect(() => api.setStudyContent({ ...EMPTY, activities: [{ ...a, output: Number.NaN }] })).toThrow(/needs an output above 0 \(an 'output' row\); found none/);
  });
});

describe('refusals of a line name its phase when the scenario has several', () => {
  it('says the phase, the line within it, the row and the column', () => {
    api.loadTable({ text: TABLE, fileName: 'ridgeline-test.csv' });
    const scenario = {
      name: 'New cannery', phases: [
        { name: 'Building', timing: 'once' as const, lines: [{ sector: 'Timber', amount: 100, kind: 'final-demand' as const, localShare: 1 }] },
        { name: 'Operating', timing: 'annual' as const, lines: [
          { sector: 'Cannery', amount: 300, kind: 'final-demand' as const, localShare: 1 },
          { sector: 'Cannery', amount: 50, kind: 'final-demand' as const, localShare: 1, prices: 'purchaser' as const },
        ] },
      ],
    };
    const e = refusalOf(() => api.runScenario({ scenario, choices: ON }));
    expect(e.location).toEqual({ line: 2, rowLabel: 'Cannery', columnLabel: 'prices', phase: 'Operating' });
    expect(formatLocated(e)).toMatch(/^line 2 \(phase 'Operating', row 'Cannery', column 'prices'\): the line is in purchaser prices, but there are no margins/);
    // One phase: the line number is enough, as before.
    const single = refusalOf(() => api.runScenario({ scenario: { ...scenario, phases: [scenario.phases[1]!] }, choices: ON }));
    expect(single.location.phase).toBeUndefined();
  });
});

describe('the bundled two-phase example in the app', () => {
  it('is offered on the sample county with the CLI\'s phases and lines, and not on a table without its sectors', () => {
    api.loadSample({});
    const s = api.exampleScenario({})!;
    const file = parseShockCsv(SAMPLE_SHOCK_CSV, SAMPLE_SHOCK_FILE_NAME);
    expect(s.phases.map((p) => ({ ...p, lines: p.lines.map((l) => ({ ...l, origin: undefined })) }))).toEqual(file.phases.map((p) => ({ ...p, lines: p.lines.map((l) => ({ ...l, origin: undefined })) })));
    const view = api.runScenario({ scenario: s, choices: ON });
    expect(view.phases.map((p) => p.timing)).toEqual(['once', 'annual']);
    api.loadTable({ text: TABLE, fileName: 'ridgeline-test.csv' });
    expect(api.exampleScenario({})).toBeNull();
  });
});
