/**
 * The study's deliverables: the brief (PDF) of a scenario and the workbook (XLSX) of a study or a scenario, assembled
 * here once from the prepared study, the scenario outcome and the report registry, so the CLI and the app hand over
 * the same documents. The typesetting and the spreadsheet writing are src/deliverables'.
 */
import {
  briefDocument, briefPdf, councilNumber, HEADLINE, headlineRows, workbookXlsx, type BaseEconomy, type BriefDocument, type BriefFonts, type BriefInput, type BriefPhase,
  type Paper, type WorkbookSheet,
} from '../deliverables/index.ts';
import { CAUTIONS, modelTypeOf, originLines, SCENARIO_CAUTIONS, timingText, type ReportFile } from '../report/index.ts';
import { sourceOriginsOf } from './source.ts';
import { valueAddedPerUnit } from '../model/index.ts';
import type { AnalysisReportKind } from '../report/index.ts';
import type { PreparedStudy } from './prepare.ts';
import { reportUnavailable, scenarioReport, tableReport, type ReportKind, type ScenarioReportKind } from './reports.ts';
import { lineReady, tableYearOf, type ScenarioOutcome } from './scenarios.ts';
import type { SensitivityResult, UncertaintyResult } from '../uncertainty/index.ts';
import { bandReports, sensitivityReports } from './uncertainty.ts';

/** How sure the numbers are, when the user computed it: the deliverables then include it. */
export interface HowSure {
  bands?: UncertaintyResult | null;
  /** One per phase (studySensitivity). */
  sensitivity?: SensitivityResult[] | null;
}

/** The bands of a scenario's totals in sentences (the point estimate first; the band beside it). */
export function bandSentences(r: UncertaintyResult, scenario: string): string[] {
  const s = r.scenarios.find((x) => x.scenario === scenario);
  if (!s) return [];
  const parts = HEADLINE.flatMap((h) => {
    const b = s.totals[h.v];
    return b ? [`${h.sheet} ${councilNumber(b.point, h.q)} (${councilNumber(b.p5, h.q)} to ${councilNumber(b.p95, h.q)})`] : [];
  });
  if (!parts.length) return [];
  return [`How sure: redrawing the table ${r.draws} times with independent errors of ${Math.round(r.settings.cv * 100)} % on every coefficient (seed ${r.settings.seed}; ${r.rejected} draws left out as unusable), the total effects and the range holding 90 % of the draws (5th to 95th percentile) are: ${parts.join('; ')}. The estimates themselves are the ones above; the ranges reflect only the errors assumed.`];
}

export interface BriefOptions {
  /** ISO 8601 date-time of the run. */
  date: string;
  paper: Paper;
  fonts: BriefFonts;
}

/** The county's base-year totals in the definitions the effects use: each variable's coefficient × output, summed. */
export function baseEconomy(ps: PreparedStudy): BaseEconomy {
  const { x, h, e, fte, taxes } = ps.pm.coef;
  const va = valueAddedPerUnit(ps.pm.coef);
  let output = 0, income = 0, valueAdded = 0, employment = 0, fteSum = 0, taxSum = 0;
  for (let j = 0; j < x.length; j++) {
    output += x[j]!;
    income += h[j]! * x[j]!;
    valueAdded += va[j]! * x[j]!;
    if (e) employment += e[j]! * x[j]!;
    if (fte) fteSum += fte[j]! * x[j]!;
    if (taxes) taxSum += taxes[j]! * x[j]!;
  }
  return { output, income, valueAdded, employment: e ? employment : null, fte: fte ? fteSum : null, taxes: taxes ? taxSum : null };
}

/** The phases of an outcome, each with its timing in words (one-time, or annual with its years). */
export function phasesOf(o: ScenarioOutcome): BriefPhase[] {
  return o.phases.map((p) => ({ name: p.phase.name, timing: timingText(p.phase), result: { ...p.result, notes: p.notes }, lines: p.phase.lines.filter(lineReady), overTime: p.overTime }));
}

/** Every phase's notes, each once, in phase order. */
function notesOf(o: ScenarioOutcome): string[] {
  return [...new Set(o.phases.flatMap((p) => p.notes))];
}

