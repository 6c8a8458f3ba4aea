// Row and column labels that differ only in Unicode form, invisible characters or spacing are one sector; labels the
// role rules read as roles are warned about when they look like a sector; and what the table writer writes reads back
// as the same sectors and roles, without a role map (aggregation, regionalization, balancing and the app's grouping
// all write tables this way).
import { describe, it, expect } from 'vitest';
import { importTable, previewTable, writeTableCsv, cleanLabel, matchKey, type IOTable } from '../../../src/table/index.ts';
import { normaliseText } from '../../../src/table/labels.ts';
import { seeded } from '../../support/random.ts';
import { aggregateTable, parseGroupMapping, parseEmploymentCsv, regionalize } from '../../../src/regional/index.ts';
import { analyzeTable } from '../../../src/model/index.ts';
import { BASE } from './helpers.ts';

const clean = importTable(BASE, { fileName: 'base.csv' });
const header = (text: string, from: string, to: string): string => {
  const [head, ...rest] = text.split('\n');
  return [head!.replace(from, to), ...rest].join('\n');
};
const codes = (t: IOTable) => t.warnings.map((w) => w.code);

function expectSameNumbers(t: IOTable): void {
  expect(t.n).toBe(3);
  expect(Array.from(t.Z)).toEqual(Array.from(clean.Z));
  expect(Array.from(t.x)).toEqual(Array.from(clean.x));
  expect(analyzeTable(t).multipliers.output.typeI).toEqual(analyzeTable(clean).multipliers.output.typeI);
}

describe('label normalisation before matching rows to columns', () => {
  it('cleanLabel: NFC, invisible format and control characters removed, white space made single spaces', () => {
    expect(cleanLabel('Cafe\u0301')).toBe('Caf\u00e9'); // Unicode Standard Annex #15: e + U+0301 composes to U+00E9
    expect(cleanLabel('Tra\u200bde')).toBe('Trade'); // zero-width space (Cf)
    expect(cleanLabel('\ufeffTrade\u2060')).toBe('Trade'); // BOM and word joiner (Cf)
    expect(cleanLabel('Real \u00a0 estate\r\n')).toBe('Real estate');
    expect(cleanLabel('Farm\u0007ing')).toBe('Farming'); // BEL (Cc)
    expect(cleanLabel('\u202eTrade')).toBe('Trade'); // right-to-left override (Cf)
    expect(cleanLabel("'=SUM(A1)")).toBe('=SUM(A1)');
    expect(matchKey('REAL  Estate')).toBe(matchKey('real estate'));
  });

  it('a column label in NFD meets the row label in NFC: three sectors, not two', () => {
    const nfc = BASE.replace(/Mills/g, 'Caf\u00e9 mills');
    const text = header(nfc, 'Caf\u00e9 mills', 'Cafe\u0301 mills');
    expect(text).not.toBe(nfc);
    const t = importTable(text, { fileName: 'nfd.csv' });
    expect(t.sectors).toEqual(['Farming', 'Caf\u00e9 mills', 'Services']);
    expect(codes(t)).toEqual([]);
    expectSameNumbers(t);
  });

  it('a zero-width space in a column label does not split the sector', () => {
    const t = importTable(header(BASE, 'Mills', 'Mi\u200bl\u200bls'), { fileName: 'zw.csv' });
    expect(t.sectors).toEqual(['Farming', 'Mills', 'Services']);
    expectSameNumbers(t);
  });

  it('labels that differ only by such characters are duplicates', () => {
    const text = BASE.replace('Mills,15,20', 'Mi\u200bl\u200bls,15,20').replace('Services,5,20', 'Mills,5,20');
    const p = previewTable(text, { fileName: 'dup.csv' });
    expect(p.refusal?.code).toBe('duplicate-label');
  });
});

