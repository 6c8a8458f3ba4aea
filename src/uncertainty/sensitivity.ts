/**
 * One-at-a-time sensitivity of a scenario's headline totals to its assumptions: each assumption is moved to a low and
 * a high setting with every other assumption as typed, and the scenario recomputed in full (Saltelli et al., Global
 * Sensitivity Analysis: The Primer, Wiley 2008, ch. 1 — recalled from memory — for one-at-a-time designs and their
 * limits: they show each assumption's own swing, not interactions). Assumptions:
 *  - each local share (a final-demand line's, or a spending mix's for all its lines together) ± a stated step, within 0–1;
 *  - the household closure off and on (when the table's closed model is usable);
 *  - the FLQ δ over a range, for a table estimated with FLQ (the study re-runs the estimate);
 *  - for scenarios with purchaser-price lines: each margin's shares (retail, wholesale, transport, every sector's
 *    share of that margin together) × (1 ± a relative step), a share capped so a sector's margins never exceed its
 *    purchaser price, and each margin's local share ± the local-share step.
 * Items are sorted by the swing (high − low) of total output, largest first: the order of a tornado chart.
 */
import { decideModels, modelsForClosure, type Availability, type PreparedModel } from '../model/index.ts';
import { isInputError } from '../diagnostics/index.ts';
import { MARGIN_KINDS, NO_SHOCK_INPUTS, runPhase, VARIABLES, type LineSet, type MarginKind, type Margins, type ScenarioResult, type ShockInputs, type Variable } from '../scenario/index.ts';
import type { IOTable } from '../table/index.ts';
import { localShareGroups, modelOf, shareRange } from './draws.ts';

export type Totals = Record<Variable, number | null>;

export interface SensitivitySide {
  /** The setting in words, e.g. "0.7", "open model (Type I)", "δ = 0.1". */
  setting: string;
  /** Headline totals at this setting (null: not defined, or the model could not be used — see `why`). */
  totals: Totals;
  why?: string;
}

export interface SensitivityItem {
  kind: 'local-share' | 'closure' | 'flq-delta' | 'margin-share' | 'margin-local-share';
  /** The assumption in words. */
  assumption: string;
  /** The value as typed or estimated. */
  base: string;
  low: SensitivitySide;
  high: SensitivitySide;
  /** high − low per variable (null when either side is undefined). */
  swing: Totals;
}

export interface SensitivityResult {
  scenario: string;
  point: Totals;
  /** Step of the local shares. */
  step: number;
  /** Relative step of the margin shares (null when no margin was varied). */
  marginStep: number | null;
  items: SensitivityItem[];
  notes: string[];
}

export interface SensitivityOptions {
  /** Local shares move by ± this (default 0.1). */
  step?: number;
  /** Margin shares move by × (1 ± this) (default 0.2). */
  marginStep?: number;
  /** The models the point estimate may use (the analysis' availability) and the study's closure setting. */
  available: Availability;
  closure: 'households' | 'none';
  /** What the lines may refer to (the study's spending mixes, activities, margins, price index). */
  inputs?: ShockInputs;
  /** The study's commuting (resident share of each sector's labour income), for tables built at another δ. */
  residentShare?: Float64Array | null;
  /** The county table at another FLQ δ, with the range to try and the δ of the estimate. */
  delta?: { tableAt: (delta: number) => IOTable; range: [number, number]; estimate: number } | null;
}

export const DEFAULT_SHARE_STEP = 0.1;
export const DEFAULT_MARGIN_STEP = 0.2;

/** The margins with one kind's shares scaled by `factor`, each capped at what the sector's other margins leave of 1. */
function scaledMargins(m: Margins, kind: MarginKind, factor: number): Margins {
  return {
    ...m,
    rows: m.rows.map((r) => {
      let others = 0;
      for (const k of MARGIN_KINDS) if (k !== kind) others += r.shares[k];
      return { ...r, shares: { ...r.shares, [kind]: Math.min(Math.max(0, 1 - others), r.shares[kind] * factor) } };
    }),
  };
}

function withMarginLocalShare(m: Margins, kind: MarginKind, share: number): Margins {
  return { ...m, localShare: { ...m.localShare, [kind]: share } };
}

function totalsOf(r: ScenarioResult): Totals {
  const t = {} as Totals;
  for (const v of VARIABLES) {
    const x = r.totals[v]?.total ?? null;
    t[v] = x !== null && Number.isFinite(x) ? x : null;
  }
  return t;
}

const NONE: Totals = { output: null, valueAdded: null, income: null, employment: null, taxes: null, fte: null };

function swing(lo: Totals, hi: Totals): Totals {
  const s = {} as Totals;
  for (const v of VARIABLES) s[v] = lo[v] === null || hi[v] === null ? null : hi[v]! - lo[v]!;
  return s;
}

function side(setting: string, run: () => ScenarioResult): SensitivitySide {
  try {
    return { setting, totals: totalsOf(run()) };
  } catch (e) {
    if (isInputError(e)) return { setting, totals: NONE, why: e.message };
    throw e;
  }
}

const num = (x: number) => String(Math.round(x * 1e6) / 1e6);

