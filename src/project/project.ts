/**
 * Project files: one JSON document per study — the imported table (with its source file name and SHA-256), the role
 * map, scenarios, spending patterns and settings. Results are never stored (a caller recomputes them), and
 * load → save → results is bit-for-bit identical (numbers are written in shortest round-trip form, −0 kept).
 * Loading refuses, with one clear message, a file that is empty, truncated, not JSON, not a Roundwise project,
 * from a newer version, or inconsistent; the caller keeps the file on disk untouched.
 * The save itself (temporary file, then rename) is the caller's: `writeFileAtomic` of src/node-io (the CLI and the desktop shell both use it).
 */
import { InputError } from '../diagnostics/index.ts';
import type { Scenario, SpendingPattern } from '../scenario/index.ts';
import type { IOTable, LabelledVector } from '../table/index.ts';
import { writeJson, type Json } from './json.ts';
import {
  DEFAULT_SETTINGS, PROJECT_FORMAT, PROJECT_VERSION, migrateV1, projectV1Schema, projectV2Schema, type ProjectV2Doc,
} from './schema.ts';
import { sha256Hex } from './sha256.ts';

export { PROJECT_FORMAT, PROJECT_VERSION } from './schema.ts';

export type ProjectSettings = ProjectV2Doc['settings'];

export interface SourceInfo {
  fileName: string;
  /** Lower-case hex SHA-256 of the source file's bytes. */
  sha256: string;
  bytes?: number;
}

export interface Project {
  name: string;
  source: SourceInfo | null;
  /** The table as imported; `table.roles` is the role map that is saved. */
  table: IOTable;
  scenarios: Scenario[];
  patterns: SpendingPattern[];
  settings: ProjectSettings;
}

export function sourceInfo(fileName: string, bytes: Uint8Array): SourceInfo {
  return { fileName, sha256: sha256Hex(bytes), bytes: bytes.length };
}

export function defaultSettings(): ProjectSettings {
  return { paths: { ...DEFAULT_SETTINGS.paths }, rounds: { ...DEFAULT_SETTINGS.rounds }, activeScenario: null };
}

export function createProject(table: IOTable, opts: { name?: string; source?: SourceInfo | null; scenarios?: Scenario[]; patterns?: SpendingPattern[] } = {}): Project {
  return {
    name: opts.name ?? table.name,
    source: opts.source ?? null,
    table,
    scenarios: opts.scenarios ?? [],
    patterns: opts.patterns ?? [],
    settings: defaultSettings(),
  };
}

// ---- save ----

const arr = (v: Float64Array): number[] => Array.from(v);
const labelledDoc = (vs: LabelledVector[]) => vs.map((v) => ({ label: v.label, values: arr(v.values) }));

function toDoc(p: Project): ProjectV2Doc {
  const t = p.table;
  return {
    format: PROJECT_FORMAT,
    version: 2,
    name: p.name,
    source: p.source ? { fileName: p.source.fileName, sha256: p.source.sha256, ...(p.source.bytes !== undefined ? { bytes: p.source.bytes } : {}) } : null,
    table: {
      name: t.name,
      sectors: [...t.sectors],
      moneyUnit: t.moneyUnit,
      layout: t.layout,
      Z: arr(t.Z),
      x: arr(t.x),
      labourIncome: labelledDoc(t.labourIncome),
      otherValueAdded: labelledDoc(t.otherValueAdded),
      imports: labelledDoc(t.imports),
      employment: t.employment ? arr(t.employment) : null,
      householdConsumption: labelledDoc(t.householdConsumption),
      otherFinalDemand: labelledDoc(t.otherFinalDemand),
      ...(t.householdIncomeFromFinalDemand?.length ? { householdIncomeFromFinalDemand: t.householdIncomeFromFinalDemand.map((c) => ({ row: c.row, column: c.column, value: c.value })) } : {}),
      warnings: t.warnings.map((w) => ({ code: w.code, message: w.message, ...(w.location ? { location: { ...w.location } } : {}) })),
    },
    roles: { rows: { ...t.roles.rows }, columns: { ...t.roles.columns }, ...(t.roles.sectors?.length ? { sectors: [...t.roles.sectors] } : {}) },
    // Line origins (shock-file lines) describe where a line was typed, not the study: they are not saved.
    scenarios: p.scenarios.map((s) => ({
      name: s.name,
      ...(s.description !== undefined ? { description: s.description } : {}),
      lines: s.lines.map((l) => ({
        sector: l.sector, amount: l.amount, kind: l.kind, localShare: l.localShare,
        ...(l.note !== undefined ? { note: l.note } : {}), ...(l.pattern !== undefined ? { pattern: l.pattern } : {}),
      })),
    })),
    patterns: p.patterns.map((pt) => ({ name: pt.name, shares: pt.shares.map((s) => ({ sector: s.sector, share: s.share })) })),
    settings: { paths: { ...p.settings.paths }, rounds: { ...p.settings.rounds }, activeScenario: p.settings.activeScenario },
  };
}

