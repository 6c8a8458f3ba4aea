// importTableBytes reads plain ASCII files from their bytes (bytes.ts, grid.ts ByteGrid) and everything else as text:
// either way it must give exactly importTable's result for the UTF-8 text of the same bytes — the same table, the
// same warnings, the same refusal with the same located message.
import { describe, it, expect } from 'vitest';
import { readdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import fc from 'fast-check';
import { importTable, importTableBytes, previewTable, previewTableBytes, type ImportOptions } from '../../../src/table/index.ts';
import { plainHead } from '../../../src/table/bytes.ts';
import { gridTable, encoding, toText, refusalOf } from '../../support/fuzz-tables.ts';
import { seeded } from '../../support/random.ts';

const utf8 = new TextDecoder('utf-8');

/**
 * Both imports of `bytes`: the same table (every field) or the same refusal; and both previews the same (what was
 * detected before a refusal, the first cells as parsed, the balance), as the app previews a file, then imports it.
 */
function expectSameImport(bytes: Uint8Array, opts: ImportOptions): void {
  const text = utf8.decode(bytes);
  expect(previewTableBytes(bytes, opts)).toEqual(previewTable(text, opts));
  // Each import once: its table, or its refusal (checked well formed by refusalOf).
  let want: ReturnType<typeof importTable> | undefined;
  let got: ReturnType<typeof importTableBytes> | undefined;
  const wantRefusal = refusalOf(() => { want = importTable(text, opts); }, opts.fileName);
  const gotRefusal = refusalOf(() => { got = importTableBytes(bytes, opts); }, opts.fileName);
  if (wantRefusal !== null || gotRefusal !== null) {
    expect(gotRefusal && { code: gotRefusal.code, message: gotRefusal.message, location: gotRefusal.location })
      .toEqual(wantRefusal && { code: wantRefusal.code, message: wantRefusal.message, location: wantRefusal.location });
    return;
  }
  expect(got).toEqual(want);
}

const bytesOf = (text: string) => new TextEncoder().encode(text);

describe('importTableBytes', () => {
  it('is importTable of the text for every file of the malformed corpus (refusals, warnings and tables)', () => {
    const dir = fileURLToPath(new URL('../../fixtures/table/corpus/', import.meta.url));
    let plain = 0;
    for (const f of readdirSync(dir).filter((name) => name.endsWith('.csv'))) {
      const bytes = new Uint8Array(readFileSync(dir + f));
      if (plainHead(bytes) !== null) plain++;
      expectSameImport(bytes, { fileName: f });
    }
    expect(plain).toBeGreaterThan(10); // the byte path ran, not only the text path
  });

  it('is importTable of the text for random tables in every dialect, with cells broken at random', () => {
    fc.assert(
      fc.property(gridTable, encoding, fc.integer({ min: 0, max: 5 }), fc.integer(), (t, e, breaks, seed) => {
        const r = seeded(seed);
        const grid = t.grid.map((row) => [...row]);
        // damage: an exponent, a grouped number, a word, an empty cell, a negative flow, a lone CR inside a line
        const damage = ['1.5e3', '1,234', 'n/a', '', '-7', '3\r4', ' 12 ', '0012', '1234567890123456789'];
        for (let k = 0; k < breaks; k++) {
          const row = 1 + Math.floor(r() * (grid.length - 1));
          const col = 1 + Math.floor(r() * (grid[row]!.length - 1));
          grid[row]![col] = damage[Math.floor(r() * damage.length)]!;
        }
        expectSameImport(bytesOf(toText(grid, e)), { fileName: 'random.csv', allowNegative: seed % 2 === 0 });
      }),
      { seed: 20261202, numRuns: 300 },
    );
  });

  it('decides the dialect from the head only when the whole text would decide it the same way', () => {
    // Semicolon-separated, decimal comma: the mark is proved only by a number beyond the first MiB. Before it every
    // number reads both ways, so the head alone would guess; the import must read the whole text and find the proof.
    const rows = ['unit;A;B;Households;Total output'];
    let k = 0;
    for (let size = 0; size < 1.2 * (1 << 20); k++) {
      rows.push(`A${k};1,500;2,250;3,000;6,750`);
      size += rows[rows.length - 1]!.length + 1;
    }
    const late = [...rows.slice(0, 1), 'A;1;2;3;6', 'B;2;1;3;6', ...rows.slice(1).map((l) => l.replace(/^A\d+/, (m) => `X${m}`)), 'X;1,5;0;0;1,5'].join('\n') + '\n';
    const bytes = bytesOf(late);
    expect(plainHead(bytes)).not.toBeNull();
    expectSameImport(bytes, { fileName: 'late.csv' });
    // and a plain file whose head decides: read from the bytes, the same table
    const early = bytesOf('unit,A,B,Households,Total output\nA,1.5,2,3,6.5\nB,2,1,3,6\nLabor income,2,2,,\nImports,1,1,,\n');
    expect(plainHead(early)).not.toBeNull();
    expectSameImport(early, { fileName: 'early.csv' });
  });

  it('reads as text a file with quotes, bytes beyond ASCII, a NUL or no line feed', () => {
    const table = 'unit,A,B,Households,Total output\nA,1,2,3,6\nB,2,1,3,6\nLabor income,2,2,,\nImports,1,1,,\n';
    for (const text of [table.replace('unit', '"unit"'), table.replace('unit', 'unité'), table.replace('unit', 'un\u0000it'), table.replace(/\n/g, '\r'), `\ufeff${table}`]) {
      const bytes = bytesOf(text);
      expect(plainHead(bytes)).toBeNull();
      expectSameImport(bytes, { fileName: 'text.csv' });
    }
    expect(plainHead(bytesOf(table))).not.toBeNull();
  });
});
