/** One call for what a scenario screen or export needs: effects, spending rounds and (optionally) structural paths. */
import { type PreparedModel, perronRoot } from '../model/index.ts';
import { runScenario } from './effects.ts';
import { structuralPaths, type PathAnalysis, type PathOptions } from './paths.ts';
import { spendingRounds, type RoundsOptions, type RoundsResult } from './rounds.ts';
import type { Scenario, ScenarioResult } from './types.ts';

export interface ScenarioAnalysis {
  result: ScenarioResult;
  rounds: RoundsResult;
  /** Present when a destination sector was asked for. */
  paths: PathAnalysis | null;
}

export function analyseScenario(
  pm: PreparedModel,
  scenario: Scenario,
  opts: { rounds?: RoundsOptions; pathsTo?: number | null; paths?: PathOptions } = {},
): ScenarioAnalysis {
  const result = runScenario(pm, scenario);
  // The ratios of successive rounds tend to ρ(A); give it beside them (ρ(|A|) bounds it when flows are negative).
  const rho = opts.rounds?.perronRoot ?? perronRoot(Float64Array.from(pm.coef.A, Math.abs), pm.coef.n, { rightOnly: true }).root;
  const rounds = spendingRounds(pm, result.effectiveDemand, result.openOutput, { ...opts.rounds, perronRoot: rho });
  let paths: PathAnalysis | null = null;
  if (opts.pathsTo !== undefined && opts.pathsTo !== null) {
    const model = opts.paths?.model ?? 'open';
    let f = result.effectiveDemand;
    if (model === 'closed') {
      // The closed system has the household pole last; the scenario puts no exogenous demand there.
      f = new Float64Array(pm.coef.n + 1);
      f.set(closedEffectiveDemand(pm, result));
    }
    paths = structuralPaths(pm, f, opts.pathsTo, opts.paths);
  }
  return { result, rounds, paths };
}

/**
 * Effective demand for the closed model: the mixed closed solution implies its own demand at fixed sectors,
 * f̄ = (I − Ā)·x̄ at those sectors (households have none).
 */
function closedEffectiveDemand(pm: PreparedModel, r: ScenarioResult): Float64Array {
  const closed = pm.closed;
  if (!closed || !r.closedOutput) throw new Error('the table has no household closure');
  const m = closed.m;
  const xbar = new Float64Array(m);
  xbar.set(r.closedOutput);
  xbar[m - 1] = r.closedHouseholdIncome!;
  // Only fixed sectors take the residual; elsewhere the demand is the shock itself (no rounding noise as fake origins).
  const f = Float64Array.from(r.shock.df);
  for (const i of r.shock.fixed) {
    let s = xbar[i]!;
    for (let j = 0; j < m; j++) s -= closed.Abar[i * m + j]! * xbar[j]!;
    f[i] = s;
  }
  return f;
}
