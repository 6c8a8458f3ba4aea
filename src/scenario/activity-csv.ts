/**
 * ACT.csv: activities not in the table, each described by its own yearly budget. Header
 * `activity,item,sector,amount[,local_share][,note]` (any order, case-insensitive); `item` is one of
 *   output           the activity's output (money, required, above 0)
 *   jobs, fte        its jobs and full-time equivalents
 *   labour_income    its payroll (money)
 *   value_added      its value added (money; default: output less all its purchases)
 *   taxes            its taxes less subsidies on production (money; default 0)
 *   purchase         a purchase from the table sector in `sector` (money), of which `local_share` (0–1, default 1)
 *                    is bought inside the region
 * Without an `activity` column the file is one activity named after the file. Refused, located: a purchase without a
 * sector, a budget item given twice, an activity without output, purchases adding up to more than its output.
 */
import { InputError } from '../diagnostics/index.ts';
import { toCsv } from '../csv/index.ts';
import { cleanLabel } from '../table/index.ts';
import { nameFromFile, readHeaderCsv, shareCell } from './header-csv.ts';
import type { Activity, LineOrigin } from './types.ts';

const COLUMNS = ['activity', 'item', 'sector', 'amount', 'local_share', 'note'] as const;
export const ACTIVITY_HEADER = '[activity,]item,sector,amount[,local_share][,note]';
const ITEMS = ['output', 'jobs', 'fte', 'labour_income', 'value_added', 'taxes', 'purchase'] as const;
type Item = (typeof ITEMS)[number];
const FIELD: Record<Exclude<Item, 'purchase'>, 'output' | 'jobs' | 'fte' | 'labourIncome' | 'valueAdded' | 'taxes'> = {
  output: 'output', jobs: 'jobs', fte: 'fte', labour_income: 'labourIncome', value_added: 'valueAdded', taxes: 'taxes',
};

function at(o: LineOrigin | undefined, field: string, rowLabel: string) {
  return {
    ...(o?.file !== undefined ? { file: o.file } : {}), ...(o?.line !== undefined ? { line: o.line } : {}),
    ...(o?.columns?.[field] !== undefined ? { column: o.columns[field] } : {}), rowLabel, columnLabel: field,
  };
}

/**
 * Refuse an activity whose budget cannot be: no positive output, negative jobs or purchases, purchases above its
 * output (its value added would be negative). Located at the file line and field when it came from a file.
 */
export function checkActivity(a: Activity): void {
  const o = a.itemOrigins ?? {};
  if (!Number.isFinite(a.output) || !(a.output > 0)) {
    throw new InputError('activity-bad', `activity '${a.name}' needs an output above 0 (an 'output' row); found ${Number.isFinite(a.output) ? a.output : 'none'}`, at(o.output ?? a.origin, 'amount', a.name));
  }
  for (const k of ['jobs', 'fte', 'labourIncome', 'valueAdded', 'taxes'] as const) {
    const v = a[k];
    if (v !== undefined && !Number.isFinite(v)) throw new InputError('activity-bad', `activity '${a.name}': ${k} is not a finite number`, at(o[k] ?? a.origin, 'amount', a.name));
    if (v !== undefined && v < 0 && (k === 'jobs' || k === 'fte')) throw new InputError('activity-bad', `activity '${a.name}': ${k} cannot be negative (${v})`, at(o[k] ?? a.origin, 'amount', a.name));
  }
  let sum = 0;
  for (const p of a.purchases) {
    if (!Number.isFinite(p.amount) || p.amount < 0) throw new InputError('activity-bad', `activity '${a.name}': the purchase from '${p.sector}' must be a number of 0 or more (found ${p.amount})`, at(p.origin ?? a.origin, 'amount', p.sector));
    if (!Number.isFinite(p.localShare) || p.localShare < 0 || p.localShare > 1) throw new InputError('local-share-range', `activity '${a.name}': local share ${p.localShare} of the purchase from '${p.sector}' is outside [0, 1]`, at(p.origin ?? a.origin, 'local_share', p.sector));
    sum += p.amount;
    if (sum > a.output * (1 + 1e-12)) {
      throw new InputError('activity-purchases-exceed-output', `activity '${a.name}': its purchases add up to ${sum} by this line, more than its output ${a.output} — its value added would be negative; check the amounts and their unit`, at(p.origin ?? a.origin, 'amount', p.sector));
    }
  }
}

