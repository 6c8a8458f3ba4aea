// The quote-free fast grid must give the same records and fields as papaparse (RFC 4180 reader from the registry).
import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { buildGrid, recordStartLines, type Grid } from '../../../src/table/grid.ts';
import type { Delimiter } from '../../../src/table/text.ts';

function cellsOf(g: Grid): string[][] {
  const out: string[][] = [];
  for (let r = 0; r < g.rowCount; r++) out.push(Array.from({ length: g.width(r) }, (_, c) => g.cell(r, c)));
  return out;
}

describe('grid', () => {
  it('fast grid equals papaparse on random quote-free text', () => {
    const field = fc.string({ unit: fc.constantFrom('a', '1', '.', ' ', '-', 'é', ';', ',', '\t'), maxLength: 6 });
    fc.assert(
      fc.property(
        fc.constantFrom<Delimiter>(',', ';', '\t'),
        fc.constantFrom('\r\n', '\n', '\r'),
        fc.array(fc.array(field, { minLength: 1, maxLength: 5 }), { minLength: 1, maxLength: 6 }),
        fc.boolean(),
        (d, eol, rows, finalEol) => {
          const text = rows.map((r) => r.join(d)).join(eol) + (finalEol ? eol : '');
          const fast = buildGrid(text, d, 't.csv');
          const papa = buildGrid(text, d, 't.csv', true);
          expect(cellsOf(fast)).toEqual(cellsOf(papa));
          for (let r = 0; r < fast.rowCount; r++) {
            expect(fast.line(r)).toBe(papa.line(r));
            expect(fast.blank(r)).toBe(papa.blank(r));
            for (let c = 0; c < fast.width(r); c++) expect(Object.is(fast.plain(r, c, 46), papa.plain(r, c, 46))).toBe(true);
          }
        },
      ),
      { numRuns: 500, seed: 4180 },
    );
  });
  it('finds the starting line of records with quoted line breaks', () => {
    const text = 'a,"x\r\ny"\r\nb,"p\nq\nr"\nc,1\n';
    expect(recordStartLines(text).slice(0, 3)).toEqual([1, 3, 6]);
    const g = buildGrid(text, ',', 't.csv');
    expect(g.cell(1, 1)).toBe('p\nq\nr');
    expect(g.line(2)).toBe(6);
  });
  it('mixed line ends: CRLF and LF end records; a lone CR in a file with LF is text', () => {
    for (const text of ['a,1\r\nb,2\nc,3\n', 'a,"1"\r\nb,2\nc,3\n']) {
      const g = buildGrid(text, ',', 't.csv');
      expect(cellsOf(g)).toEqual([['a', '1'], ['b', '2'], ['c', '3']]);
      expect([0, 1, 2].map((r) => g.line(r))).toEqual([1, 2, 3]);
    }
    for (const text of ['a,1\nb\r2,3\n', 'a,"1"\nb\r2,3\n']) expect(cellsOf(buildGrid(text, ',', 't.csv'))).toEqual([['a', '1'], ['b\r2', '3']]);
    expect(cellsOf(buildGrid('a,1\rb,2\r', ',', 't.csv'))).toEqual([['a', '1'], ['b', '2']]);
  });
  it('an unclosed quote is refused with its line', () => {
    expect(() => buildGrid('a,b\nc,"d\n', ',', 't.csv')).toThrow(/quoted cell is not closed/);
  });
});
