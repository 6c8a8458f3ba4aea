/**
 * From the numbers as read to a validated IOTable: the coefficients layout scaled to flows, total output chosen,
 * refusals that need whole rows or columns (non-positive output that buys inputs, negative jobs, overflowing sums),
 * empty sectors dropped, and the balance report.
 */
import { InputError, type Location, type Warning } from '../diagnostics/index.ts';
import { showNumber } from './numbers.ts';
import type { RawTable } from './structure.ts';
import type { FinalDemandIncome, IOTable, LabelledVector } from './types.ts';
import { checkEmployment, checkOutputs, checkTotals, outputRefusal } from './validate.ts';

/** How well the table adds up, sector by sector (shown in the import preview). */
export interface BalanceReport {
  /** Relative tolerance used, e.g. 0.001 for 0.1 %. */
  tolerance: number;
  sectors: string[];
  /** Total output used for the model. */
  output: number[];
  outputSource: 'total output column' | 'total input row' | 'row sums';
  /** Σ_j z_ij + final demand_i; null when the table has no final-demand columns. */
  sales: number[] | null;
  /** Σ_i z_ij + value added_j + imports_j; null when the table has no value-added or import rows. */
  purchases: number[] | null;
  /** The total-input row as given, or null. */
  statedTotalInput: number[] | null;
  /** Relative gaps (a − b) / max(|a|, |b|) of sales against output, purchases against total input, total input against output. */
  rowGap: number[] | null;
  columnGap: number[] | null;
  totalGap: number[] | null;
  /** Sectors beyond the tolerance, worst first (at most 5 of each kind). */
  worst: { sector: string; kind: 'row' | 'column' | 'total'; gap: number }[];
  balanced: boolean;
}

export interface FinishOptions {
  name: string;
  tolerance: number;
  moneyUnit?: string;
}

function gap(a: number, b: number): number {
  const d = Math.max(Math.abs(a), Math.abs(b));
  return d === 0 ? 0 : (a - b) / d;
}

function pct(g: number): string {
  return `${g > 0 ? '+' : g < 0 ? '−' : ''}${Math.abs(g * 100).toFixed(Math.abs(g) < 0.01 ? 3 : 2)} %`;
}

/** A matrix-shaped table whose block reads as technical coefficients rather than flows. */
export function looksLikeCoefficients(raw: RawTable): boolean {
  if (/coefficient|per unit/i.test(raw.corner)) return true;
  const total = raw.columns.find((c) => c.role === 'totalOutput');
  if (!total) return false;
  const n = raw.sectors.length;
  let zSum = 0;
  for (let j = 0; j < n; j++) {
    let col = 0;
    for (let i = 0; i < n; i++) {
      const a = raw.Z[i * n + j]!;
      if (a < 0 || a > 1) return false;
      col += a;
    }
    if (col > 1) return false;
    zSum += col;
  }
  // An all-zero block is no evidence either way; read it as flows (as coefficients it would rescale the value-added rows).
  if (zSum === 0) return false;
  let xSum = 0;
  for (let i = 0; i < n; i++) xSum += total.values[i]!;
  // In a flow table intermediate flows are a large share of output (typically 30–65 %); 1 % would be implausible.
  return xSum > 100 * zSum;
}

/** Coefficients layout: z_ij = a_ij·x_j, and every extra row is per unit of output too. */
export function scaleCoefficients(raw: RawTable): void {
  const k = raw.columns.findIndex((c) => c.role === 'totalOutput');
  if (k < 0) throw new InputError('no-total-output', 'the coefficients layout needs a total output column', { file: raw.fileName });
  const x = raw.columns[k]!.values;
  const n = raw.sectors.length;
  for (let j = 0; j < n; j++) {
    const xj = x[j]!;
    const buys = (): boolean => {
      for (let i = 0; i < n; i++) if (raw.Z[i * n + j] !== 0) return true;
      return false;
    };
    if (xj < 0 || (xj === 0 && buys())) throw outputRefusal(raw.sectors[j]!, xj, raw.columnCellAt(k, j));
    for (let i = 0; i < n; i++) raw.Z[i * n + j] = raw.Z[i * n + j]! * xj;
    for (const row of raw.rows) row.values[j] = row.values[j]! * xj;
  }
}