function modelChoices(o: ScenarioOutcome): string[] {
  const r = o.phases[0]!.result;
  const lines = o.phases.flatMap((p) => p.phase.lines);
  const fixed = [...new Set(o.phases.flatMap((p) => p.result.shock.fixed.map((j) => p.result.sectors[j]!)))];
  const choices = [
    r.closure === 'household'
      ? 'Induced effects from the household-closed model (Type II): local households re-spend their extra labour income in the base-year pattern.'
      : `No induced effects: ${r.multipliers.output.typeII.reason ?? 'the household closure is not used'}.`,
    'Final-demand lines enter the model as amount × local share (the part bought inside the county).',
  ];
  if (fixed.length) {
    choices.push(`Mixed exogenous/endogenous model: the output of ${fixed.map((s) => `'${s}'`).join(', ')} is fixed from outside by output or jobs lines; the other sectors respond to its purchases.`);
  }
  choices.push(
    lines.some((l) => l.prices === 'purchaser')
      ? 'Purchaser-price lines are split into the producer value and trade and transport margins (the inputs list each split); other amounts are producer prices.'
      : 'Amounts are producer prices; no trade or transport margins are applied.',
    lines.some((l) => l.priceYear !== undefined)
      ? 'Amounts given in another year\'s money are converted to the table\'s money year with the price index entered (the inputs list each factor).'
      : 'No price-year conversion: amounts are taken in the table\'s money unit.',
    ...o.model.map((m) => `${m[0]!.toUpperCase()}${m.slice(1)}.`),
  );
  return choices;
}

export function briefInputOf(ps: PreparedStudy, o: ScenarioOutcome, date: string, sure: HowSure = {}): BriefInput {
  const { study } = ps;
  return {
    scenario: o.scenario.name,
    ...(o.scenario.description ? { description: o.scenario.description } : {}),
    tableName: study.table.name,
    source: study.source ? { fileName: study.source.fileName, sha256: study.source.sha256, origins: sourceOriginsOf(study) } : null,
    date,
    moneyUnit: study.table.moneyUnit,
    priceYear: tableYearOf(study) ? String(tableYearOf(study)!.year) : null,
    verdict: ps.verdict.say,
    model: modelTypeOf(o.phases[0]!.result),
    base: baseEconomy(ps),
    phases: phasesOf(o),
    sameTiming: o.byTiming.map((t) => ({ timing: t.timing, phases: t.phases, totals: t.gross, cumulative: t.grossCumulative })),
    modelChoices: modelChoices(o),
    notes: [...notesOf(o), ...(sure.bands ? bandSentences(sure.bands, o.scenario.name) : [])],
    cautions: [...CAUTIONS, ...SCENARIO_CAUTIONS],
  };
}

/** The brief's content (what the PDF typesets and the app's print view shows). */
export function studyBriefDocument(ps: PreparedStudy, o: ScenarioOutcome, date: string, sure: HowSure = {}): BriefDocument {
  return briefDocument(briefInputOf(ps, o, date, sure));
}

/** The brief of one scenario as PDF bytes. */
export function studyBrief(ps: PreparedStudy, o: ScenarioOutcome, opts: BriefOptions, sure: HowSure = {}): Promise<Uint8Array> {
  return briefPdf(studyBriefDocument(ps, o, opts.date, sure), { paper: opts.paper, fonts: opts.fonts });
}

/** Sheet names of the reports (spreadsheet programs allow 31 characters). */
const SHEET_NAMES: Partial<Record<ReportKind, string>> = {
  'scenario-inputs': 'Inputs',
  'scenario-phases': 'Phases',
  'scenario-impact': 'Effects by sector',
  'scenario-net-impact': 'Net effects by sector',
  'scenario-multipliers': 'Scenario multipliers',
  'scenario-rounds': 'Spending rounds',
  'scenario-paths': 'Structural paths',
  multipliers: 'Multipliers',
  coefficients: 'Coefficients',
  'leontief-inverse': 'Leontief inverse',
  viability: 'Viability',
  'perron-vectors': 'Perron vectors',
  spectrum: 'Eigenvalues',
};

const TABLE_KINDS: readonly AnalysisReportKind[] = ['multipliers', 'coefficients', 'leontief-inverse', 'viability', 'perron-vectors', 'spectrum'];

/** The n × n sheets (coefficients, Leontief inverse) only up to this many sectors: beyond, a workbook of millions of
 * cells is slow to write and to open, and the CSV reports hold the matrices. Common practice, no source. */
export const WORKBOOK_MATRIX_LIMIT = 500;
const MATRIX_KINDS: readonly AnalysisReportKind[] = ['coefficients', 'leontief-inverse'];

