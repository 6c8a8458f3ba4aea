/**
 * A scenario of a study, computed one way for every front end: phase by phase, the effects (with the models the study
 * allows), gross and — when lines carry displacement or deadweight shares — net; spending rounds with the Perron root
 * beside them; structural paths traced in the same model as the effects, so the paths to a sector add up to that
 * sector's total in the effects table; an annual phase's cumulative effect and present value; and sums across phases of
 * the same timing only (one-time and annual results are never added together).
 */
import { formatLocated, InputError } from '../diagnostics/index.ts';
import {
  compareScenarios, commutingText, mixesOfTable, overTime, runPhaseExpanded, spendingRounds, structuralPaths, sumTotals,
  yearOfMoneyUnit, type ComparisonEntry, type ExpandedLine, type OverTime, type PathAnalysis, type Phase, type RoundsResult, type Scenario,
  type ScenarioComparison, type ScenarioLine, type ScenarioResult, type ShockInputs, type Timing,
} from '../scenario/index.ts';
import type { TimingSum } from '../report/index.ts';
import type { PreparedStudy } from './prepare.ts';
import type { Study } from './study.ts';

export interface PhaseOutcome {
  phase: Phase;
  /** "Scenario" for a scenario of one phase, else "Scenario — Phase": the name its results and reports carry. */
  label: string;
  /** Gross results (every line at its full amount). */
  result: ScenarioResult;
  /** Net of displacement and deadweight, when some line of the phase has such a share; else null. */
  net: ScenarioResult | null;
  /** The lines as expanded: price conversion, mixes, margins, what enters the model (inputs report). */
  expanded: ExpandedLine[];
  rounds: RoundsResult;
  /** Paths to the study's destination sector (or the one asked for), or null when none was asked for. */
  paths: PathAnalysis | null;
  /** An annual phase with a number of years: cumulative effect and present value (gross and net); else null. */
  overTime: OverTime | null;
  netOverTime: OverTime | null;
  /** The result's notes, the study's input notes and the table's warnings. */
  notes: string[];
}

/**
 * Phases of one timing added up (labelled as such wherever shown); only when the scenario has two or more of them.
 * The same record the phase summary report takes.
 */
export type TimingTotal = TimingSum;

export interface ScenarioOutcome {
  scenario: Scenario;
  phases: PhaseOutcome[];
  /** Sums across phases of the same timing (two or more such phases), one-time first. */
  byTiming: TimingTotal[];
  /** What the study adds to the model line of every report (commuting, margins, price conversion). */
  model: string[];
  /** Notes on the study's inputs (defaults used, conversions), for every report. */
  inputNotes: string[];
}

/** A line still being typed: no sector, mix or activity chosen yet (labour-income lines have none by design). */
export function lineReady(l: ScenarioLine): boolean {
  return l.kind === 'labour-income' || l.sector !== '';
}

/**
 * Lines still being typed are left out of a scenario; every other line counts, a zero amount included (a zero output
 * or jobs line holds that sector's output unchanged in the mixed model).
 */
export function readyLines(s: Scenario): Scenario {
  return s.phases.every((p) => p.lines.every(lineReady)) ? s : { ...s, phases: s.phases.map((p) => ({ ...p, lines: p.lines.filter(lineReady) })) };
}

export interface OutcomeOptions {
  /** Destination of structural paths: a sector label, 'default' (the study's, else the most affected sector not shocked itself), or null for none. */
  paths?: string | 'default' | null;
}

/** The table's money year: the study's, else a single four-digit year in the table's corner cell. */
export function tableYearOf(study: Study): { year: number; source: string } | null {
  if (study.prices.tableYear !== null) return { year: study.prices.tableYear, source: 'given for the study' };
  const y = yearOfMoneyUnit(study.table.moneyUnit);
  return y === null ? null : { year: y, source: `from the table's corner cell '${study.table.moneyUnit}'` };
}