function vectors(raw: RawTable, keep: number[], pick: (r: { role: string }) => boolean, from: 'rows' | 'columns'): LabelledVector[] {
  const list = from === 'rows' ? raw.rows : raw.columns;
  return list.filter(pick).map((v) => ({ label: v.label, values: Float64Array.from(keep, (j) => v.values[j]!) }));
}

export function finishTable(raw: RawTable, opts: FinishOptions, onBalance?: (b: BalanceReport) => void): IOTable {
  const file = raw.fileName;
  const n0 = raw.sectors.length;
  const Z0 = raw.Z;
  const warnings: Warning[] = [...raw.classified.warnings];
  const fdCols = raw.columns.filter((c) => c.role === 'householdConsumption' || c.role === 'otherFinalDemand');
  const vaRows = raw.rows.filter((r) => r.role === 'labourIncome' || r.role === 'otherValueAdded' || r.role === 'taxes' || r.role === 'imports');
  const totalColK = raw.columns.findIndex((c) => c.role === 'totalOutput');
  const totalRowK = raw.rows.findIndex((r) => r.role === 'totalInput');
  const empRows = raw.rows.filter((r) => r.role === 'employment');
  const fteRows = raw.rows.filter((r) => r.role === 'fte');
  const extraTotals = Math.max(0, raw.columns.filter((c) => c.role === 'totalOutput').length - 1) + Math.max(0, raw.rows.filter((r) => r.role === 'totalInput').length - 1);
  if (extraTotals > 0) warnings.push({ code: 'extra-total', message: 'more than one total row or column: the first of each is used, the others are not read', location: { file } });
  if (empRows.length > 1) warnings.push({ code: 'extra-employment', message: `more than one employment row: '${empRows[0]!.label}' is used`, location: { file, rowLabel: empRows[1]!.label } });
  if (fteRows.length > 1) warnings.push({ code: 'extra-employment', message: `more than one full-time-equivalents row: '${fteRows[0]!.label}' is used`, location: { file, rowLabel: fteRows[1]!.label } });

  // Row and column sums in the table as read.
  const zRow = new Float64Array(n0);
  const zCol = new Float64Array(n0);
  for (let i = 0; i < n0; i++) {
    let s = 0;
    const base = i * n0;
    for (let j = 0; j < n0; j++) {
      const v = Z0[base + j]!;
      s += v;
      zCol[j] = zCol[j]! + v;
    }
    zRow[i] = s;
  }
  const sales0 = Float64Array.from(zRow);
  for (const c of fdCols) for (let i = 0; i < n0; i++) sales0[i] = sales0[i]! + c.values[i]!;
  const purchases0 = Float64Array.from(zCol);
  for (const r of vaRows) for (let j = 0; j < n0; j++) purchases0[j] = purchases0[j]! + r.values[j]!;
  for (let i = 0; i < n0; i++) {
    if (!Number.isFinite(sales0[i]!)) {
      const at = raw.flowAt(i, 0);
      throw new InputError('overflow', 'the row sum overflows (numbers too large to add up)', { file, ...(at.line !== undefined ? { line: at.line } : {}), rowLabel: raw.sectors[i]! });
    }
    if (!Number.isFinite(purchases0[i]!)) {
      throw new InputError('overflow', 'the column sum overflows (numbers too large to add up)', { file, columnLabel: raw.sectors[i]! });
    }
  }

  let x0: Float64Array;
  let outputSource: BalanceReport['outputSource'];
  let xAt: (j: number) => Location;
  if (totalColK >= 0) {
    x0 = Float64Array.from(raw.columns[totalColK]!.values);
    outputSource = 'total output column';
    xAt = (j) => raw.columnCellAt(totalColK, j);
  } else if (totalRowK >= 0) {
    x0 = Float64Array.from(raw.rows[totalRowK]!.values);
    outputSource = 'total input row';
    xAt = (j) => raw.rowCellAt(totalRowK, j);
  } else {
    x0 = Float64Array.from(sales0);
    outputSource = 'row sums';
    xAt = (j) => ({ file, rowLabel: raw.sectors[j]! });
    warnings.push({ code: 'no-total', message: 'no total output column or total input row: total output is taken as each row’s sum of flows and final demand', location: { file } });
  }

  // Refusals over whole sectors.
  checkOutputs(x0, Z0, raw.sectors, xAt);
  const emp0 = empRows[0];
  if (emp0) {
    const k = raw.rows.indexOf(emp0);
    checkEmployment(emp0.values, (j) => raw.rowCellAt(k, j));
  }
  const fte0 = fteRows[0];
  if (fte0) {
    const k = raw.rows.indexOf(fte0);
    checkEmployment(fte0.values, (j) => raw.rowCellAt(k, j), 'full-time equivalents');
  }

  // Drop sectors with zero output that neither buy nor sell nor carry any other number.
  const keep: number[] = [];
  const dropped: string[] = [];
  for (let j = 0; j < n0; j++) {
    const empty = x0[j] === 0 && !zColNonZero(Z0, n0, j) && !zRowNonZero(Z0, n0, j) && raw.rows.every((r) => r.values[j] === 0) && raw.columns.every((c) => c.values[j] === 0);
    if (empty) dropped.push(raw.sectors[j]!);
    else keep.push(j);
  }
  if (dropped.length) {
    warnings.push({ code: 'sector-dropped', message: `dropped ${dropped.length} sector${dropped.length > 1 ? 's' : ''} with zero output and no purchases or sales: ${dropped.slice(0, 5).map((s) => `'${s}'`).join(', ')}${dropped.length > 5 ? ', …' : ''}`, location: { file, rowLabel: dropped[0]! } });
  }
  if (keep.length === 0) throw new InputError('no-sectors', 'every sector has zero output and no flows: there is nothing to model', { file });
  const n = keep.length;
  const sectors = keep.map((j) => raw.sectors[j]!);
  let Z: Float64Array;
  if (n === n0) Z = Z0;
  else {
    Z = new Float64Array(n * n);
    for (let a = 0; a < n; a++) for (let b = 0; b < n; b++) Z[a * n + b] = Z0[keep[a]! * n0 + keep[b]!]!;
  }
  const sub = (v: Float64Array): Float64Array => (n === n0 ? v : Float64Array.from(keep, (j) => v[j]!));
  const x = sub(x0);

  // Balance report.
  const tol = opts.tolerance;
  const sales = fdCols.length ? sub(sales0) : null;
  const purchases = vaRows.length ? sub(purchases0) : null;
  const stated = totalRowK >= 0 ? sub(raw.rows[totalRowK]!.values) : null;
  const rowGap = sales && outputSource !== 'row sums' ? Array.from(sales, (s, i) => gap(s, x[i]!)) : null;
  const inputRef = stated ?? x;
  const columnGap = purchases ? Array.from(purchases, (p, j) => gap(p, inputRef[j]!)) : null;
  const totalGap = stated && totalColK >= 0 ? Array.from(stated, (t, j) => gap(t, x[j]!)) : null;
  const worst: BalanceReport['worst'] = [];
  const describe = (gaps: number[] | null, kind: 'row' | 'column' | 'total', code: string, what: string): void => {
    if (!gaps) return;
    const bad = gaps.map((g, i) => ({ sector: sectors[i]!, kind, gap: g })).filter((e) => Math.abs(e.gap) > tol);
    if (!bad.length) return;
    bad.sort((a, b) => Math.abs(b.gap) - Math.abs(a.gap));
    const top = bad.slice(0, 5);
    worst.push(...top);
    const list = top.map((e) => `'${e.sector}' ${pct(e.gap)}`).join(', ');
    const loc: Location = kind === 'row' ? { file, rowLabel: top[0]!.sector } : { file, columnLabel: top[0]!.sector };
    warnings.push({ code, message: `${what} beyond ${Number((tol * 100).toPrecision(3))} % in ${bad.length} sector${bad.length > 1 ? 's' : ''}; worst: ${list}`, location: loc });
  };
  describe(rowGap, 'row', 'row-total-mismatch', 'sales (intermediate flows plus final demand) differ from total output');
  describe(columnGap, 'column', 'column-total-mismatch', `purchases (intermediate inputs, value added and imports) differ from ${stated ? 'total input' : 'total output'}`);
  describe(totalGap, 'total', 'total-input-output-mismatch', 'total input differs from total output');
  const report: BalanceReport = {
    tolerance: tol,
    sectors,
    output: Array.from(x),
    outputSource,
    sales: sales ? Array.from(sales) : null,
    purchases: purchases ? Array.from(purchases) : null,
    statedTotalInput: stated ? Array.from(stated) : null,
    rowGap,
    columnGap,
    totalGap,
    worst,
    balanced: worst.length === 0,
  };
  onBalance?.(report);

  // Intermediate inputs above output: imported; value added is negative there. The table may still be productive
  // (a column sum of A above 1 does not make ρ(A) ≥ 1): the analysis decides that, and names each sector's value added.
  const over = keep.filter((j) => zCol[j]! > x0[j]!).map((j) => raw.sectors[j]!);
  if (over.length) {
    warnings.push({ code: 'inputs-exceed-output', message: `intermediate inputs exceed output in ${over.slice(0, 5).map((s) => `'${s}'`).join(', ')}${over.length > 5 ? ', …' : ''}: value added there is negative (the analysis lists each such sector with its value added)`, location: { file, columnLabel: over[0]! } });
  }
  for (const s of [...sectors, ...raw.rows.map((r) => r.label), ...raw.columns.map((c) => c.label)]) {
    if (s.includes('\ufffd')) {
      warnings.push({ code: 'encoding', message: `label '${s}' holds characters that were not valid UTF-8: save the file as UTF-8`, location: { file } });
      break;
    }
  }

  const taxes = vectors(raw, keep, (r) => r.role === 'taxes', 'rows');
  const table: IOTable = {
    name: opts.name,
    sectors,
    n,
    Z,
    x,
    labourIncome: vectors(raw, keep, (r) => r.role === 'labourIncome', 'rows'),
    otherValueAdded: vectors(raw, keep, (r) => r.role === 'otherValueAdded', 'rows'),
    // Taxes and FTE only when the table has them, so tables without them look as they always did.
    ...(taxes.length ? { taxes } : {}),
    imports: vectors(raw, keep, (r) => r.role === 'imports', 'rows'),
    employment: emp0 ? sub(emp0.values) : null,
    ...(fte0 ? { fte: sub(fte0.values) } : {}),
    householdConsumption: vectors(raw, keep, (c) => c.role === 'householdConsumption', 'columns'),
    otherFinalDemand: vectors(raw, keep, (c) => c.role === 'otherFinalDemand', 'columns'),
    moneyUnit: opts.moneyUnit ?? (raw.corner !== '' ? raw.corner : 'money units'),
    layout: raw.layout,
    roles: raw.classified.roles,
    warnings,
  };
  if (raw.finalDemandIncome.length) {
    table.householdIncomeFromFinalDemand = raw.finalDemandIncome.map(({ row, column, value }): FinalDemandIncome => ({ row, column, value }));
    warnings.push(finalDemandIncomeWarning(table, raw.finalDemandIncome));
  }
  checkTotals(table, file);
  return table;
}

