// Reading supply and use pairs: the importer's dialect, roles of the supply table's extra columns, the product balance
// and valuation, and every refusal with its location.
import { describe, expect, it } from 'vitest';
import { deriveSymmetric, parseSutRoleMap, readSupplyUse, supplyUseRoles, type SutRoleMap } from '../../../src/sut/index.ts';
import { formatLocated } from '../../../src/diagnostics/index.ts';
import { refusal } from '../../support/refusal.ts';
import { SUPPLY, USE } from '../../support/sut-pairs.ts';

const read = (supply: string, use: string, map?: SutRoleMap, extra: Parameters<typeof readSupplyUse>[2] = {}) =>
  readSupplyUse({ text: supply, fileName: 'supply.csv' }, { text: use, fileName: 'use.csv' }, { ...(map ? { map } : {}), ...extra });

describe('the supply table\'s columns and rows', () => {
  it('reads imports, margins, taxes on products and totals by their words, and checks total use against output plus imports', () => {
    // Use of all products: product a 20 + 10 + 70 + 10 imported = 110 = 100 + 10 imports.
    const supply = [
      'million crowns,Industry A,Industry B,Imports cif,Trade and transport margins,Taxes less subsidies on products,Total supply at purchasers\' prices',
      'Product a,90,10,10,4,3,117',
      'Product b,0,50,0,-4,1,47',
      'Total,90,60,10,0,4,164',
    ].join('\n');
    const use = USE.replace('Product a,20,10,70', 'Product a,22,10,78');
    const s = read(supply, use);
    expect(s.roles.supply).toEqual({
      'Industry A': 'industry', 'Industry B': 'industry', 'Imports cif': 'imports', 'Trade and transport margins': 'margins',
      'Taxes less subsidies on products': 'productTaxes', "Total supply at purchasers' prices": 'total',
    });
    expect(s.products).toEqual(['Product a', 'Product b']);
    expect(s.valuation).toBe('total');
    expect(Array.from(s.imports)).toEqual([10, 0]);
    // Import proportionality: product a's imported share is 10/110; industry A's 22 of a → 20 domestic, 2 imported.
    expect(s.U[0]).toBeCloseTo(20, 12);
    expect(s.industryRows.find((r) => r.role === 'imports')!.values[0]).toBeCloseTo(2 + 0, 12);
    expect(s.importedFinalDemand[0]!.value).toBeCloseTo(78 * 10 / 110, 12);
    expect(s.finalDemand[0]!.values[0]).toBeCloseTo(78 * 100 / 110, 12);
  });

  it('refuses a use table at purchasers\' prices, whose products add up to supply with margins and taxes', () => {
    const supply = ['m,Industry A,Industry B,Trade margins,Taxes on products', 'Product a,90,10,6,4', 'Product b,0,50,-6,1'].join('\n');
    // a: 100 + 6 + 4 = 110; b: 50 − 6 + 1 = 45
    const use = ['m,Industry A,Industry B,Households', 'Product a,22,11,77', 'Product b,4,14,27', 'Compensation,40,20,', 'Other value added,25,15,'].join('\n');
    const e = refusal(() => read(supply, use));
    expect(e.code).toBe('sut-purchasers-prices');
    expect(formatLocated(e)).toMatch(/^use\.csv: .*basic prices/);
  });

  it('refuses a supply column that is neither an industry of the use table nor a recognised role, at its header cell', () => {
    const supply = SUPPLY.replace('Industry B', 'Industry Bee');
    const e = refusal(() => read(supply, USE));
    expect(e.code).toBe('sut-unknown-industry');
    expect(e.location).toMatchObject({ file: 'supply.csv', line: 1, column: 3, columnLabel: 'Industry Bee' });
    // …and accepts it with a role from the map, as long as the industries still cover the use table
    expect(parseSutRoleMap('{"supply": {"Industry Bee": "ignore"}}', 'map.json')).toEqual({ supply: { 'Industry Bee': 'ignore' } });
  });

  it('refuses a product of the supply table that the use table lacks, at its row', () => {
    const e = refusal(() => read(SUPPLY.replace('Product b,0,50', 'Product bb,0,50'), USE));
    expect(e.code).toBe('sut-unknown-product');
    expect(e.location).toMatchObject({ file: 'supply.csv', line: 3, rowLabel: 'Product bb' });
  });

  it('refuses a pair whose product totals disagree, naming the worst products with their gaps', () => {
    const e = refusal(() => read(SUPPLY, USE.replace('Product b,5,15,30', 'Product b,5,15,40')));
    expect(e.code).toBe('sut-products-disagree');
    expect(e.message).toMatch(/1 product: .*'Product b' \+16\.67 %/);
    expect(e.location).toMatchObject({ file: 'use.csv', rowLabel: 'Product b' });
    // a wider tolerance accepts it
    expect(read(SUPPLY, USE.replace('Product b,5,15,30', 'Product b,5,15,40'), undefined, { tolerance: 0.2 }).products).toHaveLength(2);
  });

  it('refuses negative output and negative intermediate use at the cell, unless negatives are allowed', () => {
    const e = refusal(() => read(SUPPLY, USE.replace('Product a,20,10,70', 'Product a,20,-10,90')));
    expect(e.code).toBe('sut-negative');
    expect(e.location).toMatchObject({ file: 'use.csv', line: 2, column: 3, rowLabel: 'Product a', columnLabel: 'Industry B' });
    expect(read(SUPPLY, USE.replace('Product a,20,10,70', 'Product a,20,-10,90'), undefined, { allowNegative: true }).U[1]).toBe(-10);
  });

  it('refuses an industry that uses products but produces nothing', () => {
    const supply = ['m,Industry A,Industry B,Industry C', 'Product a,90,10,0', 'Product b,0,50,0'].join('\n');
    const use = ['m,Industry A,Industry B,Industry C,Households', 'Product a,20,10,1,69', 'Product b,5,15,0,30', 'Compensation,40,20,0,', 'Other value added,25,15,-1,'].join('\n');
    const e = refusal(() => read(supply, use));
    expect(e.code).toBe('sut-industry-no-output');
    expect(e.location).toMatchObject({ file: 'supply.csv', columnLabel: 'Industry C' });
  });

  it('refuses text, a ragged row and a repeated label where they are, as the table importer does', () => {
    expect(formatLocated(refusal(() => read(SUPPLY.replace('90,10', 'ninety,10'), USE)))).toBe("supply.csv:2:2 (row 'Product a', column 'Industry A'): 'ninety' is not a number");
    expect(refusal(() => read(SUPPLY, USE.replace('Product b,5,15,30', 'Product b,5,15')))).toMatchObject({ code: 'ragged-row', location: { file: 'use.csv', line: 3 } });
    expect(refusal(() => read(SUPPLY.replace('Product b', 'product a'), USE))).toMatchObject({ code: 'duplicate-label', location: { file: 'supply.csv', line: 3 } });
  });

  it('refuses the product technology and the fixed industry sales structure for a pair with more products than industries, and a singular make table', () => {
    const supply = ['m,Industry A,Industry B', 'Product a,90,10', 'Product b,0,50', 'Product c,5,0'].join('\n');
    const use = ['m,Industry A,Industry B,Households', 'Product a,20,10,70', 'Product b,5,15,30', 'Product c,0,0,5', 'Compensation,45,20,', 'Other value added,25,15,'].join('\n');
    const s = read(supply, use);
    expect(refusal(() => deriveSymmetric(s, { assumption: 'product' }))).toMatchObject({ code: 'sut-not-square' });
    expect(refusal(() => deriveSymmetric(s, { assumption: 'industry-sales' })).message).toMatch(/3 products and 2 industries/);
    // both industries make a and b in the same proportions: V is singular
    const singular = read(['m,Industry A,Industry B', 'Product a,60,30', 'Product b,20,10'].join('\n'), ['m,Industry A,Industry B,Households', 'Product a,20,10,60', 'Product b,5,5,20', 'Compensation,40,15,', 'Other value added,15,10,'].join('\n'));
    expect(refusal(() => deriveSymmetric(singular, { assumption: 'product' }))).toMatchObject({ code: 'sut-singular' });
    expect(refusal(() => deriveSymmetric(singular, { assumption: 'industry-sales' }))).toMatchObject({ code: 'sut-singular' });
    expect(deriveSymmetric(singular, { assumption: 'product-sales' }).table.n).toBe(2);
  });
});

