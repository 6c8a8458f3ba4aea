/**
 * Report layout, shared by every report: each CSV is plain and rectangular (one header row with units in the
 * header names, one row per sector, then a total row where totals make sense), so spreadsheets and papaparse
 * read it back cleanly. What would break the rectangle — table name, model type, date, units, cautions — goes
 * into a sidecar text file of the same base name: `multipliers.csv` + `multipliers.about.txt`.
 */
import { CAUTIONS } from './cautions.ts';
import { toCsv, type Cell } from '../csv/index.ts';

export interface ReportMeta {
  /** What the report is, e.g. "Multipliers by sector". */
  title: string;
  tableName: string;
  sourceFile?: string;
  /** Hex SHA-256 of the source file, when known. */
  sourceHash?: string;
  /** The files the source was derived from (a supply and use pair), each with its SHA-256. */
  sourceOrigins?: SourceOrigin[];
  /** e.g. "open (Type I) and household-closed (Type II)". */
  modelType: string;
  /** ISO 8601 date-time of the run. */
  date: string;
  /** Money unit of the table, e.g. "thousand dollars". */
  moneyUnit: string;
  /** Extra notes (warnings, scenario description, aggregation-bias note...). */
  notes?: string[];
}

/** A file a table was derived from: what it is ("Supply table"), its name and the SHA-256 of its bytes. */
export interface SourceOrigin {
  what: string;
  fileName: string;
  sha256: string;
}

/** A source's origins as lines (the sidecars, summaries and the brief say them alike). */
export function originLines(origins: readonly SourceOrigin[] | undefined): [string, string][] {
  return (origins ?? []).flatMap((o): [string, string][] => [[`${o.what} file`, o.fileName], [`${o.what} SHA-256`, o.sha256]]);
}

export interface ReportFile {
  /** File name without folder, e.g. "multipliers.csv". */
  name: string;
  content: string;
  /**
   * On the CSV of a report: its rows and sidecar facts, so the workbook shows exactly what the CSV holds. Dropped
   * before files cross to the UI (`filesOnly`), which only writes `content`.
   */
  sheet?: ReportSheet;
}

export interface ReportSheet {
  meta: ReportMeta;
  rows: readonly (readonly Cell[])[];
}

/** The files without their sheets (what a writer needs; small enough to post to the UI). */
export function filesOnly(files: readonly ReportFile[]): ReportFile[] {
  return files.map((f) => ({ name: f.name, content: f.content }));
}

/** First words of every sidecar: how a later run recognises a Roundwise report in an output folder. */
export const ABOUT_SIGNATURE = 'Roundwise report:';

export function aboutText(meta: ReportMeta): string {
  const lines = [
    `${ABOUT_SIGNATURE} ${meta.title}`,
    `Table: ${meta.tableName}`,
    ...(meta.sourceFile ? [`Source file: ${meta.sourceFile}`] : []),
    ...(meta.sourceHash ? [`Source SHA-256: ${meta.sourceHash}`] : []),
    ...originLines(meta.sourceOrigins).map(([k, v]) => `${k}: ${v}`),
    `Model: ${meta.modelType}`,
    `Money unit: ${meta.moneyUnit}`,
    `Produced: ${meta.date}`,
    '',
    ...(meta.notes?.length ? ['Notes:', ...meta.notes.map((n) => `- ${n}`), ''] : []),
    'Cautions (input-output analysis):',
    ...CAUTIONS.map((c) => `- ${c}`),
    '',
  ];
  return lines.join('\r\n');
}

/** The CSV and its sidecar for one report. `base` is the file name without extension, e.g. "multipliers". */
export function reportFiles(base: string, meta: ReportMeta, rows: readonly (readonly Cell[])[]): ReportFile[] {
  return [
    { name: `${base}.csv`, content: toCsv(rows), sheet: { meta, rows } },
    { name: `${base}.about.txt`, content: aboutText(meta) },
  ];
}