/** What a study's shock lines may refer to: its mixes and the table's, its activities, margins and prices. */
export function shockInputsOf(study: Study): ShockInputs {
  return {
    mixes: [...study.mixes, ...mixesOfTable(study.table)],
    activities: study.activities,
    margins: study.margins,
    priceIndex: study.prices.index,
    tableYear: tableYearOf(study),
    activityCommuting: study.commuting.overall,
  };
}

function hasAdditionality(p: Phase): boolean {
  return p.lines.some((l) => (l.displacement ?? 0) !== 0 || (l.deadweight ?? 0) !== 0);
}

/** The clauses the study adds to the model line of every report, and its input notes. */
export function studyModelNotes(ps: PreparedStudy, scenario?: Scenario): { model: string[]; notes: string[] } {
  const { study } = ps;
  const model: string[] = [];
  const notes: string[] = [];
  const c = commutingText(study.commuting);
  if (c) model.push(c);
  const lines = scenario ? scenario.phases.flatMap((p) => p.lines) : [];
  if (lines.some((l) => l.prices === 'purchaser') && study.margins) {
    const m = study.margins;
    model.push('purchaser-price lines split into producer value and trade and transport margins');
    notes.push(`Margins: retail earned by ${m.sectors.retail ?? '—'} (local share ${m.localShare.retail}), wholesale by ${m.sectors.wholesale ?? '—'} (local share ${m.localShare.wholesale}), transport by ${m.sectors.transport ?? '—'} (local share ${m.localShare.transport}); ${m.rows.length} sector${m.rows.length === 1 ? '' : 's'} with margin shares, every other sector's purchaser price is all producer value (no margins).`);
  }
  const ty = tableYearOf(study);
  if (lines.some((l) => l.priceYear !== undefined) && ty) {
    model.push(`amounts converted to ${ty.year} money`);
    notes.push(`Price conversion: amounts given in another year's money are converted to the table's money year ${ty.year} (${ty.source}) with the price index entered by the user: amount × index(${ty.year}) / index(price year); each line's factor is in the inputs report.`);
  }
  if (scenario?.phases.some(hasAdditionality)) {
    notes.push('Additionality: results are given gross (every line in full) and net (each line × (1 − displacement share) × (1 − deadweight share)); common practice, no source checked — the displaced activity is taken to be of the same kind as the line\'s, so it scales the line.');
  }
  if (lines.some((l) => l.kind === 'activity') && study.commuting.overall > 0) {
    notes.push(`Activities not in the table: ${Number((study.commuting.overall * 100).toPrecision(4))} % of their payroll is paid to non-residents (the study's overall commuting share).`);
  }
  if (scenario?.phases.some((p) => p.timing === 'annual')) {
    const r = study.settings.discountRate;
    notes.push(r === null ? 'Annual phases: no discount rate given, so no present values (default: none).' : `Annual phases: present values at a discount rate of ${r} per year (ordinary annuity).`);
  }
  return { model, notes };
}

/**
 * Run one phase's step; a refusal of one of its lines names the phase too when the scenario has several (in the app
 * lines are numbered within their phase, so "line 2" alone does not say which).
 */
function inPhase<T>(scenario: Scenario, phase: Phase, run: () => T): T {
  try {
    return run();
  } catch (e) {
    if (!(e instanceof InputError) || scenario.phases.length < 2 || e.location.phase !== undefined) throw e;
    throw new InputError(e.code, e.message, { ...e.location, phase: phase.name }, e.hint);
  }
}