/** The project as JSON text (UTF-8, LF line ends, trailing newline). Same project → same text. */
export function serializeProject(p: Project): string {
  return `${writeJson(toDoc(p) as unknown as Json)}\n`;
}

// ---- load ----

/** True when the text is a JSON value cut short: a string or bracket left open at the end. */
function looksTruncated(text: string): boolean {
  let depth = 0;
  let inString = false;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (inString) {
      if (c === '\\') i++;
      else if (c === '"') inString = false;
    } else if (c === '"') inString = true;
    else if (c === '{' || c === '[') depth++;
    else if (c === '}' || c === ']') depth--;
  }
  return inString || depth > 0;
}

function lineColumn(text: string, pos: number): { line: number; column: number } {
  const before = text.slice(0, pos).split('\n');
  return { line: before.length, column: before.at(-1)!.length + 1 };
}

/** How JSON.parse fails on the text: null when it parses, else whether it stopped at the very end, and where. */
function jsonFailure(text: string): { atEnd: boolean; position: number | null } | null {
  try {
    JSON.parse(text);
    return null;
  } catch (e) {
    const msg = e instanceof Error ? e.message : '';
    const m = /position (\d+)/.exec(msg);
    const position = m ? Number(m[1]) : null;
    return { atEnd: /end of JSON/.test(msg) || (position !== null && position >= text.trimEnd().length), position };
  }
}

/**
 * Offset of the first offending character. V8 does not always say ("Unexpected token …"), so search for the longest
 * prefix that is still a valid beginning of JSON (fails only at its end): every longer prefix fails earlier.
 */
function errorOffset(text: string, failure: { position: number | null }): number {
  if (failure.position !== null) return failure.position;
  let lo = 0;
  let hi = text.length;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    const f = jsonFailure(text.slice(0, mid));
    if (f === null || f.atEnd) lo = mid;
    else hi = mid;
  }
  return hi - 1;
}

function parseJson(text: string, file: string): unknown {
  if (text.trim() === '') throw new InputError('project-empty', 'the project file is empty', { file });
  const failure = jsonFailure(text);
  if (failure === null) return JSON.parse(text);
  // Cut short: the parser stopped at the very end with a string or bracket still open.
  if (failure.atEnd && looksTruncated(text)) {
    throw new InputError('project-truncated', 'the project file ends early — it looks truncated (an interrupted copy or save); it was not changed', { file });
  }
  const loc = lineColumn(text, errorOffset(text, failure));
  throw new InputError('project-corrupt', 'the project file is not valid JSON — it may be damaged; it was not changed', { file, ...loc });
}

function pathText(path: readonly PropertyKey[]): string {
  return path.map((k) => (typeof k === 'number' ? `[${k}]` : `.${String(k)}`)).join('').replace(/^\./, '') || '(top level)';
}

function invalid(file: string, path: string, message: string): InputError {
  return new InputError('project-invalid', `the project file is damaged or was edited by hand: ${path}: ${message}`, { file });
}

