/**
 * Scenario effects: direct (the shock itself), indirect (open-model total − direct), induced (household-closed total −
 * open total) and total (closed model), for output, value added, labour income and employment — the usual split of
 * Type I and Type II impact analysis (Miller & Blair 2009, ch. 6).
 */
import { InputError } from '../diagnostics/index.ts';
import { conditionEstimate1 } from '../linalg/index.ts';
import { closedModelDecision, solveClosed, solveOpen, type PreparedModel } from '../model/index.ts';
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

function multiplierOf(t: EffectTotals): ScenarioMultiplier {
  return {
    typeI: ratio(t.direct + t.indirect, t.direct),
    typeII: t.induced === null ? { value: null, reason: 'the table has no household closure' } : ratio(t.total, t.direct),
  };
}

/**
 * For A ≥ 0, ρ(A) < 1 exactly when y = (I − A)⁻¹·1 is positive: I − A is a Z-matrix, and a Z-matrix is a nonsingular
 * M-matrix iff some x > 0 has (I − A)x > 0 (Berman & Plemmons, Nonnegative Matrices in the Mathematical Sciences,
 * 1994, ch. 6; recalled from memory). One solve with the factorisation at hand. Null when A has negative entries.
 */
function openProductive(pm: PreparedModel): boolean | null {
  const { A, n } = pm.coef;
  for (let k = 0; k < A.length; k++) if (A[k]! < 0) return null;
  const y = solveOpen(pm, new Float64Array(n).fill(1));
  for (let i = 0; i < n; i++) if (!(y[i]! > 0)) return false;
  return true;
}

/** The analysis's closed-model decision for this prepared table (model/closed-model.ts), made once per table. */
function closedUsable(pm: PreparedModel): boolean {
  return closedModelDecision(pm).usable;
}

/** Above this 1-norm condition estimate of I − A the results may have lost most of their digits (as the analysis warns). */
const CONDITION_LIMIT = 1e12;

// One estimate per prepared table: it costs several solves, and a planner runs many scenarios on one table.
const conditionCache = new WeakMap<PreparedModel, number>();

function conditionOfOpen(pm: PreparedModel): number {
  const cached = conditionCache.get(pm);
  if (cached !== undefined) return cached;
  const { A, n } = pm.coef;
  let norm = 0;
  for (let j = 0; j < n; j++) {
    let col = 0;
    for (let i = 0; i < n; i++) col += Math.abs((i === j ? 1 : 0) - A[i * n + j]!);
    if (col > norm) norm = col;
  }
  const estimate = conditionEstimate1(pm.openLU, norm);
  conditionCache.set(pm, estimate);
  return estimate;
}

export function runScenario(pm: PreparedModel, scenario: Scenario): ScenarioResult {
  const shock = resolveShock(pm, scenario);
  // The UI and projects call this directly, not only the CLI: a singular or unproductive table is a refusal,
  // not a solver exception or a set of meaningless (negative) effects.
  if (pm.openLU.singular) {
    throw new InputError('singular', 'I − A is singular, so the table cannot carry a demand shock (check that every sector has inputs from outside the table, i.e. value added or imports)');
  }
  if (openProductive(pm) === false) {
    throw new InputError('not-productive', 'the table is not productive (Perron root of A at least 1: the sectors together need more inputs than they produce), so a demand shock has no meaningful effects; see the viability test');
  }
  const useClosure = pm.closed !== null && closedUsable(pm);
  const { n, sectors, h, otherVA, e } = pm.coef;
  const direct = Float64Array.from(shock.df);
  shock.fixed.forEach((j, r) => { direct[j] = shock.fixedOutput[r]!; });

  const open = solveMixed((b) => solveOpen(pm, b), n, shock.df, shock.fixed, shock.fixedOutput);
  let closedOutput: Float64Array | null = null;
  let closedHouseholdIncome: number | null = null;
  if (pm.closed && useClosure) {
    const m = pm.closed.m;
    const fbar = new Float64Array(m);
    fbar.set(shock.df);
    const closed = solveMixed((b) => solveClosed(pm, b), m, fbar, shock.fixed, shock.fixedOutput);
    closedOutput = closed.x.slice(0, n);
    closedHouseholdIncome = closed.x[n]!;
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
  if (!pm.closed) notes.push('The table has no household income or household consumption, so there is no Type II model: induced effects are not available and totals are open-model (Type I) totals.');
  else if (!useClosure) notes.push(`There is no Type II model: ${closedModelDecision(pm).reason}; induced effects are not available and totals are open-model (Type I) totals.`);
  else if (closedModelDecision(pm).accuracyNote) notes.push(`${closedModelDecision(pm).accuracyNote}.`);
  if (!e) notes.push('The table has no employment row: employment effects are not available.');
  const condition = conditionOfOpen(pm);
  if (!(condition <= CONDITION_LIMIT)) {
    notes.push(`I − A is ill-conditioned (condition estimate ${Number.isFinite(condition) ? condition.toExponential(2) : 'beyond range'}, limit ${CONDITION_LIMIT.toExponential(0)}): the effects may have lost most of their digits.`);
  }
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
    effects: { output, valueAdded, income, employment },
    totals,
    multipliers: {
      output: multiplierOf(totals.output),
      valueAdded: multiplierOf(totals.valueAdded),
      income: multiplierOf(totals.income),
      employment: totals.employment ? multiplierOf(totals.employment) : null,
    },
    notes,
  };
  result.notes.push(...shockNotes(checkShock(pm, scenario, result)));
  return result;
}
