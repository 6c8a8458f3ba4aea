/**
 * One-time and annual phases over time. An annual phase's effects are one year's; over its number of years the
 * cumulative effect is years × annual (undiscounted; for jobs, job-years), and with a discount rate r its present value
 * is that of an ordinary annuity, Σ_{t=1..years} annual / (1 + r)^t: each year's effect counted at the end of the
 * year, discounted to the start of the first year (the standard annuity definition; any corporate-finance text,
 * e.g. Brealey, Myers & Allen, Principles of Corporate Finance, ch. 2 — recalled from memory). Present values are
 * given for money only: discounting head counts has no accepted meaning.
 */
import { InputError } from '../diagnostics/index.ts';
import { MONEY_VARIABLES, type EffectTotals, type Phase, type Variable } from './types.ts';

/** Σ_{t=1..years} 1/(1 + r)^t, summed term by term (the closed form is the tests' independent check). */
export function annuityFactor(rate: number, years: number): number {
  let s = 0;
  let d = 1;
  for (let t = 1; t <= years; t++) {
    d /= 1 + rate;
    s += d;
  }
  return s;
}

/** A discount rate must be a finite number in [0, 1) (a share per year, e.g. 0.035). */
export function checkDiscountRate(rate: number, where: string): void {
  if (!Number.isFinite(rate) || rate < 0 || rate >= 1) {
    throw new InputError('discount-rate-range', `${where}: discount rate ${rate} is outside [0, 1) (a share per year, e.g. 0.035 for 3.5 %)`);
  }
}

export type TotalsRecord = Partial<Record<Variable, EffectTotals | null>>;

function scaled(t: EffectTotals, f: number): EffectTotals {
  return { direct: t.direct * f, indirect: t.indirect * f, induced: t.induced === null ? null : t.induced * f, total: t.total * f };
}

export interface OverTime {
  years: number;
  /** years × one year's totals, per variable (jobs: job-years). */
  cumulative: TotalsRecord;
  /** The ordinary-annuity present value of the money variables, or null without a discount rate. */
  presentValue: TotalsRecord | null;
  rate: number | null;
  /** Σ_{t=1..years} (1 + r)^−t, or null without a discount rate. */
  annuityFactor: number | null;
}

/** Cumulative effect and present value of an annual phase with a number of years; null for other phases. */
export function overTime(phase: Pick<Phase, 'timing' | 'years'>, totals: TotalsRecord, rate: number | null): OverTime | null {
  if (phase.timing !== 'annual' || phase.years === undefined) return null;
  const years = phase.years;
  const cumulative: TotalsRecord = {};
  for (const [v, t] of Object.entries(totals) as [Variable, EffectTotals | null][]) cumulative[v] = t ? scaled(t, years) : null;
  if (rate === null) return { years, cumulative, presentValue: null, rate: null, annuityFactor: null };
  const factor = annuityFactor(rate, years);
  const presentValue: TotalsRecord = {};
  for (const v of MONEY_VARIABLES) {
    const t = totals[v];
    if (t !== undefined) presentValue[v] = t ? scaled(t, factor) : null;
  }
  return { years, cumulative, presentValue, rate, annuityFactor: factor };
}

/** Sum totals of several phases of the same timing (labelled as such wherever shown). */
export function sumTotals(list: readonly TotalsRecord[]): TotalsRecord {
  const out: TotalsRecord = {};
  for (const rec of list) {
    for (const [v, t] of Object.entries(rec) as [Variable, EffectTotals | null][]) {
      const prev = out[v];
      if (prev === null) continue;
      if (!t) { out[v] = null; continue; }
      out[v] = prev === undefined ? { ...t } : {
        direct: prev.direct + t.direct,
        indirect: prev.indirect + t.indirect,
        induced: prev.induced === null || t.induced === null ? null : prev.induced + t.induced,
        total: prev.total + t.total,
      };
    }
  }
  return out;
}