describe('rows and columns left unmatched are named', () => {
  it("'Trade' as a row and 'Retail' as a column: imported as two sectors with a warning naming both", () => {
    const text = header(BASE, 'Services', 'Retail').replace('Services,5,20', 'Trade,5,20');
    const t = importTable(text, { fileName: 'typo.csv' });
    expect(t.sectors).toEqual(['Farming', 'Mills']);
    const w = t.warnings.find((x) => x.code === 'labels-unmatched');
    expect(w?.message).toBe(
      "row 'Trade' and column 'Retail' match no label on the other axis and are not usual value-added or final-demand labels: they were read as other value added and other final demand. If a row and a column are one sector, give them the same label; if not, confirm their roles in a role map",
    );
    expect(w?.location).toMatchObject({ file: 'typo.csv', line: 4, column: 1, rowLabel: 'Trade' });
    // Confirming the roles in a role map is a decision: no warning.
    const mapped = importTable(text, { fileName: 'typo.csv', roles: { rows: { Trade: 'otherValueAdded' }, columns: { Retail: 'otherFinalDemand' } } });
    expect(codes(mapped)).not.toContain('labels-unmatched');
  });

  it('usual value-added and final-demand labels are not taken for a lost sector', () => {
    const text = header(BASE, 'Exports', 'Gross fixed capital formation').replace('Other value added,', 'Gross operating surplus,');
    expect(codes(importTable(text, { fileName: 'usual.csv' }))).toEqual([]);
  });

  it("a sector whose name reads as a role ('Import services'): a warning with the fix; the role map or a '(sector)' mark makes it a sector", () => {
    const text = BASE.replace(/Services/g, 'Import services');
    const t = importTable(text, { fileName: 'imp.csv' });
    expect(t.sectors).toEqual(['Farming', 'Mills']);
    const w = t.warnings.find((x) => x.code === 'label-role-conflict');
    expect(w?.message).toBe(
      "'Import services' is a row and a column label but was not read as a sector: the row as imports (by its words), the column as other final demand (not a recognised label). If it is a sector, name it in a role map ({\"sectors\": [\"Import services\"]}) or add '(sector)' to its row and column labels",
    );
    expect(w?.location).toMatchObject({ line: 4, rowLabel: 'Import services' });
    const byMap = importTable(text, { fileName: 'imp.csv', roles: { sectors: ['Import services'] } });
    expect(byMap.sectors).toEqual(['Farming', 'Mills', 'Import services']);
    expect(byMap.roles.sectors).toEqual(['Import services']);
    expectSameNumbers(byMap);
    const byMark = importTable(BASE.replace(/Services/g, 'Import services (sector)'), { fileName: 'mark.csv' });
    expect(byMark.sectors).toEqual(['Farming', 'Mills', 'Import services']);
    expect(codes(byMark)).toEqual([]);
  });

  it('Households, Total and Imports as both a row and a column are roles, without a warning', () => {
    const text = BASE.replace('Other value added,', 'Households,').replace(',Exports,', ',Imports,');
    const t = importTable(text, { fileName: 'roles.csv' });
    expect(t.sectors).toEqual(['Farming', 'Mills', 'Services']);
    expect(t.labourIncome.map((v) => v.label)).toEqual(['Compensation of employees', 'Households']);
    expect(codes(t)).toEqual([]);
  });

  it("'Taxes on production and imports' is a taxes row (value added), not an import row", () => {
    const t = importTable(BASE.replace('Other value added', 'Taxes on production and imports'), { fileName: 'tax.csv' });
    expect(t.taxes!.map((v) => v.label)).toEqual(['Taxes on production and imports']);
    expect(t.otherValueAdded).toEqual([]);
    expect(t.imports.map((v) => v.label)).toEqual(['Imports']);
  });
});

