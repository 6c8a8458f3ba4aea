/**
 * Scenario lines → the shock the solvers see, with every refusal located (file line, field, sector label).
 *
 * Each line is expanded into components, in this order (the same for every front end, listed in the inputs report):
 * 1. price year: the amount is converted to the table's money year, amount × index(table year) / index(price year);
 * 2. mix: the amount is spread over the mix's sectors by its shares;
 * 3. purchaser prices: each sector's amount is split into the producer value (to the sector, at the line's local
 *    share) and the retail, wholesale and transport margins (to the sectors earning them, at the margins' local
 *    shares), so the parts add up to the purchaser amount (Miller & Blair 2009, §4.3 on the valuation of transactions
 *    and margins — recalled from memory; the split itself is common practice);
 * 4. local share: only the part supplied inside the region enters as demand;
 * 5. additionality (net results only): every component × (1 − displacement) × (1 − deadweight).
 */
import { InputError, type Location } from '../diagnostics/index.ts';
import type { PreparedModel } from '../model/index.ts';
import { fixedOutputOf, refuseNonFiniteSum } from './shock-checks.ts';
import {
  MARGIN_KINDS, type Activity, type MarginKind, type OutsideRow, type ResolvedShock, type ScenarioLine, type ShockInputs,
  type SpendingMix, type Variable, LINE_KINDS,
} from './types.ts';

/** A line's location, naming one of its fields when the line came from a file that has that column. */
export function lineWhere(line: ScenarioLine | undefined, field?: string, label?: string): Location {
  const loc: Location = {};
  const o = line?.origin;
  if (o?.file !== undefined) loc.file = o.file;
  if (o?.line !== undefined) loc.line = o.line;
  if (field !== undefined && o?.columns?.[field] !== undefined) loc.column = o.columns[field];
  const row = label ?? (line?.sector ? line.sector : undefined);
  if (row !== undefined && row !== '') loc.rowLabel = row;
  if (field !== undefined) loc.columnLabel = field;
  return loc;
}

/** Shares must sum to 1 within this (they are usually typed as percentages rounded to a few digits). */
export const MIX_SUM_TOLERANCE = 1e-6;

/**
 * Check a spending mix and give its shares rescaled to sum to 1 exactly (shares within MIX_SUM_TOLERANCE of summing
 * to 1 — a column's shares, or percentages typed to a few digits — are rescaled; further off is refused).
 */
export function mixShares(mix: SpendingMix): { sector: string; share: number }[] {
  const at = (): Location => ({
    ...(mix.origin?.file !== undefined ? { file: mix.origin.file } : {}),
    ...(mix.origin?.line !== undefined ? { line: mix.origin.line } : {}),
    rowLabel: mix.name,
  });
  if (mix.shares.length === 0) throw new InputError('mix-empty', `spending mix '${mix.name}' has no sectors`, at());
  let sum = 0;
  const seen = new Set<string>();
  for (const s of mix.shares) {
    if (seen.has(s.sector)) {
      const o = s.origin ?? mix.origin;
      throw new InputError('duplicate-entry', `sector '${s.sector}' appears twice in mix '${mix.name}'`, {
        ...(o?.file !== undefined ? { file: o.file } : {}), ...(o?.line !== undefined ? { line: o.line } : {}),
        ...(o?.columns?.sector !== undefined ? { column: o.columns.sector } : {}), rowLabel: s.sector, columnLabel: 'sector',
      });
    }
    seen.add(s.sector);
    if (!Number.isFinite(s.share) || s.share < 0 || s.share > 1) {
      throw new InputError('mix-share-range', `spending mix '${mix.name}': share ${s.share} of '${s.sector}' is outside [0, 1] (shares are fractions: write 0.25, not 25)`, { ...at(), columnLabel: s.sector });
    }
    sum += s.share;
  }
  if (Math.abs(sum - 1) > MIX_SUM_TOLERANCE) {
    throw new InputError('mix-share-sum', `spending mix '${mix.name}': shares sum to ${Number(sum.toPrecision(12))}, not 1`, at());
  }
  return mix.shares.map((s) => ({ sector: s.sector, share: s.share / sum }));
}

/**
 * Spread one amount over sectors by a spending mix, as separate final-demand lines that carry the mix's name (the
 * app's way before mix lines existed; kept for lines of older projects and for "spread into lines").
 */
