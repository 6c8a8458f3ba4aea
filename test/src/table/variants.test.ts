// CSV dialect variants of one table import to the same numbers as the clean file.
// Sources: RFC 4180 (CSV records, quoted fields, doubled quotes, CRLF); Unicode Standard §23.8 (U+FEFF as a UTF-8
// signature); decimal comma with ';' as the field separator and thousands grouping by '.', ',' or space — common
// spreadsheet practice in many locales (common practice, no source).
import { describe, it, expect } from 'vitest';
import { importTable, previewTable, type IOTable } from '../../../src/table/index.ts';
import { SAMPLE_CSV } from '../../../src/table/sample.ts';

const cells: string[][] = SAMPLE_CSV.trimEnd().split('\r\n').map((l) => l.split(','));
const clean = importTable(SAMPLE_CSV, { fileName: 'clean.csv' });

function emit(rows: string[][], delimiter: string, eol = '\r\n', cell: (s: string, r: number, c: number) => string = (s) => s): string {
  return rows.map((row, r) => row.map((s, c) => cell(s, r, c)).join(delimiter)).join(eol) + eol;
}

const isNumber = (s: string): boolean => /^-?\d/.test(s);

/** Group the integer part in threes with `sep` and write the decimal mark `dec`. */
function grouped(s: string, sep: string, dec: string): string {
  const [int, frac] = s.split('.');
  const g = int!.replace(/\B(?=(\d{3})+(?!\d))/g, sep);
  return frac === undefined ? g : `${g}${dec}${frac}`;
}

function same(t: IOTable, ref: IOTable = clean): void {
  expect(t.sectors).toEqual(ref.sectors);
  expect(Array.from(t.Z)).toEqual(Array.from(ref.Z));
  expect(Array.from(t.x)).toEqual(Array.from(ref.x));
  for (const k of ['labourIncome', 'otherValueAdded', 'imports', 'householdConsumption', 'otherFinalDemand'] as const) {
    expect(t[k].map((v) => [v.label, Array.from(v.values)])).toEqual(ref[k].map((v) => [v.label, Array.from(v.values)]));
  }
  expect(Array.from(t.employment ?? [])).toEqual(Array.from(ref.employment ?? []));
  expect(t.moneyUnit).toBe(ref.moneyUnit);
  expect(t.warnings).toEqual([]);
}

describe('CSV variants import to the same numbers', () => {
  it('the clean sample imports without warnings', () => {
    expect(clean.n).toBe(16);
    expect(clean.warnings).toEqual([]);
  });
  it('LF and lone-CR line ends (RFC 4180 uses CRLF)', () => {
    same(importTable(emit(cells, ',', '\n'), { fileName: 'lf.csv' }));
    same(importTable(emit(cells, ',', '\r'), { fileName: 'cr.csv' }));
  });
  it('no final line break, and blank lines between records', () => {
    same(importTable(SAMPLE_CSV.trimEnd(), { fileName: 'a.csv' }));
    same(importTable(SAMPLE_CSV.replace('\r\n', '\r\n\r\n').replace(/\r\nImports/, '\r\n,,,\r\nImports') + '\r\n\r\n', { fileName: 'b.csv' }));
  });
  it('UTF-8 byte-order mark', () => {
    same(importTable('\ufeff' + SAMPLE_CSV, { fileName: 'bom.csv' }));
  });
  it('semicolons with the decimal comma', () => {
    const text = emit(cells, ';', '\r\n', (s) => (isNumber(s) ? s.replace('.', ',') : s));
    expect(text).toContain(';37645,2;');
    same(importTable(text, { fileName: 'semi.csv' }));
  });
  it('semicolons with the decimal comma and point thousands separators', () => {
    const text = emit(cells, ';', '\r\n', (s) => (isNumber(s) ? grouped(s, '.', ',') : s));
    expect(text).toContain(';37.645,2;');
    same(importTable(text, { fileName: 'semi-grouped.csv' }));
  });
  it('semicolons with decimal points (no comma between digits anywhere)', () => {
    same(importTable(emit(cells, ';'), { fileName: 'semi-point.csv' }));
    const withCommaLabel = emit(cells, ';', '\r\n', (s) => (s === 'Farming' ? 'Farming, fishing' : s));
    expect(importTable(withCommaLabel, { fileName: 'semi-point2.csv' }).sectors[0]).toBe('Farming, fishing');
  });
  it('semicolons with points only as thousands separators stay decimal-comma (ambiguous: "1.234" is 1234)', () => {
    const p = previewTable('x;A;Total output\nA;1.234;2.468\nWages;1.234;\n', { fileName: 'amb.csv' });
    expect(p.decimalMark).toBe(',');
    expect(Array.from(p.table!.Z)).toEqual([1234]);
  });
  it('tabs, with space thousands separators', () => {
    const text = emit(cells, '\t', '\n', (s) => (isNumber(s) ? grouped(s, ' ', '.') : s));
    expect(text).toContain('\t37 645.2\t');
    same(importTable(text, { fileName: 'tab.tsv' }));
  });
  it('every field quoted (RFC 4180 §2.5), with comma thousands separators inside the quotes', () => {
    const text = emit(cells, ',', '\r\n', (s) => `"${isNumber(s) ? grouped(s, ',', '.') : s}"`);
    expect(text).toContain(',"37,645.2",');
    same(importTable(text, { fileName: 'quoted.csv' }));
  });
  it('quoted labels with delimiters, doubled quotes and line breaks (RFC 4180 §2.6–2.7)', () => {
    const odd = 'Farming, "fishing"\r\nand hunting';
    const text = emit(cells, ',', '\r\n', (s) => (s === 'Farming' ? `"${odd.replace(/"/g, '""')}"` : s));
    const t = importTable(text, { fileName: 'odd.csv' });
    // The quoted line break is part of the cell; the label keeps it as one space (labels are one line).
    expect(t.sectors[0]).toBe('Farming, "fishing" and hunting');
    same(t, { ...clean, sectors: ['Farming, "fishing" and hunting', ...clean.sectors.slice(1)] });
  });
  it('sector columns in another order than the rows', () => {
    const n = clean.n;
    const perm = Array.from({ length: n }, (_, k) => n - 1 - k); // reversed sector columns
    const rows = cells.map((row) => [row[0]!, ...perm.map((k) => row[1 + k]!), ...row.slice(1 + n)]);
    same(importTable(emit(rows, ','), { fileName: 'perm.csv' }));
  });
  it('column labels that differ from the row labels only in case or spacing', () => {
    const rows = cells.map((row, r) => (r === 0 ? row.map((s, c) => (c > 0 && c <= clean.n ? s.toUpperCase().replace(/ /g, '  ') : s)) : row));
    same(importTable(emit(rows, ','), { fileName: 'case.csv' }));
  });
  it('spaces around cells and labels', () => {
    same(importTable(emit(cells, ',', '\r\n', (s) => (s === '' ? '  ' : ` ${s} `)), { fileName: 'spaces.csv' }));
  });
  it('blank cells outside the inter-industry block are 0', () => {
    const withZeros = emit(cells, ',', '\r\n', (s, r, c) => (s === '' && r > 0 && c > 0 ? '0' : s));
    same(importTable(withZeros, { fileName: 'zeros.csv' }));
  });
});
