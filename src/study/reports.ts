/**
 * The one report registry: every report a study can produce, with its label, what it holds, and the one function
 * that builds it. The CLI's --out and the app's Export screen list and write the same set from here, with the same
 * file names, headers and sidecars.
 */
import { InputError } from '../diagnostics/index.ts';
import { formLeontief } from '../model/index.ts';
import {
  analysisReport, comparisonReport, impactReport, inputsReport, pathReport, phaseSummaryReport, roundsReport, scenarioMultiplierReport,
  ANALYSIS_REPORT_KINDS, type AnalysisReportKind, type ReportFile, type ScenarioReportContext,
} from '../report/index.ts';
import type { Scenario } from '../scenario/index.ts';
import type { PreparedStudy } from './prepare.ts';
import { sourceContext } from './source.ts';
import { compareStudyScenarios, runStudyScenario, studyModelNotes, type PhaseOutcome, type ScenarioOutcome } from './scenarios.ts';

export type ScenarioReportKind =
  | 'scenario-inputs' | 'scenario-phases' | 'scenario-impact' | 'scenario-net-impact' | 'scenario-multipliers' | 'scenario-rounds' | 'scenario-paths';
export type ReportKind = AnalysisReportKind | ScenarioReportKind | 'comparison';

export interface ReportEntry {
  kind: ReportKind;
  label: string;
  what: string;
  /** 'table': one per study; 'scenario': one per scenario; 'study': across the study's scenarios. */
  scope: 'table' | 'scenario' | 'study';
}

export const REPORTS: readonly ReportEntry[] = [
  { kind: 'multipliers', scope: 'table', label: 'Multipliers and linkages', what: 'Type I and II output, income, jobs and value-added multipliers with backward/forward linkages and key sectors, one row per sector.' },
  { kind: 'coefficients', scope: 'table', label: 'Technical coefficients', what: 'The matrix A, seller by buyer, with the per-unit income, value-added, import and jobs rows.' },
  { kind: 'leontief-inverse', scope: 'table', label: 'Leontief inverse', what: 'L = (I − A)⁻¹ with its column sums (formed on request; slow for very large tables).' },
  { kind: 'viability', scope: 'table', label: 'Viability', what: 'The verdict, Hawkins–Simon, the Perron root with its bounds, irreducibility and the rounds needed.' },
  { kind: 'perron-vectors', scope: 'table', label: 'Perron vectors', what: 'The long-run direction of the spending rounds and the long-run weight of each sector\'s demand.' },
  { kind: 'spectrum', scope: 'table', label: 'Eigenvalues', what: 'Every eigenvalue of A and its long-run behaviour (tables up to 400 sectors).' },
  { kind: 'scenario-inputs', scope: 'scenario', label: 'Scenario inputs', what: 'Every line of every phase: kind, sector, mix or activity, amount, prices, price year and conversion, local share, displacement, deadweight and note.' },
  { kind: 'scenario-phases', scope: 'scenario', label: 'Phase summary', what: 'Totals of each phase (one-time or annual), gross and net; an annual phase\'s cumulative effect and present value; sums across phases of the same timing only.' },
  { kind: 'scenario-impact', scope: 'scenario', label: 'Scenario effects by sector', what: 'Per phase: direct, indirect, induced and total effects for output, value added, labour income, jobs, and taxes and FTE when the table has them.' },
  { kind: 'scenario-net-impact', scope: 'scenario', label: 'Net effects by sector', what: 'Per phase: the effects net of the lines\' displacement and deadweight shares.' },
  { kind: 'scenario-multipliers', scope: 'scenario', label: 'Scenario multipliers', what: 'Per phase: totals and the implied Type I and Type II multipliers.' },
  { kind: 'scenario-rounds', scope: 'scenario', label: 'Scenario spending rounds', what: 'Per phase: output and income of each round, by round and by sector, with the share of the open-model total reached.' },
  { kind: 'scenario-paths', scope: 'scenario', label: 'Structural paths', what: 'Per phase: the largest paths carrying the effects to the study\'s chosen sector.' },
  { kind: 'comparison', scope: 'study', label: 'Scenario comparison', what: 'All scenarios (and their phases) side by side, with differences from the first scenario\'s phase of the same name and timing.' },
];

