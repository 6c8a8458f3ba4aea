// The app's brief and workbook (the worker's `brief` and `workbook` operations, run in Node) are the study layer's:
// the same PDF bytes as studyBrief — the function `roundwise scenario --brief` calls — for the same study and date,
// and a workbook whose cells read back (SheetJS) equal the study layer's. Reports cross to the UI without their rows.
import { describe, expect, it } from 'vitest';
import { api } from '../../renderer/worker/compute.ts';
import {
  prepareStudy, runStudyScenario, SAMPLE_CSV, SAMPLE_FILE_NAME, studyBrief, studyFromTableFile, studyWorkbook, utf8Bytes, type Scenario,
} from '../../src/study/index.ts';
import type { StudyChoices } from '../../renderer/worker/protocol.ts';
import { fonts, readWorkbook } from '../support/deliverables.ts';

const ON: StudyChoices = { closure: 'households', destination: null };
const date = '2026-12-02T10:00:00.000Z';
const SCENARIO: Scenario = {
  name: 'Plant and road',
  phases: [
    { name: 'Building the road', timing: 'once', year: 2026, lines: [{ sector: 'Construction', amount: 5000, kind: 'final-demand', localShare: 0.7 }] },
    { name: 'Operating the plant', timing: 'annual', year: 2027, years: 15, lines: [{ sector: 'Food processing', amount: 120, kind: 'jobs', localShare: 1, note: 'a new plant' }] },
  ],
};

describe('the app\'s brief and workbook', () => {
  api.loadSample({});
  const study = studyFromTableFile(utf8Bytes(SAMPLE_CSV), SAMPLE_FILE_NAME, { name: 'Fernhollow County (invented sample)' }, { scenarios: [SCENARIO] });
  const ps = prepareStudy(study); // as the app prepares it (with the eigenvalues)
  const o = runStudyScenario(ps, SCENARIO, { paths: null });

  it('gives the same PDF bytes as the study layer for the same study and date', async () => {
    const b = await api.brief({ scenario: SCENARIO, scenarios: [SCENARIO], choices: ON, paper: 'a4', fonts, date });
    expect(b.name).toBe('plant-and-road-brief.pdf');
    const direct = await studyBrief(ps, o, { date, paper: 'a4', fonts });
    expect(Buffer.from(b.pdf).equals(Buffer.from(direct))).toBe(true);
    expect(b.document.title).toBe('Economic impact brief: Plant and road');
  });

  it('gives a workbook with the study layer\'s cells', async () => {
    const w = await api.workbook({ scenario: SCENARIO, scenarios: [SCENARIO], choices: ON, date });
    expect(w.name).toBe('plant-and-road.xlsx');
    const app = readWorkbook(w.xlsx);
    const direct = readWorkbook(await studyWorkbook(ps, o, { date }));
    expect(app.names).toEqual(direct.names);
    for (const n of app.names) expect(app.sheets.get(n), n).toEqual(direct.sheets.get(n));
  });

  it('posts reports to the UI as name and content only', () => {
    const files = api.report({ kind: 'multipliers', scenarios: [], choices: ON });
    for (const f of files) expect(Object.keys(f).sort()).toEqual(['content', 'name']);
  });
});
