/**
 * Scenario reports: impact by sector (direct / indirect / induced / total for output, value added, labour income and
 * employment), spending rounds, the scenario's implied multipliers, structural paths and scenario comparisons.
 * Each is a rectangular CSV with units in the header names plus an `.about.txt` sidecar (see document.ts).
 */
import type { Cell } from '../csv/index.ts';
import { reportFiles, type ReportFile, type ReportMeta } from './document.ts';
import type { PathAnalysis } from '../scenario/index.ts';
import { COVERAGE_TARGETS, type RoundsResult } from '../scenario/index.ts';
import type { ScenarioComparison } from '../scenario/index.ts';
import { VARIABLES, type EffectSplit, type Scenario, type ScenarioResult, type Variable } from '../scenario/index.ts';

/** Cautions that belong to demand-shock scenarios in particular, added to the general ones of cautions.ts. */
export const SCENARIO_CAUTIONS: readonly string[] = [
  'Scenario results assume unchanged prices and unchanged local shares: the part of spending bought inside the region is what the scenario lines say, and stays so as the effects spread.',
  'Induced effects depend on the household closure (how household income and consumption are modelled); they are shown separately so they can be left out.',
  'Results are gross: they are not net of activity the new spending displaces elsewhere in the region.',
  'For decisions, consult a qualified regional economist and local practice.',
];

/** What every scenario report needs besides the numbers. */
export interface ScenarioReportContext {
  tableName: string;
  sourceFile?: string;
  sourceHash?: string;
  /** ISO 8601 date-time of the run. */
  date: string;
}

export const VARIABLE_NAMES: Record<Variable, string> = {
  output: 'output',
  valueAdded: 'value added',
  income: 'labour income',
  employment: 'employment',
};

function unitOf(v: Variable, moneyUnit: string): string {
  return v === 'employment' ? 'jobs' : moneyUnit;
}

/** Exactly the model the scenario's numbers came from, with the reason when there are no induced effects. */
export function modelTypeOf(r: ScenarioResult): string {
  const base = r.closure === 'household'
    ? 'open (Type I) and household-closed (Type II) input-output model; induced effects from the household closure'
    : `open (Type I) input-output model; no induced effects (${r.multipliers.output.typeII.reason ?? 'no household closure'})`;
  return r.shock.fixed.length ? `${base}; mixed exogenous/endogenous for fixed-output lines` : base;
}

function meta(ctx: ScenarioReportContext, title: string, modelType: string, moneyUnit: string, notes: string[]): ReportMeta {
  return {
    title,
    tableName: ctx.tableName,
    ...(ctx.sourceFile !== undefined ? { sourceFile: ctx.sourceFile } : {}),
    ...(ctx.sourceHash !== undefined ? { sourceHash: ctx.sourceHash } : {}),
    modelType,
    date: ctx.date,
    moneyUnit,
    notes: [...notes, ...SCENARIO_CAUTIONS],
  };
}

function lineNotes(r: ScenarioResult): string[] {
  return [`Scenario: ${r.scenario}`, ...r.notes];
}

const PARTS = ['direct', 'indirect', 'induced', 'total'] as const;

/** Rows of the impact report: sector, then direct/indirect/induced/total per variable; a Total row last. */
export function impactRows(r: ScenarioResult): Cell[][] {
  const vars = VARIABLES.filter((v) => r.effects[v] !== null);
  const header: Cell[] = ['sector'];
  for (const v of vars) for (const p of PARTS) header.push(`${VARIABLE_NAMES[v]} ${p} (${unitOf(v, r.moneyUnit)})`);
  const rows: Cell[][] = [header];
  const n = r.sectors.length;
  const cell = (s: EffectSplit, p: (typeof PARTS)[number], i: number): Cell => {
    const vec = s[p];
    return vec ? vec[i]! : null;
  };
  for (let i = 0; i < n; i++) {
    const row: Cell[] = [r.sectors[i]!];
    for (const v of vars) for (const p of PARTS) row.push(cell(r.effects[v]!, p, i));
    rows.push(row);
  }
  const total: Cell[] = ['Total'];
  for (const v of vars) for (const p of PARTS) total.push(r.totals[v]![p]);
  rows.push(total);
  return rows;
}

