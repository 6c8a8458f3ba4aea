// Shock, employment, group and totals files are read with the tables' dialect rules (one reader, src/table
// small-csv.ts): delimiter guess and "sep=" line, decimal comma and thousands separators, BOM, RFC 4180 quotes, the
// size limit, binary and UTF-16 refusal; and a value beyond the expected fields is refused, never dropped.
import { describe, it, expect } from 'vitest';
import { MAX_TABLE_BYTES, readSmallCsv } from '../../../src/table/index.ts';
import { parseShockCsv } from '../../../src/scenario/index.ts';
import { parseEmploymentCsv, parseGroupMapping, parseLabelledMatrix, parseTotals } from '../../../src/regional/index.ts';
import { formatLocated } from '../../../src/diagnostics/index.ts';
import { refusal } from '../../support/refusal.ts';
import { linesOf } from '../../support/scenario.ts';

const located = (f: () => unknown): string => formatLocated(refusal(f));

describe('shock files', () => {
  it("a value beyond the header's fields is refused ('A,1,000' is not the amount 1)", () => {
    expect(located(() => parseShockCsv('sector,amount\nA,1,000\n', 's.csv'))).toBe("s.csv:2:3 (row 'A'): row has a value in field 3 ('000'), beyond the header's 2 fields");
    expect(located(() => parseShockCsv('sector,amount,kind,local_share\nA,300,final-demand,0,5\n', 's.csv'))).toBe(
      "s.csv:2:5 (row 'A'): row has a value in field 5 ('5'), beyond the header's 4 fields",
    );
    expect(located(() => parseShockCsv('sector,,amount\nA,x,3\n', 's.csv'))).toBe("s.csv:2:2 (row 'A'): row has a value in field 2 ('x'), whose column has no header");
    // Empty trailing fields (a spreadsheet's trailing delimiter) are fine.
    expect(linesOf(parseShockCsv('sector,amount,\nA,3,\n', 's.csv'))[0]!.amount).toBe(3);
  });

  it('semicolons with decimal commas and point-grouped thousands, as a European spreadsheet saves them', () => {
    const s = parseShockCsv('\ufeffsector;amount;kind;local_share;note\r\nRetail;1.250,5;final-demand;0,8;"new shop; staff"\r\nMining;-2,25;;;\r\n', 'dir/eu.csv');
    expect(linesOf(s).map((l) => [l.sector, l.amount, l.localShare, l.note ?? null, l.origin])).toEqual([
      ['Retail', 1250.5, 0.8, 'new shop; staff', { file: 'dir/eu.csv', line: 2, columns: { sector: 1, amount: 2, kind: 3, local_share: 4, note: 5 } }],
      ['Mining', -2.25, 1, null, { file: 'dir/eu.csv', line: 3, columns: { sector: 1, amount: 2, kind: 3, local_share: 4, note: 5 } }],
    ]);
  });

  it('an Excel "sep=" line, quoted thousands and a Unicode minus', () => {
    const s = parseShockCsv('sep=,\nsector,amount\nRetail,"1,500"\nMining,\u221240\n', 's.csv');
    expect(linesOf(s).map((l) => [l.amount, l.origin?.line])).toEqual([[1500, 3], [-40, 4]]);
  });

  it('a number that reads two ways is refused at the number', () => {
    expect(located(() => parseShockCsv('sector;amount\nRetail;2.500\n', 's.csv'))).toBe(
      "s.csv:2:2: '2.500' could be 2500 or 2.5: no number in the file shows whether '.' is a decimal mark or groups thousands; write 2500 or 2.5, whichever is meant",
    );
    expect(located(() => parseShockCsv('sector;amount\nRetail;1,500\n', 's.csv'))).toContain("'1,500' could be 1500 or 1.5");
    // Another number settles it: here the local share's decimal comma.
    expect(linesOf(parseShockCsv('sector;amount;local_share\nRetail;2.500;0,5\n', 's.csv'))[0]!.amount).toBe(2500);
  });

  it('labels are cleaned like table labels (NFD, zero-width space)', () => {
    expect(linesOf(parseShockCsv('sector,amount\nCafe\u0301 mi\u200bll,1\n', 's.csv'))[0]!.sector).toBe('Caf\u00e9 mill');
  });

  it('bad numbers name the decimal mark expected', () => {
    expect(located(() => parseShockCsv('sector;amount\nRetail;1.5\nMining;2,5\n', 's.csv'))).toBe("s.csv:3:2 (row 'Mining', column 'amount'): amount '2,5' is not a number");
    expect(located(() => parseShockCsv('sector;amount\nRetail;1,5\nMining;2.5\n', 's.csv'))).toBe("s.csv:3:2 (row 'Mining', column 'amount'): amount '2.5' is not a number (decimal comma expected)");
  });
});

