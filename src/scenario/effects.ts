/**
 * Scenario effects: direct (the shock itself), indirect (open-model total − direct), induced (household-closed total −
 * open total) and total (closed model), for output, value added, labour income and employment — the usual split of
 * Type I and Type II impact analysis (Miller & Blair 2009, ch. 6).
 */
import { InputError } from '../diagnostics/index.ts';
import { solveClosed, solveOpen, type PreparedModel } from '../model/index.ts';
import type { Availability } from '../model/index.ts';
import { resolveShock } from './lines.ts';
import { checkShock, shockNotes } from './shock-checks.ts';
import { solveMixed } from './mixed.ts';
import type { EffectSplit, EffectTotals, Ratio, Scenario, ScenarioMultiplier, ScenarioResult } from './types.ts';

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

function totalsOf(s: EffectSplit): EffectTotals {
  return { direct: sum(s.direct), indirect: sum(s.indirect), induced: s.induced ? sum(s.induced) : null, total: sum(s.total) };
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

export function runScenario(pm: PreparedModel, scenario: Scenario, models: ScenarioModels): ScenarioResult {
  if (models.open !== true) {
    throw new InputError('not-productive', `scenario effects are not defined: ${models.open}; check the table (its viability report says why)`);
  }
  const shock = resolveShock(pm, scenario);
  const useClosure = pm.closed !== null && models.closed === true;
  const { n, sectors, h, otherVA, e } = pm.coef;
  const direct = Float64Array.from(shock.df);
  shock.fixed.forEach((j, r) => { direct[j] = shock.fixedOutput[r]!; });

  const open = solveMixed((b) => solveOpen(pm, b), n, shock.df, shock.fixed, shock.fixedOutput);
  let closedOutput: Float64Array | null = null;
  let closedHouseholdIncome: number | null = null;
  let closedDemand: Float64Array | null = null;
  if (pm.closed && useClosure) {
    const m = pm.closed.m;
    const fbar = new Float64Array(m);
    fbar.set(shock.df);
    const closed = solveMixed((b) => solveClosed(pm, b), m, fbar, shock.fixed, shock.fixedOutput);
    closedOutput = closed.x.slice(0, n);
    closedHouseholdIncome = closed.x[n]!;
    closedDemand = closed.fEffective;
  }

  const va = new Float64Array(n);
  for (let j = 0; j < n; j++) va[j] = h[j]! + otherVA[j]!;
  const ones = new Float64Array(n).fill(1);
  const output = split(ones, direct, open.x, closedOutput);
  const valueAdded = split(va, direct, open.x, closedOutput);
  const income = split(h, direct, open.x, closedOutput);
  const employment = e ? split(e, direct, open.x, closedOutput) : null;

  const totals = {
    output: totalsOf(output),
    valueAdded: totalsOf(valueAdded),
    income: totalsOf(income),
    employment: employment ? totalsOf(employment) : null,
  };
  const notes: string[] = [];
  const noClosure = models.closed === true ? 'the table has no household income or household consumption' : models.closed;
  if (!useClosure) notes.push(`No induced effects: ${noClosure}. Totals are open-model (Type I) totals.`);
  if (!e) notes.push('The table has no employment row: employment effects are not available.');
  for (let r = 0; r < shock.fixed.length; r++) {
    const j = shock.fixed[r]!;
    notes.push(`Output of '${sectors[j]}' is fixed from outside at ${shortNumber(shock.fixedOutput[r]!)} ${pm.table.moneyUnit} (mixed exogenous/endogenous model); the other sectors respond to its purchases.`);
  }
  const result: ScenarioResult = {
    scenario: scenario.name,
    sectors: pm.coef.sectors,
    moneyUnit: pm.table.moneyUnit,
    closure: useClosure ? 'household' : 'none',
    shock,
    openOutput: open.x,
    closedOutput,
    closedHouseholdIncome,
    effectiveDemand: open.fEffective,
    closedEffectiveDemand: closedDemand,
    effects: { output, valueAdded, income, employment },
    totals,
    multipliers: {
      output: multiplierOf(totals.output, noClosure),
      valueAdded: multiplierOf(totals.valueAdded, noClosure),
      income: multiplierOf(totals.income, noClosure),
      employment: totals.employment ? multiplierOf(totals.employment, noClosure) : null,
    },
    notes,
  };
  result.notes.push(...shockNotes(checkShock(pm, scenario, result)));
  return result;
}
