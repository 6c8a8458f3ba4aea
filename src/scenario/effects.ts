/**
 * Scenario effects: direct (the shock itself), indirect (open-model total − direct), induced (household-closed total −
 * open total) and total (closed model), for output, value added, labour income, employment, taxes and full-time
 * equivalents — the usual split of Type I and Type II impact analysis (Miller & Blair 2009, ch. 6).
 *
 * Two kinds of line put effects outside the sectors, on rows of their own (`outside`): an activity not in the table
 * (its own output, jobs, income… are direct; its local purchases are demand on the sectors whose whole effect is
 * indirect) and a labour-income line (the income is direct; household spending of it is induced: the closed model is
 * solved with that income as the households' exogenous entry, Miller & Blair 2009, §6.2 — recalled from memory — so
 * its open-model effect is zero).
 */
import { InputError } from '../diagnostics/index.ts';
import { solveClosedFrom, solveOpen, valueAddedPerUnit, type PreparedModel } from '../model/index.ts';
import type { Availability } from '../model/index.ts';
import { resolveShock, type ExpandedLine } from './lines.ts';
import { checkShock, shockNotes } from './shock-checks.ts';
import { solveMixed } from './mixed.ts';
import {
  NO_SHOCK_INPUTS, VARIABLES,
  type EffectRecord, type EffectSplit, type EffectTotals, type LineSet, type OutsideRow, type Ratio, type ScenarioMultiplier, type ScenarioResult,
  type ShockInputs, type Variable,
} from './types.ts';

function scale(c: Float64Array, x: Float64Array): Float64Array {
  const out = new Float64Array(x.length);
  for (let i = 0; i < x.length; i++) out[i] = c[i]! * x[i]!;
  return out;
}

function minus(a: Float64Array, b: Float64Array): Float64Array {
  const out = new Float64Array(a.length);
  for (let i = 0; i < a.length; i++) out[i] = a[i]! - b[i]!;
  return out;
}

/** For notes only (reports carry full precision): at most 2 decimals. */
function shortNumber(v: number): string {
  return String(Math.round(v * 100) / 100);
}

export function sum(v: Float64Array): number {
  let s = 0;
  for (let i = 0; i < v.length; i++) s += v[i]!;
  return s;
}

function split(coef: Float64Array, direct: Float64Array, open: Float64Array, closed: Float64Array | null): EffectSplit {
  const d = scale(coef, direct);
  const o = scale(coef, open);
  const c = closed ? scale(coef, closed) : null;
  return { direct: d, indirect: minus(o, d), induced: c ? minus(c, o) : null, total: c ?? o };
}

/** Sector sums, plus the direct effects of the rows outside the sectors (activities, household income paid directly). */
function totalsOf(s: EffectSplit, outsideDirect: number): EffectTotals {
  const direct = sum(s.direct) + outsideDirect;
  return { direct, indirect: sum(s.indirect), induced: s.induced ? sum(s.induced) : null, total: sum(s.total) + outsideDirect };
}

function ratio(num: number, den: number): Ratio {
  if (den === 0) return { value: null, reason: 'the direct effect is zero' };
  return { value: num / den };
}

function multiplierOf(t: EffectTotals, noClosure: string): ScenarioMultiplier {
  return {
    typeI: ratio(t.direct + t.indirect, t.direct),
    typeII: t.induced === null ? { value: null, reason: noClosure } : ratio(t.total, t.direct),
  };
}

/**
 * Which models a scenario may use: the open model when the table is productive, the household-closed one when the
 * closed model is productive and the caller wants it. Decided once per table by the analysis (`Analysis.availability`)
 * and the study's closure setting, never here, so a scenario can never use a model the analysis rejected.
 */
export type ScenarioModels = Availability;

export interface PhaseRunOptions {
  /** Net of displacement and deadweight (each line's components × (1 − displacement)(1 − deadweight)). */
  net?: boolean;
}

function outsideSum(rows: readonly OutsideRow[], v: Variable): number {
  let s = 0;
  for (const r of rows) s += r.direct[v] ?? 0;
  return s;
}

/** The first n entries of p and q are equal. */
function sameEntries(p: Float64Array, q: Float64Array, n: number): boolean {
  for (let i = 0; i < n; i++) if (!Object.is(p[i], q[i])) return false;
  return true;
}

/** The effects of one phase's lines. `inputs` holds what the lines may refer to (mixes, activities, margins, prices). */
export function runPhase(pm: PreparedModel, set: LineSet, models: ScenarioModels, inputs: ShockInputs = NO_SHOCK_INPUTS, opts: PhaseRunOptions = {}): ScenarioResult {
  return runPhaseExpanded(pm, set, models, inputs, opts).result;
}