function checkV2(d: ProjectV2Doc, file: string): void {
  const t = d.table;
  const n = t.sectors.length;
  if (new Set(t.sectors).size !== n) throw invalid(file, 'table.sectors', 'sector labels repeat');
  if (t.Z.length !== n * n) throw invalid(file, 'table.Z', `expected ${n * n} flows for ${n} sectors, found ${t.Z.length}`);
  if (t.x.length !== n) throw invalid(file, 'table.x', `expected ${n} outputs, found ${t.x.length}`);
  if (t.employment && t.employment.length !== n) throw invalid(file, 'table.employment', `expected ${n} values, found ${t.employment.length}`);
  for (const key of ['labourIncome', 'otherValueAdded', 'imports', 'householdConsumption', 'otherFinalDemand'] as const) {
    t[key].forEach((v, k) => {
      if (v.values.length !== n) throw invalid(file, `table.${key}[${k}].values`, `expected ${n} values, found ${v.values.length}`);
    });
  }
  const known = new Set(t.sectors);
  d.scenarios.forEach((s, i) => s.lines.forEach((l, j) => {
    if (!known.has(l.sector)) throw invalid(file, `scenarios[${i}].lines[${j}].sector`, `unknown sector '${l.sector}'`);
  }));
  d.patterns.forEach((p, i) => p.shares.forEach((s, j) => {
    if (!known.has(s.sector)) throw invalid(file, `patterns[${i}].shares[${j}].sector`, `unknown sector '${s.sector}'`);
  }));
}

function fromDoc(d: ProjectV2Doc): Project {
  const t = d.table;
  const f64 = (v: number[]) => Float64Array.from(v);
  const labelledVec = (vs: { label: string; values: number[] }[]) => vs.map((v) => ({ label: v.label, values: f64(v.values) }));
  const table: IOTable = {
    name: t.name,
    sectors: t.sectors,
    n: t.sectors.length,
    Z: f64(t.Z),
    x: f64(t.x),
    labourIncome: labelledVec(t.labourIncome),
    otherValueAdded: labelledVec(t.otherValueAdded),
    imports: labelledVec(t.imports),
    employment: t.employment ? f64(t.employment) : null,
    householdConsumption: labelledVec(t.householdConsumption),
    otherFinalDemand: labelledVec(t.otherFinalDemand),
    ...(t.householdIncomeFromFinalDemand ? { householdIncomeFromFinalDemand: t.householdIncomeFromFinalDemand } : {}),
    moneyUnit: t.moneyUnit,
    layout: t.layout,
    roles: d.roles,
    warnings: t.warnings,
  };
  return { name: d.name, source: d.source, table, scenarios: d.scenarios, patterns: d.patterns, settings: d.settings };
}

/**
 * Read a project file (any supported version; older ones are migrated). Refusals are InputErrors with codes
 * project-empty, project-truncated, project-corrupt, project-foreign, project-newer, project-invalid.
 */
export function parseProject(text: string, fileName = 'project'): Project {
  const raw = parseJson(text.replace(/^\uFEFF/, ''), fileName);
  if (typeof raw !== 'object' || raw === null || Array.isArray(raw) || (raw as { format?: unknown }).format !== PROJECT_FORMAT) {
    throw new InputError('project-foreign', `this is not a Roundwise project file (it has no "format": "${PROJECT_FORMAT}")`, { file: fileName });
  }
  const version = (raw as { version?: unknown }).version;
  if (typeof version !== 'number' || !Number.isInteger(version) || version < 1) {
    throw invalid(fileName, 'version', `expected a whole number, found ${JSON.stringify(version)}`);
  }
  if (version > PROJECT_VERSION) {
    throw new InputError('project-newer', `the project was saved by a newer Roundwise (project version ${version}; this one reads up to ${PROJECT_VERSION}) — open it there, or update`, { file: fileName });
  }
  let doc: ProjectV2Doc;
  if (version === 1) {
    const v1 = projectV1Schema.safeParse(raw);
    if (!v1.success) throw invalid(fileName, pathText(v1.error.issues[0]!.path), v1.error.issues[0]!.message);
    const n = v1.data.table.sectors.length;
    const rows = v1.data.table.Z;
    const bad = rows.findIndex((r) => r.length !== n);
    if (rows.length !== n || bad >= 0) throw invalid(fileName, bad >= 0 ? `table.Z[${bad}]` : 'table.Z', `expected ${n} rows of ${n} flows`);
    doc = migrateV1(v1.data);
  } else {
    const v2 = projectV2Schema.safeParse(raw);
    if (!v2.success) throw invalid(fileName, pathText(v2.error.issues[0]!.path), v2.error.issues[0]!.message);
    doc = v2.data;
  }
  checkV2(doc, fileName);
  return fromDoc(doc);
}