function phaseOutcome(ps: PreparedStudy, scenario: Scenario, phase: Phase, inputs: ShockInputs, want: string | 'default' | null, tableNotes: string[], studyNotes: string[]): PhaseOutcome {
  const { pm, analysis, study } = ps;
  const label = scenario.phases.length > 1 ? `${scenario.name} — ${phase.name}` : scenario.name;
  const set = { name: label, lines: phase.lines };
  const { result, expanded } = inPhase(scenario, phase, () => runPhaseExpanded(pm, set, ps.models, inputs));
  const net = hasAdditionality(phase) ? inPhase(scenario, phase, () => runPhaseExpanded(pm, set, ps.models, inputs, { net: true })).result : null;
  const rounds = spendingRounds(pm, result.effectiveDemand, result.openOutput, { maxRounds: study.settings.rounds.maxRounds, perronRoot: analysis.viability.perronRoot });
  const dest = want === null ? null : want === 'default' ? (study.settings.paths.destination ?? study.table.sectors[defaultDestination(result)]!) : want;
  const paths = dest === null ? null : tracePaths(ps, result, dest);
  const rate = study.settings.discountRate;
  return {
    phase, label, result, net, expanded, rounds, paths,
    overTime: overTime(phase, result.totals, rate),
    netOverTime: net ? overTime(phase, net.totals, rate) : null,
    notes: [...result.notes, ...studyNotes, ...tableNotes],
  };
}

function timingTotals(phases: readonly PhaseOutcome[]): TimingTotal[] {
  const out: TimingTotal[] = [];
  for (const timing of ['once', 'annual'] as const) {
    const of = phases.filter((p) => p.phase.timing === timing);
    if (of.length < 2) continue;
    const allNet = of.some((p) => p.net);
    const cumulative = of.every((p) => p.overTime);
    out.push({
      timing,
      phases: of.map((p) => p.phase.name),
      gross: sumTotals(of.map((p) => p.result.totals)),
      net: allNet ? sumTotals(of.map((p) => (p.net ?? p.result).totals)) : null,
      grossCumulative: cumulative ? sumTotals(of.map((p) => p.overTime!.cumulative)) : null,
      netCumulative: cumulative && allNet ? sumTotals(of.map((p) => (p.netOverTime ?? p.overTime)!.cumulative)) : null,
    });
  }
  return out;
}

export function runStudyScenario(ps: PreparedStudy, scenario: Scenario, opts: OutcomeOptions = {}): ScenarioOutcome {
  const ready = readyLines(scenario);
  if (ready.phases.length === 0) throw new InputError('empty-scenario', `scenario '${scenario.name}' has no phases`);
  const names = new Set<string>();
  for (const p of ready.phases) {
    if (names.has(p.name)) throw new InputError('duplicate-name', `scenario '${scenario.name}' has two phases named '${p.name}'`);
    names.add(p.name);
  }
  const inputs = shockInputsOf(ps.study);
  const { model, notes } = studyModelNotes(ps, ready);
  const tableNotes = ps.analysis.warnings.map((w) => `Table: ${formatLocated(w)}`);
  const want = opts.paths ?? null;
  const phases = ready.phases.map((p) => phaseOutcome(ps, ready, p, inputs, want, tableNotes, notes));
  return { scenario: ready, phases, byTiming: timingTotals(phases), model, inputNotes: notes };
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

/**
 * Every phase of every scenario side by side; each compared with the first scenario's phase of the same name and
 * timing (for two one-phase scenarios of the same timing, with the first one's phase).
 */
export function compareStudyScenarios(ps: PreparedStudy, scenarios: readonly Scenario[]): ScenarioComparison {
  const inputs = shockInputsOf(ps.study);
  const entries: ComparisonEntry[] = [];
  const firstPhases: { name: string; timing: Timing; index: number }[] = [];
  scenarios.map(readyLines).forEach((s, si) => {
    for (const p of s.phases) {
      const label = s.phases.length > 1 ? `${s.name} — ${p.name}` : s.name;
      const result = inPhase(s, p, () => runPhaseExpanded(ps.pm, { name: label, lines: p.lines }, ps.models, inputs)).result;
      const index = entries.length;
      let baseline: number | null = null;
      if (si === 0) {
        firstPhases.push({ name: p.name, timing: p.timing, index });
        baseline = index;
      } else {
        const single = s.phases.length === 1 && firstPhases.length === 1;
        const match = single ? firstPhases.find((f) => f.timing === p.timing) : firstPhases.find((f) => f.name === p.name && f.timing === p.timing);
        baseline = match ? match.index : null;
      }
      entries.push({ label, timing: p.timing, result, baseline });
    }
  });
  return compareScenarios(entries);
}
