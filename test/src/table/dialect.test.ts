// The dialect of a file — delimiter and decimal mark — is decided once, said back in the preview, and warned about
// when it was guessed in a way that changes numbers. Thousands grouping (1–3 digits, then groups of exactly three) is
// the rule of the Unicode CLDR number patterns ("#,##0.###") and of spreadsheet exports; a first group never starts
// with 0 (recalled from memory).
import { describe, it, expect } from 'vitest';
import { importTable, previewTable, parseNumberText } from '../../../src/table/index.ts';
import { guessDelimiter, markEvidence, readSepLine } from '../../../src/table/dialect.ts';
import { BASE } from './helpers.ts';

/** BASE as a semicolon file with every money cell divided by 1000 and written with three decimals ("0.010"). */
const MILLIONS = BASE.trim()
  .split('\n')
  .map((line, k) => {
    const cells = line.split(',');
    if (k === 0 || cells[0]!.startsWith('Employment')) return cells.join(';');
    return [cells[0], ...cells.slice(1).map((c) => (c === '' ? '' : (Number(c) / 1000).toFixed(3)))].join(';');
  })
  .join('\n');

describe('decimal mark', () => {
  it('a semicolon file whose points have three decimals ("0.010") reads them as decimal points: jobs per unit stay right', () => {
    expect(MILLIONS).toContain('Farming;0.010;0.040;0.005;');
    const p = previewTable(MILLIONS, { fileName: 'millions.csv' });
    expect(p.ok).toBe(true);
    expect(p.decimalMark).toBe('.');
    expect(p.dialect).toMatchObject({ delimiter: ';', delimiterFrom: 'guessed', decimalMark: '.', decimalMarkFrom: 'numbers' });
    expect(p.dialect?.decimalMarkNote).toBe("decimal point: '0.010' (line 2) can only be read with a decimal point");
    expect(p.warnings).toEqual([]);
    const t = p.table!;
    expect(Array.from(t.x)).toEqual([0.1, 0.2, 0.15]);
    // 12 jobs for 0.1 million of output: 120 jobs per million, not 0.12.
    expect(t.employment![0]! / t.x[0]!).toBeCloseTo(120, 12);
  });

  it('a file in which every number reads both ways is read with the decimal comma, and the warning says how to read it otherwise', () => {
    const text = 'x;A;B;Total output\nA;1.234;2.000;3.234\nB;1.000;1.000;4.000\nWages;1.000;1.000;\n';
    const p = previewTable(text, { fileName: 'amb.csv' });
    expect(p.dialect).toMatchObject({ decimalMark: ',', decimalMarkFrom: 'guessed' });
    expect(Array.from(p.table!.Z)).toEqual([1234, 2000, 1000, 1000]);
    expect(p.warnings.map((w) => w.code)).toEqual(['decimal-mark-guessed']);
    expect(p.warnings[0]!.message).toBe(
      "the decimal mark was guessed: no number in the file shows whether '.' is a decimal mark or groups thousands, so '.' was read as a thousands separator ('1.234' is 1234); if '1.234' means 1.234, import again with the decimal mark '.' (command line: --decimal-mark point)",
    );
    expect(p.warnings[0]!.location).toEqual({ file: 'amb.csv', line: 2, column: 2 });
    // Forcing the other reading: the numbers are decimals and nothing is guessed.
    const forced = previewTable(text, { fileName: 'amb.csv', decimalMark: '.' });
    expect(Array.from(forced.table!.Z)).toEqual([1.234, 2, 1, 1]);
    expect(forced.dialect).toMatchObject({ decimalMarkFrom: 'option' });
    expect(forced.warnings).toEqual([]);
  });

  it('commas that all read both ways in a semicolon file ("1,500") are warned about too', () => {
    const p = previewTable('x;A;Total output\nA;1,500;3\n', { fileName: 'c.csv' });
    expect(p.table!.Z[0]).toBe(1.5);
    expect(p.warnings[0]!.message).toContain("so ',' was read as a decimal mark ('1,500' is 1.5); if '1,500' means 1500, import again with the decimal mark '.' (command line: --decimal-mark point)");
  });

  it('integers only: nothing to decide, nothing to warn about', () => {
    const p = previewTable(BASE.replace(/,/g, ';'), { fileName: 'int.csv' });
    expect(p.warnings).toEqual([]);
    expect(p.dialect?.decimalMarkFrom).toBe('guessed');
  });

  it('a tab file with decimal commas is read with them (the numbers decide)', () => {
    const t = importTable('x\tA\tTotal output\nA\t1,5\t3\n', { fileName: 't.tsv' });
    expect(t.Z[0]).toBe(1.5);
  });

  it('evidence from one cell', () => {
    const cases: [string, ReturnType<typeof markEvidence>][] = [
      ['12.5', { proves: '.' }], ['0.010', { proves: '.' }], ['.5', { proves: '.' }], ['1,234.5', { proves: '.' }], ['1,234,567', { proves: '.' }],
      ['1234.567', { proves: '.' }], ['12,5', { proves: ',' }], ['0,010', { proves: ',' }], ['1.234,5', { proves: ',' }], ['1.234.567', { proves: ',' }],
      ['12.345', { ambiguous: true }], ['-1,500', { ambiguous: true }], ['1 234.567', { proves: '.' }], ['1234', null], ['Farming 1.2', null], ['', null],
    ];
    for (const [cell, want] of cases) expect(markEvidence(cell), cell).toEqual(want);
  });

  it("a thousands group cannot start with 0: '0.010' with the decimal comma is refused, not read as 10", () => {
    expect(parseNumberText('0.010', ',').problem).toBe('non-numeric');
    expect(parseNumberText('0,010', '.').problem).toBe('non-numeric');
    expect(parseNumberText('1.010', ',').value).toBe(1010);
    // The first number that decides ('1,5') sets the mark for the whole file; '0.010' is then no number.
    const p = previewTable('x;A;Total output\nA;1,5;0.010\n', { fileName: 'mixed.csv' });
    expect(p.refusal?.formatted).toBe("mixed.csv:2:3 (row 'A', column 'Total output'): '0.010' is not a number (decimal comma expected)");
  });
});

