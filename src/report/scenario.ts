/**
 * Scenario reports: impact by sector (direct / indirect / induced / total for output, value added, labour income,
 * employment, taxes and full-time equivalents), spending rounds, the scenario's implied multipliers, structural paths,
 * the scenario's inputs, its phase summary and scenario comparisons. Each is a rectangular CSV with units in the
 * header names plus an `.about.txt` sidecar (see document.ts).
 */
import type { Cell } from '../csv/index.ts';
import { reportFiles, type ReportFile, type ReportMeta, type SourceOrigin } from './document.ts';
import type { ExpandedLine, OverTime, PathAnalysis, Phase, Timing, TotalsRecord } from '../scenario/index.ts';
import { COVERAGE_TARGETS, type RoundsResult } from '../scenario/index.ts';
import type { ScenarioComparison } from '../scenario/index.ts';
import { VARIABLES, type EffectSplit, type ScenarioResult, type Variable } from '../scenario/index.ts';

/** Cautions that belong to demand-shock scenarios in particular, added to the general ones of cautions.ts. */
export const SCENARIO_CAUTIONS: readonly string[] = [
  'Scenario results assume unchanged prices and unchanged local shares: the part of spending bought inside the region is what the scenario lines say, and stays so as the effects spread.',
  'Induced effects depend on the household closure (how household income and consumption are modelled); they are shown separately so they can be left out.',
  'Results are gross unless labelled net: gross results are not net of activity the new spending displaces elsewhere in the region or of what would have happened anyway; net results deduct the displacement and deadweight shares the lines give.',
  'One-time (e.g. construction) and annual (e.g. operations) effects are never added together: an annual phase\'s effects are one year\'s.',
  'For decisions, consult a qualified regional economist and local practice.',
];

/** What every scenario report needs besides the numbers. */
export interface ScenarioReportContext {
  tableName: string;
  sourceFile?: string;
  sourceHash?: string;
  sourceOrigins?: SourceOrigin[];
  /** ISO 8601 date-time of the run. */
  date: string;
  /** What the study adds to the model line (commuting, margins, price conversion), one clause each. */
  model?: string[];
  /** The study's notes on its inputs (defaults used, conversions), for the sidecars. */
  notes?: string[];
}

export const VARIABLE_NAMES: Record<Variable, string> = {
  output: 'output',
  valueAdded: 'value added',
  income: 'labour income',
  employment: 'employment',
  taxes: 'taxes less subsidies',
  fte: 'full-time equivalents',
};

export function unitOf(v: Variable, moneyUnit: string): string {
  return v === 'employment' ? 'jobs' : v === 'fte' ? 'FTE' : moneyUnit;
}

/** The unit of a cumulative effect: money, job-years or FTE-years. */
export function cumulativeUnitOf(v: Variable, moneyUnit: string): string {
  return v === 'employment' ? 'job-years' : v === 'fte' ? 'FTE-years' : moneyUnit;
}

/** The variables a result has (taxes and FTE only with the table's rows, jobs only with its employment row). */
export function variablesOf(r: ScenarioResult): Variable[] {
  return VARIABLES.filter((v) => r.effects[v] !== null);
}

/** Exactly the model the scenario's numbers came from, with the reason when there are no induced effects. */
export function modelTypeOf(r: ScenarioResult, extra: readonly string[] = []): string {
  const base = r.closure === 'household'
    ? 'open (Type I) and household-closed (Type II) input-output model; induced effects from the household closure'
    : `open (Type I) input-output model; no induced effects (${r.multipliers.output.typeII.reason ?? 'no household closure'})`;
  const parts = [base];
  if (r.shock.fixed.length) parts.push('mixed exogenous/endogenous for fixed-output lines');
  parts.push(...extra);
  return parts.join('; ');
}

function meta(ctx: ScenarioReportContext, title: string, modelType: string, moneyUnit: string, notes: string[]): ReportMeta {
  return {
    title,
    tableName: ctx.tableName,
    ...(ctx.sourceFile !== undefined ? { sourceFile: ctx.sourceFile } : {}),
    ...(ctx.sourceHash !== undefined ? { sourceHash: ctx.sourceHash } : {}),
    ...(ctx.sourceOrigins?.length ? { sourceOrigins: ctx.sourceOrigins } : {}),
    modelType,
    date: ctx.date,
    moneyUnit,
    notes: [...notes, ...(ctx.notes ?? []), ...SCENARIO_CAUTIONS],
  };
}

