/**
 * How sure the study's numbers are: Monte Carlo bands around its multipliers and scenario totals, and one-at-a-time
 * sensitivity of a scenario's totals (src/uncertainty), set up from the prepared study so every draw uses the models
 * the study's own results use. The CLI and the app's worker call these, so the same seed gives the same bands in both.
 */
import {
  multiplierBandReport, planDraws, runDraws, scenarioBandReport, sensitivity, sensitivityReport, startRun, summarise,
  type BandReportContext, type DrawChunk, type DrawSetup, type RunOptions, type ScenarioBands, type SensitivityResult, type UncertaintyResult, type UncertaintySettings,
} from '../uncertainty/index.ts';
import type { ReportFile } from '../report/index.ts';
import { residentShares, type LineSet, type Scenario } from '../scenario/index.ts';
import type { PreparedStudy } from './prepare.ts';
import { readyLines, shockInputsOf } from './scenarios.ts';
import { scenarioSlug } from './reports.ts';
import { sourceContext } from './source.ts';
import type { FlqOrigin } from './estimate.ts';

export interface BandsRequest {
  settings: UncertaintySettings;
  /** Draw every multiplier (the Multipliers screen, analyze). */
  multipliers: boolean;
  /** Scenarios whose totals to draw (lines without a sector left out, as everywhere). */
  scenarios: readonly Scenario[];
}

/** Each phase of a scenario as the named list of lines that is drawn ("Scenario" for one phase, else "Scenario — Phase"). */
export function phaseSets(scenario: Scenario): LineSet[] {
  const s = readyLines(scenario);
  return s.phases.map((p) => ({ name: s.phases.length > 1 ? `${s.name} — ${p.name}` : s.name, lines: p.lines }));
}

export function drawSetupOf(ps: PreparedStudy, req: BandsRequest): DrawSetup {
  return {
    table: ps.study.table,
    closure: ps.study.settings.closure,
    multipliers: req.multipliers,
    scenarios: req.scenarios.flatMap(phaseSets),
    inputs: shockInputsOf(ps.study),
    residentShare: residentShares(ps.study.commuting, ps.study.table.sectors),
    settings: req.settings,
    spectrum: ps.analysis.viability.spectrum !== null,
  };
}

/** A run taken a range of draws at a time (the app's worker, between which the UI shows progress and may stop). */
export interface BandsRun {
  total: number;
  /**
   * What is drawn, as plain data: another thread can compute any range of the draws from it (`drawChunk`) and hand the
   * result back through `add`. Null when the draws need what cannot be posted (the county estimate at another δ).
   */
  setup: DrawSetup | null;
  /** Compute draws from ≤ k < to (any split gives the same numbers). */
  step(from: number, to: number): void;
  /** Draws computed elsewhere from `setup`. */
  add(chunk: DrawChunk): void;
  /** The bands of every draw computed so far; they must cover 0 … total − 1. */
  finish(): UncertaintyResult;
}

/** Checks the settings and computes the point estimate through the draws' evaluation (refused when not usable). */
export function beginStudyBands(ps: PreparedStudy, req: BandsRequest, origin: FlqOrigin | null = null): BandsRun {
  const setup = drawSetupOf(ps, req);
  const { plan, point } = startRun(setup, origin ? { tableAt: origin.tableAt } : {});
  const chunks: DrawChunk[] = [];
  return {
    total: req.settings.draws,
    setup: plan.tableAt ? null : setup,
    step: (from, to) => { chunks.push(runDraws(plan, from, to)); },
    add: (chunk) => { chunks.push(chunk); },
    finish: () => summarise(plan, point, chunks),
  };
}

/**
 * Draws from ≤ k < to of a setup posted by `BandsRun.setup` (another thread's part of a run). The plan is made once per
 * setup object and kept while the same setup keeps coming.
 */
let lastPlan: { setup: DrawSetup; plan: ReturnType<typeof planDraws> } | null = null;
export function drawChunk(setup: DrawSetup, from: number, to: number): DrawChunk {
  if (lastPlan?.setup !== setup) lastPlan = { setup, plan: planDraws(setup) };
  return runDraws(lastPlan.plan, from, to);
}

/** The bands of the request; null when `onProgress` stopped the run. */
export function studyBands(ps: PreparedStudy, req: BandsRequest, opts: RunOptions = {}): UncertaintyResult | null {
  const run = beginStudyBands(ps, req);
  const size = Math.max(1, Math.floor(opts.chunk ?? 25));
  for (let from = 0; from < run.total; from += size) {
    const to = Math.min(run.total, from + size);
    run.step(from, to);
    if (opts.onProgress && opts.onProgress(to, run.total) === false) return null;
  }
  return run.finish();
}

export interface SensitivityRequest {
  /** Local shares ± this. */
  step?: number;
  /** Margin shares × (1 ± this). */
  marginStep?: number;
  /** The table's FLQ origin (flqOriginOf) and the δ range to try; without it δ is not varied. */
  flq?: { origin: FlqOrigin; range: [number, number] } | null;
}

/** One-at-a-time sensitivity of a scenario's totals, phase by phase, in the models the study uses. */
export function studySensitivity(ps: PreparedStudy, scenario: Scenario, step?: number, more: Omit<SensitivityRequest, 'step'> = {}): SensitivityResult[] {
  const inputs = shockInputsOf(ps.study);
  const residentShare = residentShares(ps.study.commuting, ps.study.table.sectors);
  const flq = more.flq ?? null;
  return phaseSets(scenario).map((set) => sensitivity(ps.pm, set, {
    available: ps.analysis.availability, closure: ps.study.settings.closure, inputs, residentShare, ...(step !== undefined ? { step } : {}),
    ...(more.marginStep !== undefined ? { marginStep: more.marginStep } : {}),
    delta: flq ? { tableAt: flq.origin.tableAt, range: flq.range, estimate: flq.origin.delta } : null,
  }));
}

function bandContext(ps: PreparedStudy, date: string, modelType: string): BandReportContext {
  return { tableName: ps.study.table.name, date, moneyUnit: ps.study.table.moneyUnit, modelType, ...sourceContext(ps.study) };
}

const MODEL_OF = (ps: PreparedStudy) => (ps.models.closed === true
  ? 'open (Type I) and household-closed (Type II) input-output model, each draw recomputed in full'
  : `open (Type I) input-output model (${ps.models.closed}), each draw recomputed in full`);

/** The bands as reports: multiplier-bands, and NAME-bands for each scenario drawn. */
export function bandReports(ps: PreparedStudy, r: UncertaintyResult, date: string): ReportFile[] {
  const ctx = bandContext(ps, date, MODEL_OF(ps));
  return [
    ...(r.multipliers ? multiplierBandReport(r, ctx) : []),
    ...r.scenarios.flatMap((s: ScenarioBands) => scenarioBandReport(r, s, ctx, `${scenarioSlug(s.scenario)}-bands`)),
  ];
}

export function sensitivityReports(ps: PreparedStudy, s: SensitivityResult, date: string): ReportFile[] {
  return sensitivityReport(s, bandContext(ps, date, MODEL_OF(ps)), `${scenarioSlug(s.scenario)}-sensitivity`);
}
