/**
 * The one report registry: every report a study can produce, with its label, what it holds, and the one function
 * that builds it. The CLI's --out and the app's Export screen list and write the same set from here, with the same
 * file names, headers and sidecars.
 */
import { InputError } from '../diagnostics/index.ts';
import { formLeontief } from '../model/index.ts';
import {
  analysisReport, comparisonReport, impactReport, inputsReport, pathReport, roundsReport, scenarioMultiplierReport,
  ANALYSIS_REPORT_KINDS, type AnalysisReportKind, type ReportFile, type ScenarioReportContext,
} from '../report/index.ts';
import type { Scenario } from '../scenario/index.ts';
import type { PreparedStudy } from './prepare.ts';
import { compareStudyScenarios, runStudyScenario, type ScenarioOutcome } from './scenarios.ts';

export type ScenarioReportKind = 'scenario-inputs' | 'scenario-impact' | 'scenario-multipliers' | 'scenario-rounds' | 'scenario-paths';
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
  { kind: 'scenario-inputs', scope: 'scenario', label: 'Scenario inputs', what: 'Every line of the scenario: sector, kind, amount, local share, pattern and note.' },
  { kind: 'scenario-impact', scope: 'scenario', label: 'Scenario effects by sector', what: 'Direct, indirect, induced and total effects for output, value added, income and jobs.' },
  { kind: 'scenario-multipliers', scope: 'scenario', label: 'Scenario multipliers', what: 'Totals and the implied Type I and Type II multipliers of the scenario.' },
  { kind: 'scenario-rounds', scope: 'scenario', label: 'Scenario spending rounds', what: 'Output and income of each round, by round and by sector, with the share of the open-model total reached.' },
  { kind: 'scenario-paths', scope: 'scenario', label: 'Structural paths', what: 'The largest paths carrying the scenario to the study\'s chosen sector.' },
  { kind: 'comparison', scope: 'study', label: 'Scenario comparison', what: 'All scenarios side by side, with differences from the first.' },
];

/** File-name stem of a scenario's reports: its name in lower case, runs of other characters as one hyphen. */
export function scenarioSlug(name: string): string {
  return name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'scenario';
}

const SCENARIO_FILE: Record<ScenarioReportKind, string> = {
  'scenario-inputs': 'inputs',
  'scenario-impact': 'impact',
  'scenario-multipliers': 'implied-multipliers',
  'scenario-rounds': 'rounds',
  'scenario-paths': 'paths',
};

function context(ps: PreparedStudy, date: string): ScenarioReportContext {
  const src = ps.study.source;
  return { tableName: ps.study.table.name, date, ...(src ? { sourceFile: src.fileName, sourceHash: src.sha256 } : {}) };
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
  return null;
}

/** A table report; the Leontief inverse is formed here when the analysis did not form it. */
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

/** A report of one scenario outcome. */
export function scenarioReport(ps: PreparedStudy, kind: ScenarioReportKind, o: ScenarioOutcome, date: string): ReportFile[] {
  const ctx = context(ps, date);
  const base = `${scenarioSlug(o.scenario.name)}-${SCENARIO_FILE[kind]}`;
  const r = { ...o.result, notes: o.notes };
  switch (kind) {
    case 'scenario-inputs': return inputsReport(o.scenario, r, ctx, base);
    case 'scenario-impact': return impactReport(r, ctx, base);
    case 'scenario-multipliers': return scenarioMultiplierReport(r, ctx, base);
    case 'scenario-rounds': return roundsReport(r, o.rounds, ctx, base);
    case 'scenario-paths': {
      if (!o.paths) throw new InputError('report-unavailable', 'no structural paths were traced for this scenario');
      return pathReport(r, o.paths, ctx, base);
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

/** Every report of one scenario outcome (paths when they were traced). */
export function scenarioReportSet(ps: PreparedStudy, o: ScenarioOutcome, date: string): ReportFile[] {
  const kinds: ScenarioReportKind[] = ['scenario-inputs', 'scenario-impact', 'scenario-multipliers', 'scenario-rounds', ...(o.paths ? ['scenario-paths' as const] : [])];
  return kinds.flatMap((k) => scenarioReport(ps, k, o, date));
}
