/**
 * The hardening corpus (test/fixtures/hardening/corpus, written by make-corpus.ts): tables in foreign encodings and
 * formats, shock files for every scenario refusal, and damaged or foreign project files. Each file is read as the
 * CLI reads it (bytes decoded as UTF-8) and must give exactly the message below. Complements test/fixtures/table,
 * whose corpus holds one file per single-cell refusal of the importer.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { formatLocated, InputError } from '../../../src/diagnostics/index.ts';
import { importTable, previewTable } from '../../../src/table/index.ts';
import { parseShockCsv } from '../../../src/scenario/index.ts';
import { linesOf, runScenario } from '../../support/scenario.ts';
import { prepareModel } from '../../../src/model/index.ts';
import { parseProject, serializeProject } from '../../../src/project/index.ts';
import { ACCEPTED, BASE, NO_JOBS_TABLE, projects, SHOCKS, TABLES } from '../../fixtures/hardening/make-corpus.ts';
import { expectSameTable, expectWellFormedRefusal } from '../../support/fuzz-tables.ts';

const DIR = fileURLToPath(new URL('../../fixtures/hardening/corpus/', import.meta.url));
const read = (name: string) => readFileSync(join(DIR, name), 'utf8');

const UTF16 = 'the file is UTF-16 text; save it as UTF-8 (in a spreadsheet: "CSV UTF-8")';
const NUL = 'the file holds binary data (NUL bytes), not CSV text';
const NOT_JSON = 'the project file is not valid JSON — it may be damaged; it was not changed';

/** File → the one-line message the user sees (`formatLocated`), or 'imports' with what must hold. */
const TABLE_EXPECT: Record<string, string> = {
  'table-utf16le-bom.csv': `table-utf16le-bom.csv: ${UTF16}`,
  'table-utf16be-bom.csv': `table-utf16be-bom.csv: ${UTF16}`,
  'table-utf16le-no-bom.tsv': `table-utf16le-no-bom.tsv: ${UTF16}`,
  'table-latin1-number.csv': "table-latin1-number.csv:3:2 (row 'Canning', column 'Orchards'): '5\ufffd000' is not a number",
  'table-zip.csv': `table-zip.csv:1:6: ${NUL}`,
  'table-pdf.csv': `table-pdf.csv:6:49: ${NUL}`,
  'table-png.csv': `table-png.csv:3:1: ${NUL}`,
  'table-bom-only.csv': 'table-bom-only.csv: the file is empty',
  'table-html.csv': 'table-html.csv:1: no row label matches a column label, so there is no inter-industry block (sector rows and columns need the same labels)',
  'table-json.csv': 'table-json.csv:1: the file has a header but no rows of numbers',
  'table-excel-error.csv': "table-excel-error.csv:4:3 (row 'Services', column 'Canning'): '#DIV/0!' is not a number",
  'table-dash-for-zero.csv': "table-dash-for-zero.csv:3:2 (row 'Canning', column 'Orchards'): '-' is not a number",
  'table-mixed-delimiters.csv': "table-mixed-delimiters.csv:4:1 (row 'Services;15;30;20;100;35;200'): row has 1 field, the header has 7 (fields were split at each comma, the delimiter guessed from the first lines; if the file uses ';', make its first line sep=;, or choose the delimiter when importing (command line: --delimiter semicolon))",
  'table-excel-sep-pipe.csv': "table-excel-sep-pipe.csv:1: the first line 'sep=|' names '|' as the delimiter; Roundwise reads comma-, semicolon- or tab-separated files",
  'table-percent.csv': "table-percent.csv:2:2 (row 'Orchards', column 'Orchards'): '10 %' is not a number",
  'table-currency.csv': "table-currency.csv:2:2 (row 'Orchards', column 'Orchards'): '$10' is not a number",
  'table-long-junk.csv': "table-long-junk.csv:3:3 (row 'Orchards', column 'Canning'): 'forty' is not a number",
  'table-quoted-newline-label.csv': "table-quoted-newline-label.csv:3:3 (row 'Orchards', column 'Can ning'): 'x' is not a number",
};