export function spreadMix(mix: SpendingMix, amount: number, opts: { localShare?: number; note?: string } = {}): ScenarioLine[] {
  return mixShares(mix).map((s) => ({
    sector: s.sector,
    amount: amount * s.share,
    kind: 'final-demand' as const,
    localShare: opts.localShare ?? 1,
    mix: mix.name,
    ...(opts.note !== undefined ? { note: opts.note } : {}),
  }));
}

/** One piece of a line, as it enters the model. */
export interface LineComponent {
  /**
   * demand: final demand on a sector (direct effect); margin: a trade or transport margin (final demand on the
   * sector earning it, direct effect); purchase: an activity's purchase (demand on a sector, indirect effect); fixed:
   * a fixed output; household-income: income entering household spending from outside the sectors.
   */
  role: 'demand' | 'margin' | 'purchase' | 'fixed' | 'household-income';
  /** Sector index (not for household-income). */
  sector: number;
  /** Money before the local share (the purchaser or producer value); for fixed, the output. */
  gross: number;
  localShare: number;
  /** What enters the model: gross × local share (or the fixed output, or the resident part of a payroll). */
  value: number;
  /** The margin's kind, for margins. */
  margin?: MarginKind;
}

export interface ExpandedLine {
  line: ScenarioLine;
  /** index(table year) / index(price year); 1 without a price year. */
  priceFactor: number;
  /** The amount in the table's money year. */
  amount: number;
  /** (1 − displacement)(1 − deadweight): the share that is net additional. */
  netFactor: number;
  components: LineComponent[];
  /** Direct effects outside the sectors: an activity's own row, or the income a labour-income line pays. */
  outside: OutsideRow | null;
  /** What the model made of the line, in words (inputs report). */
  enters: string;
}

function fieldNumber(v: number | undefined, line: ScenarioLine, field: string, what: string): void {
  if (v !== undefined && (!Number.isFinite(v) || v < 0 || v > 1)) {
    throw new InputError('additionality-range', `${what} ${v} is outside [0, 1]`, lineWhere(line, field));
  }
}

function short(v: number): string {
  return String(Number(v.toPrecision(6)));
}

/** index(table year) / index(price year), refused with the line's location when a year or the index is missing. */
export function priceFactorOf(line: ScenarioLine, inputs: ShockInputs): number {
  if (line.priceYear === undefined) return 1;
  const y = line.priceYear;
  if (!Number.isInteger(y)) throw new InputError('bad-year', `price year ${y} is not a whole year`, lineWhere(line, 'price_year'));
  if (line.kind === 'jobs') throw new InputError('price-year-not-money', 'a jobs line counts jobs, not money: it has no price year', lineWhere(line, 'price_year'));
  const idx = inputs.priceIndex;
  if (!idx || idx.points.length === 0) {
    throw new InputError('no-price-index', `the line is in ${y} money, but there is no price index to convert it (give a price index: year,index)`, lineWhere(line, 'price_year'));
  }
  if (!inputs.tableYear) {
    throw new InputError('table-year-unknown', `the line is in ${y} money, but the table's money year is not known (give the table year, or put a four-digit year in the table's corner cell)`, lineWhere(line, 'price_year'));
  }
  const from = idx.points.find((p) => p.year === y);
  if (!from) {
    const years = idx.points.map((p) => p.year).sort((a, b) => a - b);
    throw new InputError('price-year-missing', `price year ${y} is not in the price index (it has ${years[0]}–${years.at(-1)}${years.length !== (years.at(-1)! - years[0]! + 1) ? ', with gaps' : ''})`, lineWhere(line, 'price_year'));
  }
  const to = idx.points.find((p) => p.year === inputs.tableYear!.year);
  if (!to) {
    throw new InputError('price-year-missing', `the table's money year ${inputs.tableYear.year} (${inputs.tableYear.source}) is not in the price index, so ${y} money cannot be converted to it`, lineWhere(line, 'price_year'));
  }
  return to.index / from.index;
}

function sectorIndex(pm: PreparedModel, line: ScenarioLine, label: string, field = 'sector'): number {
  const j = pm.coef.sectors.indexOf(label);
  if (j >= 0) return j;
  const sectors = pm.coef.sectors;
  const key = label.trim().toLowerCase();
  const near = sectors.find((s) => s.trim().toLowerCase() === key);
  const hint = near !== undefined ? `did you mean '${near}'?` : `the table has: ${sectors.slice(0, 8).join(', ')}${sectors.length > 8 ? ', …' : ''}`;
  throw new InputError('unknown-sector', `unknown sector '${label}' (${hint})`, lineWhere(line, field, label));
}

