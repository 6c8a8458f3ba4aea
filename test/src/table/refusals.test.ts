// One test per refusal of the table import, each asserting the message and the location.
// Locations follow RFC 4180 records: line = 1-based line of the record, column = 1-based field number.
import { describe, it, expect } from 'vitest';
import { BASE, expectRefusal, replaceOnce } from './helpers.ts';
import { checkTableSize, importTable, MAX_TABLE_BYTES } from '../../../src/table/index.ts';
import { InputError } from '../../../src/diagnostics/index.ts';

describe('table import refusals', () => {
  it('refuses a file over the size limit before parsing', () => {
    expect(MAX_TABLE_BYTES).toBe(200 * 1024 * 1024);
    expect(() => checkTableSize(MAX_TABLE_BYTES, 'big.csv')).not.toThrow();
    try {
      checkTableSize(MAX_TABLE_BYTES + 1, 'big.csv');
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(InputError);
      expect((e as InputError).code).toBe('file-too-large');
      expect((e as InputError).message).toBe('file is 200.0 MB, larger than the 200.0 MB limit; it was not imported');
      expect((e as InputError).location).toEqual({ file: 'big.csv' });
    }
  });
  it('refuses an empty file (0 bytes, only a BOM, only blank lines)', () => {
    expectRefusal('', 'empty', 'the file is empty', {});
    expectRefusal('\ufeff', 'empty', 'the file is empty', {});
    expectRefusal('\r\n  \n\n', 'empty', 'the file is empty', {});
  });
  it('refuses a header-only file', () => {
    expectRefusal(BASE.split('\n')[0]! + '\r\n\r\n', 'header-only', 'the file has a header but no rows of numbers', { line: 1 });
  });
  it('refuses binary content (NUL bytes)', () => {
    expectRefusal('\u0089PNG\r\n\u001a\n\u0000\u0000\u0000\rIHDR', 'binary', 'the file holds binary data (NUL bytes), not CSV text', { line: 3, column: 1 });
  });
  it('refuses binary content (mostly undecodable bytes)', () => {
    expectRefusal('\ufffd'.repeat(50) + 'a,b\n', 'binary', 'the file looks like binary data, not CSV text', {});
  });
  it('refuses a broken quote', () => {
    expectRefusal(replaceOnce(BASE, 'Mills,15,20', '"Mills,15,20'), 'bad-quotes', 'a quoted cell is not closed or a quote is misplaced (RFC 4180 §2)', { line: 3 });
  });
  it('refuses a ragged row (too few fields)', () => {
    expectRefusal(replaceOnce(BASE, 'Mills,15,20,10,45,110,200', 'Mills,15,20,10,45,110'), 'ragged-row', 'row has 6 fields, the header has 7', { line: 3, column: 6, rowLabel: 'Mills' });
  });
  it('refuses a ragged row (a value beyond the header)', () => {
    expectRefusal(replaceOnce(BASE, 'Mills,15,20,10,45,110,200', 'Mills,15,20,10,45,110,200,7'), 'ragged-row', "row has a value in field 8, beyond the header's 7 fields", { line: 3, column: 8, rowLabel: 'Mills' });
  });
  it('accepts empty trailing fields beyond the header (trailing delimiters)', () => {
    expect(importTable(replaceOnce(BASE, 'Mills,15,20,10,45,110,200', 'Mills,15,20,10,45,110,200,,'), { fileName: 't.csv' }).n).toBe(3);
  });
  it('refuses a row with numbers but no label', () => {
    expectRefusal(replaceOnce(BASE, 'Imports,15,20,10', ',15,20,10'), 'missing-label', 'row has numbers but no label', { line: 7, column: 1 });
  });
  it('refuses a column without a label', () => {
    expectRefusal(replaceOnce(BASE, ',Exports,', ',,'), 'missing-label', 'column has no label', { line: 1, column: 6 });
  });
  it('refuses a non-numeric cell', () => {
    expectRefusal(replaceOnce(BASE, 'Mills,15,20,10', 'Mills,15,twenty,10'), 'non-numeric', "'twenty' is not a number", { line: 3, column: 3, rowLabel: 'Mills', columnLabel: 'Mills' });
  });
  it('refuses a non-numeric cell outside the block too', () => {
    expectRefusal(replaceOnce(BASE, 'Imports,15,20,10', 'Imports,15,n/a,10'), 'non-numeric', "'n/a' is not a number", { line: 7, column: 3, rowLabel: 'Imports', columnLabel: 'Mills' });
  });
  it('refuses NaN', () => {
    expectRefusal(replaceOnce(BASE, 'Services,5,20,30', 'Services,5,NaN,30'), 'not-finite', "'NaN' is not a finite number", { line: 4, column: 3, rowLabel: 'Services', columnLabel: 'Mills' });
  });
  it('refuses an infinite number', () => {
    expectRefusal(replaceOnce(BASE, 'Farming,10,40,5,20,25', 'Farming,10,40,5,20,-inf'), 'not-finite', "'-inf' is not a finite number", { line: 2, column: 6, rowLabel: 'Farming', columnLabel: 'Exports' });
  });
  it('refuses a number that overflows a double (IEEE 754 binary64 max ≈ 1.7977e308)', () => {
    expectRefusal(replaceOnce(BASE, 'Mills,15,20,10', 'Mills,15,1e999,10'), 'overflow', "'1e999' is too large for a number (above 1.7977e+308)", { line: 3, column: 3, rowLabel: 'Mills', columnLabel: 'Mills' });
  });
  it('refuses sums that overflow', () => {
    expectRefusal(replaceOnce(BASE, 'Farming,10,40', 'Farming,1e308,1e308'), 'overflow', 'the row sum overflows (numbers too large to add up)', { line: 2, rowLabel: 'Farming' });
  });
  it('refuses an empty cell inside the inter-industry block', () => {
    expectRefusal(replaceOnce(BASE, 'Services,5,20,30', 'Services,5,,30'), 'blank-flow', 'empty cell in the inter-industry block (write 0 for no flow)', { line: 4, column: 3, rowLabel: 'Services', columnLabel: 'Mills' });
  });
  it('refuses duplicate sector row labels', () => {
    expectRefusal(replaceOnce(BASE, 'Services,5,20,30,60,35,150\n', 'Services,5,20,30,60,35,150\nMills,1,2,3,4,5,15\n'), 'duplicate-label', "duplicate row label 'Mills' (also on line 3)", { line: 5, column: 1, rowLabel: 'Mills' });
  });
  it('refuses row labels that differ only in case', () => {
    expectRefusal(replaceOnce(BASE, 'Services,5,20,30,60,35,150\n', 'Services,5,20,30,60,35,150\nMILLS,1,2,3,4,5,15\n'), 'duplicate-label', "duplicate row label 'MILLS' (also on line 3)", { line: 5, column: 1, rowLabel: 'MILLS' });
  });
  it('refuses duplicate column labels', () => {
    expectRefusal(replaceOnce(BASE, ',Farming,Mills,', ',Farming,Farming,'), 'duplicate-label', "duplicate column label 'Farming' (also in field 2)", { line: 1, column: 3, columnLabel: 'Farming' });
  });
  it('refuses a table whose row and column labels never match', () => {
    expectRefusal(replaceOnce(BASE, ',Farming,Mills,Services,', ',To farming,To mills,To services,'), 'no-sectors', 'no row label matches a column label, so there is no inter-industry block (sector rows and columns need the same labels)', { line: 1 });
  });
  it('refuses a negative intermediate flow unless allowed', () => {
    const text = replaceOnce(BASE, 'Mills,15,20,10', 'Mills,15,-20,10');
    expectRefusal(text, 'negative-flow', 'negative intermediate flow -20 (allow negative flows to accept it)', { line: 3, column: 3, rowLabel: 'Mills', columnLabel: 'Mills' });
    expect(importTable(text, { fileName: 't.csv', allowNegative: true }).Z[4]).toBe(-20);
  });
  it('refuses a sector with zero output that buys inputs', () => {
    expectRefusal(replaceOnce(BASE, 'Services,5,20,30,60,35,150', 'Services,5,20,30,60,35,0'), 'output-not-positive', "sector 'Services' has zero output but buys intermediate inputs", { line: 4, column: 7, rowLabel: 'Services', columnLabel: 'Total output' });
  });
  it('refuses a sector with negative output', () => {
    expectRefusal(replaceOnce(BASE, 'Services,5,20,30,60,35,150', 'Services,5,20,30,60,35,-150'), 'output-not-positive', "sector 'Services' has negative output -150", { line: 4, column: 7, rowLabel: 'Services', columnLabel: 'Total output' });
  });
  it('refuses negative employment', () => {
    expectRefusal(replaceOnce(BASE, 'Employment (jobs),12,30', 'Employment (jobs),12,-30'), 'negative-employment', 'negative employment -30 (jobs cannot be negative)', { line: 8, column: 3, rowLabel: 'Employment (jobs)', columnLabel: 'Mills' });
  });
  it('refuses the coefficients layout without a total output column', () => {
    const text = 'Technical coefficients,Farming,Mills\nFarming,0.1,0.2\nMills,0.3,0.1\n';
    expectRefusal(text, 'no-total-output', 'the coefficients layout needs a total output column', {});
  });
  it('refuses a long-layout pair given twice', () => {
    const text = 'from,to,value\nFarming,Farming,10\nFarming,Mills,40\nMills,Farming,15\nMills,Mills,20\nFarming,Mills,41\n';
    expectRefusal(text, 'duplicate-entry', "the pair 'Farming' → 'Mills' occurs twice (also on line 3)", { line: 6, column: 3, rowLabel: 'Farming', columnLabel: 'Mills' });
  });
  it('refuses a forced long layout without from/to/value fields', () => {
    expectRefusal(BASE, 'bad-long-header', "the long layout needs a header naming the fields 'from', 'to' and 'value'", { line: 1 }, { layout: 'long' });
  });
});