describe('dialect, roles and warnings', () => {
  it('reads a semicolon pair with decimal commas and a sep= line as the comma pair', () => {
    const semi = (t: string) => `sep=;\n${t.replace(/,/g, ';')}`;
    const a = deriveSymmetric(read(SUPPLY, USE), { assumption: 'product-sales' }).table;
    const b = deriveSymmetric(read(semi(SUPPLY), semi(USE).replace('Product a;20;10;70', 'Product a;20,0;10;70,0')), { assumption: 'product-sales' }).table;
    expect(Array.from(b.Z)).toEqual(Array.from(a.Z));
  });

  it('takes the use table\'s rows and columns by the table roles, or by the role map', () => {
    const use = USE.replace('Other value added', 'Operating surplus').replace('Households', 'Private consumption');
    const s = read(SUPPLY, use.replace('Employment', 'Staff'), { rows: { Staff: 'employment' } });
    expect(s.roles.rows).toMatchObject({ 'Operating surplus': 'otherValueAdded', Staff: 'employment' });
    expect(s.finalDemand[0]).toMatchObject({ label: 'Private consumption', role: 'householdConsumption' });
  });

  it('warns about a use-table row that is neither a product nor a usual label, and about industries that do not add up', () => {
    const s = read(SUPPLY, USE.replace('Other value added,25,15,', 'Scrap,25,15,\nValue added,65,35,'));
    const codes = s.warnings.map((w) => w.code);
    expect(codes).toContain('sut-labels-unmatched');
    expect(s.warnings.find((w) => w.code === 'sut-labels-unmatched')!.message).toMatch(/'Scrap'/);
    // "Value added" beside its parts counts them twice
    expect(s.warnings.find((w) => w.code === 'sut-industry-balance')!.message).toMatch(/'Industry A' \+41\.94 %/);
  });

  it('warns when the two corner cells state different units', () => {
    const s = read(SUPPLY, USE.replace('million crowns', 'thousand crowns'));
    expect(s.warnings.map((w) => w.code)).toContain('sut-units-differ');
    expect(s.moneyUnit).toBe('thousand crowns');
  });

  it('refuses a role map with an unknown key or role, at the key', () => {
    expect(refusal(() => parseSutRoleMap('{\n "supply": {"X": "exports"}\n}', 'map.json'))).toMatchObject({ code: 'role-map-schema', location: { file: 'map.json', line: 2 } });
    expect(refusal(() => parseSutRoleMap('{"sectors": []}', 'map.json')).message).toMatch(/unknown key 'sectors'/);
    expect(refusal(() => parseSutRoleMap('{"supply": ', 'map.json')).code).toBe('role-map-json');
  });
});

