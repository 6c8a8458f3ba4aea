/**
 * Role suggestions from labels, and the role-map file (`--map map.json`, the UI's role editor, saved projects).
 * Labels are compared as cleaned (labels.ts), case-insensitively, with a trailing remark in parentheses ignored
 * ("Employment (jobs)" is "employment").
 */
import { z } from '../schema/index.ts';
import { InputError, type Location } from '../diagnostics/index.ts';
import type { ColumnRole, RoleMap, RowRole } from './types.ts';
import { cleanLabel } from './labels.ts';

export const ROW_ROLES: readonly RowRole[] = ['labourIncome', 'otherValueAdded', 'taxes', 'imports', 'employment', 'fte', 'totalInput', 'ignore'];
export const COLUMN_ROLES: readonly ColumnRole[] = ['householdConsumption', 'otherFinalDemand', 'totalOutput', 'ignore'];

/**
 * Recognised row labels (after normalising). Any label naming a tax (the word "tax", "taxes" or "taxation") is a
 * taxes row, even when it also names imports ("Taxes on production and imports", "Taxes less subsidies", "Net taxes
 * on products": national-accounts terms, SNA 2008 ch. 7 — recalled from memory); any other label containing "import"
 * is an import row.
 */
export const ROW_LABELS: Readonly<Record<'labourIncome' | 'employment' | 'fte' | 'totalInput', readonly string[]>> = {
  labourIncome: ['labor income', 'labour income', 'compensation of employees', 'wages and salaries', 'household income', 'households', 'employee compensation', 'wages', 'labor compensation', 'labour compensation'],
  employment: ['employment', 'jobs'],
  fte: ['full-time equivalents', 'full-time equivalent', 'full time equivalents', 'full time equivalent', 'fte', 'ftes', 'fte jobs', 'full-time equivalent jobs', 'full-time equivalent employment', 'employment in full-time equivalents'],
  totalInput: ['total input', 'total inputs', 'total outlays', 'total outlay', 'total'],
};

/**
 * Recognised column labels (after normalising). An "Imports" column (imports entered as negative final demand) is
 * other final demand, recognised so that it never pairs with the Imports row as a sector.
 */
export const COLUMN_LABELS: Readonly<Record<'householdConsumption' | 'totalOutput' | 'otherFinalDemand', readonly string[]>> = {
  householdConsumption: ['households', 'household consumption', 'personal consumption', 'household', 'personal consumption expenditures', 'private consumption'],
  totalOutput: ['total output', 'total outputs', 'gross output', 'total'],
  otherFinalDemand: ['imports', 'imports of goods and services', 'competitive imports'],
};

/**
 * Usual labels of other value-added rows and other final-demand columns. Knowing them does not change any role (the
 * fallback roles are these already) and does not stop a label being a sector; it only keeps the "row and column left
 * unmatched" warning for labels that may be a misspelt sector. National-accounts terms (SNA 2008 ch. 7 and 9 —
 * recalled from memory) and the usual input–output table headings.
 */
export const KNOWN_LABELS: Readonly<{ rows: readonly string[]; columns: readonly string[] }> = {
  rows: [
    'other value added', 'value added', 'gross value added', 'gross operating surplus', 'operating surplus', 'net operating surplus',
    'mixed income', 'gross mixed income', 'taxes on production', 'other taxes on production', 'taxes on production and imports',
    'taxes on production and imports, less subsidies', 'taxes less subsidies', 'taxes less subsidies on products',
    'taxes less subsidies on production', 'net taxes on production', 'taxes on products', 'net taxes on products',
    'subsidies', 'other subsidies on production', 'consumption of fixed capital', 'depreciation', 'capital consumption',
    'indirect business taxes', 'indirect taxes', 'business taxes', 'property income', 'property-type income',
    'other property type income', 'other property income', "proprietors' income", 'proprietors income', 'profits',
    'gross profits', 'surplus', 'value added taxes', 'other', 'others',
  ],
  columns: [
    'other final demand', 'final demand', 'exports', 'export', 'exports of goods and services', 'foreign exports',
    'domestic exports', 'government', 'government consumption', 'government expenditure', 'government final consumption',
    'general government', 'federal government', 'state and local government', 'local government', 'investment',
    'private investment', 'gross private fixed investment', 'gross fixed capital formation', 'gross capital formation',
    'capital formation', 'changes in inventories', 'change in inventories', 'inventory change', 'inventory changes',
    'change in private inventories', 'net exports', 'npish', 'non-profit institutions', 'visitors', 'tourism',
    'visitor spending', 'other', 'others',
  ],
};

/** Cleaned, lower case, a trailing "(…)" remark dropped. */
export function normaliseLabel(label: string): string {
  return cleanLabel(label)
    .toLowerCase()
    .replace(/\s*\([^()]*\)\s*$/, '')
    .trim();
}

/** Other subtotals ("Total value added", "Subtotal intermediate") would double-count, so they are ignored. */
function isSubtotal(key: string): boolean {
  return /^(sub)?total\b/.test(key);
}

export interface Suggestion<R> {
  role: R;
  /** True when the label is one of the recognised labels; false when the role is the fallback. */
  recognised: boolean;
}

/** True when a label is recognised or one of the usual value-added (rows) or final-demand (columns) labels. */
export function isKnownLabel(label: string, axis: 'row' | 'column'): boolean {
  if ((axis === 'row' ? suggestRowRole(label) : suggestColumnRole(label)).recognised) return true;
  return KNOWN_LABELS[axis === 'row' ? 'rows' : 'columns'].includes(normaliseLabel(label));
}

