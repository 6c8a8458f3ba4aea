/**
 * Defects found by the hardening property tests, each pinned by the smallest input that showed it.
 */
import { describe, expect, it } from 'vitest';
import { linesOf } from '../../support/scenario.ts';
import { formatLocated, InputError } from '../../../src/diagnostics/index.ts';
import { importTable } from '../../../src/table/index.ts';
import { parseShockCsv } from '../../../src/scenario/index.ts';
import { refusalOf } from '../../support/fuzz-tables.ts';

describe('found by the property tests', () => {
  it('a label holding a carriage return (LF file) still gives a one-line message', () => {
    // Character fuzz, seed 73382: a CR inside a row label (here quoted, so it stays in the label).
    const text = 'unit,A,"B\r1",Total output\nA,1,2,10\n"B\r1",x,3,10\n';
    const e = refusalOf(() => importTable(text, { fileName: 'cr.csv' }), 'cr.csv');
    expect(e?.code).toBe('non-numeric');
    // Labels are normalised (white space runs become one space), so the row is 'B 1' on one line.
    expect(formatLocated(e!)).toMatch(/^cr\.csv:\d+:2 \(row 'B 1', column 'A'\): 'x' is not a number$/);
  });

  it('control and bidi characters are shown escaped wherever they are, whatever the quote marks around them', () => {
    const e = new InputError('non-numeric', "'a\tb\u0000\r' is not a number", { file: 'f.csv', line: 1, rowLabel: 'x\ny' });
    expect(formatLocated(e)).toBe("f.csv:1 (row 'x\\ny'): 'a\\tb\\u0000\\r' is not a number");
    // An odd number of quote marks (an apostrophe in the text) no longer decides what is escaped.
    expect(formatLocated(new InputError('non-numeric', "it's 'a\u001b[2Jb' and\nmore"))).toBe("it's 'a\\u001b[2Jb' and\\nmore");
    // A right-to-left override in a label cannot reverse the rest of the line.
    expect(formatLocated(new InputError('unknown-sector', 'unknown sector', { rowLabel: 'Farm\u202eing' }))).toBe("(row 'Farm\\u202eing'): unknown sector");
    // Our own hint (a usage line) goes on its own line, below the one-line message.
    expect(formatLocated(new InputError('usage', "unknown option '--x'", {}, 'usage: roundwise …'))).toBe("unknown option '--x'\nusage: roundwise …");
  });

  it('a flow table whose inter-industry block is all zero is not read as a coefficients table', () => {
    // Scaling property, seed 8103: with zero flows, the "flows are ≥ 1 % of output" test took the table for
    // coefficients and multiplied the labour-income row by output.
    const text = 'thousand dollars,A,B,Households,Total output\r\nA,0,0,2,2\r\nB,0,0,2,2\r\nLabor income,1,1,,\r\n';
    const t = importTable(text, { fileName: 'zero.csv' });
    expect(t.layout).toBe('matrix');
    expect(Array.from(t.labourIncome[0]!.values)).toEqual([1, 1]);
  });

  it('a flow table with flows far below output that is read as coefficients says so', () => {
    // Scaling property, seed 8103, 1000 runs: flows of 0.01 against outputs of 2 were taken for coefficients silently.
    const text = 'thousand dollars,A,B,Households,Total output\r\nA,0,0,2,2\r\nB,0,0.01,2,2.01\r\nLabor income,1,1,,\r\n';
    const t = importTable(text, { fileName: 'tiny-flows.csv' });
    expect(t.layout).toBe('coefficients');
    expect(t.warnings.find((w) => w.code === 'coefficients-guessed')?.message).toMatch(/read as technical coefficients.*matrix layout/);
    expect(importTable(text, { fileName: 'tiny-flows.csv', layout: 'matrix' }).warnings.map((w) => w.code)).not.toContain('coefficients-guessed');
  });
});

describe('found by the hardening corpus', () => {
  it('a shock-file refusal below a quoted note that spans lines names its own file line', () => {
    const s = parseShockCsv('sector,amount,kind,local_share,note\r\nCanning,300,final-demand,1,"new line\r\nof jars"\r\nServices,20,,,\r\nCannery,5,,,\r\n', 'shock.csv');
    expect(linesOf(s).map((l) => l.origin?.line)).toEqual([2, 4, 5]);
  });
  it('a binary or UTF-16 shock file is refused as such, not as a header with an unknown column of garbage', () => {
    const utf16 = '\ufffd\ufffd' + 'sector,amount\r\n'.split('').join('\u0000') + '\u0000';
    expect(refusalOf(() => parseShockCsv(utf16, 'shock.csv'), 'shock.csv')?.code).toBe('utf16');
    expect(refusalOf(() => parseShockCsv('sector,amount\r\nCan\u0000ning,1\r\n', 'shock.csv'), 'shock.csv')?.code).toBe('binary');
  });
});

describe('found by the regional CLI property', () => {
  it('an unclosed quote in a regional input is refused at its line instead of swallowing the file into one cell', async () => {
    const { parseGroupMapping } = await import('../../../src/regional/index.ts');
    const e = refusalOf(() => parseGroupMapping('"sector,group\nFarming,Goods\nMaking,Goods\n', 'groups.csv'), 'groups.csv');
    expect(e?.code).toBe('bad-quotes');
    expect(e!.location).toEqual({ file: 'groups.csv', line: 1 });
  });
});

describe('line breaks quoted from the file', () => {
  it('a quoted cell holding line breaks is echoed on one line', () => {
    const text = 'unit,A,B,Total output\r\nA,"1\n2\n3\n4",2,10\r\nB,1,3,10\r\n';
    const e = refusalOf(() => importTable(text, { fileName: 'nl.csv' }), 'nl.csv');
    expect(e?.code).toBe('non-numeric');
    expect(formatLocated(e!)).toBe("nl.csv:2:2 (row 'A', column 'A'): '1\\n2\\n3\\n4' is not a number");
  });
});
