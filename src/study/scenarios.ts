/**
 * A scenario of a study, computed one way for every front end: effects (with the models the study allows), spending
 * rounds with the Perron root beside them, and structural paths traced in the same model as the effects, so the paths
 * to a sector add up to that sector's total in the effects table.
 */
import { formatLocated, InputError } from '../diagnostics/index.ts';
import {
  compareScenarios, runScenario, spendingRounds, structuralPaths,
  type PathAnalysis, type RoundsResult, type Scenario, type ScenarioComparison, type ScenarioResult, type SpendingPattern,
} from '../scenario/index.ts';
import type { PreparedStudy } from './prepare.ts';
import type { IOTable } from '../table/index.ts';

export interface ScenarioOutcome {
  scenario: Scenario;
  result: ScenarioResult;
  rounds: RoundsResult;
  /** Paths to the study's destination sector (or the one asked for), or null when none was asked for. */
  paths: PathAnalysis | null;
  /** The result's notes and the table's warnings: what every report and screen of this scenario says beside it. */
  notes: string[];
}

/**
 * Lines still being typed (no sector chosen yet) are left out of a scenario; every other line counts, a zero amount
 * included (a zero output or jobs line holds that sector's output unchanged in the mixed model).
 */
export function readyLines(s: Scenario): Scenario {
  return s.lines.every((l) => l.sector !== '') ? s : { ...s, lines: s.lines.filter((l) => l.sector !== '') };
}

export interface OutcomeOptions {
  /** Destination of structural paths: a sector label, 'default' (the study's, else the most affected sector not shocked itself), or null for none. */
  paths?: string | 'default' | null;
}

export function runStudyScenario(ps: PreparedStudy, scenario: Scenario, opts: OutcomeOptions = {}): ScenarioOutcome {
  const { pm, analysis, study } = ps;
  const result = runScenario(pm, readyLines(scenario), ps.models);
  const rounds = spendingRounds(pm, result.effectiveDemand, result.openOutput, { maxRounds: study.settings.rounds.maxRounds, perronRoot: analysis.viability.perronRoot });
  const want = opts.paths ?? null;
  const dest = want === null ? null : want === 'default' ? (study.settings.paths.destination ?? study.table.sectors[defaultDestination(result)]!) : want;
  const paths = dest === null ? null : tracePaths(ps, result, dest);
  const notes = [...result.notes, ...analysis.warnings.map((w) => `Table: ${formatLocated(w)}`)];
  return { scenario, result, rounds, paths, notes };
}

/** The sector whose output moves most without being shocked itself (its paths are the informative ones); else the most moved. */
export function defaultDestination(r: ScenarioResult): number {
  const { total, direct } = r.effects.output;
  let best = -1;
  for (let i = 0; i < total.length; i++) {
    if (direct[i] === 0 && (best < 0 || Math.abs(total[i]!) > Math.abs(total[best]!))) best = i;
  }
  if (best >= 0) return best;
  for (let i = 0; i < total.length; i++) if (best < 0 || Math.abs(total[i]!) > Math.abs(total[best]!)) best = i;
  return Math.max(0, best);
}

/** Structural paths to `sector`, in the model the effects used (household-closed when induced effects are shown). */
export function tracePaths(ps: PreparedStudy, r: ScenarioResult, sector: string): PathAnalysis {
  const dest = ps.study.table.sectors.indexOf(sector);
  if (dest < 0) throw new InputError('unknown-sector', `structural paths: the table has no sector '${sector}'`, { rowLabel: sector });
  const closed = r.closure === 'household' && r.closedEffectiveDemand !== null;
  const p = ps.study.settings.paths;
  return structuralPaths(ps.pm, closed ? r.closedEffectiveDemand! : r.effectiveDemand, dest, {
    model: closed ? 'closed' : 'open', maxLength: p.maxLength, minShare: p.minShare, maxPaths: p.maxPaths,
  });
}

export function compareStudyScenarios(ps: PreparedStudy, scenarios: readonly Scenario[]): ScenarioComparison {
  return compareScenarios(scenarios.map((s) => runScenario(ps.pm, s, ps.models)));
}

/** Spending patterns read from the table's final-demand columns (each column's positive entries as shares). */
export function tablePatterns(t: IOTable): SpendingPattern[] {
  return [...t.householdConsumption, ...t.otherFinalDemand].flatMap((col) => {
    let sum = 0;
    for (let i = 0; i < t.n; i++) sum += Math.max(0, col.values[i]!);
    if (!(sum > 0)) return [];
    const shares = t.sectors.map((sector, i) => ({ sector, share: Math.max(0, col.values[i]!) / sum })).filter((x) => x.share > 0);
    return [{ name: `Like ${col.label}`, shares }];
  });
}