/** A label naming a tax: "tax", "taxes" or "taxation" as a word ("Taxi services" is not one). */
export function namesTax(key: string): boolean {
  return /\btax(es|ation)?\b/.test(key);
}

export function suggestRowRole(label: string): Suggestion<RowRole> {
  const key = normaliseLabel(label);
  if (namesTax(key)) return { role: 'taxes', recognised: true };
  if (key.includes('import')) return { role: 'imports', recognised: true };
  if (ROW_LABELS.labourIncome.includes(key)) return { role: 'labourIncome', recognised: true };
  if (ROW_LABELS.employment.includes(key)) return { role: 'employment', recognised: true };
  if (ROW_LABELS.fte.includes(key)) return { role: 'fte', recognised: true };
  if (ROW_LABELS.totalInput.includes(key)) return { role: 'totalInput', recognised: true };
  if (isSubtotal(key)) return { role: 'ignore', recognised: true };
  return { role: 'otherValueAdded', recognised: false };
}

export function suggestColumnRole(label: string): Suggestion<ColumnRole> {
  const key = normaliseLabel(label);
  if (COLUMN_LABELS.householdConsumption.includes(key)) return { role: 'householdConsumption', recognised: true };
  if (COLUMN_LABELS.totalOutput.includes(key)) return { role: 'totalOutput', recognised: true };
  if (COLUMN_LABELS.otherFinalDemand.includes(key)) return { role: 'otherFinalDemand', recognised: true };
  if (isSubtotal(key)) return { role: 'ignore', recognised: true };
  return { role: 'otherFinalDemand', recognised: false };
}

/** Suggested roles for the given non-sector row and column labels. */
export function suggestRoles(rowLabels: readonly string[], columnLabels: readonly string[]): RoleMap {
  const rows: Record<string, RowRole> = {};
  const columns: Record<string, ColumnRole> = {};
  for (const l of rowLabels) rows[l] = suggestRowRole(l).role;
  for (const l of columnLabels) columns[l] = suggestColumnRole(l).role;
  return { rows, columns };
}

/** Built on first use (see src/project/schema.ts: a run that reads no role map never needs zod). */
function roleMapSchema() {
  return z
    .object({
      rows: z.record(z.string(), z.enum(ROW_ROLES as [RowRole, ...RowRole[]])).optional(),
      columns: z.record(z.string(), z.enum(COLUMN_ROLES as [ColumnRole, ...ColumnRole[]])).optional(),
      sectors: z.array(z.string()).optional(),
    })
    .strict();
}

/** Where a key first appears in the JSON text (for messages). */
function locateKey(text: string, key: string | number | undefined, fileName: string): Location {
  if (key === undefined) return { file: fileName };
  const at = text.indexOf(JSON.stringify(String(key)));
  if (at < 0) return { file: fileName };
  const before = text.slice(0, at);
  const line = before.split('\n').length;
  return { file: fileName, line, column: at - before.lastIndexOf('\n') };
}

function jsonErrorLocation(text: string, err: unknown, fileName: string): Location {
  const msg = err instanceof Error ? err.message : '';
  const lc = /line (\d+) column (\d+)/.exec(msg);
  if (lc) return { file: fileName, line: Number(lc[1]), column: Number(lc[2]) };
  const pos = /position (\d+)/.exec(msg);
  if (pos) {
    const before = text.slice(0, Number(pos[1]));
    return { file: fileName, line: before.split('\n').length, column: Number(pos[1]) - before.lastIndexOf('\n') };
  }
  return { file: fileName };
}

/**
 * Read a role map: `{"rows": {"Wages": "labourIncome", …}, "columns": {"Visitors": "otherFinalDemand", …},
 * "sectors": ["Import services"]}`.
 * Row roles: labourIncome, otherValueAdded, taxes, imports, employment, fte, totalInput, ignore.
 * Column roles: householdConsumption, otherFinalDemand, totalOutput, ignore.
 * Sectors: labels that are sectors whatever their words (found as a row and as a column).
 */
export function parseRoleMap(text: string, fileName: string): Partial<RoleMap> {
  let data: unknown;
  try {
    data = JSON.parse(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text);
  } catch (e) {
    throw new InputError('role-map-json', 'the role map is not valid JSON', jsonErrorLocation(text, e, fileName));
  }
  const res = roleMapSchema().safeParse(data);
  if (!res.success) {
    const issue = res.error.issues[0]!;
    const path = issue.path.map(String);
    const where = path.join('.');
    let message: string;
    if (issue.code === 'invalid_value' && path[0] === 'rows') message = `unknown row role for '${path[1]}': use one of ${ROW_ROLES.join(', ')}`;
    else if (issue.code === 'invalid_value' && path[0] === 'columns') message = `unknown column role for '${path[1]}': use one of ${COLUMN_ROLES.join(', ')}`;
    else if (issue.code === 'unrecognized_keys') message = `unknown key ${issue.keys.map((k) => `'${k}'`).join(', ')}: a role map has only "rows", "columns" and "sectors"`;
    else message = `${where ? `'${where}': ` : ''}${issue.message}`;
    const key = issue.code === 'unrecognized_keys' ? issue.keys[0] : path[path.length - 1];
    throw new InputError('role-map-schema', message, locateKey(text, key, fileName));
  }
  const out: Partial<RoleMap> = {};
  if (res.data.rows) out.rows = res.data.rows;
  if (res.data.columns) out.columns = res.data.columns;
  if (res.data.sectors) out.sectors = res.data.sectors;
  return out;
}
