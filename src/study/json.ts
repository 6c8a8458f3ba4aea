/**
 * The study's results as plain JSON (the CLI's --json): the analysis (src/report analysisJson, plus the verdict in
 * words) and a scenario outcome. Arrays are in sector order; a value that is not defined is null, never NaN.
 */
import { analysisJson, CAUTIONS, linkageClass, modelTypeOf, SCENARIO_CAUTIONS } from '../report/index.ts';
import { unitDemandRounds } from './rounds.ts';
import { VARIABLES, type EffectSplit } from '../scenario/index.ts';
import type { PreparedStudy } from './prepare.ts';
import type { ScenarioOutcome } from './scenarios.ts';

const finite = (x: number | null) => (x === null || !Number.isFinite(x) ? null : x);
const arr = (v: Float64Array | null) => (v ? Array.from(v, (x) => finite(x)) : null);
const splitJson = (s: EffectSplit | null) => (s ? { direct: arr(s.direct), indirect: arr(s.indirect), induced: arr(s.induced), total: arr(s.total) } : null);

/**
 * The analysis JSON (its keys are a contract) plus what the screens show beside it: the verdict in words, each
 * sector's Rasmussen class, and the spending rounds of one unit of demand in every sector with the round by which
 * each share of the open-model total is reached.
 */
export function studyAnalysisJson(ps: PreparedStudy): Record<string, unknown> {
  const base = analysisJson(ps.analysis) as Record<string, unknown> & { linkages: Record<string, unknown> };
  const ur = unitDemandRounds(ps);
  return {
    ...base,
    linkages: { ...base.linkages, classes: ps.analysis.sectors.map((_, j) => linkageClass(ps.analysis, j)) },
    verdict: { ...ps.verdict },
    unitDemandRounds: ur.rounds
      ? { output: ur.rounds.roundTotals, coverage: ur.rounds.coverage, reach: ur.rounds.reach, perronRoot: ur.rounds.perronRoot }
      : { reason: ur.reason },
  };
}

export function scenarioJson(ps: PreparedStudy, o: ScenarioOutcome): Record<string, unknown> {
  const r = o.result;
  const effects: Record<string, unknown> = {};
  const totals: Record<string, unknown> = {};
  const multipliers: Record<string, unknown> = {};
  for (const v of VARIABLES) {
    effects[v] = splitJson(r.effects[v]);
    totals[v] = r.totals[v];
    multipliers[v] = r.multipliers[v];
  }
  const rounds = o.rounds;
  const paths = o.paths;
  return {
    scenario: r.scenario,
    table: ps.study.table.name,
    moneyUnit: r.moneyUnit,
    model: modelTypeOf(r),
    closure: r.closure,
    sectors: r.sectors,
    lines: o.scenario.lines.map((l) => ({ sector: l.sector, amount: l.amount, kind: l.kind, localShare: l.localShare, ...(l.note !== undefined ? { note: l.note } : {}) })),
    effects,
    totals,
    multipliers,
    rounds: {
      output: rounds.roundTotals,
      income: rounds.roundIncome,
      coverage: rounds.coverage,
      ratio: rounds.ratio,
      reach: rounds.reach,
      normA: rounds.normA,
      remainder: rounds.remainder,
      remainderBound: rounds.remainderBound,
      perronRoot: rounds.perronRoot,
    },
    ...(paths ? {
      paths: {
        destination: paths.destinationLabel, model: paths.model, destinationTotal: paths.destinationTotal,
        explained: paths.explained, explainedShare: paths.explainedShare, found: paths.found, truncated: paths.truncated,
        paths: paths.paths.map((p) => ({ sectors: p.labels, direct: p.direct, pathMultiplier: p.pathMultiplier, total: p.total, global: p.global, shock: p.shock, contribution: p.contribution, share: p.share })),
      },
    } : {}),
    verdict: { ...ps.verdict },
    notes: o.notes,
    cautions: [...CAUTIONS, ...SCENARIO_CAUTIONS],
  };
}