/** File-name stem of a scenario's reports: its name in lower case, runs of other characters as one hyphen. */
export function scenarioSlug(name: string): string {
  return name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'scenario';
}

const SCENARIO_FILE: Record<ScenarioReportKind, string> = {
  'scenario-inputs': 'inputs',
  'scenario-phases': 'phases',
  'scenario-impact': 'impact',
  'scenario-net-impact': 'net-impact',
  'scenario-multipliers': 'implied-multipliers',
  'scenario-rounds': 'rounds',
  'scenario-paths': 'paths',
};

/** Reports written once per scenario; the others once per phase. */
const PER_SCENARIO: readonly ScenarioReportKind[] = ['scenario-inputs', 'scenario-phases'];

function context(ps: PreparedStudy, date: string, o?: ScenarioOutcome): ScenarioReportContext {
  const extra = o ? { model: o.model, notes: o.inputNotes } : { model: studyModelNotes(ps).model };
  return { tableName: ps.study.table.name, date, ...sourceContext(ps.study), ...extra };
}

/**
 * File-name stem of each phase's reports: the scenario's slug for a scenario of one phase (the names of old), else
 * SCENARIO-PHASE, made unique if two phase names slug alike.
 */
export function phaseSlugs(o: Pick<ScenarioOutcome, 'scenario'>): string[] {
  const base = scenarioSlug(o.scenario.name);
  if (o.scenario.phases.length === 1) return [base];
  const seen = new Set<string>();
  return o.scenario.phases.map((p) => {
    const stem = `${base}-${scenarioSlug(p.name)}`;
    let slug = stem;
    for (let k = 2; seen.has(slug); k++) slug = `${stem}-${k}`;
    seen.add(slug);
    return slug;
  });
}

function hasNet(o: ScenarioOutcome): boolean {
  return o.phases.some((p) => p.net !== null);
}

/** Why a report cannot be produced for this study (and scenario), or null when it can. */
export function reportUnavailable(ps: PreparedStudy, kind: ReportKind): string | null {
  const entry = REPORTS.find((r) => r.kind === kind);
  if (!entry) return `unknown report '${kind}'`;
  if (kind === 'leontief-inverse' && ps.models.open !== true) return ps.models.open;
  if (kind === 'spectrum' && !ps.analysis.viability.spectrum) return ps.analysis.viability.spectrumNote ?? 'the spectrum was not computed';
  if (entry.scope !== 'table' && ps.models.open !== true) return ps.models.open;
  if (entry.scope === 'scenario' && ps.study.scenarios.length === 0) return 'the study has no scenario';
  if (kind === 'comparison' && ps.study.scenarios.length < 2) return 'needs two scenarios or more';
  if (kind === 'scenario-net-impact' && !ps.study.scenarios.some((s) => s.phases.some((p) => p.lines.some((l) => (l.displacement ?? 0) !== 0 || (l.deadweight ?? 0) !== 0)))) {
    return 'no line gives a displacement or deadweight share, so net effects equal gross ones';
  }
  return null;
}

/** A table report; the Leontief inverse is formed here, with its accuracy ratio, when the analysis did not form it. */
export function tableReport(ps: PreparedStudy, kind: AnalysisReportKind, date: string): ReportFile[] {
  const why = reportUnavailable(ps, kind);
  if (why) throw new InputError('report-unavailable', `no ${kind} report: ${why}`);
  let an = ps.analysis;
  if (kind === 'leontief-inverse' && !an.leontief) {
    const { L, residual } = formLeontief(ps.pm);
    an = { ...an, leontief: L, checks: { ...an.checks, inverseResidual: residual } };
  }
  return analysisReport(an, kind, context(ps, date))!;
}

function phaseReport(ps: PreparedStudy, kind: ScenarioReportKind, o: ScenarioOutcome, p: PhaseOutcome, base: string, ctx: ScenarioReportContext): ReportFile[] {
  const r = { ...p.result, notes: p.notes };
  switch (kind) {
    case 'scenario-impact': return impactReport(r, ctx, base);
    case 'scenario-net-impact': return p.net ? impactReport({ ...p.net, notes: p.notes }, ctx, base, 'net') : [];
    case 'scenario-multipliers': return scenarioMultiplierReport(r, ctx, base);
    case 'scenario-rounds': return roundsReport(r, p.rounds, ctx, base);
    case 'scenario-paths': return p.paths ? pathReport(r, p.paths, ctx, base) : [];
    default: throw new Error(`not a per-phase report: ${kind}`);
  }
}

