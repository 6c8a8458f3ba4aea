/**
 * Property-based tests of the table importer (fast-check, fixed seeds, bounded runs): random valid tables written
 * in any accepted encoding import to the same doubles; scaled tables give the same technical coefficients; and
 * random mutations either import to finite numbers or are refused with a located InputError — nothing else escapes.
 * Complements test/src/table (fixed variants of the sample and one test per refusal).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { importTable, previewTable } from '../../../src/table/index.ts';
import { coefficients } from '../../../src/model/index.ts';
import { CLEAN, encoding, expectFiniteTable, expectSameTable, gridTable, refusalOf, toText, type GridTable } from '../../support/fuzz-tables.ts';

const FILE = 'county.csv';
const RUNS = { numRuns: 120 };
const imp = (text: string) => importTable(text, { fileName: FILE });

function clone(g: GridTable): string[][] {
  return g.grid.map((r) => [...r]);
}

/** A grid cell chosen among the given rows and columns. */
const cellIn = (g: GridTable, rows: number[], cols: number[]) => fc.record({ r: fc.constantFrom(...rows), c: fc.constantFrom(...cols) });

/** Text that no reading of a number accepts (and holds no delimiter, quote or line break). */
const junk = fc.constantFrom('abc', '12abc', '1..2', '--3', '#N/A', 'n/a', '?', '1.2.3', '$', '12 %', '0x1F', '1e', 'e5', '..', '1-2', '(3)', 'TRUE', '½', '1e+-3');

