// Role suggestions: every label the role rules list (ROW_LABELS, COLUMN_LABELS) must be recognised, case-insensitively; and the
// role-map file (`--map map.json`) is validated with located messages.
import { describe, it, expect } from 'vitest';
import { importTable, parseRoleMap, previewTable, suggestColumnRole, suggestRoles, suggestRowRole } from '../../../src/table/index.ts';
import { InputError } from '../../../src/diagnostics/index.ts';
import { BASE, replaceOnce } from './helpers.ts';

const variants = (l: string): string[] => [l, l.toLowerCase(), l.toUpperCase(), `  ${l}  `];

describe('suggested row roles', () => {
  const cases: [string, string][] = [
    ['Labor income', 'labourIncome'],
    ['Labour income', 'labourIncome'],
    ['Compensation of employees', 'labourIncome'],
    ['Wages and salaries', 'labourIncome'],
    ['Household income', 'labourIncome'],
    ['Wages', 'labourIncome'],
    ['Labour compensation', 'labourIncome'],
    ['Imports', 'imports'],
    ['Imported intermediate inputs', 'imports'],
    ['Competitive imports from other regions', 'imports'],
    ['Employment', 'employment'],
    ['Jobs', 'employment'],
    ['Employment (jobs)', 'employment'],
    ['Total input', 'totalInput'],
    ['Total inputs', 'totalInput'],
    ['Total outlays', 'totalInput'],
    ['Total', 'totalInput'],
    ['Gross operating surplus', 'otherValueAdded'],
    // Taxes less subsidies are part of value added in national accounts, with a role of their own (SNA 2008 ch. 7 —
    // recalled from memory); a label naming a tax is a taxes row even when it also names imports.
    ['Taxes on production', 'taxes'],
    ['Taxes on production and imports', 'taxes'],
    ['Taxes less subsidies', 'taxes'],
    ['Net taxes on products', 'taxes'],
    ['Taxes less subsidies on products and imports', 'taxes'],
    ['Taxi services', 'otherValueAdded'],
    ['Full-time equivalents', 'fte'],
    ['FTE', 'fte'],
    ['Total value added', 'ignore'],
  ];
  for (const [label, role] of cases) {
    it(`'${label}' → ${role}`, () => {
      for (const v of variants(label)) expect(suggestRowRole(v).role).toBe(role);
    });
  }
});

describe('suggested column roles', () => {
  const cases: [string, string][] = [
    ['Households', 'householdConsumption'],
    ['Household consumption', 'householdConsumption'],
    ['Personal consumption', 'householdConsumption'],
    ['Total output', 'totalOutput'],
    ['Total', 'totalOutput'],
    ['Exports', 'otherFinalDemand'],
    ['Government', 'otherFinalDemand'],
    ['Investment', 'otherFinalDemand'],
    ['Total final demand', 'ignore'],
  ];
  for (const [label, role] of cases) {
    it(`'${label}' → ${role}`, () => {
      for (const v of variants(label)) expect(suggestColumnRole(v).role).toBe(role);
    });
  }
});

describe('role map in use', () => {
  it('suggestRoles maps every label', () => {
    expect(suggestRoles(['Wages and salaries', 'Taxes'], ['Visitors', 'TOTAL'])).toEqual({
      rows: { 'Wages and salaries': 'labourIncome', Taxes: 'taxes' },
      columns: { Visitors: 'otherFinalDemand', TOTAL: 'totalOutput' },
    });
  });
  it('"Total" as both a row and a column is not a sector', () => {
    const text = BASE.replace('Total output', 'Total').replace('Total input', 'Total');
    const t = importTable(text, { fileName: 't.csv' });
    expect(t.sectors).toEqual(['Farming', 'Mills', 'Services']);
    expect(t.roles.rows['Total']).toBe('totalInput');
    expect(t.roles.columns['Total']).toBe('totalOutput');
  });
  it('overrides replace suggestions, and the preview shows both', () => {
    const text = replaceOnce(BASE, 'Other value added', 'Proprietors');
    const roles = { rows: { Proprietors: 'labourIncome' as const }, columns: { Exports: 'ignore' as const } };
    const p = previewTable(text, { fileName: 't.csv', roles });
    expect(p.ok).toBe(true);
    const row = p.rows.find((r) => r.label === 'Proprietors')!;
    expect(row).toEqual({ label: 'Proprietors', role: 'labourIncome', suggested: 'otherValueAdded', location: { file: 't.csv', line: 6, column: 1 } });
    expect(p.columns.find((c) => c.label === 'Exports')?.role).toBe('ignore');
    const t = p.table!;
    expect(t.labourIncome.map((v) => v.label)).toEqual(['Compensation of employees', 'Proprietors']);
    expect(t.otherFinalDemand).toEqual([]);
  });
  it('warns about role-map labels the table does not have', () => {
    const t = importTable(BASE, { fileName: 't.csv', roles: { rows: { Wagez: 'labourIncome' } } });
    expect(t.warnings.map((w) => w.message)).toContain("the role map names labels the table does not have: row 'Wagez'");
  });
});

describe('parseRoleMap', () => {
  function refusal(text: string): InputError {
    try {
      parseRoleMap(text, 'map.json');
    } catch (e) {
      if (e instanceof InputError) return e;
      throw e;
    }
    throw new Error('expected a refusal');
  }
  it('reads a valid map', () => {
    expect(parseRoleMap('{"rows": {"Wages": "labourIncome"}, "columns": {"Visitors": "otherFinalDemand"}}', 'map.json')).toEqual({
      rows: { Wages: 'labourIncome' },
      columns: { Visitors: 'otherFinalDemand' },
    });
    expect(parseRoleMap('\ufeff{}', 'map.json')).toEqual({});
  });
  it('refuses invalid JSON with its position', () => {
    const e = refusal('{\n  "rows": {"Wages": "labourIncome",}\n}');
    expect(e.code).toBe('role-map-json');
    expect(e.message).toBe('the role map is not valid JSON');
    expect(e.location.file).toBe('map.json');
    expect(e.location.line).toBe(2);
  });
  it('refuses an unknown row role, naming the label and its line', () => {
    const e = refusal('{\n  "rows": {\n    "Wages": "wages"\n  }\n}');
    expect(e.code).toBe('role-map-schema');
    expect(e.message).toBe("unknown row role for 'Wages': use one of labourIncome, otherValueAdded, taxes, imports, employment, fte, totalInput, ignore");
    expect(e.location).toEqual({ file: 'map.json', line: 3, column: 5 });
  });
  it('refuses an unknown column role', () => {
    const e = refusal('{"columns": {"Visitors": "exports"}}');
    expect(e.message).toBe("unknown column role for 'Visitors': use one of householdConsumption, otherFinalDemand, totalOutput, ignore");
    expect(e.location).toEqual({ file: 'map.json', line: 1, column: 14 });
  });
  it('refuses unknown keys', () => {
    const e = refusal('{"row": {}}');
    expect(e.message).toBe('unknown key \'row\': a role map has only "rows", "columns" and "sectors"');
    expect(e.location).toEqual({ file: 'map.json', line: 1, column: 2 });
  });
  it('refuses a map that is not an object of objects', () => {
    expect(refusal('[1]').code).toBe('role-map-schema');
    expect(refusal('{"rows": ["Wages"]}').code).toBe('role-map-schema');
  });
});
