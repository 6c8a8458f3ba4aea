/**
 * What the file bridges accept and how big a file may be. Shared by the desktop shell (dialog filters, read
 * limit) and the browser bridge (file-input accept list, read limit) so both refuse the same files.
 */
import { InputError } from '../diagnostics/index.ts';
import type { ExportKind, FileKind } from './contract.ts';

/**
 * Largest file the product reads into memory, 200 MiB (a 2000-sector table is about 40 MB): the one limit for every
 * file, in the browser bridge, in the CLI and the desktop shell (src/node-io) and in the table importer
 * (MAX_TABLE_BYTES). Bigger files are refused before they are read.
 */
export const MAX_OPEN_BYTES = 200 * 1024 * 1024;

/** The one refusal for a file over the limit, wherever it is noticed (`outcome`: what did not happen). */
export function fileTooLarge(bytes: number, file: string, outcome = 'nothing was read', max = MAX_OPEN_BYTES): InputError {
  return new InputError('file-too-large', `file is ${formatBytes(bytes)}, larger than the ${formatBytes(max)} limit; ${outcome}`, { file });
}

/** Largest content the UI may hand to a save or export (same limit, in UTF-16 code units or base64 characters). */
export const MAX_SAVE_CHARS = 128 * 1024 * 1024;

/** Project files: JSON written by the UI; `.roundwise` is our own extension, `.json` is accepted on open. */
export const PROJECT_EXTENSION = 'roundwise';

export const OPEN_EXTENSIONS: Record<FileKind, readonly string[]> = {
  table: ['csv', 'tsv', 'txt'],
  project: [PROJECT_EXTENSION, 'json'],
};

export const OPEN_FILTER_NAMES: Record<FileKind, string> = {
  table: 'Flow tables (CSV)',
  project: 'Roundwise projects',
};

export const EXPORT_TYPES: Record<ExportKind, { extension: string; mime: string; filterName: string }> = {
  csv: { extension: 'csv', mime: 'text/csv;charset=utf-8', filterName: 'CSV report' },
  txt: { extension: 'txt', mime: 'text/plain;charset=utf-8', filterName: 'Text' },
  png: { extension: 'png', mime: 'image/png', filterName: 'PNG image' },
  json: { extension: 'json', mime: 'application/json', filterName: 'JSON' },
  pdf: { extension: 'pdf', mime: 'application/pdf', filterName: 'PDF document' },
  xlsx: { extension: 'xlsx', mime: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet', filterName: 'Spreadsheet workbook' },
};

/** `name` with `ext` as its extension: kept when it already ends with `ext` or one of `alsoAccepted`, else added. */
export function withExtension(name: string, ext: string, alsoAccepted: readonly string[] = []): string {
  const lower = name.toLowerCase();
  return [ext, ...alsoAccepted].some((e) => lower.endsWith(`.${e}`)) ? name : `${name}.${ext}`;
}

/** A project file name: `.roundwise` added unless the name already ends with an accepted project extension. */
export function projectFileName(name: string): string {
  return withExtension(name, PROJECT_EXTENSION, OPEN_EXTENSIONS.project);
}

/** Human size for messages: "12.3 MB". */
export function formatBytes(n: number): string {
  if (n < 1024) return `${n} bytes`;
  if (n < 1024 * 1024) return `${(n / 1024).toFixed(1)} KB`;
  return `${(n / (1024 * 1024)).toFixed(1)} MB`;
}
