/**
 * One name per multiplier, from the engine to every header: the CSV report, the CLI summary and the app's columns all
 * take their labels and units from this list, keyed by the engine's own field (`income.total` is the household-closed
 * income per unit of final demand, `income.typeII` its ratio to the direct income). Definitions after Miller & Blair,
 * Input-Output Analysis, 2nd ed. 2009, ch. 6; linkage indices after Rasmussen 1956.
 */
import type { Analysis } from '../model/index.ts';
import type { Values } from '../model/index.ts';

export type MeasureKey =
  | 'output.typeI' | 'output.typeII'
  | 'income.simple' | 'income.typeI' | 'income.total' | 'income.typeII'
  | 'employment.simple' | 'employment.typeI' | 'employment.total' | 'employment.typeII'
  | 'valueAdded.simple' | 'valueAdded.total'
  | 'taxes.simple' | 'taxes.total'
  | 'fte.simple' | 'fte.typeI' | 'fte.total' | 'fte.typeII'
  | 'linkage.backward' | 'linkage.forward';

export interface Measure {
  key: MeasureKey;
  /** The name everywhere: "labour income Type I". */
  label: string;
  /** Unit of the value, given the table's money unit. */
  unit: (moneyUnit: string) => string;
  /** Which model it needs: 'closed' measures exist only with the household closure. */
  model: 'open' | 'closed';
  /** Jobs per money: the table's money unit is usually small for it (the app offers a larger one). */
  jobsPerMoney?: true;
  /** A row the table must have for the measure to exist (taxes, full-time equivalents); listed only then. */
  needs?: 'taxes' | 'fte';
}

const perDemand = () => 'per unit of final demand';
const money = (u: string) => `${u} per ${u} of final demand`;
const jobs = (u: string) => `jobs per ${u} of final demand`;
const ftes = (u: string) => `full-time equivalents per ${u} of final demand`;
const ratio = () => 'ratio';
const index = () => 'Rasmussen index, 1 = average';

export const MEASURES: readonly Measure[] = [
  { key: 'output.typeI', label: 'output Type I', unit: perDemand, model: 'open' },
  { key: 'output.typeII', label: 'output Type II', unit: perDemand, model: 'closed' },
  { key: 'income.simple', label: 'labour income simple', unit: money, model: 'open' },
  { key: 'income.typeI', label: 'labour income Type I', unit: ratio, model: 'open' },
  { key: 'income.total', label: 'labour income total', unit: money, model: 'closed' },
  { key: 'income.typeII', label: 'labour income Type II', unit: ratio, model: 'closed' },
  { key: 'employment.simple', label: 'employment simple', unit: jobs, model: 'open', jobsPerMoney: true },
  { key: 'employment.typeI', label: 'employment Type I', unit: ratio, model: 'open' },
  { key: 'employment.total', label: 'employment total', unit: jobs, model: 'closed', jobsPerMoney: true },
  { key: 'employment.typeII', label: 'employment Type II', unit: ratio, model: 'closed' },
  { key: 'valueAdded.simple', label: 'value added simple', unit: money, model: 'open' },
  { key: 'valueAdded.total', label: 'value added total', unit: money, model: 'closed' },
  { key: 'taxes.simple', label: 'taxes simple', unit: money, model: 'open', needs: 'taxes' },
  { key: 'taxes.total', label: 'taxes total', unit: money, model: 'closed', needs: 'taxes' },
  { key: 'fte.simple', label: 'FTE simple', unit: ftes, model: 'open', jobsPerMoney: true, needs: 'fte' },
  { key: 'fte.typeI', label: 'FTE Type I', unit: ratio, model: 'open', needs: 'fte' },
  { key: 'fte.total', label: 'FTE total', unit: ftes, model: 'closed', jobsPerMoney: true, needs: 'fte' },
  { key: 'fte.typeII', label: 'FTE Type II', unit: ratio, model: 'closed', needs: 'fte' },
  { key: 'linkage.backward', label: 'backward linkage', unit: index, model: 'open' },
  { key: 'linkage.forward', label: 'forward linkage', unit: index, model: 'open' },
];

/** The measures this analysis has: every one, except taxes and FTE measures when the table lacks that row. */
export function measuresOf(an: Analysis): Measure[] {
  return MEASURES.filter((m) => m.needs === undefined || an.multipliers[m.needs] !== null);
}

/** The values of one measure, in sector order (all null when the table lacks the row the measure needs). */
export function measureValues(an: Analysis, key: MeasureKey): Values {
  const [group, form] = key.split('.') as [string, string];
  if (group === 'linkage') return form === 'backward' ? an.linkages.backward : an.linkages.forward;
  const m = an.multipliers as unknown as Record<string, Record<string, Values> | null>;
  return m[group]?.[form] ?? new Array<number | null>(an.n).fill(null);
}

/** Header text of a measure: "labour income simple (thousand dollars per thousand dollars of final demand)". */
export function measureHeader(m: Measure, moneyUnit: string): string {
  return `${m.label} (${m.unit(moneyUnit)})`;
}

export type LinkageClass = 'key' | 'backward' | 'forward' | 'weak';

/**
 * Rasmussen's classes: key sectors have both indices above 1; a strong buyer only the backward one; a strong supplier
 * only the forward one; the rest are weakly linked. Null where the indices are undefined.
 */
export function linkageClass(an: Analysis, j: number): LinkageClass | null {
  const b = an.linkages.backward[j], f = an.linkages.forward[j];
  if (b === null || b === undefined || f === null || f === undefined) return null;
  return b > 1 && f > 1 ? 'key' : b > 1 ? 'backward' : f > 1 ? 'forward' : 'weak';
}

export const LINKAGE_CLASS_NAMES: Record<LinkageClass, string> = {
  key: 'key sector', backward: 'strong buyer', forward: 'strong supplier', weak: 'weakly linked',
};