const SHOCK_EXPECT: Record<string, string> = {
  'shock-0-byte.csv': "shock-0-byte.csv: the shock file is empty (expected a header sector,amount[,kind][,local_share][,phase][,timing][,year][,years][,price_year][,prices][,displacement][,deadweight][,note])",
  'shock-header-only.csv': 'shock-header-only.csv:1: the shock file has a header but no lines',
  'shock-unknown-sector.csv': "shock-unknown-sector.csv:3:1 (row 'Cannery', column 'sector'): unknown sector 'Cannery' (the table has: Orchards, Canning, Services)",
  'shock-share-above-one.csv': "shock-share-above-one.csv:2:4 (row 'Canning', column 'local_share'): local share 1.2 is outside [0, 1]",
  'shock-share-percent.csv': "shock-share-percent.csv:2:4 (row 'Canning', column 'local_share'): local share 80 is outside [0, 1]",
  'shock-share-negative.csv': "shock-share-negative.csv:2:4 (row 'Canning', column 'local_share'): local share -0.5 is outside [0, 1]",
  'shock-jobs-no-employment.csv': "shock-jobs-no-employment.csv:2:1 (row 'Canning', column 'sector'): a jobs line needs employment for 'Canning', and the table has no employment row",
  'shock-fixed-and-shocked.csv': "shock-fixed-and-shocked.csv:4 (row 'Canning'): 'Canning' is both fixed (output line) and shocked with demand (final demand); its output is set from outside, so a demand change there has no meaning — use one or the other",
  'shock-extra-field.csv': "shock-extra-field.csv:2:3 (row 'Canning'): row has a value in field 3 ('000'), beyond the header's 2 fields",
  'shock-share-extra-field.csv': "shock-share-extra-field.csv:2:5 (row 'Canning'): row has a value in field 5 ('5'), beyond the header's 4 fields",
  'shock-ambiguous-decimal.csv': "shock-ambiguous-decimal.csv:2:2: '1.500' could be 1500 or 1.5: no number in the file shows whether '.' is a decimal mark or groups thousands; write 1500 or 1.5, whichever is meant",
  'shock-amount-overflow.csv': "shock-amount-overflow.csv:2:2 (row 'Canning', column 'amount'): amount '1e999' is too large for a number (above 1.7977e+308)",
  'shock-bad-kind.csv': "shock-bad-kind.csv:2:3 (row 'Canning', column 'kind'): kind 'plant' is not one of final-demand, output, jobs, labour-income, mix, activity",
  'shock-unknown-column.csv': "shock-unknown-column.csv:1:3: unknown column 'share'; the header is sector,amount[,kind][,local_share][,phase][,timing][,year][,years][,price_year][,prices][,displacement][,deadweight][,note]",
  'shock-no-amount.csv': "shock-no-amount.csv:1: the header needs a 'amount' column (sector,amount[,kind][,local_share][,phase][,timing][,year][,years][,price_year][,prices][,displacement][,deadweight][,note])",
  'shock-output-local-share.csv': "shock-output-local-share.csv:2:4 (row 'Canning', column 'local_share'): local share applies to final-demand and mix lines only; an output line fixes the sector's own (local) output",
  'shock-multiline-note.csv': "shock-multiline-note.csv:5:1 (row 'Cannery', column 'sector'): unknown sector 'Cannery' (the table has: Orchards, Canning, Services)",
  'shock-utf16le-bom.csv': `shock-utf16le-bom.csv: ${UTF16}`,
  'shock-binary.csv': 'shock-binary.csv: the file looks like binary data, not CSV text',
};

const PROJECT_EXPECT: Record<string, string> = {
  'project-0-byte.json': 'project-0-byte.json: the project file is empty',
  'project-truncated.json': 'project-truncated.json: the project file ends early — it looks truncated (an interrupted copy or save); it was not changed',
  'project-corrupt.json': `project-corrupt.json:14:16: ${NOT_JSON}`,
  'project-newer.json': 'project-newer.json: the project was saved by a newer Roundwise (project version 99; this one reads up to 4) — open it there, or update',
  'project-foreign.json': 'project-foreign.json: this is not a Roundwise project file (it has no "format": "roundwise-project")',
  'project-is-a-table.json': `project-is-a-table.json:1:2: ${NOT_JSON}`,
  'project-utf16le-bom.json': `project-utf16le-bom.json:1:1: ${NOT_JSON}`,
  'project-zip.json': `project-zip.json:1:1: ${NOT_JSON}`,
  'project-inconsistent.json': 'project-inconsistent.json: the project file is damaged or was edited by hand: table.Z: expected 9 flows for 3 sectors, found 5',
};

function refusal(f: () => unknown, file: string): string {
  try {
    f();
  } catch (e) {
    if (!(e instanceof InputError)) throw e;
    expectWellFormedRefusal(e, file);
    return formatLocated(e);
  }
  throw new Error(`${file} was not refused`);
}

const base = importTable(BASE, { fileName: 'base.csv' });