export function impactReport(r: ScenarioResult, ctx: ScenarioReportContext, base: string): ReportFile[] {
  const notes = [
    ...lineNotes(r),
    'direct = the shock itself (final-demand change after local shares, or the fixed output) times each variable’s coefficient; indirect = open-model total − direct; induced = household-closed total − open-model total; total = household-closed total.',
  ];
  return reportFiles(base, meta(ctx, 'Scenario impact by sector', modelTypeOf(r), r.moneyUnit, notes), impactRows(r));
}

/**
 * Rows by round: round, output, labour income, share of the open-model total reached so far, ratio to the previous
 * round; then the sum of the listed rounds and the open-model total itself, each labelled as what it is.
 */
export function roundRows(rounds: RoundsResult, openTotal: { output: number; income: number }, moneyUnit: string): Cell[][] {
  const rows: Cell[][] = [[
    'round', `output (${moneyUnit})`, `labour income (${moneyUnit})`, 'share of the open-model total reached (0-1)', 'ratio to previous round',
  ]];
  rounds.rounds.forEach((_, k) => rows.push([k, rounds.roundTotals[k]!, rounds.roundIncome[k]!, rounds.coverage[k]!, rounds.ratio[k] ?? null]));
  const sumOf = (v: number[]) => v.reduce((a, b) => a + b, 0);
  rows.push(['Sum of the rounds listed', sumOf(rounds.roundTotals), sumOf(rounds.roundIncome), rounds.coverage.at(-1) ?? null, null]);
  rows.push(['Open-model total (all rounds)', openTotal.output, openTotal.income, 1, null]);
  return rows;
}

/** Rows by sector: sector, round 0 … round K, sum of the rounds listed, open-model total; a Total row last. */
export function roundSectorRows(rounds: RoundsResult, sectors: string[], openOutput: Float64Array, moneyUnit: string): Cell[][] {
  const K = rounds.rounds.length;
  const header: Cell[] = ['sector'];
  for (let k = 0; k < K; k++) header.push(`round ${k} output (${moneyUnit})`);
  header.push(`sum of the rounds listed (${moneyUnit})`, `open-model total (${moneyUnit})`);
  const rows: Cell[][] = [header];
  const colTotals = new Array<number>(K + 2).fill(0);
  sectors.forEach((s, i) => {
    const row: Cell[] = [s];
    let cum = 0;
    for (let k = 0; k < K; k++) {
      const v = rounds.rounds[k]![i]!;
      row.push(v);
      cum += v;
      colTotals[k] = colTotals[k]! + v;
    }
    row.push(cum, openOutput[i]!);
    colTotals[K] = colTotals[K]! + cum;
    colTotals[K + 1] = colTotals[K + 1]! + openOutput[i]!;
    rows.push(row);
  });
  rows.push(['Total', ...colTotals]);
  return rows;
}

/** "99 % by round 5": the one way rounds are counted (round 0 is the initial demand). */
export function reachText(rounds: RoundsResult, target: number): string {
  const r = rounds.reach.find((x) => x.target === target);
  const share = `${Number((target * 100).toFixed(1))} %`;
  return r?.round == null ? `${share} not reached in the ${rounds.rounds.length} rounds computed (rounds 0–${rounds.rounds.length - 1})` : `${share} by round ${r.round}`;
}

/** What round 0 is: the demand itself, or for fixed-output lines the final demand that produces the fixed output. */
export function roundZeroText(r: ScenarioResult): string {
  return r.shock.fixed.length
    ? `Round 0 is the initial demand: the final-demand lines after local shares plus, for the sectors whose output is fixed from outside (${r.shock.fixed.map((j) => r.sectors[j]).join(', ')}), the final demand that would produce that output in the open model; it therefore differs from the direct effect there.`
    : 'Round 0 is the initial demand: the final-demand lines after local shares.';
}

