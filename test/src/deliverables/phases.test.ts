/**
 * The brief (PDF) and the workbook (XLSX) of a study of several phases, read back with independent readers (poppler's
 * pdftotext, SheetJS): each phase reported on its own, one-time and annual results never added together, the total of
 * phases of the same timing labelled as such, and an annual phase's cumulative effect (years × one year) and present
 * value (ordinary annuity). Reference values are computed here from the phases' one-year totals: cumulative = years ×
 * annual; present value = annual × (1 − (1 + r)^−years) / r, the closed form of Σ_{t=1..years} (1 + r)^−t (the
 * standard annuity formula, recalled from memory; the engine sums the terms one by one).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  parseShockCsv, prepareStudy, runStudyScenario, studyBrief, studyFromTableFile, studyWorkbook, type ScenarioOutcome, type PreparedStudy,
} from '../../../src/study/index.ts';
import { fonts, pdfWords, readWorkbook, SAMPLE_TABLE } from '../../support/deliverables.ts';
import { relBetween } from '../../support/compare.ts';

const RATE = 0.035;
const YEARS = 20;
// The invented food plant of the sample, built in two one-time phases, then operated for 20 years.
const SHOCK = [
  'sector,amount,kind,local_share,phase,timing,year,years',
  'Construction,12000,final-demand,0.8,Building the plant,once,2026,',
  'Metal and machinery,3000,final-demand,0.5,Fitting out,once,2026,',
  `Food processing,300,jobs,1,Operating the plant,annual,2027,${YEARS}`,
].join('\n');

// The brief's rounding rules as README "Brief" states them (jobs to whole jobs, money to three significant figures),
// written out here independently of src/deliverables/rounding.ts.
const jobs = (v: number) => new Intl.NumberFormat('en-US', { maximumFractionDigits: 0 }).format(v);
const money = (v: number) => new Intl.NumberFormat('en-US', { maximumSignificantDigits: 3 }).format(v);

function study(): { ps: PreparedStudy; o: ScenarioOutcome } {
  const scenario = parseShockCsv(SHOCK, 'plant.csv');
  const base = studyFromTableFile(readFileSync(SAMPLE_TABLE), 'fernhollow-county.csv', {}, { scenarios: [scenario] });
  const ps = prepareStudy({ ...base, settings: { ...base.settings, discountRate: RATE } }, { spectrum: false });
  return { ps, o: runStudyScenario(ps, scenario, { paths: null }) };
}

const { ps, o } = study();
const [build, fit, operate] = o.phases.map((p) => p.result.totals);
const annuity = (1 - (1 + RATE) ** -YEARS) / RATE;

describe('the brief of a study of several phases', async () => {
  const text = pdfWords(await studyBrief(ps, o, { date: '2026-12-02T09:00:00Z', paper: 'a4', fonts }));
  const section = (from: string, to: string) => text.slice(text.indexOf(from), text.indexOf(to, text.indexOf(from) + from.length));

  it('reports each phase on its own, under its name and timing', () => {
    expect(text).toContain('Building the plant (one-time, 2026)');
    expect(text).toContain('Fitting out (one-time, 2026)');
    expect(text).toContain(`Operating the plant (annual from 2027, ${YEARS} years)`);
    const own = [
      [section('Building the plant (one-time, 2026)', 'Fitting out (one-time'), build!],
      [section('Fitting out (one-time, 2026)', 'Operating the plant (annual'), fit!],
      [section(`Operating the plant (annual from 2027, ${YEARS} years)`, 'Inputs'), operate!],
    ] as const;
    for (const [words, t] of own) {
      expect(words).toContain(`Altogether (direct, indirect and induced): ${jobs(t.employment!.total)} jobs`);
      expect(words).toContain(`${money(t.output!.total)} thousand dollars of output`);
    }
  });

  it('never adds one-time and annual results, and labels the one-time total as such', () => {
    expect(text).toContain('one-time and annual results are never added together');
    const onceJobs = build!.employment!.total + fit!.employment!.total;
    const onceOutput = build!.output!.total + fit!.output!.total;
    expect(text).toContain(`All one-time phases (Building the plant, Fitting out), added: ${jobs(onceJobs)} jobs,`);
    expect(text).toContain(`${money(onceOutput)} thousand dollars of output.`);
    // A single annual phase has no "all annual phases" total, and no figure adds the phases of both timings.
    expect(text).not.toContain('All annual phases');
    for (const v of ['employment', 'output', 'income', 'valueAdded'] as const) {
      const mixed = build![v]!.total + fit![v]!.total + operate![v]!.total;
      const shown = v === 'employment' ? jobs(mixed) : money(mixed);
      expect(text, `${v}: ${shown}`).not.toMatch(new RegExp(`(^|[^\\d,.])${shown.replace(/[.,]/g, '\\$&')}([^\\d,]|$)`));
    }
  });

  it('gives the annual phase\'s cumulative effect over its years and its present value', () => {
    const op = section(`Operating the plant (annual from 2027, ${YEARS} years)`, 'Inputs');
    expect(op).toContain(`Over ${YEARS} years (${YEARS} × one year's effects, undiscounted), in total: ${jobs(YEARS * operate!.employment!.total)} job-years,`);
    expect(op).toContain(`${money(YEARS * operate!.output!.total)} thousand dollars of output.`);
    expect(op).toContain('Present value at a discount rate of 3.5 % a year');
    expect(op).toContain(`${money(annuity * operate!.income!.total)} thousand dollars of labour income`);
    expect(op).toContain(`${money(annuity * operate!.output!.total)} thousand dollars of output.`);
    // One-time phases have neither.
    expect(section('Building the plant (one-time, 2026)', 'Operating the plant (annual')).not.toMatch(/Over \d+ years|Present value/);
  });
});

describe('the workbook of a study of several phases', async () => {
  const wb = readWorkbook(await studyWorkbook(ps, o, { date: '2026-12-02T09:00:00Z' }));
  const rows = wb.sheets.get('Phases')!;
  const head = rows[0] as string[];
  const col = (name: string) => head.findIndex((h) => h.startsWith(name));
  const [P, TIMING, BASIS, VAR, TOTAL, CUM, PV, RATE_COL] = ['phase', 'timing', 'basis', 'variable', 'total', 'cumulative total', 'present value', 'discount rate'].map(col);
  const row = (phase: string, variable: string) => rows.find((r) => r[P!] === phase && r[VAR!] === variable && r[BASIS!] === 'gross')!;

  it('has a row per phase and variable, one-time and annual apart', () => {
    for (const [name, t, timing] of [['Building the plant', build!, 'one-time'], ['Fitting out', fit!, 'one-time'], ['Operating the plant', operate!, 'annual (one year\'s effects)']] as const) {
      expect(row(name, 'output')[TOTAL!]).toBe(t.output!.total);
      expect(row(name, 'employment')[TIMING!]).toBe(timing);
    }
    // Every row is of one timing; no row's label names phases of both.
    for (const r of rows.slice(1)) {
      expect(['one-time', 'annual (one year\'s effects)']).toContain(r[TIMING!]);
      expect(String(r[P!])).not.toMatch(/Building.*Operating|Operating.*Building/);
    }
  });

  it('labels the total of the one-time phases as such, and it is their sum', () => {
    const label = 'All one-time phases (Building the plant, Fitting out), added';
    const sum = row(label, 'output');
    expect(sum[TIMING!]).toBe('one-time');
    expect(relBetween(sum[TOTAL!] as number, build!.output!.total + fit!.output!.total)).toBeLessThan(1e-12);
    expect(rows.some((r) => String(r[P!]).startsWith('All annual phases'))).toBe(false);
  });

  it('gives the annual phase\'s cumulative total and present value, and none for one-time phases', () => {
    const out = row('Operating the plant', 'output');
    expect(relBetween(out[CUM!] as number, YEARS * operate!.output!.total)).toBeLessThan(1e-12);
    expect(relBetween(out[PV!] as number, annuity * operate!.output!.total)).toBeLessThan(1e-12);
    expect(out[RATE_COL!]).toBe(RATE);
    const job = row('Operating the plant', 'employment');
    expect(relBetween(job[CUM!] as number, YEARS * operate!.employment!.total)).toBeLessThan(1e-12);
    expect(job[PV!]).toBeNull(); // no present value of head counts
    expect(row('Building the plant', 'output')[CUM!]).toBeNull();
    expect(row('Building the plant', 'output')[PV!]).toBeNull();
  });
});
