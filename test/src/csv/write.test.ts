// Report CSV cells, re-read with papaparse (an independent RFC 4180 reader). Formula-injection escaping follows OWASP
// "CSV Injection" (a text cell beginning with =, +, -, @, tab or CR gets a leading apostrophe); the full-width and
// small forms of those signs (Unicode blocks Halfwidth and Fullwidth Forms, Small Form Variants) are escaped too,
// because spreadsheets with East Asian input settings may fold them to ASCII (common practice, no source).
import { describe, it, expect } from 'vitest';
import Papa from 'papaparse';
import { toCsv } from '../../../src/csv/index.ts';
import { importTable, writeTableCsv } from '../../../src/table/index.ts';

const reread = (csv: string) => Papa.parse<string[]>(csv, { skipEmptyLines: true }).data;

describe('text cells in reports', () => {
  it('full-width and small =, +, -, @ at the start of a cell get the apostrophe, like their ASCII forms', () => {
    const leads = ['\uff1d1+1', '\ufe62SUM(A1)', '\uff0b2', '\uff0d2+3', '\ufe63x', '\uff20cmd', '\ufe66y', '\ufe6bz', '=1+1', '@cmd'];
    const rows = reread(toCsv([leads]));
    expect(rows[0]).toEqual(leads.map((l) => `'${l}`));
    // Not at the start: left alone.
    expect(reread(toCsv([['a\uff1db', 'Farm\uff20ing']]))[0]).toEqual(['a\uff1db', 'Farm\uff20ing']);
  });

  it('bidi and control characters are written as visible escapes; line breaks inside a quoted cell stay', () => {
    const rows = reread(toCsv([['Farm\u202eing', 'a\u001b[31mb', 'two\nlines', 'tab\there', 'iso\u2066late\u2069']]));
    expect(rows[0]).toEqual(['Farm\\u202eing', 'a\\u001b[31mb', 'two\nlines', 'tab\there', 'iso\\u2066late\\u2069']);
  });

  it('numbers are untouched', () => {
    expect(reread(toCsv([[-2.5, 3e-7, 0]]))[0]).toEqual(['-2.5', '3e-7', '0']);
  });

  it('a written table with full-width formula labels reads back to the same sectors (the importer undoes the apostrophe)', () => {
    const text = ['unit,\uff1dA,\uff20B,Households,Total output', '\uff1dA,10,20,70,100', '\uff20B,30,10,160,200', 'Labor income,60,170,,', 'Total input,100,200,,'].join('\n');
    const t = importTable(text, { fileName: 'fw.csv' });
    expect(t.sectors).toEqual(['\uff1dA', '\uff20B']);
    const written = writeTableCsv(t);
    expect(written).toContain("'\uff1dA");
    expect(importTable(written, { fileName: 'again.csv' }).sectors).toEqual(t.sectors);
  });
});