export function roundsNotes(r: ScenarioResult, rounds: RoundsResult): string[] {
  const lastRatio = rounds.ratio.at(-1);
  return [
    `Spending rounds: ${roundZeroText(r)} Round k+1 = A × round k. Their sum tends to the open-model (Type I) total.`,
    `Share of the open-model total reached: ${COVERAGE_TARGETS.map((t) => reachText(rounds, t)).join('; ')}.`,
    `Largest column sum of A (‖A‖₁) = ${rounds.normA}; the rounds not shown add at most ${rounds.remainderBound ?? 'n/a (‖A‖₁ ≥ 1)'} (absolute, summed over sectors); actually left: ${rounds.remainder}.`,
    `In the long run the ratio of successive rounds tends to the Perron root ρ(A)${rounds.perronRoot !== null ? ` = ${rounds.perronRoot}` : ''}; it says how fast late rounds shrink, not the first ones. Last ratio shown: ${lastRatio ?? 'n/a'}.`,
  ];
}

export function roundsReport(r: ScenarioResult, rounds: RoundsResult, ctx: ScenarioReportContext, base: string): ReportFile[] {
  const m = meta(ctx, 'Scenario spending rounds', 'open (Type I) input-output model, power series', r.moneyUnit, [...lineNotes(r), ...roundsNotes(r, rounds)]);
  const openTotal = { output: r.totals.output.direct + r.totals.output.indirect, income: r.totals.income.direct + r.totals.income.indirect };
  return [
    ...reportFiles(base, m, roundRows(rounds, openTotal, r.moneyUnit)),
    ...reportFiles(`${base}-by-sector`, { ...m, title: 'Scenario spending rounds by sector' }, roundSectorRows(rounds, r.sectors, r.openOutput, r.moneyUnit)),
  ];
}

/** Rows of the scenario's implied multipliers: one row per variable (the scenario has one multiplier per variable). */
export function scenarioMultiplierRows(r: ScenarioResult): Cell[][] {
  const rows: Cell[][] = [['variable', 'unit', 'direct', 'indirect', 'induced', 'total', 'Type I multiplier (ratio)', 'Type II multiplier (ratio)']];
  for (const v of VARIABLES) {
    const t = r.totals[v];
    const m = r.multipliers[v];
    if (!t || !m) continue;
    rows.push([VARIABLE_NAMES[v], unitOf(v, r.moneyUnit), t.direct, t.indirect, t.induced, t.total, m.typeI.value, m.typeII.value]);
  }
  return rows;
}

export function scenarioMultiplierReport(r: ScenarioResult, ctx: ScenarioReportContext, base: string): ReportFile[] {
  const reasons: string[] = [];
  for (const v of VARIABLES) {
    const m = r.multipliers[v];
    if (m?.typeI.reason) reasons.push(`${VARIABLE_NAMES[v]} Type I multiplier not available: ${m.typeI.reason}.`);
    if (m?.typeII.reason) reasons.push(`${VARIABLE_NAMES[v]} Type II multiplier not available: ${m.typeII.reason}.`);
  }
  const notes = [...lineNotes(r), 'Implied multipliers of this scenario: Type I = (direct + indirect) / direct, Type II = total / direct, summed over sectors.', ...reasons];
  return reportFiles(base, meta(ctx, 'Scenario multipliers', modelTypeOf(r), r.moneyUnit, notes), scenarioMultiplierRows(r));
}

export function pathRows(pa: PathAnalysis, moneyUnit: string): Cell[][] {
  const rows: Cell[][] = [[
    'rank', 'path', 'origin', 'arcs', 'direct influence (per unit)', 'path multiplier', 'total influence (per unit)', 'global influence (per unit)',
    `shock at origin (${moneyUnit})`, `contribution (${moneyUnit})`, 'share of destination change (0-1)',
  ]];
  pa.paths.forEach((p, k) => rows.push([
    k + 1, p.labels.join(' > '), p.labels[0]!, p.poles.length - 1, p.direct, p.pathMultiplier, p.total, p.global, p.shock, p.contribution, p.share,
  ]));
  rows.push(['Total', 'listed paths', null, null, null, null, null, null, null, pa.explained, pa.explainedShare]);
  return rows;
}

