/**
 * IOTable → CSV in the labelled-matrix layout, which importTable reads back to the same numbers:
 *
 *   <money unit>, sector 1 … sector n, household columns, other final-demand columns, Total output
 *   sector rows:  flows, final demand, total output
 *   labour-income rows, other value-added rows, import rows (sector columns only)
 *   Employment (jobs)                                         (when the table has jobs)
 *   Total input:  column sums of the money rows, final-demand column sums, grand total
 *
 * Numbers are written in the shortest form that reads back to the same double (ECMAScript Number::toString),
 * text cells through src/csv/ (RFC 4180 quoting, CSV-injection escaping, which the importer undoes); a text
 * cell holding ';' or a tab is quoted as well, so that delimiter detection on the header line cannot be misled.
 * The totals row is derived, written to 15 significant digits so that a table balanced in decimal shows exact totals.
 */
import { formatCell, type Cell } from '../csv/index.ts';
import type { IOTable, RoleMap } from './types.ts';

const TOTAL_OUTPUT = 'Total output';
const TOTAL_INPUT = 'Total input';
const EMPLOYMENT = 'Employment (jobs)';

function cell(c: Cell): string {
  const s = formatCell(c);
  return typeof c === 'string' && !s.startsWith('"') && /[;\t]/.test(s) ? `"${s}"` : s;
}

function derived(v: number): number {
  return Number(v.toPrecision(15));
}

function unique(label: string, taken: Set<string>): string {
  let l = label;
  for (let k = 2; taken.has(l); k++) l = `${label} ${k}`;
  return l;
}

interface Plan {
  totalOutput: string;
  totalInput: string;
  employment: string;
}

function plan(t: IOTable): Plan {
  const cols = new Set([...t.sectors, ...t.householdConsumption.map((v) => v.label), ...t.otherFinalDemand.map((v) => v.label)]);
  const rows = new Set([...t.sectors, ...t.labourIncome.map((v) => v.label), ...t.otherValueAdded.map((v) => v.label), ...t.imports.map((v) => v.label)]);
  const employment = unique(EMPLOYMENT, rows);
  rows.add(employment);
  return { totalOutput: unique(TOTAL_OUTPUT, cols), totalInput: unique(TOTAL_INPUT, rows), employment };
}

/** The role of every non-sector row and column of the written file (pass as `roles` to read it back whatever the labels). */
export function writtenRoleMap(t: IOTable): RoleMap {
  const p = plan(t);
  const rows: RoleMap['rows'] = {};
  const columns: RoleMap['columns'] = {};
  for (const v of t.labourIncome) rows[v.label] = 'labourIncome';
  for (const v of t.otherValueAdded) rows[v.label] = 'otherValueAdded';
  for (const v of t.imports) rows[v.label] = 'imports';
  if (t.employment) rows[p.employment] = 'employment';
  rows[p.totalInput] = 'totalInput';
  for (const v of t.householdConsumption) columns[v.label] = 'householdConsumption';
  for (const v of t.otherFinalDemand) columns[v.label] = 'otherFinalDemand';
  columns[p.totalOutput] = 'totalOutput';
  return { rows, columns };
}

export function writeTableCsv(t: IOTable): string {
  const { n, Z, x, sectors } = t;
  const p = plan(t);
  const fd = [...t.householdConsumption, ...t.otherFinalDemand];
  const money = [...t.labourIncome, ...t.otherValueAdded, ...t.imports];
  const out: Cell[][] = [];
  out.push([t.moneyUnit, ...sectors, ...fd.map((v) => v.label), p.totalOutput]);
  for (let i = 0; i < n; i++) {
    const row: Cell[] = [sectors[i]!];
    for (let j = 0; j < n; j++) row.push(Z[i * n + j]!);
    for (const v of fd) row.push(v.values[i]!);
    row.push(x[i]!);
    out.push(row);
  }
  const blanks = (): Cell[] => fd.map(() => null);
  for (const v of money) out.push([v.label, ...Array.from(v.values), ...blanks(), null]);
  if (t.employment) out.push([p.employment, ...Array.from(t.employment), ...blanks(), null]);
  const totals: Cell[] = [p.totalInput];
  for (let j = 0; j < n; j++) {
    let s = 0;
    for (let i = 0; i < n; i++) s += Z[i * n + j]!;
    for (const v of money) s += v.values[j]!;
    totals.push(derived(s));
  }
  for (const v of fd) totals.push(derived(v.values.reduce((a, b) => a + b, 0)));
  totals.push(derived(x.reduce((a, b) => a + b, 0)));
  out.push(totals);
  return out.map((r) => r.map(cell).join(',')).join('\r\n') + '\r\n';
}