describe('delimiter', () => {
  it('a semicolon file whose labels hold more commas than the line has semicolons is read as semicolon-separated', () => {
    const text = BASE.replace(/Farming/g, 'Farming, fishing, forestry, hunting').replace(/Mills/g, 'Mills, sawmills, paper, print').replace(/Services/g, 'Services, trade, repair').replace(/,(?! )/g, ';');
    expect(text.split('\n')[0]!.split(',').length).toBeGreaterThan(text.split('\n')[0]!.split(';').length);
    const p = previewTable(text, { fileName: 'labels.csv' });
    expect(p.refusal).toBeNull();
    expect(p.sectors).toEqual(['Farming, fishing, forestry, hunting', 'Mills, sawmills, paper, print', 'Services, trade, repair']);
    expect(p.dialect?.delimiterNote).toBe('guessed semicolon-separated (9 of the first 9 lines have 7 fields)');
  });

  it('guessDelimiter prefers the delimiter that splits the lines evenly, then the most frequent on the first line', () => {
    expect(guessDelimiter('a,b;c;d\n1;2;3\n').delimiter).toBe(';');
    expect(guessDelimiter('a;b,c,d\n1,2,3\n').delimiter).toBe(',');
    expect(guessDelimiter('a\tb\tc\n1\t2\t3\n').delimiter).toBe('\t');
    expect(guessDelimiter('"a;b",c\n1,2\n').delimiter).toBe(',');
    expect(guessDelimiter('abc\n').delimiter).toBe(',');
  });

  it('a row split wrongly names the delimiter assumed and how to force another', () => {
    const text = BASE.replace('Services,5,20,30,60,35,150', 'Services;5;20;30;60;35;150');
    const p = previewTable(text, { fileName: 'mixed.csv' });
    expect(p.refusal?.formatted).toBe(
      "mixed.csv:4:1 (row 'Services;5;20;30;60;35;150'): row has 1 field, the header has 7 (fields were split at each comma, the delimiter guessed from the first lines; if the file uses ';', make its first line sep=;, or choose the delimiter when importing (command line: --delimiter semicolon))",
    );
    // Without another delimiter in sight the message stays short.
    expect(previewTable(BASE.replace('Services,5,20,30,60,35,150', 'Services,5,20,30,60,35'), { fileName: 'r.csv' }).refusal?.message).toBe('row has 6 fields, the header has 7');
  });
});

describe('Excel "sep=" first line', () => {
  it('names the delimiter, is not a record, and keeps line numbers', () => {
    const semi = 'sep=;\r\n' + BASE.replace(/,/g, ';');
    const p = previewTable(semi, { fileName: 's.csv' });
    expect(p.dialect).toMatchObject({ delimiter: ';', delimiterFrom: 'sep-line', delimiterNote: 'semicolon-separated (the file\'s first line says sep=;)' });
    expect(p.sectors).toEqual(['Farming', 'Mills', 'Services']);
    expect(p.cells[0]![0]).toBe('thousand dollars');
    const bad = previewTable(semi.replace('Mills;15;', 'Mills;x;'), { fileName: 's.csv' });
    expect(bad.refusal?.location).toMatchObject({ line: 4, column: 2 });
  });
  it('quoted, padded and tab forms; a delimiter Roundwise does not read is refused', () => {
    expect(readSepLine('"sep=;";;;\nx', 'f').delimiter).toBe(';');
    expect(readSepLine('sep=\t\nx', 'f').delimiter).toBe('\t');
    expect(readSepLine('sep=,x,y\n', 'f').delimiter).toBeNull(); // a corner cell that happens to start "sep="
    const p = previewTable('sep=|\nx|A\n', { fileName: 'p.csv' });
    expect(p.refusal?.formatted).toBe("p.csv:1: the first line 'sep=|' names '|' as the delimiter; Roundwise reads comma-, semicolon- or tab-separated files");
  });
});

describe('the preview shows the cells as parsed', () => {
  it('decimal commas stay inside their cells, quoted delimiters too, and values sit under their headings', () => {
    const text = 'sep=;\r\nmillion euros;"Agriculture; fishing";Trade;Total output\r\n"Agriculture; fishing";100,00;450,00;1 000,5\r\nTrade;18O;2,5;30\r\n';
    const p = previewTable(text, { fileName: 'p.csv' });
    expect(p.cells).toEqual([
      ['million euros', 'Agriculture; fishing', 'Trade', 'Total output'],
      ['Agriculture; fishing', '100,00', '450,00', '1 000,5'],
      ['Trade', '18O', '2,5', '30'],
    ]);
    // The refusal names the same cell the grid shows under 'Agriculture; fishing'.
    expect(p.refusal?.formatted).toBe("p.csv:4:2 (row 'Trade', column 'Agriculture; fishing'): '18O' is not a number (decimal comma expected)");
  });
  it('at most 12 records of 10 fields; nothing for a file refused before it was parsed', () => {
    const wide = Array.from({ length: 20 }, (_, r) => Array.from({ length: 15 }, (_, c) => `${r}-${c}`).join(',')).join('\n');
    const p = previewTable(wide, { fileName: 'w.csv' });
    expect(p.cells.length).toBe(12);
    expect(p.cells.every((r) => r.length === 10)).toBe(true);
    expect(previewTable('\u0000\u0000', { fileName: 'b.csv' }).cells).toEqual([]);
  });
});
