/**
 * IOTable → CSV in the labelled-matrix layout, which importTable reads back — without a role map — to the same
 * sectors, roles and numbers:
 *
 *   <money unit>, sector 1 … sector n, household columns, other final-demand columns, Total output
 *   sector rows:  flows, final demand, total output
 *   labour-income rows (with any labour income paid by final-demand columns), other value-added rows, taxes rows,
 *   import rows
 *   Employment (jobs), Full-time equivalents                  (when the table has them)
 *   Total input:  column sums of the money rows, final-demand column sums, grand total
 *
 * Labels are written so that the importer's label rules give them back their roles:
 * - a sector whose name the rules would read as something else ("Import services", a group "Households and
 *   personal services") is written with the " (sector)" mark, which the importer removes again (labels.ts);
 * - a value-added, import or final-demand label whose role came from a role map ("Pay" mapped to labour income) is
 *   written under the role's usual name with the original as a remark: "Labour income (Pay)" — the remark is ignored
 *   when roles are suggested, so no map is needed to read the file back;
 * - labels are written cleaned (Unicode NFC, no invisible characters, single spaces); two labels of one axis that
 *   would be read as one (they differ only in case or spacing) are refused.
 *
 * Numbers are written in the shortest form that reads back to the same double (ECMAScript Number::toString),
 * text cells through src/csv/write.ts (RFC 4180 quoting, CSV-injection escaping, which the importer undoes); a text
 * cell holding ';' or a tab is quoted as well, so that delimiter detection on the header line cannot be misled.
 * The totals row is derived, written to 15 significant digits so that a table balanced in decimal shows exact totals.
 */
import { formatCell, type Cell } from '../csv/index.ts';
import { InputError } from '../diagnostics/index.ts';
import { cleanLabel, matchKey, SECTOR_MARK_TEXT, splitSectorMark } from './labels.ts';
import { suggestColumnRole, suggestRowRole } from './roles.ts';
import type { ColumnRole, IOTable, LabelledVector, RoleMap, RowRole } from './types.ts';

function cell(c: Cell): string {
  const s = formatCell(c);
  return typeof c === 'string' && !s.startsWith('"') && /[;\t]/.test(s) ? `"${s}"` : s;
}

function derived(v: number): number {
  return Number(v.toPrecision(15));
}

const ROW_NAMES: Readonly<Record<'labourIncome' | 'otherValueAdded' | 'taxes' | 'imports', string>> = {
  labourIncome: 'Labour income', otherValueAdded: 'Other value added', taxes: 'Taxes less subsidies', imports: 'Imports',
};
const MONEY_ROLES = ['labourIncome', 'otherValueAdded', 'taxes', 'imports'] as const;

function rowsOf(t: IOTable, role: (typeof MONEY_ROLES)[number]): LabelledVector[] {
  return t[role] ?? [];
}
const COLUMN_NAMES: Readonly<Record<'householdConsumption' | 'otherFinalDemand', string>> = {
  householdConsumption: 'Households', otherFinalDemand: 'Other final demand',
};

/** Labels of one axis as written: unique by match key. */
class Axis {
  readonly keys = new Set<string>();
  take(label: string): string {
    this.keys.add(matchKey(label));
    return label;
  }
  has(label: string): boolean {
    return this.keys.has(matchKey(label));
  }
}

/** A remark may not hold parentheses (the importer drops only a final remark without nested ones). */
function remark(label: string): string {
  return label.replace(/\(/g, '[').replace(/\)/g, ']');
}

interface Plan {
  sectors: string[];
  rows: Map<LabelledVector, string>;
  columns: Map<LabelledVector, string>;
  totalOutput: string;
  totalInput: string;
  employment: string;
  fte: string;
}

function plan(t: IOTable): Plan {
  const rowAxis = new Axis();
  const colAxis = new Axis();
  const names = new Map<string, string>();
  const sectors = t.sectors.map((s) => {
    const name = cleanLabel(s);
    if (name === '') throw new InputError('label-unwritable', 'a sector label is empty or only invisible characters', { rowLabel: s });
    const before = names.get(matchKey(name));
    if (before !== undefined) throw new InputError('label-unwritable', `sectors '${before}' and '${s}' differ only in case, spacing or invisible characters; they would be read back as one sector`, { rowLabel: s });
    names.set(matchKey(name), s);
    rowAxis.take(name);
    colAxis.take(name);
    const readsAsRole = suggestRowRole(name).recognised || suggestColumnRole(name).recognised || splitSectorMark(name).marked;
    return readsAsRole ? name + SECTOR_MARK_TEXT : name;
  });

  // A non-sector label is kept when it alone gives back its role, is new on its axis, and is not also on the other
  // axis (it would pair into a sector) unless both sides are recognised roles ("Households" row and column).
  const keeps = (label: string, role: string, axis: 'row' | 'column'): boolean => {
    const own = axis === 'row' ? rowAxis : colAxis;
    const other = axis === 'row' ? colAxis : rowAxis;
    const s = axis === 'row' ? suggestRowRole(label) : suggestColumnRole(label);
    if (label === '' || s.role !== role || own.has(label) || splitSectorMark(label).marked) return false;
    if (!other.has(label)) return true;
    return suggestRowRole(label).recognised && suggestColumnRole(label).recognised;
  };
  const place = (label: string, role: string, axis: 'row' | 'column', canonical: string): string => {
    const own = axis === 'row' ? rowAxis : colAxis;
    const name = cleanLabel(label);
    if (keeps(name, role, axis)) return own.take(name);
    const base = name === '' || name.toLowerCase() === canonical.toLowerCase() ? '' : remark(name);
    for (let k = 1; ; k++) {
      const note = [base, k > 1 ? String(k) : ''].filter(Boolean).join(', ');
      const candidate = note ? `${canonical} (${note})` : canonical;
      if (keeps(candidate, role, axis)) return own.take(candidate);
    }
  };
  // Total and employment labels are placed after the labelled vectors; they must not meet a sector or each other.
  const rows = new Map<LabelledVector, string>();
  for (const role of MONEY_ROLES) for (const v of rowsOf(t, role)) rows.set(v, place(v.label, role, 'row', ROW_NAMES[role]));
  const columns = new Map<LabelledVector, string>();
  for (const role of ['householdConsumption', 'otherFinalDemand'] as const) for (const v of t[role]) columns.set(v, place(v.label, role, 'column', COLUMN_NAMES[role]));
  const fixed = (axis: Axis, first: string, rest: (k: number) => string, ok: (l: string) => boolean): string => {
    for (let k = 1; ; k++) {
      const l = k === 1 ? first : rest(k);
      if (!axis.has(l) && ok(l)) return axis.take(l);
    }
  };
  const employment = t.employment
    ? fixed(rowAxis, 'Employment (jobs)', (k) => `Employment (jobs ${k})`, (l) => suggestRowRole(l).role === 'employment' && !colAxis.has(l))
    : '';
  const fte = t.fte
    ? fixed(rowAxis, 'Full-time equivalents', (k) => `Full-time equivalents (${k})`, (l) => suggestRowRole(l).role === 'fte' && !colAxis.has(l))
    : '';
  const totalInput = fixed(rowAxis, 'Total input', (k) => `Total input (${k})`, (l) => suggestRowRole(l).role === 'totalInput' && !colAxis.has(l));
  const totalOutput = fixed(colAxis, 'Total output', (k) => `Total output (${k})`, (l) => suggestColumnRole(l).role === 'totalOutput' && !rowAxis.has(l));
  return { sectors, rows, columns, totalOutput, totalInput, employment, fte };
}