/** The scenario with one share group's local shares set to `share` (lines keep their own share relative to the step). */
function withShares(s: LineSet, group: number[], delta: number): LineSet {
  const lines = s.lines.slice();
  for (const i of group) {
    const l = lines[i]!;
    const [lo, hi] = shareRange(l.localShare, Math.abs(delta));
    lines[i] = { ...l, localShare: delta < 0 ? lo : hi };
  }
  return { ...s, lines };
}

export function sensitivity(pm: PreparedModel, scenario: LineSet, opts: SensitivityOptions): SensitivityResult {
  const step = opts.step ?? DEFAULT_SHARE_STEP;
  const inputs = opts.inputs ?? NO_SHOCK_INPUTS;
  const runScenario = (m: PreparedModel, s: LineSet, models: Availability): ScenarioResult => runPhase(m, s, models, inputs);
  const models = modelsForClosure(opts.available, opts.closure);
  const point = totalsOf(runScenario(pm, scenario, models));
  const items: SensitivityItem[] = [];
  const notes: string[] = [];

  for (const group of localShareGroups(scenario)) {
    const first = scenario.lines[group[0]!]!;
    const what = first.mix !== undefined
      ? `local share of spending mix '${first.mix}' (${group.length} line${group.length === 1 ? '' : 's'})`
      : `local share of '${first.sector}' (line ${group[0]! + 1})`;
    const [lo, hi] = shareRange(first.localShare, step);
    const low = side(num(lo), () => runScenario(pm, withShares(scenario, group, -step), models));
    const high = side(num(hi), () => runScenario(pm, withShares(scenario, group, step), models));
    items.push({ kind: 'local-share', assumption: what, base: num(first.localShare), low, high, swing: swing(low.totals, high.totals) });
  }

  if (opts.available.closed === true) {
    const open: Availability = { open: opts.available.open, closed: 'the household closure is off for this setting' };
    const low = side('off: open model (Type I)', () => runScenario(pm, scenario, open));
    const high = side('on: household-closed model (Type II)', () => runScenario(pm, scenario, opts.available));
    items.push({ kind: 'closure', assumption: 'household closure', base: opts.closure === 'households' ? 'on' : 'off', low, high, swing: swing(low.totals, high.totals) });
  } else {
    notes.push(`The household closure is not varied: ${opts.available.closed}.`);
  }

  if (opts.delta) {
    const { tableAt, range, estimate } = opts.delta;
    const at = (d: number): SensitivitySide => {
      const setting = `δ = ${num(d)}`;
      const dpm = modelOf(tableAt(d), opts.residentShare ?? null);
      const decision = decideModels(dpm);
      if (decision.availability.open !== true) return { setting, totals: NONE, why: decision.availability.open };
      return side(setting, () => runScenario(dpm, scenario, modelsForClosure(decision.availability, opts.closure)));
    };
    const low = at(range[0]);
    const high = at(range[1]);
    items.push({ kind: 'flq-delta', assumption: 'FLQ δ of the county estimate', base: num(estimate), low, high, swing: swing(low.totals, high.totals) });
  }

  const margins = inputs.margins;
  const purchaser = scenario.lines.some((l) => l.prices === 'purchaser');
  const marginStep = opts.marginStep ?? DEFAULT_MARGIN_STEP;
  let variedMargins = false;
  if (purchaser && margins) {
    const withMargins = (m: Margins) => (): ScenarioResult => runPhase(pm, scenario, models, { ...inputs, margins: m });
    for (const kind of MARGIN_KINDS) {
      if (margins.sectors[kind] === null || !margins.rows.some((r) => r.shares[kind] > 0)) continue;
      variedMargins = true;
      const low = side(`× ${num(1 - marginStep)}`, withMargins(scaledMargins(margins, kind, 1 - marginStep)));
      const high = side(`× ${num(1 + marginStep)}`, withMargins(scaledMargins(margins, kind, 1 + marginStep)));
      items.push({ kind: 'margin-share', assumption: `${kind} margin shares (every sector's, together)`, base: 'as in the margins file', low, high, swing: swing(low.totals, high.totals) });
      const [lo, hi] = shareRange(margins.localShare[kind], step);
      const lowL = side(num(lo), withMargins(withMarginLocalShare(margins, kind, lo)));
      const highL = side(num(hi), withMargins(withMarginLocalShare(margins, kind, hi)));
      items.push({ kind: 'margin-local-share', assumption: `local share of the ${kind} margin`, base: num(margins.localShare[kind]), low: lowL, high: highL, swing: swing(lowL.totals, highL.totals) });
    }
  }

  const key = (i: SensitivityItem) => Math.abs(i.swing.output ?? 0);
  items.sort((a, b) => key(b) - key(a));
  notes.push(
    `One-at-a-time sensitivity: each assumption moved on its own to a low and a high setting (local shares ± ${step}, within 0–1), every other assumption as typed; sorted by the swing in total output. The swings do not add up and say nothing about assumptions moved together.`,
    variedMargins
      ? `Margins of purchaser-price lines: each margin's shares moved together by × (1 ± ${marginStep}) (a share capped where a sector's margins would exceed its purchaser price), and each margin's local share ± ${step}.`
      : purchaser ? 'The margins are not varied: no margin sector earns a share of these lines.' : 'No line is in purchaser prices, so no margin is varied.',
  );
  return { scenario: scenario.name, point, step, marginStep: variedMargins ? marginStep : null, items, notes };
}
