// The CLI's brief and workbook: `roundwise scenario … --brief --xlsx` and `roundwise analyze … --xlsx` write a PDF
// whose text (pdftotext) holds the headline numbers of the same run's --json after the stated rounding (redone here
// with toPrecision and Math.round), and an XLSX whose cells, read back by SheetJS, equal the --json values to full
// precision. CSV reports start with the UTF-8 byte-order mark unless --no-bom, and read back through papaparse.
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { runCli } from '../../support/cli.ts';
import { pdfWords, poppler, readWorkbook, SAMPLE_SHOCK, SAMPLE_TABLE } from '../../support/deliverables.ts';

const dir = mkdtempSync(join(tmpdir(), 'roundwise-deliverables-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const en = (v: number) => v.toLocaleString('en-US', { maximumFractionDigits: 20 });
const sig3 = (v: number) => en(Number(v.toPrecision(3)));

interface Split { direct: number; indirect: number; induced: number; total: number }

describe('roundwise scenario --brief --xlsx', async () => {
  const brief = join(dir, 'brief.pdf');
  const book = join(dir, 'book.xlsx');
  const run = await runCli(['scenario', SAMPLE_TABLE, '--shock', SAMPLE_SHOCK, '--brief', brief, '--paper', 'letter', '--xlsx', book, '--json']);
  const json = JSON.parse(run.out) as { totals: Record<string, Split>; files: string[] };

  it('writes both files and lists them', () => {
    expect(run.code, run.err).toBe(0);
    expect(json.files).toEqual([brief, book]);
  });
  it('gives the headline numbers of the JSON in the brief, rounded as it states', () => {
    const text = pdfWords(readFileSync(brief));
    expect(text).toContain('Rounding: jobs to whole jobs; money to three significant figures');
    const e = json.totals.employment!;
    expect(text).toContain(`Jobs ${[e.direct, e.indirect, e.induced, e.total].map((x) => en(Math.round(x))).join(' ')}`);
    for (const [v, label] of [['income', 'Labour income'], ['valueAdded', 'Value added'], ['output', 'Output']] as const) {
      const t = json.totals[v]!;
      expect(text, v).toContain(`${label} (thousand dollars) ${[t.direct, t.indirect, t.induced, t.total].map(sig3).join(' ')}`);
    }
    expect(poppler('pdfinfo', readFileSync(brief))).toMatch(/612 x 792 pts \(letter\)/);
  });
  it('gives the JSON totals to full precision in the workbook', () => {
    const rows = readWorkbook(readFileSync(book)).sheets.get('Summary')!;
    const byVariable = new Map(rows.slice(1).map((r) => [r[2], r.slice(4, 8)]));
    expect(byVariable.get('jobs')).toEqual(Object.values(json.totals.employment!));
    expect(byVariable.get('output')).toEqual(Object.values(json.totals.output!));
  });
});

describe('roundwise analyze --xlsx', () => {
  it('writes the table\'s reports as sheets with the JSON multipliers to full precision', async () => {
    const book = join(dir, 'table.xlsx');
    const run = await runCli(['analyze', SAMPLE_TABLE, '--xlsx', book, '--json']);
    expect(run.code, run.err).toBe(0);
    const json = JSON.parse(run.out) as { sectors: string[]; multipliers: { output: { typeI: (number | null)[] } } };
    const wb = readWorkbook(readFileSync(book));
    expect(wb.names).toEqual(expect.arrayContaining(['Multipliers', 'Coefficients', 'Leontief inverse', 'Viability']));
    const sheet = wb.sheets.get('Multipliers')!;
    const col = (sheet[0] as string[]).indexOf('output Type I (per unit of final demand)');
    expect(col).toBeGreaterThan(0);
    expect(sheet.slice(1).map((r) => r[col])).toEqual(json.multipliers.output.typeI);
  });
  it('refuses a workbook name without .xlsx and --paper without --brief, writing nothing', async () => {
    const bad = await runCli(['analyze', SAMPLE_TABLE, '--xlsx', join(dir, 'x.csv')]);
    expect(bad.code).toBe(1);
    expect(bad.err).toContain('--xlsx: the file name must end in .xlsx');
    const paper = await runCli(['scenario', SAMPLE_TABLE, '--shock', SAMPLE_SHOCK, '--paper', 'a4']);
    expect(paper.code).toBe(1);
    expect(paper.err).toContain('--paper sets the size of the brief');
  });
});

describe('CSV reports and the byte-order mark', () => {
  it('start with the UTF-8 byte-order mark by default, without it under --no-bom, and read back the same', async () => {
    const withBom = join(dir, 'bom');
    const without = join(dir, 'nobom');
    expect((await runCli(['analyze', SAMPLE_TABLE, '--out', withBom])).code).toBe(0);
    expect((await runCli(['analyze', SAMPLE_TABLE, '--out', without, '--no-bom'])).code).toBe(0);
    const a = readFileSync(join(withBom, 'viability.csv'));
    const b = readFileSync(join(without, 'viability.csv'));
    expect([...a.subarray(0, 3)]).toEqual([0xef, 0xbb, 0xbf]);
    expect(b[0]).not.toBe(0xef);
    expect(a.subarray(3).equals(b)).toBe(true);
    expect(readFileSync(join(withBom, 'viability.about.txt'))[0]).not.toBe(0xef);
    // papaparse strips the mark, so the header reads the same either way.
    const parse = (buf: Buffer) => Papa.parse<string[]>(buf.toString('utf8'), { skipEmptyLines: true }).data;
    expect(parse(a)).toEqual(parse(b));
    expect(parse(a)[0]![0]).toBe('measure');
  });
});
