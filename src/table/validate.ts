/**
 * The importer's whole-table checks, on an IOTable however it was made: `validateTable` applies them to a table that
 * did not come through `importTable` (a project file's stored table), and finish.ts applies the shared ones to every
 * import. Refusals are InputErrors located by row and column label (there is no file line for a stored table).
 */
import { InputError, type Location } from '../diagnostics/index.ts';
import { showNumber } from './numbers.ts';
import { cleanLabel, matchKey } from './labels.ts';
import type { IOTable, LabelledVector } from './types.ts';

export function outputRefusal(sector: string, x: number, where: Location): InputError {
  return x < 0
    ? new InputError('output-not-positive', `sector '${sector}' has negative output ${showNumber(x)}`, where)
    : new InputError('output-not-positive', `sector '${sector}' has zero output but buys intermediate inputs`, where);
}

function buys(Z: Float64Array, n: number, j: number): boolean {
  for (let i = 0; i < n; i++) if (Z[i * n + j] !== 0) return true;
  return false;
}

/** Refuse negative output, and zero output in a sector that buys inputs (its coefficients would divide by zero). */
export function checkOutputs(x: Float64Array, Z: Float64Array, sectors: readonly string[], at: (j: number) => Location): void {
  const n = sectors.length;
  for (let j = 0; j < n; j++) {
    const xj = x[j]!;
    if (xj < 0 || (xj === 0 && buys(Z, n, j))) throw outputRefusal(sectors[j]!, xj, at(j));
  }
}

export function checkEmployment(e: Float64Array, at: (j: number) => Location, what: 'jobs' | 'full-time equivalents' = 'jobs'): void {
  for (let j = 0; j < e.length; j++) if (e[j]! < 0) throw new InputError('negative-employment', `negative employment ${showNumber(e[j]!)} (${what} cannot be negative)`, at(j));
}

/** The value-added and import rows that are money, taxes included (they count in a sector's purchases). */
export function moneyRows(t: IOTable): LabelledVector[] {
  return [...t.labourIncome, ...t.otherValueAdded, ...(t.taxes ?? []), ...t.imports];
}

function sum(v: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < v.length; i++) s += v[i]!;
  return s;
}

/**
 * Refuse totals that overflow: every total a report or screen shows (total output, each value-added row, each
 * final-demand column, jobs, total household income) must be a finite number, or it would be shown as "—".
 */
export function checkTotals(t: IOTable, file: string): void {
  const overflow = (what: string, loc: Location): InputError => new InputError('overflow', `${what} overflows (numbers too large to add up)`, { file, ...loc });
  if (!Number.isFinite(sum(t.x))) throw overflow('the total of all sectors’ output', { columnLabel: 'Total output' });
  for (const v of moneyRows(t)) if (!Number.isFinite(sum(v.values))) throw overflow('the row total', { rowLabel: v.label });
  for (const v of [...t.householdConsumption, ...t.otherFinalDemand]) if (!Number.isFinite(sum(v.values))) throw overflow('the column total', { columnLabel: v.label });
  if (t.employment && !Number.isFinite(sum(t.employment))) throw overflow('the total of jobs', { rowLabel: 'Employment' });
  if (t.fte && !Number.isFinite(sum(t.fte))) throw overflow('the total of full-time equivalents', { rowLabel: 'Full-time equivalents' });
  const income = sum(t.labourIncome.map((v) => sum(v.values))) + sum((t.householdIncomeFromFinalDemand ?? []).map((c) => c.value));
  if (!Number.isFinite(income)) throw overflow('total household income', { rowLabel: t.labourIncome[0]?.label ?? 'Labour income' });
}

/** Sector rows' sales (flows and final demand) and columns' purchases (flows, value added, imports) must add up. */
export function checkSums(t: IOTable, file: string): void {
  const { n, Z, sectors } = t;
  for (let i = 0; i < n; i++) {
    let sales = 0;
    let purchases = 0;
    for (let j = 0; j < n; j++) {
      sales += Z[i * n + j]!;
      purchases += Z[j * n + i]!;
    }
    for (const v of [...t.householdConsumption, ...t.otherFinalDemand]) sales += v.values[i]!;
    for (const v of moneyRows(t)) purchases += v.values[i]!;
    if (!Number.isFinite(sales)) throw new InputError('overflow', 'the row sum overflows (numbers too large to add up)', { file, rowLabel: sectors[i]! });
    if (!Number.isFinite(purchases)) throw new InputError('overflow', 'the column sum overflows (numbers too large to add up)', { file, columnLabel: sectors[i]! });
  }
}

export interface ValidateOptions {
  /** Accept negative intermediate flows (as the import option of the same name). */
  allowNegative?: boolean;
}

function shape(what: string, expected: number, found: number, file: string, loc: Location = {}): void {
  if (expected !== found) throw new InputError('table-shape', `${what}: expected ${expected} values, found ${found}`, { file, ...loc });
}

function notFinite(v: number, loc: Location): InputError {
  return new InputError('not-finite', `${showNumber(v)} is not a finite number`, loc);
}