function findNamed<T extends { name: string }>(list: readonly T[], name: string): T | undefined {
  return list.find((x) => x.name === name) ?? list.find((x) => x.name.trim().toLowerCase() === name.trim().toLowerCase());
}

/** Producer value and margins of a purchaser-price amount on sector j (margins absent for j: all producer value). */
function purchaserSplit(pm: PreparedModel, line: ScenarioLine, j: number, amount: number, localShare: number, inputs: ShockInputs): LineComponent[] {
  const m = inputs.margins;
  if (!m) throw new InputError('margins-missing', 'the line is in purchaser prices, but there are no margins to split it (give a margins file: sector,retail,wholesale,transport)', lineWhere(line, 'prices'));
  const row = m.rows.find((r) => r.sector === pm.coef.sectors[j]);
  const out: LineComponent[] = [];
  let producer = amount;
  if (row) {
    for (const k of MARGIN_KINDS) {
      const share = row.shares[k];
      if (share === 0) continue;
      const to = m.sectors[k]!;
      const mj = pm.coef.sectors.indexOf(to);
      const gross = amount * share;
      producer -= gross;
      out.push({ role: 'margin', sector: mj, gross, localShare: m.localShare[k], value: gross * m.localShare[k], margin: k });
    }
  }
  out.unshift({ role: 'demand', sector: j, gross: producer, localShare, value: producer * localShare });
  return out;
}

function activityRow(a: Activity, scale: number, amount: number, pm: PreparedModel): OutsideRow {
  const has = { employment: pm.coef.e !== null, taxes: pm.coef.taxes !== null, fte: pm.coef.fte !== null };
  const purchases = a.purchases.reduce((s, p) => s + p.amount, 0);
  const direct: Record<Variable, number | null> = {
    output: amount,
    valueAdded: (a.valueAdded ?? a.output - purchases) * scale,
    income: (a.labourIncome ?? 0) * scale,
    employment: has.employment ? (a.jobs ?? 0) * scale : null,
    taxes: has.taxes ? (a.taxes ?? 0) * scale : null,
    fte: has.fte ? (a.fte ?? 0) * scale : null,
  };
  return { label: a.name, kind: 'activity', direct };
}

/**
 * One line, checked and expanded. `closure` is true when the household-closed model is used, else why not (a
 * labour-income line acts only through it, so it is refused without).
 */