/** A report of one scenario outcome: one file set per scenario (inputs, phases) or per phase (the others). */
export function scenarioReport(ps: PreparedStudy, kind: ScenarioReportKind, o: ScenarioOutcome, date: string): ReportFile[] {
  const ctx = context(ps, date, o);
  const slug = scenarioSlug(o.scenario.name);
  const first = { ...o.phases[0]!.result, notes: o.phases[0]!.notes };
  switch (kind) {
    case 'scenario-inputs':
      return inputsReport(o.scenario.name, o.scenario.description, o.phases.map((p) => ({ phase: p.phase, expanded: p.expanded })), first, ctx, `${slug}-inputs`);
    case 'scenario-phases':
      return phaseSummaryReport(o.scenario.name, o.phases.map((p) => ({ phase: p.phase, gross: p.result, net: p.net, grossOverTime: p.overTime, netOverTime: p.netOverTime })), o.byTiming, ctx, `${slug}-phases`);
    default: {
      if (kind === 'scenario-paths' && o.phases.every((p) => !p.paths)) throw new InputError('report-unavailable', 'no structural paths were traced for this scenario');
      if (kind === 'scenario-net-impact' && !hasNet(o)) throw new InputError('report-unavailable', `scenario '${o.scenario.name}' gives no displacement or deadweight share, so its net effects equal its gross ones`);
      const slugs = phaseSlugs(o);
      return o.phases.flatMap((p, k) => phaseReport(ps, kind, o, p, `${slugs[k]}-${SCENARIO_FILE[kind]}`, ctx));
    }
  }
}

export function comparisonOf(ps: PreparedStudy, scenarios: readonly Scenario[], date: string): ReportFile[] {
  return comparisonReport(compareStudyScenarios(ps, scenarios), ps.study.table.moneyUnit, context(ps, date), 'scenario-comparison');
}

/**
 * One report by kind: a table report, a report of the named scenario (paths to the study's chosen sector), or the
 * comparison of all scenarios.
 */
export function buildReport(ps: PreparedStudy, kind: ReportKind, opts: { scenario?: Scenario; date: string }): ReportFile[] {
  if ((ANALYSIS_REPORT_KINDS as readonly string[]).includes(kind)) return tableReport(ps, kind as AnalysisReportKind, opts.date);
  const why = reportUnavailable(ps, kind);
  if (why) throw new InputError('report-unavailable', `no ${kind} report: ${why}`);
  if (kind === 'comparison') return comparisonOf(ps, ps.study.scenarios, opts.date);
  if (!opts.scenario) throw new InputError('report-unavailable', `the ${kind} report needs a scenario`);
  const o = runStudyScenario(ps, opts.scenario, { paths: kind === 'scenario-paths' ? 'default' : null });
  return scenarioReport(ps, kind as ScenarioReportKind, o, opts.date);
}

/** Every table report the study can produce (the Leontief inverse only when `inverse`). */
export function tableReportSet(ps: PreparedStudy, date: string, opts: { inverse: boolean }): ReportFile[] {
  return ANALYSIS_REPORT_KINDS
    .filter((k) => (k !== 'leontief-inverse' || opts.inverse) && reportUnavailable(ps, k) === null)
    .flatMap((k) => tableReport(ps, k, date));
}

/** Every report of one scenario outcome: inputs and phase summary, then per phase (net effects and paths when there are any). */
export function scenarioReportSet(ps: PreparedStudy, o: ScenarioOutcome, date: string): ReportFile[] {
  const kinds: ScenarioReportKind[] = [
    ...PER_SCENARIO, 'scenario-impact', ...(hasNet(o) ? ['scenario-net-impact' as const] : []), 'scenario-multipliers', 'scenario-rounds',
    ...(o.phases.some((p) => p.paths) ? ['scenario-paths' as const] : []),
  ];
  return kinds.flatMap((k) => scenarioReport(ps, k, o, date));
}
