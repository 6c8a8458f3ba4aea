/**
 * Refusals and warnings that reach the user. Every refusal carries a location so the message can say
 * where in the file (line, column) and where in the table (row and column labels) the problem is.
 * No stack trace is ever shown for an InputError: the CLI and the UI print `formatLocated(err)` only.
 */
import { visibleText } from './visible.ts';

/**
 * Every refusal code, in one list, so that every throw site is type-checked and one case has one name (tests and
 * the UI match on codes). A new refusal adds its code here, under its concern.
 */
export const ERROR_CODES = [
  // Command line, files and the desktop bridge (src/cli, src/node-io, src/bridge, main/)
  'usage',
  'read-failed',
  'write-failed',
  'not-a-file',
  'file-too-large',
  'output-is-input',
  'project-not-overwritten',
  'path-not-granted',
  'not-a-project',
  'recovery-unavailable',
  'recovery-write-failed',
  'ipc-failed',
  'ipc-refused',
  'ipc-invalid',
  'internal',
  // Table import (src/table)
  'binary',
  'utf16',
  'bad-quotes',
  'ragged-row',
  'header-only',
  'bad-long-header',
  'no-sectors',
  'missing-label',
  'duplicate-label',
  'duplicate-entry',
  'non-numeric',
  'not-finite',
  'overflow',
  'blank-flow',
  'negative-flow',
  'negative-employment',
  'no-total-output',
  'output-not-positive',
  'role-map-json',
  'role-map-schema',
  'bad-sep-line',
  'decimal-mark-ambiguous',
  'extra-field',
  'label-unwritable',
  'table-shape',
  // Model and scenarios (src/model, src/scenario)
  'not-productive',
  'singular',
  'unknown-sector',
  'missing-sector',
  'empty-scenario',
  'bad-header',
  'bad-amount',
  'bad-kind',
  'bad-number',
  'fixed-and-shocked',
  'local-share-fixed',
  'local-share-range',
  'no-employment',
  'mix-empty',
  'mix-share-range',
  'mix-share-sum',
  'unknown-mix',
  'unknown-activity',
  'activity-bad',
  'activity-purchases-exceed-output',
  'labour-income-sector',
  'no-household-closure',
  'phase-missing',
  'phase-timing-mixed',
  'phase-field-mixed',
  'bad-timing',
  'bad-prices',
  'bad-year',
  'prices-not-applicable',
  'price-year-not-money',
  'price-year-missing',
  'no-price-index',
  'price-index-bad',
  'table-year-unknown',
  'margins-missing',
  'margins-bad',
  'margins-exceed',
  'margins-unknown-sector',
  'additionality-range',
  'commuting-range',
  'discount-rate-range',
  'duplicate-name',
  'shock-not-finite',
  'effects-not-finite',
  'compare-different-tables',
  'compare-too-few',
  // Regional tables, RAS and aggregation (src/regional)
  'empty',
  'label-empty',
  'label-duplicate',
  'delta-range',
  'employment-above-national',
  'employment-all-zero',
  'employment-columns',
  'employment-duplicate',
  'employment-label',
  'employment-missing',
  'employment-national-missing',
  'employment-national-zero',
  'employment-negative',
  'employment-not-numeric',
  'employment-sector-missing',
  'employment-unknown-sector',
  'group-duplicate',
  'group-empty',
  'group-label-taken',
  'group-sector-empty',
  'group-sector-missing',
  'group-unknown-sector',
  'matrix-negative',
  'matrix-no-columns',
  'matrix-not-numeric',
  'totals-duplicate',
  'totals-missing',
  'totals-negative',
  'totals-not-numeric',
  'totals-unknown-label',
  'balance-output',
  'balance-purchases-above-output',
  'balance-sales-above-output',
  'ras-infeasible',
  'ras-iterations',
  'ras-negative',
  'ras-not-converged',
  'ras-shape',
  'ras-target',
  'ras-tolerance',
  'ras-totals-disagree',
  'ras-zero-column',
  'ras-zero-row',
  // Supply and use tables (src/sut)
  'sut-unknown-industry',
  'sut-unknown-product',
  'sut-no-industries',
  'sut-no-products',
  'sut-negative',
  'sut-industry-no-output',
  'sut-products-disagree',
  'sut-purchasers-prices',
  'sut-not-square',
  'sut-singular',
  'sut-assumption',
  'sut-remedy-infeasible',
  'sut-negative-jobs',
  // Classification bridges (src/classification)
  'bridge-columns',
  'bridge-code-empty',
  'bridge-unknown-sector',
  'bridge-share',
  'bridge-share-sum',
  'bridge-duplicate',
  'bridge-unknown-code',
  'bridge-sector-uncovered',
  // Project files (src/project)
  'project-corrupt',
  'project-empty',
  'project-foreign',
  'project-invalid',
  'project-newer',
  'project-truncated',
  // Uncertainty and sensitivity (src/uncertainty)
  'cv-label',
  'cv-range',
  'draws-range',
  'uncertainty-range',
  'uncertainty-unavailable',
  'flq-origin-mismatch',
  // Studies (src/study)
  'report-unavailable',
  'unknown-scenario',
] as const;

export type ErrorCode = (typeof ERROR_CODES)[number];

export function isErrorCode(x: unknown): x is ErrorCode {
  return typeof x === 'string' && (ERROR_CODES as readonly string[]).includes(x);
}

export interface Location {
  file?: string;
  /** 1-based line in the source file. */
  line?: number;
  /** 1-based column (field index) in the source file. */
  column?: number;
  rowLabel?: string;
  columnLabel?: string;
  /** The phase of a scenario the line belongs to, when the scenario has several (a line number alone is ambiguous). */
  phase?: string;
}

export class InputError extends Error {
  readonly code: ErrorCode;
  readonly location: Location;
  /** Our own advice on a line of its own below the message (e.g. a command's usage line); never text from a file. */
  readonly hint: string | undefined;
  constructor(code: ErrorCode, message: string, location: Location = {}, hint?: string) {
    super(message);
    this.name = 'InputError';
    this.code = code;
    this.location = location;
    this.hint = hint;
  }
}

export interface Warning {
  code: string;
  message: string;
  location?: Location;
}

export function formatLocation(loc: Location): string {
  const parts: string[] = [];
  let where = loc.file ?? '';
  if (loc.line !== undefined) where += `${where ? ':' : 'line '}${loc.line}`;
  if (loc.column !== undefined) where += `:${loc.column}`;
  if (where) parts.push(where);
  const labels: string[] = [];
  if (loc.phase !== undefined) labels.push(`phase '${loc.phase}'`);
  if (loc.rowLabel !== undefined) labels.push(`row '${loc.rowLabel}'`);
  if (loc.columnLabel !== undefined) labels.push(`column '${loc.columnLabel}'`);
  if (labels.length) parts.push(`(${labels.join(', ')})`);
  return parts.join(' ');
}

/**
 * One line for the user: "county.csv:12:4 (row 'Farming', column 'Mining'): negative intermediate flow -3.2".
 * Location and message may quote a file's text, so control and bidi characters in them are shown escaped
 * (src/diagnostics/visible.ts) and the line stays one line; a hint (ours) follows on its own line.
 */
export function formatLocated(err: { message: string; location?: Location; hint?: string | undefined }): string {
  const where = err.location ? visibleText(formatLocation(err.location)) : '';
  const message = visibleText(err.message);
  const line = where ? `${where}: ${message}` : message;
  return err.hint ? `${line}\n${visibleText(err.hint, '\n')}` : line;
}

export function isInputError(e: unknown): e is InputError {
  return e instanceof InputError;
}