/**
 * The role of every non-sector row and column of the written file, and its sectors. The file reads back the same
 * without it; it is for callers that want to state the roles anyway.
 */
export function writtenRoleMap(t: IOTable): RoleMap {
  const p = plan(t);
  const rows: Record<string, RowRole> = {};
  const columns: Record<string, ColumnRole> = {};
  for (const role of MONEY_ROLES) for (const v of rowsOf(t, role)) rows[p.rows.get(v)!] = role;
  if (t.employment) rows[p.employment] = 'employment';
  if (t.fte) rows[p.fte] = 'fte';
  rows[p.totalInput] = 'totalInput';
  for (const role of ['householdConsumption', 'otherFinalDemand'] as const) for (const v of t[role]) columns[p.columns.get(v)!] = role;
  columns[p.totalOutput] = 'totalOutput';
  return { rows, columns, sectors: t.sectors.map(cleanLabel) };
}

export function writeTableCsv(t: IOTable): string {
  const { n, Z, x } = t;
  const p = plan(t);
  const fd = [...t.householdConsumption, ...t.otherFinalDemand];
  const money = MONEY_ROLES.flatMap((role) => rowsOf(t, role));
  // Labour income paid by final-demand columns sits in its labour row under that column.
  const paid = new Map<string, number>();
  for (const c of t.householdIncomeFromFinalDemand ?? []) {
    const key = `${matchKey(c.row)}\u0000${matchKey(c.column)}`;
    paid.set(key, (paid.get(key) ?? 0) + c.value);
  }
  const known = new Set([...t.labourIncome.map((v) => matchKey(v.label))]);
  const knownCols = new Set(fd.map((v) => matchKey(v.label)));
  for (const c of t.householdIncomeFromFinalDemand ?? []) {
    if (!known.has(matchKey(c.row)) || !knownCols.has(matchKey(c.column))) {
      throw new InputError('label-unwritable', `labour income paid by '${c.column}' is in row '${c.row}', which is not a labour-income row and final-demand column pair of the table`, { rowLabel: c.row, columnLabel: c.column });
    }
  }
  const out: Cell[][] = [];
  out.push([t.moneyUnit, ...p.sectors, ...fd.map((v) => p.columns.get(v)!), p.totalOutput]);
  for (let i = 0; i < n; i++) {
    const row: Cell[] = [p.sectors[i]!];
    for (let j = 0; j < n; j++) row.push(Z[i * n + j]!);
    for (const v of fd) row.push(v.values[i]!);
    row.push(x[i]!);
    out.push(row);
  }
  const fdTotals = fd.map((v) => v.values.reduce((a, b) => a + b, 0));
  for (const v of money) {
    const isLabour = t.labourIncome.includes(v);
    const tail = fd.map((c, k): Cell => {
      const value = isLabour ? paid.get(`${matchKey(v.label)}\u0000${matchKey(c.label)}`) : undefined;
      if (value === undefined) return null;
      fdTotals[k] = fdTotals[k]! + value;
      return value;
    });
    out.push([p.rows.get(v)!, ...Array.from(v.values), ...tail, null]);
  }
  const blanks = (): Cell[] => fd.map(() => null);
  if (t.employment) out.push([p.employment, ...Array.from(t.employment), ...blanks(), null]);
  if (t.fte) out.push([p.fte, ...Array.from(t.fte), ...blanks(), null]);
  const totals: Cell[] = [p.totalInput];
  for (let j = 0; j < n; j++) {
    let s = 0;
    for (let i = 0; i < n; i++) s += Z[i * n + j]!;
    for (const v of money) s += v.values[j]!;
    totals.push(derived(s));
  }
  for (const s of fdTotals) totals.push(derived(s));
  totals.push(derived(x.reduce((a, b) => a + b, 0)));
  out.push(totals);
  return out.map((r) => r.map(cell).join(',')).join('\r\n') + '\r\n';
}