describe('written tables read back as the same sectors and roles', () => {
  it("aggregation: a group named 'Imported-input manufacturing' reads back as a sector", () => {
    const groups = parseGroupMapping('sector,group\nFarming,Primary\nMills,Imported-input manufacturing\nServices,Services\n', 'groups.csv');
    const agg = aggregateTable(clean, groups);
    const text = writeTableCsv(agg.table);
    expect(text.split('\r\n')[0]).toContain(',Imported-input manufacturing (sector),');
    const back = importTable(text, { fileName: 'aggregated-table.csv' });
    expect(back.sectors).toEqual(['Primary', 'Imported-input manufacturing', 'Services']);
    expect(Array.from(back.Z)).toEqual(Array.from(agg.table.Z));
    expect(codes(back)).toEqual([]);
  });

  it('sectors named like roles, and labels differing in spacing, read back unchanged', () => {
    const t: IOTable = { ...clean, sectors: ['Households', 'Total', 'Wages  and\u200b salaries'] };
    const back = importTable(writeTableCsv(t), { fileName: 'w.csv' });
    expect(back.sectors).toEqual(['Households', 'Total', 'Wages and salaries']);
    expect(back.householdConsumption.map((v) => Array.from(v.values))).toEqual(clean.householdConsumption.map((v) => Array.from(v.values)));
    expect(Array.from(back.x)).toEqual(Array.from(clean.x));
  });

  it('two sectors that would read back as one are refused with the reason', () => {
    const t: IOTable = { ...clean, sectors: ['Farming', 'farming', 'Services'] };
    expect(() => writeTableCsv(t)).toThrow("sectors 'Farming' and 'farming' differ only in case, spacing or invisible characters; they would be read back as one sector");
  });

  it('a labour-income row named by a role map keeps its role through regionalization, writing and reading (no map the second time)', () => {
    const national = importTable(BASE.replace('Compensation of employees', 'Pay'), { fileName: 'national.csv', roles: { rows: { Pay: 'labourIncome' } } });
    expect(national.labourIncome.map((v) => v.label)).toEqual(['Pay']);
    const emp = parseEmploymentCsv('sector,regional,national\nFarming,3,12\nMills,6,30\nServices,20,40\n', 'emp.csv');
    const regional = regionalize(national, emp, { method: 'slq' }).table;
    const text = writeTableCsv(regional);
    const back = importTable(text, { fileName: 'regional-table.csv' });
    expect(back.labourIncome.map((v) => v.label)).toEqual(['Labour income (Pay)']);
    expect(back.labourIncome[0]!.values).toEqual(regional.labourIncome[0]!.values);
    const want = analyzeTable(regional).multipliers.income.typeII;
    expect(want.every((v) => v !== null)).toBe(true);
    expect(analyzeTable(back).multipliers.income.typeII).toEqual(want);
  });
});

describe('normaliseText fast path', () => {
  // The full form, as labels.ts writes it after its plain-ASCII test (reference: the function's own definition).
  const SPACES = /[\t\n\v\f\r \u0085\u00a0\u1680\u2000-\u200a\u2028\u2029\u202f\u205f\u3000]+/g;
  const full = (s: string): string => s.normalize('NFC').replace(SPACES, ' ').replace(/[\p{Cf}\p{Cc}]/gu, '').replace(SPACES, ' ').trim();
  it('gives what the full normalisation gives, on plain labels and on every kind it must not take', () => {
    const r = seeded(7);
    const alphabet = ['a', 'Z', '0', ' ', '  ', '\t', '\u00a0', '\u200b', '\u0301', 'e\u0301', '\u007f', '\u0001', '(', '~', '!', '\ufeff', 'é', '\n', '\r\n'];
    const cases = ['', ' ', 'Farming', 'Real estate', ' Real estate', 'Real estate ', 'Real  estate', 'Food (sector)', 'A&B, C/D ~ 1.5%'];
    for (let k = 0; k < 2000; k++) {
      let s = '';
      const len = Math.floor(r() * 8);
      for (let q = 0; q < len; q++) s += alphabet[Math.floor(r() * alphabet.length)]!;
      cases.push(s);
    }
    for (const s of cases) expect(normaliseText(s)).toBe(full(s));
  });
});