export function pathReport(r: ScenarioResult, pa: PathAnalysis, ctx: ScenarioReportContext, base: string): ReportFile[] {
  const notes = [
    ...lineNotes(r),
    `Structural path analysis (Defourny & Thorbecke 1984) to '${pa.destinationLabel}' in the ${pa.model} model: output change there ${pa.destinationTotal}; the ${pa.paths.length} listed paths of ${pa.found} found explain ${pa.explainedShare === null ? 'n/a' : `${(pa.explainedShare * 100).toFixed(2)} %`}.`,
    `Search bounds: at most ${pa.settings.maxLength} arcs; partial paths that can carry less than ${pa.settings.minShare} of the destination change not followed${pa.truncated ? `; the search stopped at ${pa.settings.maxVisits} steps, so some paths may be missing` : ''}.`,
  ];
  return reportFiles(base, meta(ctx, `Structural paths to ${pa.destinationLabel}`, `${pa.model} input-output model`, r.moneyUnit, notes), pathRows(pa, r.moneyUnit));
}

/** Side-by-side totals by sector per scenario, then each scenario's difference from the first. */
export function comparisonRows(c: ScenarioComparison, moneyUnit: string): Cell[][] {
  const vars = VARIABLES.filter((v) => c.total[v].every((t) => t !== null));
  const header: Cell[] = ['sector'];
  for (const v of vars) {
    c.scenarios.forEach((s) => header.push(`${s}: ${VARIABLE_NAMES[v]} total (${unitOf(v, moneyUnit)})`));
    c.scenarios.slice(1).forEach((s) => header.push(`${s} minus ${c.scenarios[0]}: ${VARIABLE_NAMES[v]} (${unitOf(v, moneyUnit)})`));
  }
  const rows: Cell[][] = [header];
  const n = c.sectors.length;
  for (let i = 0; i <= n; i++) {
    const row: Cell[] = [i < n ? c.sectors[i]! : 'Total'];
    for (const v of vars) {
      const pick = (vec: Float64Array) => (i < n ? vec[i]! : vec.reduce((a, b) => a + b, 0));
      c.total[v].forEach((t) => row.push(pick(t!)));
      c.difference[v].slice(1).forEach((d) => row.push(pick(d!)));
    }
    rows.push(row);
  }
  return rows;
}

export function comparisonReport(c: ScenarioComparison, moneyUnit: string, ctx: ScenarioReportContext, base: string): ReportFile[] {
  const notes = [`Scenarios compared: ${c.scenarios.join(', ')}; differences are from '${c.scenarios[0]}'.`];
  return reportFiles(base, meta(ctx, 'Scenario comparison', 'as in each scenario', moneyUnit, notes), comparisonRows(c, moneyUnit));
}

/** The scenario's own inputs: every line as typed, with what the model made of it. */
export function inputRows(sc: Scenario, r: ScenarioResult): Cell[][] {
  const rows: Cell[][] = [['line', 'sector', 'kind', 'amount (as typed)', 'unit', 'local share (0-1)', `enters the model as (${r.moneyUnit})`, 'spending pattern', 'note']];
  sc.lines.forEach((l, k) => {
    const unit = l.kind === 'jobs' ? 'jobs' : r.moneyUnit;
    const enters = l.kind === 'final-demand' ? `final demand ${l.amount * l.localShare}` : l.kind === 'output' ? `fixed output ${l.amount}` : 'fixed output implied by the jobs';
    rows.push([k + 1, l.sector, l.kind, l.amount, unit, l.kind === 'final-demand' ? l.localShare : null, enters, l.pattern ?? null, l.note ?? null]);
  });
  return rows;
}

export function inputsReport(sc: Scenario, r: ScenarioResult, ctx: ScenarioReportContext, base: string): ReportFile[] {
  const notes = [
    `Scenario: ${sc.name}${sc.description ? ` — ${sc.description}` : ''}`,
    'Final-demand lines enter as amount × local share (the part bought inside the region); output and jobs lines fix the sector\'s output from outside (mixed model); several lines on one sector add up.',
    ...r.notes,
  ];
  return reportFiles(base, meta(ctx, 'Scenario inputs', modelTypeOf(r), r.moneyUnit, notes), inputRows(sc, r));
}
