// The brief and the workbook include the bands and the sensitivity when they were computed, with the same numbers
// as the band reports (the workbook read back by SheetJS, the brief's content as text).
import { describe, expect, it } from 'vitest';
import {
  councilNumber, defaultUncertaintySettings, documentText, studyBands, studyBriefDocument, studySensitivity, studyWorkbook,
} from '../../../src/study/index.ts';
import { readWorkbook, sampleStudy, sampleWithTaxesAndFte } from '../../support/deliverables.ts';

const { ps, o } = sampleStudy();
const date = '2026-12-02T05:30:00.000Z';
const bands = studyBands(ps, { settings: defaultUncertaintySettings({ draws: 60, seed: 9 }), multipliers: false, scenarios: [o.scenario] })!;
const sensitivity = studySensitivity(ps, o.scenario);

describe('deliverables with How sure?', () => {
  it('the workbook gains a bands sheet and a sensitivity sheet with the engine\'s numbers', async () => {
    const wb = readWorkbook(await studyWorkbook(ps, o, { date }, { bands, sensitivity }));
    expect(wb.names).toEqual(expect.arrayContaining(['Uncertainty bands', 'Sensitivity']));
    const rows = wb.sheets.get('Uncertainty bands')!;
    const out = bands.scenarios[0]!.totals.output!;
    const row = rows.find((r) => r[0] === 'scenario total' && r[2] === 'output' && r[3] === 'total')!;
    expect(row.slice(5, 10)).toEqual([out.point, out.p5, out.p50, out.p95, out.mean]);
    const without = readWorkbook(await studyWorkbook(ps, o, { date }));
    expect(without.names).not.toContain('Uncertainty bands');
  });

  it('the brief says the range of each total beside the estimate', () => {
    const text = documentText(studyBriefDocument(ps, o, date, { bands })).join('\n');
    expect(text).toMatch(/How sure: redrawing the table 60 times with independent errors of 10 % on every coefficient \(seed 9; 0 draws left out/);
    expect(documentText(studyBriefDocument(ps, o, date)).join('\n')).not.toMatch(/How sure/);
  });

  it('the brief\'s range sentence covers taxes and full-time equivalents when the table has them', () => {
    const { ps: p2, o: o2 } = sampleStudy(undefined, sampleWithTaxesAndFte().text);
    const b2 = studyBands(p2, { settings: defaultUncertaintySettings({ draws: 30, seed: 9 }), multipliers: false, scenarios: [o2.scenario] })!;
    const text = documentText(studyBriefDocument(p2, o2, date, { bands: b2 })).join(' ').replace(/\s+/g, ' ');
    const sentence = text.slice(text.indexOf('How sure: redrawing'));
    const t = b2.scenarios[0]!.totals;
    expect(sentence).toContain(`full-time equivalents ${councilNumber(t.fte!.point, 'jobs')} (${councilNumber(t.fte!.p5, 'jobs')} to ${councilNumber(t.fte!.p95, 'jobs')})`);
    expect(sentence).toContain(`taxes less subsidies ${councilNumber(t.taxes!.point, 'money')} (`);
    expect(sentence).toContain(`jobs ${councilNumber(t.employment!.point, 'jobs')} (`);
  });
});