/** runPhase, also giving each line as expanded (price conversion, margins, components) for the inputs report. */
export function runPhaseExpanded(pm: PreparedModel, set: LineSet, models: ScenarioModels, inputs: ShockInputs = NO_SHOCK_INPUTS, opts: PhaseRunOptions = {}): { result: ScenarioResult; expanded: ExpandedLine[] } {
  if (models.open !== true) {
    throw new InputError('not-productive', `scenario effects are not defined: ${models.open}; check the table (its viability report says why)`);
  }
  const useClosure = pm.closed !== null && models.closed === true;
  const noClosure = models.closed === true ? 'the table has no household income or household consumption' : models.closed;
  const { shock, expanded } = resolveShock(pm, set.name, set.lines, { inputs, closure: useClosure ? true : noClosure, ...(opts.net ? { net: true } : {}) });
  const { n, sectors, h, e, taxes, fte } = pm.coef;
  const direct = Float64Array.from(shock.df);
  shock.fixed.forEach((j, r) => { direct[j] = shock.fixedOutput[r]!; });
  const demand = Float64Array.from(shock.df);
  for (let i = 0; i < n; i++) demand[i] = demand[i]! + shock.dfIndirect[i]!;

  // The closed solves below make the same open solves, in the same order (the demand, then a unit vector per fixed
  // sector): each reuses the open one when its right-hand side is the same.
  const openSolves: { b: Float64Array; x: Float64Array }[] = [];
  const open = solveMixed((b) => { const x = solveOpen(pm, b); openSolves.push({ b, x }); return x; }, n, demand, shock.fixed, shock.fixedOutput);
  let closedOutput: Float64Array | null = null;
  let closedHouseholdIncome: number | null = null;
  let closedDemand: Float64Array | null = null;
  if (pm.closed && useClosure) {
    const m = pm.closed.m;
    const fbar = new Float64Array(m);
    fbar.set(demand);
    fbar[n] = shock.householdIncome;
    let call = 0;
    const closed = solveMixed((b) => {
      const known = openSolves[call++];
      return solveClosedFrom(pm, b, known && sameEntries(known.b, b, n) ? known.x : null);
    }, m, fbar, shock.fixed, shock.fixedOutput);
    closedOutput = closed.x.slice(0, n);
    closedHouseholdIncome = closed.x[n]!;
    closedDemand = closed.fEffective;
  }

  const ones = new Float64Array(n).fill(1);
  const effects: EffectRecord<EffectSplit> = {
    output: split(ones, direct, open.x, closedOutput),
    valueAdded: split(valueAddedPerUnit(pm.coef), direct, open.x, closedOutput),
    income: split(h, direct, open.x, closedOutput),
    employment: e ? split(e, direct, open.x, closedOutput) : null,
    taxes: taxes ? split(taxes, direct, open.x, closedOutput) : null,
    fte: fte ? split(fte, direct, open.x, closedOutput) : null,
  };
  const totals = {} as EffectRecord<EffectTotals>;
  const multipliers = {} as EffectRecord<ScenarioMultiplier>;
  for (const v of VARIABLES) {
    const s = effects[v];
    const t = s ? totalsOf(s, outsideSum(shock.outside, v)) : null;
    (totals as Record<Variable, EffectTotals | null>)[v] = t;
    (multipliers as Record<Variable, ScenarioMultiplier | null>)[v] = t ? multiplierOf(t, noClosure) : null;
  }
  const notes: string[] = [];
  if (!useClosure) notes.push(`No induced effects: ${noClosure}. Totals are open-model (Type I) totals.`);
  if (!e) notes.push('The table has no employment row: employment effects are not available.');
  for (let r = 0; r < shock.fixed.length; r++) {
    const j = shock.fixed[r]!;
    notes.push(`Output of '${sectors[j]}' is fixed from outside at ${shortNumber(shock.fixedOutput[r]!)} ${pm.table.moneyUnit} (mixed exogenous/endogenous model); the other sectors respond to its purchases.`);
  }
  for (const o of shock.outside) {
    notes.push(o.kind === 'activity'
      ? `'${o.label}' is an activity not in the table: its own output, jobs and income are direct effects on a row of their own; its local purchases are indirect effects on the sectors it buys from${useClosure ? ', its payroll re-spent by resident households induced ones' : ''}.`
      : `Household income of ${shortNumber(o.direct.income ?? 0)} ${pm.table.moneyUnit} is paid directly (labour-income lines): a direct effect on a row of its own, with no direct output, jobs, value added or taxes and no indirect effects; its re-spending by households is induced.`);
  }
  const result: ScenarioResult = {
    scenario: set.name,
    sectors: pm.coef.sectors,
    moneyUnit: pm.table.moneyUnit,
    closure: useClosure ? 'household' : 'none',
    shock,
    openOutput: open.x,
    closedOutput,
    closedHouseholdIncome,
    effectiveDemand: open.fEffective,
    closedEffectiveDemand: closedDemand,
    effects,
    totals,
    multipliers,
    outside: shock.outside,
    notes,
  };
  result.notes.push(...shockNotes(checkShock(pm, set, result)));
  return { result, expanded };
}