describe('not refused', () => {
  it('imports a table whose inputs exceed a sector’s output, with a warning', () => {
    // Farming buys 10+15+5 = 30 locally; with output 25 its inputs exceed its output (the viability test flags it).
    const text = replaceOnce(BASE, 'Farming,10,40,5,20,25,100', 'Farming,10,40,5,20,25,25');
    const t = importTable(text, { fileName: 't.csv' });
    expect(t.x[0]).toBe(25);
    expect(t.warnings.map((w) => w.code)).toContain('inputs-exceed-output');
  });
  it('drops a sector with zero output and no purchases or sales, with a note', () => {
    const text = [
      'thousand dollars,Farming,Idle,Mills,Households,Total output',
      'Farming,10,0,40,50,100',
      'Idle,0,0,0,0,0',
      'Mills,15,0,20,165,200',
      'Compensation of employees,75,0,140,,',
      'Total input,100,0,200,,',
    ].join('\n');
    const t = importTable(text, { fileName: 't.csv' });
    expect(t.sectors).toEqual(['Farming', 'Mills']);
    expect(Array.from(t.Z)).toEqual([10, 40, 15, 20]);
    expect(t.warnings.find((w) => w.code === 'sector-dropped')?.message).toBe("dropped 1 sector with zero output and no purchases or sales: 'Idle'");
  });
  it('uses the first of two total output columns and says so', () => {
    const text = BASE.split('\n').map((l, k) => (l === '' ? l : `${l},${k === 0 ? 'Gross output' : l.split(',')[6] ?? ''}`)).join('\n');
    const t = importTable(text, { fileName: 't.csv' });
    expect(t.warnings.map((w) => w.code)).toEqual(['extra-total']);
  });
  it('warns when totals disagree beyond the tolerance, listing the worst sectors', () => {
    // Mills: sales 15+20+10+45+110 = 200 against a stated 190 (gap 10/200 = 5 %); Farming 100 vs 99 (1 %).
    let text = replaceOnce(BASE, 'Mills,15,20,10,45,110,200', 'Mills,15,20,10,45,110,190');
    text = replaceOnce(text, 'Farming,10,40,5,20,25,100', 'Farming,10,40,5,20,25,99');
    const t = importTable(text, { fileName: 't.csv' });
    const w = t.warnings.find((x) => x.code === 'row-total-mismatch');
    expect(w?.message).toBe("sales (intermediate flows plus final demand) differ from total output beyond 0.1 % in 2 sectors; worst: 'Mills' +5.00 %, 'Farming' +1.00 %");
    expect(w?.location).toEqual({ file: 't.csv', rowLabel: 'Mills' });
    // Within a 10 % tolerance the row check is silent.
    const loose = importTable(text, { fileName: 't.csv', balanceTolerance: 0.1 });
    expect(loose.warnings.find((x) => x.code === 'row-total-mismatch')).toBeUndefined();
  });
});