function modelOf(r: ScenarioResult, ctx: ScenarioReportContext): string {
  return modelTypeOf(r, ctx.model ?? []);
}

function lineNotes(r: ScenarioResult): string[] {
  return [`Scenario: ${r.scenario}`, ...r.notes];
}


const PARTS = ['direct', 'indirect', 'induced', 'total'] as const;

/**
 * Rows of the impact report: sector, then direct/indirect/induced/total per variable; then the rows outside the
 * table's sectors (an activity not in the table, household income paid directly), direct effects only; a Total row last.
 */
export function impactRows(r: ScenarioResult): Cell[][] {
  const vars = variablesOf(r);
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
  for (const o of r.outside) {
    const row: Cell[] = [o.kind === 'activity' ? `${o.label} (activity not in the table)` : o.label];
    for (const v of vars) {
      const d = o.direct[v] ?? 0;
      row.push(d, 0, r.closure === 'household' ? 0 : null, d);
    }
    rows.push(row);
  }
  const total: Cell[] = ['Total'];
  for (const v of vars) for (const p of PARTS) total.push(r.totals[v]![p]);
  rows.push(total);
  return rows;
}

export function impactReport(r: ScenarioResult, ctx: ScenarioReportContext, base: string, basis: 'gross' | 'net' = 'gross'): ReportFile[] {
  const notes = [
    ...lineNotes(r),
    'direct = the shock itself (final-demand change after local shares, or the fixed output) times each variable’s coefficient; indirect = open-model total − direct; induced = household-closed total − open-model total; total = household-closed total.',
    ...(r.outside.length ? ['Rows after the sectors are outside the table: an activity not in the table (its own output, jobs, income, value added and taxes) and household income paid directly by labour-income lines. They hold direct effects only; the effects they cause are in the sectors above, and the Total row includes them.'] : []),
    'Value added = labour income + other value added + taxes less subsidies (when the table has a taxes row): the national-accounts total.',
    ...(basis === 'net' ? ['Net of displacement and deadweight: each line counts (1 − displacement share) × (1 − deadweight share) of its amount.'] : []),
  ];
  const title = basis === 'net' ? 'Scenario impact by sector, net of displacement and deadweight' : 'Scenario impact by sector (gross)';
  return reportFiles(base, meta(ctx, title, modelOf(r, ctx), r.moneyUnit, notes), impactRows(r));
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
  for (const v of variablesOf(r)) {
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
  return reportFiles(base, meta(ctx, 'Scenario multipliers', modelOf(r, ctx), r.moneyUnit, notes), scenarioMultiplierRows(r));
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

/**
 * Side-by-side totals by sector per scenario (and phase), then each one's difference from its baseline — the first
 * scenario's phase of the same name and timing; none where there is no such phase (one-time and annual effects are
 * never compared or added).
 */
export function comparisonRows(c: ScenarioComparison, moneyUnit: string): Cell[][] {
  const vars = VARIABLES.filter((v) => c.total[v].every((t) => t !== null));
  const header: Cell[] = ['sector'];
  const timing = (k: number) => (c.timings[k] === 'annual' ? ', one year' : ', one-time');
  for (const v of vars) {
    c.scenarios.forEach((s, k) => header.push(`${s}${timing(k)}: ${VARIABLE_NAMES[v]} total (${unitOf(v, moneyUnit)})`));
    c.scenarios.forEach((s, k) => {
      const b = c.baselines[k] ?? null;
      if (b !== null && b !== k) header.push(`${s} minus ${c.scenarios[b]}: ${VARIABLE_NAMES[v]} (${unitOf(v, moneyUnit)})`);
    });
  }
  const rows: Cell[][] = [header];
  const n = c.sectors.length;
  for (let i = 0; i <= n; i++) {
    const row: Cell[] = [i < n ? c.sectors[i]! : 'Total of the sectors'];
    for (const v of vars) {
      const pick = (vec: Float64Array) => (i < n ? vec[i]! : vec.reduce((a, b) => a + b, 0));
      c.total[v].forEach((t) => row.push(pick(t!)));
      c.difference[v].forEach((d, k) => {
        const b = c.baselines[k] ?? null;
        if (b !== null && b !== k) row.push(d ? pick(d) : null);
      });
    }
    rows.push(row);
  }
  return rows;
}

export function comparisonReport(c: ScenarioComparison, moneyUnit: string, ctx: ScenarioReportContext, base: string): ReportFile[] {
  const notes = [
    `Compared: ${c.scenarios.join(', ')}; each difference is from the first scenario's phase of the same name and timing.`,
    'Totals by sector; rows outside the table\'s sectors (activities not in the table, household income paid directly) are in each scenario\'s impact report, not here.',
  ];
  return reportFiles(base, meta(ctx, 'Scenario comparison', 'as in each scenario', moneyUnit, notes), comparisonRows(c, moneyUnit));
}

/** One phase's lines as expanded, for the inputs report. */
export interface PhaseInputs {
  phase: Phase;
  expanded: ExpandedLine[];
}

/** "one-time, 2025" or "annual from 2026, 20 years". */
export function timingText(p: Pick<Phase, 'timing' | 'year' | 'years'>): string {
  if (p.timing === 'once') return `one-time${p.year !== undefined ? `, ${p.year}` : ''}`;
  return `annual${p.year !== undefined ? ` from ${p.year}` : ''}${p.years !== undefined ? `, ${p.years} years` : ''}`;
}

/** The scenario's own inputs: every line as typed, phase by phase, with what the model made of it. */
export function inputRows(phases: readonly PhaseInputs[], moneyUnit: string): Cell[][] {
  const rows: Cell[][] = [[
    'line', 'phase', 'timing', 'kind', 'sector, mix or activity', 'amount (as typed)', 'unit', 'prices', 'price year', 'price factor (to the table\'s money year)',
    `amount in the table's money year (${moneyUnit})`, 'local share (0-1)', 'displacement share (0-1)', 'deadweight share (0-1)', 'net share (0-1)',
    `enters the model as (${moneyUnit})`, 'spending mix', 'note',
  ]];
  let k = 0;
  for (const { phase, expanded } of phases) {
    for (const x of expanded) {
      const l = x.line;
      const demand = l.kind === 'final-demand' || l.kind === 'mix';
      rows.push([
        ++k, phase.name, timingText(phase), l.kind, l.sector === '' ? null : l.sector, l.amount, l.kind === 'jobs' ? 'jobs' : moneyUnit,
        demand ? (l.prices ?? 'producer') : null, l.priceYear ?? null, x.priceFactor, l.kind === 'jobs' ? null : x.amount,
        demand ? l.localShare : null, l.displacement ?? 0, l.deadweight ?? 0, x.netFactor, x.enters, l.mix ?? null, l.note ?? null,
      ]);
    }
  }
  return rows;
}

export function inputsReport(name: string, description: string | undefined, phases: readonly PhaseInputs[], first: ScenarioResult, ctx: ScenarioReportContext, base: string): ReportFile[] {
  const notes = [
    `Scenario: ${name}${description ? ` — ${description}` : ''}`,
    `Phases: ${phases.map((p) => `${p.phase.name} (${timingText(p.phase)})`).join('; ')}.`,
    'Each line: its amount is converted to the table\'s money year (price year, with the price index), spread by its spending mix, split into producer value and margins (purchaser prices), and enters as demand after local shares; output and jobs lines fix the sector\'s output from outside (mixed model); labour-income lines pay household income; activity lines add an activity not in the table. Several lines on one sector add up. Net results count each line × its net share, (1 − displacement)(1 − deadweight).',
    ...first.notes,
  ];
  return reportFiles(base, meta(ctx, 'Scenario inputs', modelOf(first, ctx), first.moneyUnit, notes), inputRows(phases, first.moneyUnit));
}

/** One phase's results for the phase summary. */
export interface PhaseSummary {
  phase: Phase;
  gross: ScenarioResult;
  net: ScenarioResult | null;
  grossOverTime: OverTime | null;
  netOverTime: OverTime | null;
}

/** Phases of one timing added up (only ever within one timing), labelled as such. */
export interface TimingSum {
  timing: Timing;
  phases: string[];
  gross: TotalsRecord;
  net: TotalsRecord | null;
  /** Sum of the phases' cumulative effects, when every one has a number of years. */
  grossCumulative: TotalsRecord | null;
  netCumulative: TotalsRecord | null;
}

/**
 * The phase summary: per phase, basis (gross, net) and variable, the totals split direct/indirect/induced/total, the
 * cumulative total over an annual phase's years and its present value; then sums across phases of the same timing,
 * labelled as such. One-time and annual results are never added together.
 */
export function phaseSummaryRows(phases: readonly PhaseSummary[], sums: readonly TimingSum[], moneyUnit: string): Cell[][] {
  const rows: Cell[][] = [[
    'phase', 'timing', 'year', 'years', 'basis', 'variable', 'unit', 'direct', 'indirect', 'induced', 'total',
    'cumulative total over the years (years × one year)', 'unit of the cumulative total', 'present value of the total (money only)', 'discount rate',
  ]];
  for (const p of phases) {
    const bases: ['gross' | 'net', ScenarioResult, OverTime | null][] = [['gross', p.gross, p.grossOverTime]];
    if (p.net) bases.push(['net', p.net, p.netOverTime]);
    for (const [basis, r, ot] of bases) {
      for (const v of variablesOf(r)) {
        const t = r.totals[v]!;
        const cum = ot?.cumulative[v] ?? null;
        const pv = ot?.presentValue?.[v] ?? null;
        rows.push([
          p.phase.name, p.phase.timing === 'once' ? 'one-time' : 'annual (one year\'s effects)', p.phase.year ?? null, p.phase.years ?? null, basis,
          VARIABLE_NAMES[v], unitOf(v, moneyUnit), t.direct, t.indirect, t.induced, t.total,
          cum ? cum.total : null, cum ? cumulativeUnitOf(v, moneyUnit) : null, pv ? pv.total : null, pv ? ot!.rate : null,
        ]);
      }
    }
  }
  for (const s of sums) {
    const label = s.timing === 'once' ? `All one-time phases (${s.phases.join(', ')}), added` : `All annual phases (${s.phases.join(', ')}), one year of each, added`;
    const bases: ['gross' | 'net', TotalsRecord, TotalsRecord | null][] = [['gross', s.gross, s.grossCumulative]];
    if (s.net) bases.push(['net', s.net, s.netCumulative]);
    for (const [basis, rec, cum] of bases) {
      for (const v of VARIABLES) {
        const t = rec[v];
        if (!t) continue;
        const c = cum?.[v] ?? null;
        rows.push([
          label, s.timing === 'once' ? 'one-time' : 'annual (one year\'s effects)', null, null, basis, VARIABLE_NAMES[v], unitOf(v, moneyUnit),
          t.direct, t.indirect, t.induced, t.total, c ? c.total : null, c ? cumulativeUnitOf(v, moneyUnit) : null, null, null,
        ]);
      }
    }
  }
  return rows;
}

export function phaseSummaryReport(name: string, phases: readonly PhaseSummary[], sums: readonly TimingSum[], ctx: ScenarioReportContext, base: string): ReportFile[] {
  const first = phases[0]!.gross;
  const rate = phases.find((p) => p.grossOverTime?.rate != null)?.grossOverTime?.rate ?? null;
  const notes = [
    `Scenario: ${name}; ${phases.length} phase${phases.length === 1 ? '' : 's'}.`,
    'One-time and annual effects are never added together. An annual phase\'s effects are one year\'s; its cumulative total is years × one year (undiscounted; jobs become job-years).',
    rate !== null
      ? `Present value (money only): Σ_{t=1..years} one year / (1 + ${rate})^t, an ordinary annuity (each year counted at its end, discounted to the start of the first year).`
      : 'No discount rate was given: no present values.',
    ...(sums.length ? ['Rows "All … phases" add phases of the same timing only, and say so.'] : []),
    ...(phases.some((p) => p.net) ? ['Net rows deduct each line\'s displacement and deadweight shares; gross rows do not.'] : []),
  ];
  return reportFiles(base, meta(ctx, 'Scenario phases', modelOf(first, ctx), first.moneyUnit, notes), phaseSummaryRows(phases, sums, first.moneyUnit));
}
