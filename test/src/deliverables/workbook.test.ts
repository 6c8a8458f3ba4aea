// The workbook (XLSX) read back by an independent reader (SheetJS, not the library that writes it): one sheet per
// report holding exactly the CSV report's values (numbers as the same doubles, full precision), the summary equal to
// the JSON's totals, number formats on numeric cells, frozen header rows, fitted column widths, no formulas, text with
// a formula lead escaped as in CSV, and sheet names a spreadsheet program accepts.
import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import {
  CAUTIONS, scenarioJson, scenarioReportSet, studyWorkbook, tableReport, VARIABLES,
} from '../../../src/study/index.ts';
import { sheetNames } from '../../../src/deliverables/index.ts';
import { readWorkbook, sampleStudy, sheetPart, XLSX } from '../../support/deliverables.ts';

const date = '2026-12-02T09:30:00.000Z';
const hostile = 'sector,amount,note\nConstruction,100,=HYPERLINK("http://example.invalid")\nFarming,50,@cmd\n';
const { ps, o } = sampleStudy();
const bytes = await studyWorkbook(ps, o, { date });
const wb = readWorkbook(bytes);

/** Trailing blank cells cut (SheetJS pads short rows to the sheet's width; a CSV row may end in empty cells). */
function trimmed(r: readonly unknown[]): unknown[] {
  const out = [...r];
  while (out.length && out[out.length - 1] === null) out.pop();
  return out;
}

function csvRows(text: string): unknown[][] {
  const rows = Papa.parse<unknown[]>(text.replace(/^\ufeff/, ''), { dynamicTyping: true, skipEmptyLines: true }).data;
  return rows.map((r) => trimmed(r.map((v) => (v === '' ? null : v))));
}

function sheet(name: string): unknown[][] {
  const rows = wb.sheets.get(name);
  if (!rows) throw new Error(`no sheet '${name}' among ${wb.names.join(', ')}`);
  return rows.map(trimmed);
}

describe('the workbook read back independently', () => {
  it('has one sheet per report, then the provenance and cautions', () => {
    expect(wb.names).toEqual([
      'Summary', 'Phases', 'Effects by sector', 'Scenario multipliers', 'Inputs', 'Spending rounds', 'Spending rounds by sector',
      'Multipliers', 'Coefficients', 'Leontief inverse', 'Viability', 'Perron vectors', 'Provenance and cautions',
    ]);
  });

  it('holds exactly the values of each CSV report, numbers to full precision', () => {
    const files = [...scenarioReportSet(ps, o, date), ...tableReport(ps, 'multipliers', date), ...tableReport(ps, 'coefficients', date), ...tableReport(ps, 'leontief-inverse', date), ...tableReport(ps, 'viability', date), ...tableReport(ps, 'perron-vectors', date)];
    const csv = (suffix: string) => csvRows(files.find((f) => f.name.endsWith(suffix))!.content);
    const pairs: [string, string][] = [
      ['Phases', '-phases.csv'], ['Effects by sector', '-impact.csv'], ['Scenario multipliers', '-implied-multipliers.csv'], ['Inputs', '-inputs.csv'],
      ['Spending rounds', '-rounds.csv'], ['Spending rounds by sector', '-rounds-by-sector.csv'], ['Multipliers', '/multipliers.csv'],
      ['Coefficients', 'coefficients.csv'], ['Leontief inverse', 'leontief-inverse.csv'], ['Viability', 'viability.csv'], ['Perron vectors', 'perron-vectors.csv'],
    ];
    for (const [name, suffix] of pairs) {
      const want = suffix.startsWith('/') ? csvRows(files.find((f) => f.name === suffix.slice(1))!.content) : csv(suffix);
      expect(sheet(name), name).toEqual(want);
    }
  });

  it('gives the scenario totals of the JSON to full precision on the summary sheet', () => {
    const json = scenarioJson(ps, o) as { totals: Record<string, { direct: number; indirect: number; induced: number; total: number }> };
    const rows = sheet('Summary');
    expect(rows[0]).toContain('direct');
    const name = { employment: 'jobs', income: 'labour income', valueAdded: 'value added', output: 'output' } as const;
    for (const v of VARIABLES.filter((x) => x in json.totals) as (keyof typeof name)[]) {
      const row = rows.find((r) => r[2] === name[v])!;
      const t = json.totals[v]!;
      expect(row.slice(4, 8), v).toEqual([t.direct, t.indirect, t.induced, t.total]);
    }
  });

  it('formats numbers, freezes the header row, fits column widths and writes no formulas', () => {
    for (const name of wb.names.filter((n) => n !== 'Provenance and cautions')) {
      const ws = wb.book.Sheets[name]!;
      const cols = ws['!cols'] ?? [];
      expect(cols.length, name).toBeGreaterThan(0);
      for (const c of cols) expect(c.width ?? c.wch ?? 0, name).toBeGreaterThanOrEqual(8);
      for (const [addr, cell] of Object.entries(ws)) {
        if (addr.startsWith('!')) continue;
        const c = cell as import('xlsx').CellObject;
        expect(c.f, `${name}!${addr}`).toBeUndefined();
        if (c.t === 'n') expect(c.z, `${name}!${addr}`).not.toBe('General');
      }
    }
    for (const name of ['Summary', 'Effects by sector', 'Coefficients', 'Spending rounds']) {
      expect(sheetPart(bytes, name), name).toMatch(/<pane [^>]*ySplit="1"[^>]*state="frozen"/);
    }
  });

  it('keeps the provenance and every caution in the workbook', () => {
    const about = sheet('Provenance and cautions').flat().filter((v): v is string => typeof v === 'string');
    for (const c of CAUTIONS) expect(about).toContain(c);
    expect(about).toContain(ps.study.source!.sha256);
  });

  it('escapes text with a formula lead, as CSV does, and never makes it a formula', async () => {
    const s = sampleStudy(hostile);
    const book = readWorkbook(await studyWorkbook(s.ps, s.o, { date }));
    const ws = book.book.Sheets.Inputs!;
    const notes = Object.entries(ws).filter(([a]) => !a.startsWith('!')).map(([, c]) => c as import('xlsx').CellObject);
    expect(notes.every((c) => c.f === undefined)).toBe(true);
    const texts = notes.map((c) => c.v);
    expect(texts).toContain('\'=HYPERLINK("http://example.invalid")');
    expect(texts).toContain('\'@cmd');
    expect(XLSX.utils.sheet_to_csv(ws)).not.toMatch(/(^|,)=HYPERLINK/m);
  });

  it('writes a table-only workbook without scenario sheets', async () => {
    const names = readWorkbook(await studyWorkbook(ps, null, { date })).names;
    expect(names[0]).toBe('Multipliers');
    expect(names).not.toContain('Summary');
  });
});

describe('sheetNames', () => {
  it('shortens to 31 characters, replaces forbidden characters and makes names unique ignoring case', () => {
    expect(sheetNames(['a/b:c?d*e[f]g\\h'])).toEqual(['a-b-c-d-e-f-g-h']);
    const long = 'x'.repeat(40);
    const [a, b] = sheetNames([long, long.toUpperCase()]);
    expect(a).toHaveLength(31);
    expect(b).toHaveLength(31);
    expect(b!.endsWith(' (2)')).toBe(true);
    expect(sheetNames(['Inputs', 'inputs'])).toEqual(['Inputs', 'inputs (2)']);
    expect(sheetNames(["'quoted'", ''])).toEqual(['quoted', 'Sheet']);
  });
});
