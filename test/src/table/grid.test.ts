// The quote-free fast grid must give the same records and fields as papaparse (RFC 4180 reader from the registry).
import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { buildGrid, byteWords, countByte, recordStartLines, type Grid } from '../../../src/table/grid.ts';
import { seeded } from '../../support/random.ts';
import { scanPlain, scanPlainFields } from '../../../src/table/numbers.ts';
import type { Delimiter } from '../../../src/table/text.ts';

/** A record's numbers read in one pass equal the field-by-field reads, bit for bit (NaN where either says NaN). */
function expectRowsRead(g: Grid, decimalCode: number): void {
  for (let r = 0; r < g.rowCount; r++) {
    const out = new Float64Array(g.width(r) + 2).fill(7);
    g.plainRow(r, decimalCode, out);
    for (let c = 0; c < out.length; c++) expect(Object.is(out[c], g.plain(r, c, decimalCode))).toBe(true);
  }
}

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
          expectRowsRead(fast, 46);
          expectRowsRead(papa, 46);
        },
      ),
      { numRuns: 500, seed: 4180 },
    );
  });
  it('reads a record\'s numbers in one pass exactly as field by field (scanPlain), any decimal mark and delimiter', () => {
    const digits = fc.constantFrom('0', '1', '5', '9');
    const unit = fc.oneof({ weight: 6, arbitrary: digits }, { weight: 1, arbitrary: fc.constantFrom('.', ',', '-', '+', 'e', 'E', ' ', 'x', '\u2212') });
    const field = fc.oneof(
      fc.string({ unit, maxLength: 24 }),
      // long mantissas and exponents: the 15-digit and 10^±22 limits of the fast path
      fc.tuple(fc.bigInt({ min: 0n, max: 10n ** 20n }), fc.integer({ min: -40, max: 40 })).map(([m, e]) => `${m}e${e}`),
      fc.double({ noNaN: true }).map(String),
    );
    fc.assert(
      fc.property(
        fc.constantFrom<[Delimiter, number]>([',', 46], [';', 44], [';', 46], ['\t', 44], ['\t', 46]),
        fc.array(fc.array(field, { minLength: 1, maxLength: 8 }), { minLength: 1, maxLength: 5 }),
        fc.constantFrom('\n', '\r\n'),
        ([d, dc], rows, eol) => {
          const text = rows.map((r) => r.join(d)).join(eol) + eol;
          expectRowsRead(buildGrid(text, d, 't.csv'), dc);
          // and straight against scanPlain on each field of one record (whose fields hold no delimiter)
          if (rows[0]!.some((f) => f.includes(d))) return;
          const line = rows[0]!.join(d);
          const out = new Float64Array(rows[0]!.length);
          scanPlainFields(line, 0, line.length, d.charCodeAt(0), dc, out, out.length);
          let at = 0;
          rows[0]!.forEach((f, c) => {
            expect(Object.is(out[c], scanPlain(line, at, at + f.length, dc))).toBe(true);
            at += f.length + 1;
          });
        },
      ),
      { numRuns: 400, seed: 2024 },
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
  it('countByte counts a byte four at a time exactly as a byte loop does, at every alignment and length', () => {
    const r = seeded(41);
    const buffer = new ArrayBuffer(300);
    const all = new Uint8Array(buffer);
    // Mostly the counted byte and its neighbours (one bit apart, 0x80 and 0x00, which trip a loose zero-byte test).
    const pool = [44, 44, 45, 43, 108, 0, 0x80, 0xac, 0xff, 48, 10];
    for (let i = 0; i < all.length; i++) all[i] = pool[Math.floor(r() * pool.length)]!;
    for (let offset = 0; offset < 5; offset++) {
      for (const length of [0, 1, 2, 3, 5, 8, 64, 200]) {
        const bytes = new Uint8Array(buffer, offset, length);
        const bw = byteWords(bytes);
        for (let from = 0; from <= Math.min(length, 9); from++) {
          for (const to of [from, from + 1, from + 3, from + 4, from + 7, length].filter((t) => t <= length)) {
            for (const code of [44, 0, 0x80, 0xff]) {
              let want = 0;
              for (let p = from; p < to; p++) if (bytes[p] === code) want++;
              expect(countByte(bytes, bw, code, from, to)).toBe(want);
            }
          }
        }
      }
    }
  });
});
