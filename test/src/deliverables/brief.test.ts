// The brief (PDF) read back by an independent reader (poppler: pdftotext, pdfinfo, pdffonts): real text holding the
// headline numbers as the JSON gives them after the stated rounding (the rounding redone here with toPrecision and
// Math.round, not with the brief's own formatter), fonts embedded with a Unicode map, A4 and US Letter pages, the
// cautions in full on the page, and the same bytes for the same study and date.
import { describe, expect, it } from 'vitest';
import {
  CAUTIONS, SCENARIO_CAUTIONS, scenarioJson, studyBrief, studyBriefDocument, VARIABLES, documentText, parseShockCsv, prepareStudy, runStudyScenario, studyFromTableFile,
} from '../../../src/study/index.ts';
import { fonts, pdfWords, poppler, sampleStudy, sampleWithTaxesAndFte } from '../../support/deliverables.ts';

const date = '2026-12-02T09:30:00.000Z';
const { ps, o } = sampleStudy();
const a4 = await studyBrief(ps, o, { date, paper: 'a4', fonts });

const en = (v: number) => v.toLocaleString('en-US', { maximumFractionDigits: 20 });
/** Three significant figures, by toPrecision (independent of the brief's Intl formatter). */
const sig3 = (v: number) => en(Number(v.toPrecision(3)));
const words = (s: string) => s.replace(/\s+/g, ' ').trim();

describe('the brief as a PDF', () => {
  const text = pdfWords(a4);
  it('holds each headline number as the JSON gives it, rounded as the brief says', () => {
    const json = scenarioJson(ps, o) as { totals: Record<string, { direct: number; indirect: number; induced: number; total: number }> };
    for (const v of VARIABLES.filter((x) => x in json.totals) as ('output' | 'valueAdded' | 'income' | 'employment')[]) {
      const t = json.totals[v]!;
      const round = v === 'employment' ? (x: number) => en(Math.round(x)) : sig3;
      const row = [t.direct, t.indirect, t.induced, t.total].map(round).join(' ');
      const label = { employment: 'Jobs', income: 'Labour income (thousand dollars)', valueAdded: 'Value added (thousand dollars)', output: 'Output (thousand dollars)' }[v];
      expect(text, v).toContain(`${label} ${row}`);
    }
    expect(text).toContain(`${en(Math.round(json.totals.employment!.total))} jobs`);
  });
  it('gives each total as a share of the county base year', () => {
    const jobs = (scenarioJson(ps, o) as { totals: { employment: { total: number } } }).totals.employment.total;
    const county = ps.study.table.employment!.reduce((a, b) => a + b, 0);
    expect(text).toContain(`(${((jobs / county) * 100).toFixed(1)} % of county jobs)`);
  });
  it('prints the cautions in full, the inputs and the provenance', () => {
    for (const c of [...CAUTIONS, ...SCENARIO_CAUTIONS]) expect(text).toContain(words(c));
    const cells = pdfWords(a4, 'raw');
    for (const l of o.scenario.phases.flatMap((p) => p.lines)) expect(cells).toContain(words(l.note!));
    expect(text).toContain(ps.study.source!.sha256);
    expect(text).toContain('fernhollow-county.csv');
  });
  it('embeds its fonts with a Unicode map and has A4 or US Letter pages', async () => {
    const fontRows = poppler('pdffonts', a4).split('\n').slice(2).filter((l) => l.trim());
    expect(fontRows.length).toBe(2);
    for (const row of fontRows) expect(row, row).toMatch(/CID TrueType\s+Identity-H\s+yes\s+(yes|no)\s+yes/);
    expect(poppler('pdfinfo', a4)).toMatch(/Page size:\s+595\.28 x 841\.89 pts \(A4\)/);
    const letter = await studyBrief(ps, o, { date, paper: 'letter', fonts });
    expect(poppler('pdfinfo', letter)).toMatch(/Page size:\s+612 x 792 pts \(letter\)/);
    const pages = Number(/Pages:\s+(\d+)/.exec(poppler('pdfinfo', a4))![1]);
    expect(pages).toBeGreaterThanOrEqual(1);
    expect(pages).toBeLessThanOrEqual(3);
  });
  it('gives the same bytes for the same study and date', async () => {
    const again = await studyBrief(ps, o, { date, paper: 'a4', fonts });
    expect(Buffer.from(again).equals(Buffer.from(a4))).toBe(true);
  });
  it('carries every heading, paragraph and list item of the brief document whole (an item is not split by a page break)', () => {
    const doc = studyBriefDocument(ps, o, date);
    const strings = doc.blocks.flatMap((b) => (b.kind === 'heading' || b.kind === 'paragraph' ? [b.text] : b.kind === 'list' ? b.items : []));
    expect(strings.length).toBeGreaterThan(10);
    for (const s of strings) expect(text).toContain(words(s));
    expect(documentText(doc)).toContain(doc.title);
  });
});

describe('characters the font lacks', () => {
  it('prints them as "?" and says which, instead of dropping them silently', async () => {
    const shock = 'sector,amount,note\nConstruction,100,新しい工場\n';
    const { ps: p2, o: o2 } = sampleStudy(shock);
    const text = pdfWords(await studyBrief(p2, o2, { date, paper: 'a4', fonts }));
    expect(text).toContain('?????');
    expect(text).toContain('U+65B0');
  });
});

describe('a table with taxes and full-time equivalents', () => {
  it('adds FTE and taxes rows to each phase\'s headline, with their shares of the county', async () => {
    const { text: csv, fte } = sampleWithTaxesAndFte();
    const scenario = parseShockCsv('sector,amount,note\nConstruction,100000,road\n', 'road.csv');
    const study = studyFromTableFile(Buffer.from(csv), 'taxes.csv', {}, { scenarios: [scenario] });
    const p = prepareStudy(study, { spectrum: false });
    const out = runStudyScenario(p, scenario, { paths: null });
    const text = pdfWords(await studyBrief(p, out, { date, paper: 'a4', fonts }));
    const t = out.phases[0]!.result.totals;
    const f = t.fte!;
    expect(text).toContain(`Full-time equivalents ${[f.direct, f.indirect, f.induced!, f.total].map((x) => en(Math.round(x))).join(' ')}`);
    const x = t.taxes!;
    expect(text).toContain(`Taxes less subsidies (thousand dollars) ${[x.direct, x.indirect, x.induced!, x.total].map(sig3).join(' ')}`);
    const countyFte = fte.slice(0, p.study.table.n).reduce((a, v) => a + v, 0);
    expect(text).toContain(`${en(Math.round(f.total))} full-time equivalents (${((f.total / countyFte) * 100).toFixed(1)} % of county full-time equivalents)`);
  });
});