/**
 * Apply the importer's validations to a table that did not come through the importer. Throws an InputError on the
 * first problem: shape, labels that are empty or differ only in case, spacing or Unicode form (they would be one label
 * when read back), a non-finite number, a negative flow (unless allowed), negative output or zero output that buys
 * inputs, negative jobs, or sums and totals that overflow.
 */
export function validateTable(t: IOTable, fileName: string, opts: ValidateOptions = {}): void {
  const file = fileName;
  const n = t.sectors.length;
  shape('number of sectors', n, t.n, file);
  shape('intermediate flows', n * n, t.Z.length, file);
  shape('total output', n, t.x.length, file);
  const vectors: [LabelledVector, 'row' | 'column'][] = [
    ...moneyRows(t).map((v): [LabelledVector, 'row'] => [v, 'row']),
    ...[...t.householdConsumption, ...t.otherFinalDemand].map((v): [LabelledVector, 'column'] => [v, 'column']),
  ];
  for (const [v, axis] of vectors) shape(`${axis} '${v.label}'`, n, v.values.length, file, axis === 'row' ? { rowLabel: v.label } : { columnLabel: v.label });
  if (t.employment) shape('employment', n, t.employment.length, file, { rowLabel: 'Employment' });
  if (t.fte) shape('full-time equivalents', n, t.fte.length, file, { rowLabel: 'Full-time equivalents' });

  // Labels: a row or column label is read back by its cleaned, case-blind key, so two that share a key are one.
  const axis = (labels: string[], kind: 'row' | 'column'): void => {
    const seen = new Map<string, string>();
    for (const l of labels) {
      const loc: Location = kind === 'row' ? { file, rowLabel: l } : { file, columnLabel: l };
      if (cleanLabel(l) === '') throw new InputError('missing-label', `a ${kind} label is empty`, loc);
      const before = seen.get(matchKey(l));
      if (before !== undefined) {
        throw new InputError('duplicate-label', `${kind} labels '${before}' and '${l}' differ only in case, spacing or invisible characters, so they would be read as one`, loc);
      }
      seen.set(matchKey(l), l);
    }
  };
  axis([...t.sectors, ...moneyRows(t).map((v) => v.label)], 'row');
  axis([...t.sectors, ...t.householdConsumption.map((v) => v.label), ...t.otherFinalDemand.map((v) => v.label)], 'column');

  const { Z, x, sectors } = t;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const v = Z[i * n + j]!;
      const loc = { file, rowLabel: sectors[i]!, columnLabel: sectors[j]! };
      if (!Number.isFinite(v)) throw notFinite(v, loc);
      if (v < 0 && !opts.allowNegative) throw new InputError('negative-flow', `negative intermediate flow ${showNumber(v)} (allow negative flows to accept it)`, loc);
    }
  }
  for (let j = 0; j < n; j++) if (!Number.isFinite(x[j]!)) throw notFinite(x[j]!, { file, rowLabel: sectors[j]!, columnLabel: 'Total output' });
  for (const [v, kind] of vectors) {
    v.values.forEach((a, j) => {
      if (!Number.isFinite(a)) throw notFinite(a, kind === 'row' ? { file, rowLabel: v.label, columnLabel: sectors[j]! } : { file, rowLabel: sectors[j]!, columnLabel: v.label });
    });
  }
  if (t.employment) t.employment.forEach((e, j) => { if (!Number.isFinite(e)) throw notFinite(e, { file, rowLabel: 'Employment', columnLabel: sectors[j]! }); });
  if (t.fte) t.fte.forEach((e, j) => { if (!Number.isFinite(e)) throw notFinite(e, { file, rowLabel: 'Full-time equivalents', columnLabel: sectors[j]! }); });
  const labourRows = new Set(t.labourIncome.map((v) => matchKey(v.label)));
  const demandColumns = new Set([...t.householdConsumption, ...t.otherFinalDemand].map((v) => matchKey(v.label)));
  for (const c of t.householdIncomeFromFinalDemand ?? []) {
    const loc = { file, rowLabel: c.row, columnLabel: c.column };
    if (!labourRows.has(matchKey(c.row)) || !demandColumns.has(matchKey(c.column))) {
      throw new InputError('table-shape', 'labour income paid by a final-demand column names a row that is not a labour-income row or a column that is not final demand', loc);
    }
    if (!Number.isFinite(c.value)) throw notFinite(c.value, loc);
  }

  checkOutputs(x, Z, sectors, (j) => ({ file, rowLabel: sectors[j]!, columnLabel: 'Total output' }));
  if (t.employment) checkEmployment(t.employment, (j) => ({ file, rowLabel: 'Employment', columnLabel: sectors[j]! }));
  if (t.fte) checkEmployment(t.fte, (j) => ({ file, rowLabel: 'Full-time equivalents', columnLabel: sectors[j]! }), 'full-time equivalents');
  checkSums(t, file);
  checkTotals(t, file);
}
