/**
 * Roles of the supply table's columns that are not industries (imports, margins, taxes on products, totals), read
 * from their words (national-accounts terms, SNA 2008 ch. 14 — recalled from memory) or from the role map, and the
 * role map of a supply and use pair (`--map`).
 */
import { z } from '../schema/index.ts';
import { InputError, type Location } from '../diagnostics/index.ts';
import { COLUMN_ROLES, normaliseLabel, ROW_ROLES, type ColumnRole, type RowRole } from '../table/index.ts';
import { SUPPLY_COLUMN_ROLES, type SupplyColumnRole, type SutRoleMap } from './types.ts';

/** A total or subtotal by its words ("Total supply at basic prices", "Subtotal"). */
export function namesTotal(label: string): boolean {
  return /^(sub)?total\b/.test(normaliseLabel(label));
}

/**
 * The role of a supply-table column that is not an industry, by its words: taxes ("Taxes less subsidies on
 * products"), margins ("Trade and transport margins"), imports ("Imports cif"), totals; null when the words say none.
 */
export function suggestSupplyRole(label: string): SupplyColumnRole | null {
  const key = normaliseLabel(label);
  if (/^(sub)?total\b/.test(key)) return 'total';
  if (/\btax(es|ation)?\b/.test(key)) return 'productTaxes';
  if (/\bmargins?\b/.test(key)) return 'margins';
  if (key.includes('import')) return 'imports';
  return null;
}

/** Built on first use (see src/project/schema.ts: a run that reads no role map never needs zod). */
function mapSchema() {
  return z
    .object({
      rows: z.record(z.string(), z.enum(ROW_ROLES as [RowRole, ...RowRole[]])).optional(),
      columns: z.record(z.string(), z.enum(COLUMN_ROLES as [ColumnRole, ...ColumnRole[]])).optional(),
      supply: z.record(z.string(), z.enum(SUPPLY_COLUMN_ROLES as [SupplyColumnRole, ...SupplyColumnRole[]])).optional(),
    })
    .strict();
}

/** Line and column of the first occurrence of a JSON key in the text (for messages). */
function keyLocation(text: string, key: string | undefined, file: string): Location {
  if (key === undefined) return { file };
  const at = text.indexOf(JSON.stringify(key));
  if (at < 0) return { file };
  const before = text.slice(0, at);
  return { file, line: before.split('\n').length, column: at - before.lastIndexOf('\n') };
}

/**
 * Read the role map of a supply and use pair: `{"rows": {"Operating surplus": "otherValueAdded"}, "columns":
 * {"Visitors": "otherFinalDemand"}, "supply": {"CIF/FOB adjustment": "ignore"}}` — rows and columns of the use table
 * as in a table's role map, and supply-table columns that are not industries (imports, margins, productTaxes, total,
 * ignore; for supply rows that are not products: ignore or total).
 */
export function parseSutRoleMap(text: string, fileName: string): SutRoleMap {
  let data: unknown;
  try {
    data = JSON.parse(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text);
  } catch (e) {
    const m = /position (\d+)/.exec(e instanceof Error ? e.message : '');
    const before = m ? text.slice(0, Number(m[1])) : '';
    throw new InputError('role-map-json', 'the role map is not valid JSON', m ? { file: fileName, line: before.split('\n').length, column: Number(m[1]) - before.lastIndexOf('\n') } : { file: fileName });
  }
  const res = mapSchema().safeParse(data);
  if (!res.success) {
    const issue = res.error.issues[0]!;
    const path = issue.path.map(String);
    const roles = path[0] === 'rows' ? ROW_ROLES : path[0] === 'columns' ? COLUMN_ROLES : SUPPLY_COLUMN_ROLES;
    const what = path[0] === 'supply' ? 'supply-table' : path[0] === 'rows' ? 'use-table row' : 'use-table column';
    const message = issue.code === 'invalid_value'
      ? `unknown ${what} role for '${path[1]}': use one of ${roles.join(', ')}`
      : issue.code === 'unrecognized_keys'
        ? `unknown key ${issue.keys.map((k) => `'${k}'`).join(', ')}: a supply and use role map has only "rows", "columns" (use table) and "supply"`
        : `${path.length ? `'${path.join('.')}': ` : ''}${issue.message}`;
    const key = issue.code === 'unrecognized_keys' ? issue.keys[0] : path[path.length - 1];
    throw new InputError('role-map-schema', message, keyLocation(text, key, fileName));
  }
  const out: SutRoleMap = {};
  if (res.data.rows) out.rows = res.data.rows;
  if (res.data.columns) out.columns = res.data.columns;
  if (res.data.supply) out.supply = res.data.supply;
  return out;
}