export function expandLine(pm: PreparedModel, line: ScenarioLine, inputs: ShockInputs, closure: true | string): ExpandedLine {
  const { e } = pm.coef;
  const unit = pm.table.moneyUnit;
  if (!LINE_KINDS.includes(line.kind)) {
    throw new InputError('bad-kind', `kind '${String(line.kind)}' is not one of ${LINE_KINDS.join(', ')}`, lineWhere(line, 'kind'));
  }
  if (!Number.isFinite(line.amount)) throw new InputError('bad-amount', `amount of '${line.sector}' is not a finite number`, lineWhere(line, 'amount'));
  const share = line.localShare;
  if (!Number.isFinite(share) || share < 0 || share > 1) {
    throw new InputError('local-share-range', `local share ${share} of '${line.sector}' is outside [0, 1]`, lineWhere(line, 'local_share'));
  }
  const demandKind = line.kind === 'final-demand' || line.kind === 'mix';
  if (!demandKind && share !== 1) {
    const why = line.kind === 'labour-income' ? 'household income has no supplying sector'
      : line.kind === 'activity' ? 'an activity\'s purchases carry their own local shares' : `an ${line.kind} line fixes the sector's own (local) output`;
    throw new InputError('local-share-fixed', `local share applies to final-demand and mix lines only; ${why}`, lineWhere(line, 'local_share'));
  }
  if (line.prices === 'purchaser' && !demandKind) {
    throw new InputError('prices-not-applicable', `purchaser prices apply to final-demand and mix lines (spending by buyers); a ${line.kind} line is valued at producer prices`, lineWhere(line, 'prices'));
  }
  fieldNumber(line.displacement, line, 'displacement', 'displacement share');
  fieldNumber(line.deadweight, line, 'deadweight', 'deadweight share');
  const priceFactor = priceFactorOf(line, inputs);
  const amount = line.amount * priceFactor;
  const netFactor = (1 - (line.displacement ?? 0)) * (1 - (line.deadweight ?? 0));
  const components: LineComponent[] = [];
  let outside: OutsideRow | null = null;
  let enters: string;

  switch (line.kind) {
    case 'final-demand': {
      const j = sectorIndex(pm, line, line.sector);
      components.push(...(line.prices === 'purchaser' ? purchaserSplit(pm, line, j, amount, share, inputs) : [{ role: 'demand' as const, sector: j, gross: amount, localShare: share, value: amount * share }]));
      enters = line.prices === 'purchaser' ? 'final demand at producer prices plus margins, after local shares' : `final demand ${short(amount * share)}`;
      break;
    }
    case 'mix': {
      const mix = findNamed(inputs.mixes, line.sector);
      if (!mix) {
        throw new InputError('unknown-mix', `unknown spending mix '${line.sector}' (the study has ${inputs.mixes.map((m) => `'${m.name}'`).slice(0, 6).join(', ') || 'none'})`, lineWhere(line, 'sector'));
      }
      for (const s of mixShares(mix)) {
        const j = sectorIndex(pm, line, s.sector);
        const part = amount * s.share;
        components.push(...(line.prices === 'purchaser' ? purchaserSplit(pm, line, j, part, share, inputs) : [{ role: 'demand' as const, sector: j, gross: part, localShare: share, value: part * share }]));
      }
      enters = `final demand spread over ${mix.shares.length} sector${mix.shares.length === 1 ? '' : 's'} by the mix '${mix.name}'${line.prices === 'purchaser' ? ', with margins' : ''}, after local shares`;
      break;
    }
    case 'output':
    case 'jobs': {
      const j = sectorIndex(pm, line, line.sector);
      const ej = e ? e[j]! : 0;
      if (line.kind === 'jobs' && !(ej > 0)) {
        throw new InputError('no-employment', `a jobs line needs employment for '${line.sector}', and the table has ${e ? 'none for this sector' : 'no employment row'}`, lineWhere(line, 'sector'));
      }
      const out = fixedOutputOf({ ...line, amount }, ej, unit);
      components.push({ role: 'fixed', sector: j, gross: out, localShare: 1, value: out });
      enters = line.kind === 'output' ? `fixed output ${short(out)}` : `fixed output ${short(out)} implied by the jobs`;
      break;
    }
    case 'labour-income': {
      if (line.sector !== '') {
        throw new InputError('labour-income-sector', `a labour-income line pays households, not a sector: leave its sector blank (found '${line.sector}')`, lineWhere(line, 'sector'));
      }
      if (closure !== true) {
        throw new InputError('no-household-closure', `a labour-income line acts only through household spending (the household-closed model), which this study cannot use: ${closure}`, lineWhere(line, 'kind'));
      }
      components.push({ role: 'household-income', sector: -1, gross: amount, localShare: 1, value: amount });
      outside = { label: 'Household income paid directly (labour-income lines)', kind: 'labour-income', direct: { output: 0, valueAdded: 0, income: amount, employment: e ? 0 : null, taxes: pm.coef.taxes ? 0 : null, fte: pm.coef.fte ? 0 : null } };
      enters = `household income ${short(amount)} (induced effects only)`;
      break;
    }
    case 'activity': {
      const a = findNamed(inputs.activities, line.sector);
      if (!a) {
        throw new InputError('unknown-activity', `unknown activity '${line.sector}' (the study has ${inputs.activities.map((x) => `'${x.name}'`).slice(0, 6).join(', ') || 'none'}; describe it in an activity file)`, lineWhere(line, 'sector'));
      }
      // The budget is read in the line's money; it is scaled to the line's amount (its output in this phase).
      const scale = line.amount / a.output;
      for (const p of a.purchases) {
        const j = sectorIndex(pm, line, p.sector);
        const gross = p.amount * scale * priceFactor;
        components.push({ role: 'purchase', sector: j, gross, localShare: p.localShare, value: gross * p.localShare });
      }
      const payroll = (a.labourIncome ?? 0) * scale * priceFactor;
      if (payroll !== 0 && closure === true) {
        components.push({ role: 'household-income', sector: -1, gross: payroll, localShare: 1 - inputs.activityCommuting, value: payroll * (1 - inputs.activityCommuting) });
      }
      outside = activityRow(a, scale * priceFactor, amount, pm);
      enters = `activity '${a.name}' (budget × ${short(scale)}): own output ${short(amount)}; local purchases as demand on their sectors; payroll ${short(payroll)}${inputs.activityCommuting ? ` of which ${short(1 - inputs.activityCommuting)} paid to residents` : ''} into household spending`;
      break;
    }
  }
  for (const c of components) refuseNonFiniteSum(c.value, line);
  return { line, priceFactor, amount, netFactor, components, outside, enters };
}

