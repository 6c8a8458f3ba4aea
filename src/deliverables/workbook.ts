/**
 * The workbook (Office Open XML spreadsheet, ECMA-376), written with write-excel-file (its "universal" build: one
 * code path in Node and the browser, zipped with fflate, no eval). One sheet per report, as the CSV reports hold
 * them: real numeric cells at full precision (written in the shortest form that reads back to the same double) with
 * a number format chosen per column so the sheet shows sensible decimals; the header row (units in the names) bold,
 * wrapped and frozen, with the first column when it names rows; column widths fitted to the content; text cells
 * escaped as in CSV (src/csv safeText: a formula lead behind a single quote, control characters as escapes). An
 * "About" sheet holds the provenance, each sheet's notes and the cautions.
 */
import type { Cell as XlsxCell, Row, SheetData } from 'write-excel-file/universal';
import { safeText, type Cell } from '../csv/index.ts';

export interface WorkbookSheet {
  /** Wanted sheet name (shortened to 31 characters and made unique as spreadsheet programs require). */
  name: string;
  /** Header row first (units in the names), then data rows, as in the CSV report. */
  rows: readonly (readonly Cell[])[];
  /** What the sheet is and how to read it, for the About sheet. */
  title: string;
  notes: string[];
}

export interface WorkbookInput {
  /** Label–value pairs on the About sheet (study, table, file, SHA-256, model, date…). */
  provenance: [string, string][];
  sheets: WorkbookSheet[];
  cautions: string[];
}

/** Characters a sheet name may not hold (ECMA-376 Part 1, §18.2.19 and common spreadsheet programs). */
const SHEET_NAME_FORBIDDEN = /[\\/?*[\]:]/g;
const MAX_SHEET_NAME = 31;

/** Unique, valid sheet names in order (case is ignored when comparing, as spreadsheet programs do). */
export function sheetNames(wanted: readonly string[]): string[] {
  const used = new Set<string>();
  return wanted.map((w) => {
    const base = w.replace(SHEET_NAME_FORBIDDEN, '-').replace(/^'+|'+$/g, '').trim() || 'Sheet';
    let name = base.slice(0, MAX_SHEET_NAME);
    for (let k = 2; used.has(name.toLowerCase()); k++) {
      const suffix = ` (${k})`;
      name = base.slice(0, MAX_SHEET_NAME - suffix.length) + suffix;
    }
    used.add(name.toLowerCase());
    return name;
  });
}

/**
 * The number format of a column: whole numbers as integers; shares 0–1 and the rest by the typical size of the
 * column's values, about four significant figures ("#,##0" for money in thousands, "0.000" for multipliers,
 * "0.000000" for coefficients). Only the display: every cell keeps its full value.
 */
export function columnFormat(header: string, values: readonly number[]): string {
  const finite = values.filter((v) => Number.isFinite(v));
  if (finite.length && finite.every((v) => Number.isInteger(v))) return /\(0-1\)/.test(header) ? '0.0000' : '#,##0';
  const sizes = finite.map((v) => Math.abs(v)).filter((v) => v > 0).sort((a, b) => a - b);
  if (!sizes.length) return '0.00';
  const typical = sizes[Math.floor(sizes.length / 2)]!;
  const decimals = Math.min(8, Math.max(0, 3 - Math.floor(Math.log10(typical))));
  if (/\(0-1\)/.test(header)) return `0.${'0'.repeat(Math.max(4, decimals))}`;
  return decimals === 0 ? '#,##0' : `#,##0.${'0'.repeat(decimals)}`;
}

/** About how many characters a number takes in `format`. */
function shownLength(v: number, format: string): number {
  const decimals = format.split('.')[1]?.length ?? 0;
  const whole = Math.abs(Math.trunc(v)).toString().length;
  const groups = format.startsWith('#,##') ? Math.floor((whole - 1) / 3) : 0;
  return (v < 0 ? 1 : 0) + whole + groups + (decimals ? decimals + 1 : 0);
}

const HEADER_STYLE = { fontWeight: 'bold', wrap: true, alignVertical: 'top', bottomBorderStyle: 'thin', backgroundColor: '#EEF2F7' } as const;
/** Widest column, in characters; a header longer than its column wraps. */
const MAX_WIDTH = 48;
const MIN_WIDTH = 8;

