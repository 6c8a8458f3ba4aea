/**
 * RAS on a whole table: the intermediate block Z is scaled to known intermediate sales u_i (row totals) and purchases
 * v_j (column totals) — the RAS update of Miller & Blair, Input–Output Analysis, 2nd ed. 2009, §7.4, where the new
 * year's (or the county's) x, u and v are known. Total output x is kept unless new outputs are given; the final-demand
 * columns then share x_i − u_i and the value-added and import rows share x_j − v_j in their original proportions
 * (an even split when a sector had none), and jobs keep their jobs-per-output coefficient.
 */
import { InputError, type Warning } from '../diagnostics/index.ts';
import type { IOTable, LabelledVector } from '../table/index.ts';
import { ras, type RasOptions, type RasResult } from './ras.ts';

export interface TableTargets {
  /** Intermediate sales per sector (row sums of the new Z). */
  sales: Float64Array;
  /** Intermediate purchases per sector (column sums of the new Z). */
  purchases: Float64Array;
  /** New total output per sector; the table's own when omitted. */
  output?: Float64Array;
  /** Shown in messages. */
  fileName?: string;
}

export interface TableBalanceResult {
  table: IOTable;
  ras: RasResult;
  warnings: Warning[];
  notes: string[];
}

/** Spread `total` over the vectors at position k in their current proportions (evenly when they hold nothing there). */
function share(vs: LabelledVector[], k: number, total: number): void {
  let now = 0;
  for (const v of vs) now += v.values[k]!;
  for (const v of vs) v.values[k] = now > 0 ? (v.values[k]! / now) * total : total / vs.length;
}

export function balanceTable(t: IOTable, targets: TableTargets, opts: Omit<RasOptions, 'rowLabels' | 'columnLabels'> = {}): TableBalanceResult {
  const { n, sectors } = t;
  const file = targets.fileName ?? opts.fileName;
  const x = Float64Array.from(targets.output ?? t.x);
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(x[i]!) || x[i]! < 0) throw new InputError('balance-output', `total output ${x[i]} must be a non-negative number`, { file, rowLabel: sectors[i]! });
    if (targets.sales[i]! > x[i]! * (1 + 1e-12)) throw new InputError('balance-sales-above-output', `intermediate sales ${targets.sales[i]} exceed total output ${x[i]}`, { file, rowLabel: sectors[i]! });
    if (targets.purchases[i]! > x[i]! * (1 + 1e-12)) throw new InputError('balance-purchases-above-output', `intermediate purchases ${targets.purchases[i]} exceed total output ${x[i]}`, { file, columnLabel: sectors[i]! });
  }
  const res = ras(t.Z, n, n, targets.sales, targets.purchases, { ...opts, rowLabels: sectors, columnLabels: sectors, ...(file ? { fileName: file } : {}) });
  const copy = (vs: LabelledVector[]) => vs.map((v) => ({ label: v.label, values: Float64Array.from(v.values) }));
  const finalDemand = [copy(t.householdConsumption), copy(t.otherFinalDemand)];
  const inputs = [copy(t.labourIncome), copy(t.otherValueAdded), copy(t.imports), copy(t.taxes ?? [])];
  const warnings: Warning[] = [];
  const fdAll = finalDemand.flat();
  const vaAll = inputs.flat();
  if (fdAll.length === 0) fdAll.push({ label: 'Final demand', values: new Float64Array(n) });
  if (vaAll.length === 0) vaAll.push({ label: 'Value added', values: new Float64Array(n) });
  for (let k = 0; k < n; k++) {
    share(fdAll, k, Math.max(0, x[k]! - targets.sales[k]!));
    share(vaAll, k, Math.max(0, x[k]! - targets.purchases[k]!));
  }
  const [hh, ofd] = finalDemand as [LabelledVector[], LabelledVector[]];
  const [li, ova, im, tx] = inputs as [LabelledVector[], LabelledVector[], LabelledVector[], LabelledVector[]];
  const roles = { rows: { ...t.roles.rows }, columns: { ...t.roles.columns } };
  if (t.householdConsumption.length + t.otherFinalDemand.length === 0) { ofd.push(fdAll[0]!); roles.columns[fdAll[0]!.label] = 'otherFinalDemand'; }
  if (t.labourIncome.length + t.otherValueAdded.length + t.imports.length + (t.taxes?.length ?? 0) === 0) { ova.push(vaAll[0]!); roles.rows[vaAll[0]!.label] = 'otherValueAdded'; }
  const perOutput = (v: Float64Array) => v.map((e, j) => (t.x[j]! > 0 ? (e * x[j]!) / t.x[j]! : 0));
  const employment = t.employment ? perOutput(t.employment) : null;
  if (t.employment && targets.output) {
    t.sectors.forEach((s, j) => {
      if (!(t.x[j]! > 0) && x[j]! > 0) warnings.push({ code: 'balance-jobs-unknown', message: 'the sector had no output, so its jobs per unit of output are unknown; jobs set to 0', location: { rowLabel: s } });
    });
  }
  const table: IOTable = {
    ...t,
    name: `${t.name} (balanced by RAS)`,
    sectors: [...sectors],
    Z: res.matrix,
    x,
    labourIncome: li,
    otherValueAdded: ova,
    imports: im,
    ...(t.taxes ? { taxes: tx } : {}),
    employment,
    ...(t.fte ? { fte: perOutput(t.fte) } : {}),
    householdConsumption: hh,
    otherFinalDemand: ofd,
    roles,
    warnings,
  };
  const notes = [
    `Intermediate flows scaled by RAS to the given intermediate sales and purchases (${res.iterations} iterations, largest relative gap ${Math.max(res.rowGap, res.columnGap)}).`,
    targets.output ? 'Total output from the given outputs; jobs keep their jobs-per-output coefficients.' : 'Total output kept from the table.',
    'Final-demand columns share output minus intermediate sales, value-added and import rows share output minus intermediate purchases, in their original proportions.',
  ];
  return { table, ras: res, warnings, notes };
}
