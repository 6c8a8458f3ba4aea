/**
 * Large inputs: a 50 MB table with one bad cell near its end (generated in a temporary folder at test time, not
 * committed) is refused at that cell, with memory growth bounded; a file over the stated limit (MAX_TABLE_BYTES,
 * 200 MiB, src/table/text.ts) is refused by its size before any parsing.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { importTable, MAX_TABLE_BYTES } from '../../../src/table/index.ts';
import { refusalOf } from '../../support/fuzz-tables.ts';

const dir = mkdtempSync(join(tmpdir(), 'roundwise-large-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** n sectors of plain two-decimal flows (invented; every row has the same flows, made once), a household column and a total output column. */
function bigTable(n: number, bad: { row: number; col: number; text: string }): string {
  const header = ['thousand dollars', ...Array.from({ length: n }, (_, j) => `Sector ${j + 1}`), 'Households', 'Total output'].join(',');
  const cells = Array.from({ length: n }, (_, j) => String((j * 104_729 % 1_000_000) / 100));
  const flows = cells.join(',');
  const out: string[] = [header];
  for (let i = 0; i < n; i++) {
    const row = i === bad.row ? cells.map((c, j) => (j === bad.col ? bad.text : c)).join(',') : flows;
    out.push(`Sector ${i + 1},${row},1000,99999999`);
  }
  return out.join('\r\n') + '\r\n';
}

describe('large inputs', () => {
  it('a 50 MB table with one bad cell near the end is refused at that cell; memory stays within a few times the file', () => {
    const n = 2560;
    const file = join(dir, 'large.csv');
    writeFileSync(file, bigTable(n, { row: n - 1, col: n - 3, text: '12x4.5' }));
    const bytes = statSync(file).size;
    expect(bytes).toBeGreaterThan(50e6);
    expect(bytes).toBeLessThan(MAX_TABLE_BYTES);
    globalThis.gc?.();
    const before = process.memoryUsage().rss;
    let peak = before;
    const text = readFileSync(file, 'utf8');
    const e = refusalOf(() => importTable(text, { fileName: 'large.csv' }), 'large.csv');
    peak = Math.max(peak, process.memoryUsage().rss);
    expect(e?.code).toBe('non-numeric');
    expect(e!.location).toEqual({ file: 'large.csv', line: n + 1, column: n - 1, rowLabel: `Sector ${n}`, columnLabel: `Sector ${n - 2}` });
    expect(e!.message).toBe("'12x4.5' is not a number");
    // The text (one byte per character) plus field offsets (4 bytes per cell) plus the n×n doubles is about 3× the file;
    // allow 8× for the collector's slack. Measured on the development machine: about 1.3× (65 MB for 50 MB).
    expect(peak - before).toBeLessThan(8 * bytes);
  }, 120_000); // writing and importing 50 MB takes seconds alone, minutes on a machine shared by other jobs

  it('text over the limit is refused by its size before parsing (a file of NULs is refused as too large, not as binary)', () => {
    const text = '\u0000'.repeat(MAX_TABLE_BYTES + 1);
    const e = refusalOf(() => importTable(text, { fileName: 'huge.csv' }), 'huge.csv');
    expect(e?.code).toBe('file-too-large');
    expect(e!.location).toEqual({ file: 'huge.csv' });
  });
});

describe('the CLI and a file over the limit', () => {
  it('a 1 GiB table is refused by its size before it is read (scenario and analyze): exit 2, memory does not grow by the file', async () => {
    const { runCli } = await import('../../support/cli.ts');
    const { expectCliRefusal } = await import('../../support/fuzz-tables.ts');
    const { truncateSync } = await import('node:fs');
    const table = join(dir, 'sparse.csv');
    writeFileSync(table, '');
    truncateSync(table, 1024 ** 3); // sparse: no disk space used
    const shock = join(dir, 'shock.csv');
    writeFileSync(shock, 'sector,amount\r\nA,1\r\n');
    for (const argv of [['scenario', table, '--shock', shock], ['analyze', table, '--json']]) {
      const before = process.memoryUsage().rss;
      const r = await runCli(argv);
      const grown = process.memoryUsage().rss - before;
      expectCliRefusal(r, argv[0]!);
      expect(r.err).toMatch(new RegExp(`^roundwise ${argv[0]}: (.*/)?sparse\\.csv: file is 1024\\.0 MB, larger than the 200\\.0 MB limit; nothing was read\n$`));
      expect(grown).toBeLessThan(200 * 1024 * 1024);
    }
  });
});