function sheetsOf(kind: ReportKind, files: ReportFile[]): WorkbookSheet[] {
  return files.flatMap((f, k) => {
    if (!f.sheet) return [];
    const m = f.sheet.meta;
    const base = SHEET_NAMES[kind] ?? m.title;
    return [{
      name: k === 0 ? base : `${base} by sector`,
      rows: f.sheet.rows,
      title: `${m.title} (${f.name}). Model: ${m.modelType}.`,
      notes: (m.notes ?? []).filter((n) => !SCENARIO_CAUTIONS.includes(n)),
    }];
  });
}

function provenance(ps: PreparedStudy, date: string, o: ScenarioOutcome | null): [string, string][] {
  const { study } = ps;
  return [
    ...(o ? [['Scenario', o.scenario.name] as [string, string]] : []),
    ['Table', study.table.name],
    ['Table file', study.source?.fileName ?? 'not from a file (made in the app or estimated)'],
    ...(study.source ? [['SHA-256 of the file', study.source.sha256] as [string, string]] : []),
    ...originLines(sourceOriginsOf(study)),
    ['Money unit', study.table.moneyUnit],
    ['Model', o ? modelTypeOf(o.phases[0]!.result) : (ps.models.closed === true ? 'open (Type I) and household-closed (Type II) input-output model' : 'open (Type I) input-output model')],
    ['Table check', ps.verdict.say],
    ['Produced', `${date} by Roundwise`],
    ['Numbers', 'Cells hold full-precision values; the number formats only round what is shown.'],
  ];
}

/**
 * The workbook: for a scenario, its summary per phase, its reports and the table's; without one, the table's reports
 * (multipliers, coefficients, the Leontief inverse, viability, Perron vectors, eigenvalues when computed).
 */
export function studyWorkbook(ps: PreparedStudy, o: ScenarioOutcome | null, opts: { date: string }, sure: HowSure = {}): Promise<Uint8Array> {
  const sheets: WorkbookSheet[] = [];
  if (o) {
    sheets.push({
      name: 'Summary',
      rows: headlineRows(phasesOf(o), baseEconomy(ps)),
      title: 'The scenario\'s totals per phase and variable, with the county\'s base-year totals and each total as a share of them.',
      notes: notesOf(o),
    });
    const kinds: ScenarioReportKind[] = [
      'scenario-phases', 'scenario-impact', ...(o.phases.some((p) => p.net) ? ['scenario-net-impact' as const] : []), 'scenario-multipliers', 'scenario-inputs',
      'scenario-rounds', ...(o.phases.some((p) => p.paths) ? ['scenario-paths' as const] : []),
    ];
    for (const k of kinds) sheets.push(...sheetsOf(k, scenarioReport(ps, k, o, opts.date)));
  }
  // Bands and sensitivity when computed: one sheet per report, beside the point estimates they belong to.
  const sure_ = [...(sure.bands ? bandReports(ps, sure.bands, opts.date) : []), ...(sure.sensitivity ? sure.sensitivity.flatMap((x) => sensitivityReports(ps, x, opts.date)) : [])];
  for (const f of sure_) {
    if (!f.sheet) continue;
    const m = f.sheet.meta;
    sheets.push({ name: m.title.startsWith('Sensitivity') ? 'Sensitivity' : m.title.startsWith('Multiplier') ? 'Multiplier bands' : 'Uncertainty bands', rows: f.sheet.rows, title: `${m.title} (${f.name}). Model: ${m.modelType}.`, notes: (m.notes ?? []).filter((n) => !SCENARIO_CAUTIONS.includes(n) && !CAUTIONS.includes(n)) });
  }
  const n = ps.study.table.n;
  const left: string[] = [];
  for (const k of TABLE_KINDS) {
    if (reportUnavailable(ps, k) !== null) continue;
    if (n > WORKBOOK_MATRIX_LIMIT && MATRIX_KINDS.includes(k)) { left.push(`${k}.csv`); continue; }
    sheets.push(...sheetsOf(k, tableReport(ps, k, opts.date)));
  }
  const prov = provenance(ps, opts.date, o);
  if (left.length) prov.push(['Left out', `The ${n} × ${n} matrices of this table are not in the workbook (over ${WORKBOOK_MATRIX_LIMIT} sectors); the CSV reports ${left.join(' and ')} hold them.`]);
  return workbookXlsx({ provenance: prov, sheets, cautions: [...CAUTIONS, ...(o ? SCENARIO_CAUTIONS : [])] });
}