describe('the role preview (the app shows it before the pair is read)', () => {
  const roles = (supply: string, use: string, map?: SutRoleMap) => supplyUseRoles({ text: supply, fileName: 'supply.csv' }, { text: use, fileName: 'use.csv' }, map ? { map } : {});
  const supply = SUPPLY.replace('Industry B', 'Industry B,CIF/FOB adjustment').replace(/^(Product a,[^\n]*)$/m, '$1,0').replace(/^(Product b,[^\n]*)$/m, '$1,0');

  it('gives every label its role as the reader decides it, and none to a supply column the reader refuses', () => {
    const r = roles(supply, USE);
    expect(r.supplyColumns.map((c) => [c.label, c.role, c.mapped])).toEqual([['Industry A', 'industry', false], ['Industry B', 'industry', false], ['CIF/FOB adjustment', null, false]]);
    expect(r.supplyRows.map((c) => [c.label, c.role])).toEqual([['Product a', 'product'], ['Product b', 'product']]);
    expect(r.useRows.map((c) => [c.label, c.role])).toEqual(expect.arrayContaining([['Other value added', 'otherValueAdded'], ['Employment', 'employment']]));
    expect(r.useColumns.map((c) => [c.label, c.role])).toEqual([['Households', 'householdConsumption']]);
    expect(refusal(() => read(supply, USE)).code).toBe('sut-unknown-industry');
  });

  it('a role from the map is shown as mapped, and the reader then accepts the pair with the same roles', () => {
    const map: SutRoleMap = { supply: { 'CIF/FOB adjustment': 'ignore' }, columns: { Households: 'otherFinalDemand' } };
    const r = roles(supply, USE, map);
    expect(r.supplyColumns[2]).toMatchObject({ label: 'CIF/FOB adjustment', role: 'ignore', mapped: true });
    expect(r.useColumns[0]).toMatchObject({ role: 'otherFinalDemand', mapped: true });
    const s = read(supply, USE, map);
    expect(s.roles.supply['CIF/FOB adjustment']).toBe('ignore');
    expect(s.finalDemand.map((f) => f.role)).toEqual(['otherFinalDemand']);
  });
});
