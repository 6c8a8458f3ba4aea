/**
 * The study's results as plain JSON (the CLI's --json): the analysis (src/report analysisJson, plus the verdict in
 * words) and a scenario outcome. Arrays are in sector order; a value that is not defined is null, never NaN.
 *
 * A scenario gives `phases`, one object per phase in file order; the top-level `effects`, `totals`, `multipliers`,
 * `rounds` (and `paths`, `net`) stay for a scenario of one phase, as before phases existed. `taxes` and `fte` appear
 * only when the table has those rows.
 */
import { analysisJson, CAUTIONS, linkageClass, modelTypeOf, SCENARIO_CAUTIONS } from '../report/index.ts';
import { unitDemandRounds } from './rounds.ts';
import { VARIABLES, type EffectSplit, type OverTime, type ScenarioResult, type TotalsRecord } from '../scenario/index.ts';
import type { PreparedStudy } from './prepare.ts';
import type { PhaseOutcome, ScenarioOutcome } from './scenarios.ts';

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

/** Keys of the variables a result has: the four of old always (employment null without jobs), taxes and fte when present. */
function keysOf(r: ScenarioResult): typeof VARIABLES[number][] {
  return VARIABLES.filter((v) => (v !== 'taxes' && v !== 'fte') || r.effects[v] !== null);
}

function effectsJson(r: ScenarioResult): Record<string, unknown> {
  const effects: Record<string, unknown> = {};
  const totals: Record<string, unknown> = {};
  const multipliers: Record<string, unknown> = {};
  for (const v of keysOf(r)) {
    effects[v] = splitJson(r.effects[v]);
    totals[v] = r.totals[v];
    multipliers[v] = r.multipliers[v];
  }
  return {
    effects, totals, multipliers,
    ...(r.outside.length ? { outside: r.outside.map((o) => ({ label: o.label, kind: o.kind, direct: Object.fromEntries(keysOf(r).map((v) => [v, o.direct[v]])) })) } : {}),
  };
}

function totalsJson(t: TotalsRecord | null): Record<string, unknown> | null {
  if (!t) return null;
  return Object.fromEntries(Object.entries(t).filter(([, v]) => v !== undefined));
}

function overTimeJson(o: OverTime | null): Record<string, unknown> {
  if (!o) return {};
  return {
    cumulative: totalsJson(o.cumulative),
    ...(o.presentValue ? { presentValue: totalsJson(o.presentValue), discountRate: o.rate, annuityFactor: o.annuityFactor } : {}),
  };
}

function roundsJson(p: PhaseOutcome): Record<string, unknown> {
  const rounds = p.rounds;
  return {
    output: rounds.roundTotals,
    income: rounds.roundIncome,
    coverage: rounds.coverage,
    ratio: rounds.ratio,
    reach: rounds.reach,
    normA: rounds.normA,
    remainder: rounds.remainder,
    remainderBound: rounds.remainderBound,
    perronRoot: rounds.perronRoot,
  };
}

function pathsJson(p: PhaseOutcome): Record<string, unknown> {
  const paths = p.paths;
  if (!paths) return {};
  return {
    paths: {
      destination: paths.destinationLabel, model: paths.model, destinationTotal: paths.destinationTotal,
      explained: paths.explained, explainedShare: paths.explainedShare, found: paths.found, truncated: paths.truncated,
      paths: paths.paths.map((x) => ({ sectors: x.labels, direct: x.direct, pathMultiplier: x.pathMultiplier, total: x.total, global: x.global, shock: x.shock, contribution: x.contribution, share: x.share })),
    },
  };
}

function phaseJson(p: PhaseOutcome): Record<string, unknown> {
  return {
    name: p.phase.name,
    timing: p.phase.timing,
    year: p.phase.year ?? null,
    years: p.phase.years ?? null,
    model: modelTypeOf(p.result),
    ...effectsJson(p.result),
    ...overTimeJson(p.overTime),
    ...(p.net ? { net: { ...effectsJson(p.net), ...overTimeJson(p.netOverTime) } } : {}),
    rounds: roundsJson(p),
    ...pathsJson(p),
    notes: p.result.notes,
  };
}

export function scenarioJson(ps: PreparedStudy, o: ScenarioOutcome): Record<string, unknown> {
  const first = o.phases[0]!;
  const r = first.result;
  const single = o.phases.length === 1;
  return {
    scenario: o.scenario.name,
    table: ps.study.table.name,
    moneyUnit: r.moneyUnit,
    model: modelTypeOf(r, o.model),
    closure: r.closure,
    sectors: r.sectors,
    lines: o.scenario.phases.flatMap((ph) => ph.lines.map((l) => ({
      phase: ph.name, sector: l.sector, amount: l.amount, kind: l.kind, localShare: l.localShare,
      ...(l.prices !== undefined ? { prices: l.prices } : {}), ...(l.priceYear !== undefined ? { priceYear: l.priceYear } : {}),
      ...(l.displacement !== undefined ? { displacement: l.displacement } : {}), ...(l.deadweight !== undefined ? { deadweight: l.deadweight } : {}),
      ...(l.note !== undefined ? { note: l.note } : {}),
    }))),
    phases: o.phases.map(phaseJson),
    ...(o.byTiming.length ? {
      totalsByTiming: Object.fromEntries(o.byTiming.map((t) => [t.timing, {
        phases: t.phases, totals: totalsJson(t.gross), ...(t.net ? { net: totalsJson(t.net) } : {}),
        ...(t.grossCumulative ? { cumulative: totalsJson(t.grossCumulative) } : {}),
      }])),
    } : {}),
    ...(single ? {
      ...effectsJson(r),
      ...overTimeJson(first.overTime),
      ...(first.net ? { net: { ...effectsJson(first.net), ...overTimeJson(first.netOverTime) } } : {}),
      rounds: roundsJson(first),
      ...pathsJson(first),
    } : {}),
    verdict: { ...ps.verdict },
    notes: [...new Set(o.phases.flatMap((p) => p.notes))],
    cautions: [...CAUTIONS, ...SCENARIO_CAUTIONS],
  };
}