describe('hardening corpus', () => {
  it('the committed files are what make-corpus.ts writes, and every file has an expectation', () => {
    const written = { 'base.csv': Buffer.from(BASE), 'base-no-jobs.csv': Buffer.from(NO_JOBS_TABLE), ...TABLES, ...SHOCKS, ...projects() };
    expect(readdirSync(DIR).sort()).toEqual(Object.keys(written).sort());
    for (const [name, bytes] of Object.entries(written)) expect(readFileSync(join(DIR, name)).equals(bytes), name).toBe(true);
    const expected = new Set([...Object.keys(TABLE_EXPECT), ...Object.keys(SHOCK_EXPECT), ...Object.keys(PROJECT_EXPECT)]);
    expect([...expected, ...ACCEPTED].sort()).toEqual(Object.keys(written).sort());
  });

  describe('tables', () => {
    for (const [file, message] of Object.entries(TABLE_EXPECT)) {
      it(`${file} is refused: ${message.slice(file.length + 1, file.length + 60)}…`, () => {
        expect(refusal(() => importTable(read(file), { fileName: file }), file)).toBe(message);
      });
    }
    it('mixed CRLF and LF line ends import to the same numbers as the clean file', () => {
      expectSameTable(importTable(read('table-mixed-line-ends.csv'), { fileName: 'x.csv' }), base);
    });
    it('an Excel "sep=" first line is honoured: the same table, line numbers unchanged', () => {
      expectSameTable(importTable(read('table-excel-sep-line.csv'), { fileName: 'x.csv' }), base);
      const semi = previewTable(read('table-excel-sep-semicolon.csv'), { fileName: 'semi.csv' });
      expect(semi.dialect).toMatchObject({ delimiter: ';', delimiterFrom: 'sep-line', decimalMark: ',', decimalMarkFrom: 'numbers' });
      expect(semi.warnings).toEqual([]);
      expectSameTable(semi.table!, base);
      // The "sep=" line is line 1, so a refusal below it names the file's own line.
      const bad = read('table-excel-sep-semicolon.csv').replace('Canning;5;', 'Canning;five;');
      expect(refusal(() => importTable(bad, { fileName: 'semi.csv' }), 'semi.csv')).toBe("semi.csv:4:2 (row 'Canning', column 'Orchards'): 'five' is not a number (decimal comma expected)");
    });
    it('Latin-1 bytes in a label: imported, with a warning naming the encoding', () => {
      const t = importTable(read('table-latin1-label.csv'), { fileName: 'latin1.csv' });
      expect(t.sectors).toEqual(['Orchards', 'Canning', 'Caf\ufffd services']);
      expect(Array.from(t.Z)).toEqual(Array.from(base.Z));
      expect(t.warnings.find((w) => w.code === 'encoding')?.message).toBe("label 'Caf\ufffd services' holds characters that were not valid UTF-8: save the file as UTF-8");
    });
    it('one label in UTF-8 and the same label in Latin-1 no longer match: the warning says why a sector is missing', () => {
      const t = importTable(read('table-mixed-utf8-latin1.csv'), { fileName: 'mixed.csv' });
      expect(t.sectors).toEqual(['Canning', 'Services']);
      expect(t.warnings.map((w) => w.code)).toContain('encoding');
    });
  });

  describe('shock files (against base.csv; the jobs file against base-no-jobs.csv)', () => {
    const pm = prepareModel(base);
    const noJobs = prepareModel(importTable(read('base-no-jobs.csv'), { fileName: 'base-no-jobs.csv' }));
    for (const [file, message] of Object.entries(SHOCK_EXPECT)) {
      it(`${file} is refused`, () => {
        const model = file.includes('no-employment') ? noJobs : pm;
        expect(refusal(() => runScenario(model, parseShockCsv(read(file), file)), file)).toBe(message);
      });
    }
  });

  describe('shock files in the tables\' dialect', () => {
    it('a quoted thousands separator in a comma file is read as one (1,500 = 1500)', () => {
      expect(linesOf(parseShockCsv(read('shock-thousands.csv'), 'shock-thousands.csv')).map((l) => l.amount)).toEqual([1500]);
    });
    it('a semicolon file with decimal commas and point-grouped thousands is accepted', () => {
      const s = parseShockCsv(read('shock-semicolon-decimal-comma.csv'), 'shock-semicolon-decimal-comma.csv');
      expect(linesOf(s).map((l) => [l.sector, l.amount, l.localShare, l.origin?.line])).toEqual([['Canning', 1500.5, 0.9, 2], ['Services', 20, 1, 3]]);
      expect(() => runScenario(prepareModel(base), s)).not.toThrow();
    });
  });

  describe('project files', () => {
    it('project-valid.json loads and saves to the same text', () => {
      const text = read('project-valid.json');
      expect(serializeProject(parseProject(text, 'project-valid.json'))).toBe(text);
    });
    for (const [file, message] of Object.entries(PROJECT_EXPECT)) {
      it(`${file} is refused`, () => {
        expect(refusal(() => parseProject(read(file), file), file)).toBe(message);
      });
    }
  });
});