describe('import properties', () => {
  it('the same table in any accepted encoding imports to the same doubles', () => {
    fc.assert(
      fc.property(gridTable, encoding, (g, enc) => {
        const clean = imp(toText(g.grid, CLEAN));
        expect(clean.warnings.filter((w) => w.code !== 'row-total-mismatch' && w.code !== 'column-total-mismatch' && w.code !== 'inputs-exceed-output')).toEqual([]);
        expectSameTable(imp(toText(g.grid, enc)), clean);
      }),
      { ...RUNS, seed: 8101 },
    );
  });

  it('the same table with columns in another order imports to the same doubles', () => {
    fc.assert(
      fc.property(gridTable.chain((g) => fc.tuple(fc.constant(g), fc.shuffledSubarray(g.grid[0]!.slice(1).map((_, k) => k + 1), { minLength: g.grid[0]!.length - 1, maxLength: g.grid[0]!.length - 1 }))), ([g, order]) => {
        const permuted = g.grid.map((row) => [row[0]!, ...order.map((c) => row[c]!)]);
        expectSameTable(imp(toText(permuted)), imp(toText(g.grid)));
      }),
      { numRuns: 60, seed: 8102 },
    );
  });

  it('money values scaled by 10^k (k from −290 to 290) give the same technical coefficients to 1e-13', () => {
    fc.assert(
      fc.property(gridTable, fc.integer({ min: -290, max: 290 }), (g, k) => {
        const scaled = clone(g);
        for (const r of g.moneyRows) for (const c of g.numberCols) if (scaled[r]![c] !== '') scaled[r]![c] = `${scaled[r]![c]}e${k}`;
        // The layout is stated: with tiny flows the coefficients guess is not scale-free (regressions.test.ts).
        const a = coefficients(importTable(toText(g.grid), { fileName: FILE, layout: 'matrix' }));
        const b = coefficients(importTable(toText(scaled), { fileName: FILE, layout: 'matrix' }));
        for (let i = 0; i < a.A.length; i++) {
          const ref = a.A[i]!;
          expect(Math.abs(b.A[i]! - ref)).toBeLessThanOrEqual(1e-13 * Math.abs(ref));
        }
        for (let j = 0; j < a.n; j++) expect(Math.abs(b.h[j]! - a.h[j]!)).toBeLessThanOrEqual(1e-13 * a.h[j]!);
      }),
      { ...RUNS, seed: 8103 },
    );
  });

  it('junk in a number cell is refused at that cell, naming line, column and both labels', () => {
    fc.assert(
      fc.property(gridTable.chain((g) => fc.tuple(fc.constant(g), cellIn(g, g.moneyRows, g.numberCols), junk, encoding)), ([g, { r, c }, bad, enc]) => {
        const grid = clone(g);
        if (grid[r]![c] === '') return; // a blank value-added cell under a final-demand column is not read
        grid[r]![c] = bad;
        const e = refusalOf(() => importTable(toText(grid, enc), { fileName: FILE }), FILE);
        expect(e?.code).toBe('non-numeric');
        expect(e!.location).toMatchObject({ line: r + 1, column: c + 1, rowLabel: grid[r]![0], columnLabel: grid[0]![c] });
        expect(e!.message).toContain(bad);
      }),
      { ...RUNS, seed: 8104 },
    );
  });

  it('NaN, infinities and numbers beyond the double range are refused at their cell', () => {
    const bad = fc.constantFrom(['NaN', 'not-finite'], ['-Infinity', 'not-finite'], ['inf', 'not-finite'], ['∞', 'not-finite'], ['1e309', 'overflow'], ['-2.5e400', 'overflow'], ['1' + '0'.repeat(400), 'overflow']);
    fc.assert(
      fc.property(gridTable.chain((g) => fc.tuple(fc.constant(g), cellIn(g, g.moneyRows, g.numberCols.slice(0, g.n)), bad)), ([g, { r, c }, [text, code]]) => {
        const grid = clone(g);
        grid[r]![c] = text;
        const e = refusalOf(() => imp(toText(grid)), FILE);
        expect(e?.code).toBe(code);
        expect(e!.location).toMatchObject({ line: r + 1, column: c + 1 });
      }),
      { numRuns: 60, seed: 8105 },
    );
  });

  it('huge but finite values either import finite or are refused as an overflowing sum; tiny ones import', () => {
    fc.assert(
      fc.property(gridTable, fc.constantFrom('1e300', '1.7e308', '1e-300', '4.9e-324', '2.2e-308'), (g, v) => {
        const grid = clone(g);
        for (let i = 0; i < g.n; i++) for (let j = 0; j < g.n; j++) grid[g.sectorRow(i)]![g.sectorCol(j)] = v;
        const text = toText(grid);
        const e = refusalOf(() => expectFiniteTable(imp(text)), FILE);
        if (e) {
          expect(e.code).toBe('overflow');
          expect(e.location.rowLabel ?? e.location.columnLabel).toBeDefined();
        } else expect(Number(v)).toBeLessThan(1e308);
      }),
      { numRuns: 60, seed: 8106 },
    );
  });

  it('a sector label repeated on a later row or column is refused at the repeat', () => {
    fc.assert(
      fc.property(gridTable.chain((g) => fc.tuple(fc.constant(g), fc.integer({ min: 0, max: g.n - 1 }), fc.integer({ min: 0, max: g.n - 1 }), fc.boolean())), ([g, a, b, inHeader]) => {
        if (a === b) return;
        const [first, later] = a < b ? [a, b] : [b, a];
        const grid = clone(g);
        if (inHeader) grid[0]![g.sectorCol(later)] = g.sectors[first]!;
        else grid[g.sectorRow(later)]![0] = g.sectors[first]!;
        const e = refusalOf(() => imp(toText(grid)), FILE);
        expect(e?.code).toBe('duplicate-label');
        expect(e!.location).toMatchObject(inHeader ? { line: 1, column: g.sectorCol(later) + 1, columnLabel: g.sectors[first] } : { line: g.sectorRow(later) + 1, column: 1, rowLabel: g.sectors[first] });
      }),
      { numRuns: 80, seed: 8107 },
    );
  });

  it('one record written with another delimiter is refused as a ragged row at its line', () => {
    fc.assert(
      fc.property(gridTable.chain((g) => fc.tuple(fc.constant(g), fc.integer({ min: 1, max: g.grid.length - 1 }), fc.constantFrom(';', '\t', '|'))), ([g, r, d]) => {
        const lines = g.grid.map((row) => row.join(','));
        lines[r] = g.grid[r]!.join(d);
        const e = refusalOf(() => imp(lines.join('\r\n') + '\r\n'), FILE);
        expect(e?.code).toBe('ragged-row');
        expect(e!.location.line).toBe(r + 1);
      }),
      { numRuns: 80, seed: 8108 },
    );
  });

  it('a blank cell in the inter-industry block is refused there; elsewhere it reads as 0', () => {
    fc.assert(
      fc.property(gridTable.chain((g) => fc.tuple(fc.constant(g), cellIn(g, g.moneyRows, g.numberCols))), ([g, { r, c }]) => {
        const grid = clone(g);
        grid[r]![c] = '';
        const inBlock = r <= g.n && c <= g.n;
        const e = refusalOf(() => imp(toText(grid)), FILE);
        if (inBlock) {
          expect(e?.code).toBe('blank-flow');
          expect(e!.location).toMatchObject({ line: r + 1, column: c + 1 });
        } else if (e) {
          // A blank total output of a sector that buys inputs is a zero output that buys inputs.
          expect(e.code).toBe('output-not-positive');
          expect(c).toBe(g.n + 3);
        }
      }),
      { numRuns: 80, seed: 8109 },
    );
  });

  it('dropping any record, or cutting the file anywhere, imports finite numbers or is refused with a location', () => {
    fc.assert(
      fc.property(gridTable.chain((g) => fc.tuple(fc.constant(g), fc.integer({ min: 0, max: g.grid.length - 1 }), fc.double({ min: 0, max: 1, noNaN: true }), encoding)), ([g, drop, cut, enc]) => {
        const dropped = g.grid.filter((_, k) => k !== drop);
        const t1 = toText(dropped, enc);
        const r1 = refusalOf(() => expectFiniteTable(imp(t1)), FILE);
        if (drop === 0) expect(r1).not.toBeNull();
        const full = toText(g.grid, enc);
        const t2 = full.slice(0, Math.floor(cut * full.length));
        refusalOf(() => expectFiniteTable(imp(t2)), FILE);
      }),
      { ...RUNS, seed: 8110 },
    );
  });

  it('any character replaced by any other (quotes, delimiters, NUL, line breaks, U+FFFD…) never lets anything but an InputError escape', () => {
    const ch = fc.oneof(fc.constantFrom('"', ',', ';', '\t', '\n', '\r', '\u0000', '\ufffd', '\ufeff', "'", '=', '-', '.', 'e', ' ', '\u00a0', '\u2212'), fc.string({ minLength: 0, maxLength: 3 }));
    fc.assert(
      fc.property(gridTable, encoding, fc.array(fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), ch), { minLength: 1, maxLength: 4 }), (g, enc, edits) => {
        let text = toText(g.grid, enc);
        for (const [at, s] of edits) {
          const k = Math.floor(at * text.length);
          text = text.slice(0, k) + s + text.slice(k + 1);
        }
        const e = refusalOf(() => expectFiniteTable(imp(text)), FILE);
        const p = previewTable(text, { fileName: FILE });
        expect(p.ok).toBe(e === null);
        if (e) expect(p.refusal).toMatchObject({ code: e.code, message: e.message });
      }),
      { numRuns: 300, seed: 8111 },
    );
  });

  it('negative flows are refused at their cell unless allowed, then imported as given', () => {
    fc.assert(
      fc.property(gridTable.chain((g) => fc.tuple(fc.constant(g), cellIn(g, Array.from({ length: g.n }, (_, i) => g.sectorRow(i)), Array.from({ length: g.n }, (_, j) => g.sectorCol(j))), fc.integer({ min: 1, max: 1e6 }))), ([g, { r, c }, v]) => {
        const grid = clone(g);
        grid[r]![c] = String(-v / 100);
        const e = refusalOf(() => imp(toText(grid)), FILE);
        expect(e?.code).toBe('negative-flow');
        expect(e!.location).toMatchObject({ line: r + 1, column: c + 1 });
        const t = importTable(toText(grid), { fileName: FILE, allowNegative: true });
        expect(t.Z[(r - 1) * g.n + (c - 1)]).toBe(-v / 100);
      }),
      { numRuns: 60, seed: 8112 },
    );
  });

  it('the long layout (from,to,value) of a random table imports to the same doubles; its mutations import finite or are refused', () => {
    const toLong = (grid: string[][]): string[] => {
      const out = ['from,to,value'];
      for (let r = 1; r < grid.length; r++) for (let c = 1; c < grid[0]!.length; c++) if (grid[r]![c] !== '') out.push(`${grid[r]![0]},${grid[0]![c]},${grid[r]![c]}`);
      return out;
    };
    const ch = fc.oneof(fc.constantFrom('"', ',', '\n', 'x', '-', '', '1e999', 'NaN'), fc.string({ maxLength: 2 }));
    fc.assert(
      fc.property(gridTable, fc.array(fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), ch), { minLength: 1, maxLength: 3 }), (g, edits) => {
        const lines = toLong(g.grid);
        expectSameTable(imp(lines.join('\r\n') + '\r\n'), imp(toText(g.grid)));
        let text = lines.join('\n') + '\n';
        for (const [at, s] of edits) {
          const k = Math.floor(at * text.length);
          text = text.slice(0, k) + s + text.slice(k + 1);
        }
        refusalOf(() => expectFiniteTable(imp(text)), FILE);
      }),
      { numRuns: 100, seed: 8113 },
    );
  });
});