describe('regional inputs', () => {
  it('employment in a semicolon file with decimal commas (FTE)', () => {
    const e = parseEmploymentCsv('sector;regional;national\nFarming;12,5;1.200,5\nMills;3;40\n', 'emp.csv');
    expect(e.entries.map((x) => [x.sector, x.regional, x.national, x.line])).toEqual([['Farming', 12.5, 1200.5, 2], ['Mills', 3, 40, 3]]);
  });

  it('employment: a fourth value without a header is a stray delimiter, refused', () => {
    expect(located(() => parseEmploymentCsv('Farming,1,200,5000\nMills,3,40\n', 'emp.csv'))).toBe(
      "emp.csv:1:4 (row 'Farming'): row has a value in field 4 ('5000'), beyond the 3 fields sector,regional,national",
    );
    // A header may name a fourth column (a note); its values are not numbers the reader needs.
    expect(parseEmploymentCsv('sector,regional,national,note\nFarming,1,200,from the census\n', 'emp.csv').entries[0]!.national).toBe(200);
  });

  it('groups with a "sep=;" line; a third value refused', () => {
    const g = parseGroupMapping('sep=;\nsector;group\nFarming, fishing;Primary\n', 'g.csv');
    expect(g.entries).toEqual([{ sector: 'Farming, fishing', group: 'Primary', line: 3 }]);
    expect(located(() => parseGroupMapping('sector,group\nFarming,Primary,Goods\n', 'g.csv'))).toBe(
      "g.csv:2:3 (row 'Farming'): row has a value in field 3 ('Goods'), beyond the 2 fields sector,group",
    );
  });

  it('totals and matrices with decimal commas', () => {
    expect(Array.from(parseTotals('label;total\nA;1,5\nB;2\n', 't.csv', ['A', 'B'], 'row'))).toEqual([1.5, 2]);
    const m = parseLabelledMatrix('x;A;B\nA;1,5;2\nB;0;0,25\n', 'm.csv');
    expect(Array.from(m.values)).toEqual([1.5, 2, 0, 0.25]);
    expect(located(() => parseTotals('A,1,5\nB,2\n', 't.csv', ['A', 'B'], 'row'))).toBe("t.csv:1:3 (row 'A'): row has a value in field 3 ('5'), beyond the 2 fields label,total");
  });
});

describe('the reader itself', () => {
  it('reports the dialect, keeps file lines across quoted line breaks and blank lines', () => {
    const csv = readSmallCsv('a;b\r\n"x\r\ny";1,5\r\n\r\nz;2\r\n', 'f.csv');
    expect(csv.dialect).toMatchObject({ delimiter: ';', decimalMark: ',', decimalMarkFrom: 'numbers' });
    expect(csv.rows).toEqual([
      { cells: ['a', 'b'], line: 1 },
      { cells: ['x\r\ny', '1,5'], line: 2 },
      { cells: ['z', '2'], line: 5 },
    ]);
  });
  it('refuses binary, UTF-16, an unclosed quote and an oversized text like the table importer', () => {
    expect(refusal(() => readSmallCsv('a,b\n\u0000\u0000', 'f.csv')).code).toBe('binary');
    expect(refusal(() => readSmallCsv('\ufffd\ufffds\u0000e\u0000c\u0000t\u0000', 'f.csv')).code).toBe('utf16');
    expect(located(() => readSmallCsv('"sector,group\nA,B\n', 'f.csv'))).toBe('f.csv:1: a quoted cell is not closed or a quote is misplaced (RFC 4180 §2)');
    const big = { length: MAX_TABLE_BYTES + 1 } as unknown as string;
    expect(refusal(() => readSmallCsv(big, 'f.csv')).code).toBe('file-too-large');
  });
});