function sheetData(rows: readonly (readonly Cell[])[]): { data: SheetData; widths: number[]; firstColumnNames: boolean } {
  const header = rows[0] ?? [];
  const body = rows.slice(1);
  const ncol = Math.max(header.length, ...body.map((r) => r.length));
  const formats: (string | null)[] = [];
  const widths: number[] = [];
  for (let c = 0; c < ncol; c++) {
    const nums = body.map((r) => r[c]).filter((v): v is number => typeof v === 'number');
    const head = typeof header[c] === 'string' ? (header[c] as string) : '';
    const format = nums.length ? columnFormat(head, nums) : null;
    formats.push(format);
    let w = 0;
    for (const r of body) {
      const v = r[c];
      if (typeof v === 'number' && Number.isFinite(v)) w = Math.max(w, shownLength(v, format!));
      else if (typeof v === 'string') w = Math.max(w, Math.min(MAX_WIDTH, safeText(v).length));
    }
    // A header wraps at word boundaries: the column must hold its longest word.
    const longestWord = Math.max(0, ...head.split(/\s+/).map((x) => x.length));
    w = Math.max(w, longestWord, Math.min(head.length, 14));
    widths.push(Math.min(MAX_WIDTH, Math.max(MIN_WIDTH, w + 2)));
  }
  // Lines a wrapped header takes (a column of width w holds about w characters of the bold header font).
  const headerLines = Math.max(1, ...header.map((h, c) => (typeof h === 'string' ? Math.ceil(h.length / Math.max(1, widths[c]!)) : 1)));
  const data: SheetData = [];
  data.push(Array.from({ length: ncol }, (_, c): XlsxCell => {
    const h = header[c];
    return { ...HEADER_STYLE, value: h === null || h === undefined ? '' : safeText(String(h)), type: String, height: 14 * Math.min(headerLines, 8) + 2 };
  }));
  for (const r of body) {
    const row: Row = [];
    for (let c = 0; c < ncol; c++) {
      const v = r[c];
      if (typeof v === 'number') row.push(Number.isFinite(v) ? { value: v, type: Number, format: formats[c]! } : null);
      else if (typeof v === 'string') row.push({ value: safeText(v), type: String, ...(formats[c] ? { align: 'left' as const } : {}) });
      else row.push(null);
    }
    data.push(row);
  }
  const firstColumnNames = body.length > 0 && body.every((r) => typeof r[0] === 'string' || r[0] === null) && ncol > 2;
  return { data, widths, firstColumnNames };
}

function aboutData(input: WorkbookInput, names: string[]): SheetData {
  const bold = (s: string): XlsxCell => ({ value: safeText(s), type: String, fontWeight: 'bold', alignVertical: 'top' });
  const text = (s: string): XlsxCell => ({ value: safeText(s), type: String, wrap: true, alignVertical: 'top' });
  const rows: SheetData = [[{ value: 'Roundwise workbook', type: String, fontWeight: 'bold', fontSize: 14 }, null], [null, null]];
  for (const [k, v] of input.provenance) rows.push([bold(k), text(v)]);
  rows.push([null, null], [bold('Sheets'), null]);
  input.sheets.forEach((s, k) => {
    rows.push([bold(names[k]!), text(s.title)]);
    for (const n of s.notes) rows.push([null, text(n)]);
  });
  rows.push([null, null], [bold('Cautions (input–output analysis)'), null]);
  for (const c of input.cautions) rows.push([null, text(c)]);
  return rows;
}

/** The workbook as XLSX bytes: the report sheets in order, then About. */
export async function workbookXlsx(input: WorkbookInput): Promise<Uint8Array> {
  const names = sheetNames([...input.sheets.map((s) => s.name), 'Provenance and cautions']);
  const sheets = input.sheets.map((s, k) => {
    const { data, widths, firstColumnNames } = sheetData(s.rows);
    return { data, sheet: names[k]!, columns: widths.map((width) => ({ width })), stickyRowsCount: 1, ...(firstColumnNames ? { stickyColumnsCount: 1 } : {}) };
  });
  sheets.push({ data: aboutData(input, names), sheet: names[names.length - 1]!, columns: [{ width: 34 }, { width: 110 }], stickyRowsCount: 0 });
  // Loaded on first use, like the PDF library: most runs write no workbook.
  const { default: writeXlsxFile } = await import('write-excel-file/universal');
  const blob = await writeXlsxFile(sheets, { fontFamily: 'Calibri', fontSize: 11 }).toBlob();
  return new Uint8Array(await blob.arrayBuffer());
}