/** Refuse an activity that buys from a sector the table does not have. */
export function checkActivitySectors(activities: readonly Activity[], sectors: readonly string[]): void {
  const known = new Set(sectors);
  for (const a of activities) {
    for (const p of a.purchases) {
      if (!known.has(p.sector)) throw new InputError('unknown-sector', `activity '${a.name}' buys from '${p.sector}', which is not a sector of the table`, at(p.origin ?? a.origin, 'sector', p.sector));
    }
  }
}

export function parseActivityCsv(text: string, fileName: string): Activity[] {
  const f = readHeaderCsv(text, fileName, COLUMNS, ['item', 'amount'], ACTIVITY_HEADER, 'activity file');
  const byName = new Map<string, Activity>();
  for (const r of f.rows) {
    const name = f.columns.activity !== undefined ? cleanLabel(r.cell('activity')) : nameFromFile(fileName);
    if (name === '') throw new InputError('missing-label', 'the activity name is empty', r.at('activity'));
    let a = byName.get(name);
    if (!a) {
      a = { name, output: Number.NaN, purchases: [], origin: r.origin(), itemOrigins: {} };
      byName.set(name, a);
    }
    const item = r.cell('item').toLowerCase().replace(/[\s-]+/g, '_') as Item;
    if (!ITEMS.includes(item)) throw new InputError('activity-bad', `item '${r.cell('item')}' is not one of ${ITEMS.join(', ')}`, r.at('item', name));
    const sector = cleanLabel(r.cell('sector'));
    const amount = r.number('amount', 'amount', sector || name);
    if (amount === undefined) throw new InputError('bad-number', 'amount is missing', r.at('amount', sector || name));
    if (item === 'purchase') {
      if (sector === '') throw new InputError('missing-sector', 'a purchase names the sector it buys from', r.at('sector', name));
      const localShare = shareCell(r, 'local_share', 'local share', 'local-share-range', sector) ?? 1;
      a.purchases.push({ sector, amount, localShare, origin: r.origin() });
    } else {
      if (sector !== '') throw new InputError('activity-bad', `the ${item} row of an activity names no sector (found '${sector}'); only purchase rows do`, r.at('sector', name));
      if (r.cell('local_share') !== '') throw new InputError('local-share-fixed', `a local share belongs to purchase rows only, not to ${item}`, r.at('local_share', name));
      const k = FIELD[item];
      if (a[k] !== undefined && !(k === 'output' && Number.isNaN(a.output))) throw new InputError('duplicate-entry', `activity '${name}' gives its ${item} twice`, r.at('item', name));
      a[k] = amount;
      a.itemOrigins![k] = r.origin();
    }
  }
  if (byName.size === 0) throw new InputError('empty', 'the activity file has a header but no rows', { file: fileName, line: f.headerLine });
  for (const a of byName.values()) checkActivity(a);
  return [...byName.values()];
}

/** Activities as an activity file (header activity,item,sector,amount,local_share). */
export function writeActivityCsv(activities: readonly Activity[]): string {
  const rows: (string | number | null)[][] = [['activity', 'item', 'sector', 'amount', 'local_share']];
  for (const a of activities) {
    rows.push([a.name, 'output', null, a.output, null]);
    for (const [item, k] of Object.entries(FIELD) as [Item, keyof typeof a][]) {
      if (item === 'output') continue;
      const v = a[k];
      if (typeof v === 'number') rows.push([a.name, item, null, v, null]);
    }
    for (const p of a.purchases) rows.push([a.name, 'purchase', p.sector, p.amount, p.localShare]);
  }
  return toCsv(rows);
}