/**
 * Labour income under final-demand columns is read, not dropped: in the household-closed model total household
 * income includes what final-demand sectors (government, households' own staff) pay households (Miller & Blair,
 * Input–Output Analysis, 2nd ed. 2009, §2.5 "closing the model with respect to households" — recalled from memory).
 * Said in a warning because it lowers consumption per unit of income, and so the induced effects.
 */
function finalDemandIncomeWarning(t: IOTable, cells: RawTable['finalDemandIncome']): Warning {
  let fromSectors = 0;
  for (const v of t.labourIncome) for (const a of v.values) fromSectors += a;
  let fromDemand = 0;
  for (const c of cells) fromDemand += c.value;
  const shown = cells.slice(0, 3).map((c) => `${showNumber(c.value)} from '${c.column}' (row '${c.row}')`).join(', ') + (cells.length > 3 ? ', …' : '');
  const total = fromSectors + fromDemand;
  const share = total !== 0 ? ` (${((fromDemand / total) * 100).toFixed(1)} % of ${showNumber(total)})` : '';
  return {
    code: 'final-demand-income',
    message:
      `labour income paid by final-demand columns was read into total household income: ${shown}${share}. ` +
      'In the household-closed model this income lowers household consumption per unit of income, and so the induced effects (Miller & Blair 2009, §2.5)',
    location: cells[0]!.at,
  };
}

function zColNonZero(Z: Float64Array, n: number, j: number): boolean {
  for (let i = 0; i < n; i++) if (Z[i * n + j] !== 0) return true;
  return false;
}

function zRowNonZero(Z: Float64Array, n: number, i: number): boolean {
  for (let j = 0; j < n; j++) if (Z[i * n + j] !== 0) return true;
  return false;
}