export interface ResolveOptions {
  inputs: ShockInputs;
  /** True when the household-closed model is used, else why not. */
  closure: true | string;
  /** Net of displacement and deadweight. */
  net?: boolean;
}

/**
 * Validate the lines of one phase against a prepared table and turn them into the shock the solvers see. Several
 * lines on one sector add up. Refused: an empty phase, and each line's own refusals (expandLine), and a sector that is
 * both fixed and shocked with demand (final demand, a margin or an activity's purchase).
 */
export function resolveShock(pm: PreparedModel, name: string, lines: readonly ScenarioLine[], opts: ResolveOptions): { shock: ResolvedShock; expanded: ExpandedLine[] } {
  const { n, sectors } = pm.coef;
  if (lines.length === 0) throw new InputError('empty-scenario', `'${name}' has no lines`);
  const expanded = lines.map((l) => expandLine(pm, l, opts.inputs, opts.closure));
  const df = new Float64Array(n);
  const dfIndirect = new Float64Array(n);
  const fixedAt = new Map<number, number>();
  const firstDemandLine = new Map<number, ScenarioLine>();
  const firstFixedLine = new Map<number, ScenarioLine>();
  let householdIncome = 0;
  const outside: OutsideRow[] = [];
  const incomeRow = (): OutsideRow => {
    let r = outside.find((x) => x.kind === 'labour-income');
    if (!r) {
      r = { label: 'Household income paid directly (labour-income lines)', kind: 'labour-income', direct: { output: 0, valueAdded: 0, income: 0, employment: pm.coef.e ? 0 : null, taxes: pm.coef.taxes ? 0 : null, fte: pm.coef.fte ? 0 : null } };
      outside.push(r);
    }
    return r;
  };
  for (const x of expanded) {
    const f = opts.net ? x.netFactor : 1;
    for (const c of x.components) {
      const v = c.value * f;
      if (c.role === 'household-income') {
        householdIncome += v;
      } else if (c.role === 'fixed') {
        fixedAt.set(c.sector, (fixedAt.get(c.sector) ?? 0) + v);
        refuseNonFiniteSum(fixedAt.get(c.sector)!, x.line);
        if (!firstFixedLine.has(c.sector)) firstFixedLine.set(c.sector, x.line);
      } else {
        const target = c.role === 'purchase' ? dfIndirect : df;
        target[c.sector] = target[c.sector]! + v;
        refuseNonFiniteSum(target[c.sector]!, x.line);
        if (!firstDemandLine.has(c.sector)) firstDemandLine.set(c.sector, x.line);
      }
    }
    if (x.outside) {
      const row = x.outside.kind === 'labour-income' ? incomeRow() : (() => {
        const r: OutsideRow = { label: x.outside.label, kind: 'activity', direct: { output: 0, valueAdded: 0, income: 0, employment: null, taxes: null, fte: null } };
        const same = outside.find((o) => o.kind === 'activity' && o.label === r.label);
        if (same) return same;
        outside.push(r);
        return r;
      })();
      for (const [k, v] of Object.entries(x.outside.direct) as [Variable, number | null][]) {
        if (v === null) continue;
        row.direct[k] = (row.direct[k] ?? 0) + v * f;
      }
    }
  }
  for (const [j, fixedLine] of firstFixedLine) {
    const demandLine = firstDemandLine.get(j);
    if (demandLine) {
      const later = (demandLine.origin?.line ?? 0) > (fixedLine.origin?.line ?? 0) ? demandLine : fixedLine;
      throw new InputError('fixed-and-shocked', `'${sectors[j]}' is both fixed (${fixedLine.kind} line) and shocked with demand (${demandLine.kind === 'activity' ? 'an activity\'s purchases' : demandLine.kind === 'final-demand' && demandLine.sector !== sectors[j] ? 'a margin' : 'final demand'}); its output is set from outside, so a demand change there has no meaning — use one or the other`, lineWhere(later, undefined, sectors[j]));
    }
  }
  const fixed = [...fixedAt.keys()].sort((a, b) => a - b);
  return { shock: { n, df, dfIndirect, fixed, fixedOutput: fixed.map((j) => fixedAt.get(j)!), householdIncome, outside }, expanded };
}
