// The sample study (the invented Fernhollow County table and its food-plant scenario) and independent readers of
// the files the deliverables write: poppler's pdftotext, pdfinfo and pdffonts for PDFs, SheetJS (xlsx, a different
// library from the writer) for workbooks.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createRequire } from 'node:module';
import {
  parseShockCsv, prepareStudy, runStudyScenario, studyFromTableFile, type PreparedStudy, type ScenarioOutcome,
} from '../../src/study/index.ts';
import { readBriefFonts } from '../../src/node-io/index.ts';

export const SAMPLE_DIR = join(import.meta.dirname, '..', '..', 'sample-data');
export const SAMPLE_TABLE = join(SAMPLE_DIR, 'fernhollow-county.csv');
// One phase of the invented food plant (the sample's own shock has two: building once, operating yearly).
export const SAMPLE_SHOCK = join(import.meta.dirname, '..', 'fixtures', 'scenario', 'one-phase', 'fernhollow-food-plant.csv');

export const fonts = readBriefFonts();

/** The sample study (or, with `tableText`, the same shock on another table) prepared, and its scenario's outcome. */
export function sampleStudy(shockText = readFileSync(SAMPLE_SHOCK, 'utf8'), tableText?: string): { ps: PreparedStudy; o: ScenarioOutcome } {
  const scenario = parseShockCsv(shockText, 'fernhollow-food-plant.csv');
  const table = tableText === undefined ? readFileSync(SAMPLE_TABLE) : Buffer.from(tableText);
  const study = studyFromTableFile(table, tableText === undefined ? 'fernhollow-county.csv' : 'variant.csv', {}, { scenarios: [scenario] });
  const ps = prepareStudy(study, { spectrum: false });
  return { ps, o: runStudyScenario(ps, scenario, { paths: null }) };
}

/**
 * The sample table with a taxes row and a full-time-equivalents row (invented): 12 % of each sector's other value added
 * moved to "Taxes on production", and FTE at 86 % of jobs. Returns the CSV text and the FTE row's sector values.
 */
export function sampleWithTaxesAndFte(): { text: string; fte: number[] } {
  const rows = readFileSync(SAMPLE_TABLE, 'utf8').trimEnd().split(/\r?\n/).map((l) => l.split(','));
  const ova = rows.findIndex((r) => r[0] === 'Other value added');
  const tax = ['Taxes on production', ...rows[ova]!.slice(1).map((v, k) => { const t = Math.round(Number(v) * 12) / 100; rows[ova]![k + 1] = String(Number(v) - t); return String(t); })];
  rows.splice(ova + 1, 0, tax);
  const jobs = rows.findIndex((r) => r[0] === 'Employment (jobs)');
  const fteRow = ['Full-time equivalents', ...rows[jobs]!.slice(1).map((v) => String(Math.round(Number(v) * 0.86)))];
  rows.splice(jobs + 1, 0, fteRow);
  const sectors = rows[0]!.length - 1;
  return { text: rows.map((r) => r.join(',')).join('\n'), fte: fteRow.slice(1, 1 + sectors).map(Number) };
}

/** Run a poppler tool on PDF bytes; throws when poppler-utils is missing (CI installs it, see .ci/run). */
export function poppler(tool: 'pdftotext' | 'pdfinfo' | 'pdffonts', pdf: Uint8Array, args: string[] = []): string {
  const dir = mkdtempSync(join(tmpdir(), 'roundwise-pdf-'));
  try {
    const file = join(dir, 'brief.pdf');
    writeFileSync(file, pdf);
    const r = spawnSync(tool, tool === 'pdftotext' ? [...args, '-enc', 'UTF-8', file, '-'] : [...args, file], { encoding: 'utf8' });
    if (r.error) throw new Error(`${tool} (Debian's poppler-utils) is needed to read the brief: ${r.error.message}`);
    if (r.status !== 0) throw new Error(`${tool} failed: ${r.stderr}`);
    return r.stdout;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/**
 * The PDF's text, every run of white space made one space (lines wrap differently from the source strings). `layout`
 * (pdftotext -layout) keeps a table's row on one line; `raw` keeps a wrapped table cell's lines together.
 */
export function pdfWords(pdf: Uint8Array, mode: 'layout' | 'raw' = 'layout'): string {
  return poppler('pdftotext', pdf, mode === 'layout' ? ['-layout'] : []).replace(/\s+/g, ' ');
}

type SheetJs = typeof import('xlsx');
export const XLSX: SheetJs = createRequire(import.meta.url)('xlsx') as SheetJs;

/** A workbook read back by SheetJS: each sheet as rows of raw values (numbers as doubles, blanks as null). */
export function readWorkbook(bytes: Uint8Array): { names: string[]; sheets: Map<string, unknown[][]>; book: import('xlsx').WorkBook } {
  const book = XLSX.read(bytes, { type: 'array', cellNF: true, cellFormula: true, cellStyles: true });
  const sheets = new Map<string, unknown[][]>();
  for (const n of book.SheetNames) {
    sheets.set(n, XLSX.utils.sheet_to_json(book.Sheets[n]!, { header: 1, raw: true, defval: null, blankrows: true }));
  }
  return { names: book.SheetNames, sheets, book };
}

/** One part of the XLSX package (a zip), as text, read with SheetJS's container reader. */
export function xlsxPart(bytes: Uint8Array, path: string): string {
  const cfb = XLSX.CFB.read(Buffer.from(bytes), { type: 'buffer' });
  const entry = XLSX.CFB.find(cfb, `/${path}`);
  if (!entry?.content) throw new Error(`no part ${path} in the workbook`);
  return Buffer.from(entry.content as Uint8Array).toString('utf8');
}

/** The attributes of every `<tag …/>` element in an XML part (attribute order is free in XML). */
function elements(xml: string, tag: string): Record<string, string>[] {
  return [...xml.matchAll(new RegExp(`<${tag}\\s([^>]*?)/?>`, 'g'))].map((m) => Object.fromEntries([...m[1]!.matchAll(/([\w:]+)="([^"]*)"/g)].map((a) => [a[1]!, a[2]!])));
}

/** The worksheet part of a sheet, found by name through xl/workbook.xml and its relationships (ECMA-376 Part 1). */
export function sheetPart(bytes: Uint8Array, name: string): string {
  const unescape = (s: string) => s.replace(/&quot;/g, '"').replace(/&lt;/g, '<').replace(/&gt;/g, '>').replace(/&amp;/g, '&');
  const id = elements(xlsxPart(bytes, 'xl/workbook.xml'), 'sheet').find((e) => unescape(e.name ?? '') === name)?.['r:id'];
  const target = elements(xlsxPart(bytes, 'xl/_rels/workbook.xml.rels'), 'Relationship').find((e) => e.Id === id)?.Target;
  if (!target) throw new Error(`no worksheet part for '${name}'`);
  return xlsxPart(bytes, target.startsWith('/') ? target.slice(1) : `xl/${target}`);
}
