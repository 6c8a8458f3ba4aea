/**
 * Project files: one JSON document per study — the source file as read (its bytes, name, SHA-256 and the import
 * settings: layout, role map, options), the scenarios and their phases, spending mixes, activities not in the table,
 * margins, the price index, commuting, and settings (household closure, paths, rounds, discount rate). Results are
 * never stored. Loading re-imports the source bytes through the table importer, so a project
 * passes exactly the validations a table file does, and compares the bytes with their recorded SHA-256; studies from
 * older versions that kept only the imported numbers are checked by the importer's whole-table validations instead.
 * Loading refuses, with one clear message, a file that is empty, truncated, not JSON, not a Roundwise project,
 * from a newer version, or inconsistent; the caller keeps the file on disk untouched.
 * The save itself (temporary file, then rename) is the caller's: `writeFileAtomic` of src/node-io (the CLI and the desktop shell both use it).
 */
import { InputError, type Warning } from '../diagnostics/index.ts';
import { importTableBytes, type ImportOptions } from '../table/index.ts';
import {
  checkActivity, checkActivitySectors, checkMarginSectors, checkMixSectors, mixShares, mixesOfTable,
  type Activity, type Commuting, type Margins, type PriceIndex, type Scenario, type SpendingMix,
} from '../scenario/index.ts';
import { validateTable, type IOTable, type LabelledVector, type RoleMap } from '../table/index.ts';
import { writeJson, type Json } from './json.ts';
import {
  DEFAULT_SETTINGS, PROJECT_FORMAT, PROJECT_VERSION, migrateV1, migrateV2, migrateV3, projectSchemas, type ProjectV2Doc, type ProjectV3Doc, type ProjectV4Doc,
} from './schema.ts';
import { sha256Hex } from './sha256.ts';
import { fromBase64, toBase64 } from './base64.ts';

export { PROJECT_FORMAT, PROJECT_VERSION } from './schema.ts';

export type ProjectSettings = ProjectV4Doc['settings'];

/** How a source file was imported: everything importTable needs besides the text and the file name. */
export type ImportSettings = Omit<ImportOptions, 'fileName' | 'moneyUnit'>;

export interface SourceInfo {
  fileName: string;
  /** Lower-case hex SHA-256 of the source file's bytes. */
  sha256: string;
  bytes?: number;
  /** The file's bytes as read, when the study has them (a study opened from a table file). */
  content?: Uint8Array;
  /** The import settings used on `content`. */
  import?: ImportSettings;
  /** The files this source was derived from (a supply and use pair → the symmetric table), each with its SHA-256. */
  derivedFrom?: SourceOrigin[];
}

/** A file a source table was derived from. */
export interface SourceOrigin {
  role: 'supply' | 'use';
  fileName: string;
  sha256: string;
}

/** The price index and the table's money year (null: read from the table's corner cell, if it holds one year). */
export interface StudyPrices {
  tableYear: number | null;
  index: PriceIndex | null;
}

export interface Project {
  name: string;
  source: SourceInfo | null;
  /** The table as imported; `table.roles` is the role map that is saved. */
  table: IOTable;
  scenarios: Scenario[];
  /** Spending mixes the user made or imported (the table's own, from its final-demand columns, are added on use). */
  mixes: SpendingMix[];
  activities: Activity[];
  margins: Margins | null;
  prices: StudyPrices;
  commuting: Commuting;
  settings: ProjectSettings;
}

// ignoreBOM: a leading byte order mark stays in the text (U+FEFF, encoded back to the same three bytes), so the stored
// source keeps the file's bytes and its SHA-256.
const strictUtf8 = new TextDecoder('utf-8', { fatal: true, ignoreBOM: true });

/** Source information for a file's bytes; with `keep`, the bytes themselves travel with the study. */
export function sourceInfo(fileName: string, bytes: Uint8Array, keep?: { import: ImportSettings }): SourceInfo {
  return { fileName, sha256: sha256Hex(bytes), bytes: bytes.length, ...(keep ? { content: bytes, import: keep.import } : {}) };
}

/** Import a table from the source's own bytes and settings (the one way a kept source becomes a table). */
export function importSource(source: SourceInfo & { content: Uint8Array }): IOTable {
  return importTableBytes(source.content, { fileName: source.fileName, ...source.import });
}

export function defaultSettings(): ProjectSettings {
  return { closure: DEFAULT_SETTINGS.closure, paths: { ...DEFAULT_SETTINGS.paths }, rounds: { ...DEFAULT_SETTINGS.rounds }, activeScenario: null, discountRate: null };
}

export function createProject(table: IOTable, opts: { name?: string; source?: SourceInfo | null; scenarios?: Scenario[]; mixes?: SpendingMix[] } = {}): Project {
  return {
    name: opts.name ?? table.name,
    source: opts.source ?? null,
    table,
    scenarios: opts.scenarios ?? [],
    mixes: opts.mixes ?? [],
    activities: [],
    margins: null,
    prices: { tableYear: null, index: null },
    commuting: { overall: 0, sectors: [] },
    settings: defaultSettings(),
  };
}

// ---- save ----

const arr = (v: Float64Array): number[] => Array.from(v);
const labelledDoc = (vs: LabelledVector[]) => vs.map((v) => ({ label: v.label, values: arr(v.values) }));

function tableDoc(t: IOTable): NonNullable<ProjectV4Doc['table']> {
  return {
    name: t.name,
    sectors: [...t.sectors],
    moneyUnit: t.moneyUnit,
    layout: t.layout,
    Z: arr(t.Z),
    x: arr(t.x),
    labourIncome: labelledDoc(t.labourIncome),
    otherValueAdded: labelledDoc(t.otherValueAdded),
    ...(t.taxes?.length ? { taxes: labelledDoc(t.taxes) } : {}),
    imports: labelledDoc(t.imports),
    employment: t.employment ? arr(t.employment) : null,
    ...(t.fte ? { fte: arr(t.fte) } : {}),
    householdConsumption: labelledDoc(t.householdConsumption),
    otherFinalDemand: labelledDoc(t.otherFinalDemand),
    ...(t.householdIncomeFromFinalDemand?.length ? { householdIncomeFromFinalDemand: t.householdIncomeFromFinalDemand.map((c) => ({ row: c.row, column: c.column, value: c.value })) } : {}),
    warnings: t.warnings.map((w) => ({ code: w.code, message: w.message, ...(w.location ? { location: { ...w.location } } : {}) })),
  };
}

function rolesDoc(r: Partial<RoleMap>): ProjectV4Doc['roles'] {
  return { rows: { ...(r.rows ?? {}) }, columns: { ...(r.columns ?? {}) }, ...(r.sectors?.length ? { sectors: [...r.sectors] } : {}) };
}

function contentDoc(bytes: Uint8Array): { encoding: 'utf-8' | 'base64'; data: string } {
  try {
    return { encoding: 'utf-8', data: strictUtf8.decode(bytes) };
  } catch {
    return { encoding: 'base64', data: toBase64(bytes) };
  }
}

function importDoc(s: ImportSettings | undefined): NonNullable<ProjectV4Doc['source']>['import'] {
  const i = s ?? {};
  return {
    ...(i.layout !== undefined ? { layout: i.layout } : {}),
    ...(i.roles !== undefined ? { roles: rolesDoc(i.roles) } : {}),
    ...(i.delimiter !== undefined ? { delimiter: i.delimiter } : {}),
    ...(i.decimalMark !== undefined ? { decimalMark: i.decimalMark } : {}),
    ...(i.allowNegative !== undefined ? { allowNegative: i.allowNegative } : {}),
    ...(i.balanceTolerance !== undefined ? { balanceTolerance: i.balanceTolerance } : {}),
    ...(i.name !== undefined ? { name: i.name } : {}),
  };
}

const opt = <K extends string, V>(k: K, v: V | undefined): { [P in K]?: V } => (v === undefined ? {} : { [k]: v } as { [P in K]: V });

function toDoc(p: Project): ProjectV4Doc {
  const t = p.table;
  const src = p.source;
  return {
    format: PROJECT_FORMAT,
    version: 4,
    name: p.name,
    source: src ? {
      fileName: src.fileName,
      sha256: src.sha256,
      ...(src.bytes !== undefined ? { bytes: src.bytes } : {}),
      import: importDoc(src.import),
      ...(src.content ? { content: contentDoc(src.content) } : {}),
      ...(src.derivedFrom?.length ? { derivedFrom: src.derivedFrom.map((o) => ({ ...o })) } : {}),
    } : null,
    // The numbers only when the source bytes are not at hand: otherwise the table is re-imported from them.
    ...(src?.content ? {} : { table: tableDoc(t) }),
    roles: rolesDoc(t.roles),
    // Line origins (file lines) describe where a line was typed, not the study: they are not saved.
    scenarios: p.scenarios.map((s) => ({
      name: s.name,
      ...opt('description', s.description),
      phases: s.phases.map((ph) => ({
        name: ph.name,
        timing: ph.timing,
        ...opt('year', ph.year),
        ...opt('years', ph.years),
        lines: ph.lines.map((l) => ({
          sector: l.sector, amount: l.amount, kind: l.kind, localShare: l.localShare,
          ...opt('prices', l.prices), ...opt('priceYear', l.priceYear), ...opt('displacement', l.displacement), ...opt('deadweight', l.deadweight),
          ...opt('note', l.note), ...opt('mix', l.mix),
        })),
      })),
    })),
    mixes: p.mixes.map((m) => ({ name: m.name, shares: m.shares.map((s) => ({ sector: s.sector, share: s.share })) })),
    activities: p.activities.map((a) => ({
      name: a.name, output: a.output,
      ...opt('jobs', a.jobs), ...opt('fte', a.fte), ...opt('labourIncome', a.labourIncome), ...opt('valueAdded', a.valueAdded), ...opt('taxes', a.taxes),
      purchases: a.purchases.map((x) => ({ sector: x.sector, amount: x.amount, localShare: x.localShare })),
    })),
    margins: p.margins ? {
      sectors: { ...p.margins.sectors },
      localShare: { ...p.margins.localShare },
      rows: p.margins.rows.map((r) => ({ sector: r.sector, shares: { ...r.shares } })),
    } : null,
    prices: { tableYear: p.prices.tableYear, index: p.prices.index ? p.prices.index.points.map((x) => ({ year: x.year, index: x.index })) : null },
    commuting: { overall: p.commuting.overall, sectors: p.commuting.sectors.map((c) => ({ sector: c.sector, share: c.share })) },
    settings: {
      closure: p.settings.closure, paths: { ...p.settings.paths }, rounds: { ...p.settings.rounds }, activeScenario: p.settings.activeScenario,
      discountRate: p.settings.discountRate,
    },
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

function checkTableDoc(t: NonNullable<ProjectV4Doc['table']>, file: string): void {
  const n = t.sectors.length;
  if (new Set(t.sectors).size !== n) throw invalid(file, 'table.sectors', 'sector labels repeat');
  if (t.Z.length !== n * n) throw invalid(file, 'table.Z', `expected ${n * n} flows for ${n} sectors, found ${t.Z.length}`);
  if (t.x.length !== n) throw invalid(file, 'table.x', `expected ${n} outputs, found ${t.x.length}`);
  if (t.employment && t.employment.length !== n) throw invalid(file, 'table.employment', `expected ${n} values, found ${t.employment.length}`);
  if (t.fte && t.fte.length !== n) throw invalid(file, 'table.fte', `expected ${n} values, found ${t.fte.length}`);
  for (const key of ['labourIncome', 'otherValueAdded', 'taxes', 'imports', 'householdConsumption', 'otherFinalDemand'] as const) {
    (t[key] ?? []).forEach((v, k) => {
      if (v.values.length !== n) throw invalid(file, `table.${key}[${k}].values`, `expected ${n} values, found ${v.values.length}`);
    });
  }
}

/**
 * The study's content against its table: every line's sector (or mix, or activity), every mix, activity, margin and
 * commuting sector; a phase name used twice in a scenario; activity budgets and mix shares that cannot be.
 */
function checkContent(d: ProjectV4Doc, table: IOTable, file: string): void {
  const known = new Set(table.sectors);
  const mixNames = new Set([...d.mixes.map((m) => m.name), ...mixesOfTable(table).map((m) => m.name)]);
  const activityNames = new Set(d.activities.map((a) => a.name));
  d.scenarios.forEach((s, i) => {
    const phaseNames = new Set<string>();
    s.phases.forEach((ph, p) => {
      if (phaseNames.has(ph.name)) throw invalid(file, `scenarios[${i}].phases[${p}].name`, `phase '${ph.name}' appears twice in scenario '${s.name}'`);
      phaseNames.add(ph.name);
      if (ph.years !== undefined && ph.timing !== 'annual') throw invalid(file, `scenarios[${i}].phases[${p}].years`, 'only an annual phase has a number of years');
      ph.lines.forEach((l, j) => {
        const at = `scenarios[${i}].phases[${p}].lines[${j}].sector`;
        if (l.kind === 'labour-income') {
          if (l.sector !== '') throw invalid(file, at, `a labour-income line has no sector (found '${l.sector}')`);
        } else if (l.kind === 'mix') {
          if (!mixNames.has(l.sector)) throw invalid(file, at, `unknown spending mix '${l.sector}'`);
        } else if (l.kind === 'activity') {
          if (!activityNames.has(l.sector)) throw invalid(file, at, `unknown activity '${l.sector}'`);
        } else if (!known.has(l.sector)) {
          throw invalid(file, at, `unknown sector '${l.sector}'`);
        }
      });
    });
  });
  const wrap = (path: string, f: () => void): void => {
    try {
      f();
    } catch (e) {
      if (e instanceof InputError) throw invalid(file, path, e.message);
      throw e;
    }
  };
  d.mixes.forEach((m, i) => wrap(`mixes[${i}]`, () => { mixShares(m); checkMixSectors([m], table.sectors); }));
  d.activities.forEach((a, i) => wrap(`activities[${i}]`, () => { checkActivity(a); checkActivitySectors([a], table.sectors); }));
  if (d.margins) {
    const m = d.margins;
    wrap('margins', () => {
      checkMarginSectors(m, table.sectors);
      m.rows.forEach((r) => {
        if (r.shares.retail + r.shares.wholesale + r.shares.transport > 1 + 1e-12) throw new InputError('margins-exceed', `the margin shares of '${r.sector}' add up to more than 1`);
      });
    });
  }
  d.commuting.sectors.forEach((c, i) => {
    if (!known.has(c.sector)) throw invalid(file, `commuting.sectors[${i}].sector`, `unknown sector '${c.sector}'`);
  });
}

function tableFromDoc(t: NonNullable<ProjectV4Doc['table']>, roles: ProjectV4Doc['roles']): IOTable {
  const f64 = (v: number[]) => Float64Array.from(v);
  const labelledVec = (vs: { label: string; values: number[] }[]) => vs.map((v) => ({ label: v.label, values: f64(v.values) }));
  return {
    name: t.name,
    sectors: t.sectors,
    n: t.sectors.length,
    Z: f64(t.Z),
    x: f64(t.x),
    labourIncome: labelledVec(t.labourIncome),
    otherValueAdded: labelledVec(t.otherValueAdded),
    ...(t.taxes?.length ? { taxes: labelledVec(t.taxes) } : {}),
    imports: labelledVec(t.imports),
    employment: t.employment ? f64(t.employment) : null,
    ...(t.fte ? { fte: f64(t.fte) } : {}),
    householdConsumption: labelledVec(t.householdConsumption),
    otherFinalDemand: labelledVec(t.otherFinalDemand),
    ...(t.householdIncomeFromFinalDemand ? { householdIncomeFromFinalDemand: t.householdIncomeFromFinalDemand } : {}),
    moneyUnit: t.moneyUnit,
    layout: t.layout,
    roles,
    warnings: t.warnings,
  };
}

/** The source's bytes from the document, with their recorded hash checked (a mismatch is said, not hidden). */
function sourceFromDoc(src: NonNullable<ProjectV4Doc['source']>, file: string): { source: SourceInfo; warning: Warning | null } {
  const base: SourceInfo = {
    fileName: src.fileName, sha256: src.sha256, ...(src.bytes !== undefined ? { bytes: src.bytes } : {}), import: src.import as ImportSettings,
    ...(src.derivedFrom?.length ? { derivedFrom: src.derivedFrom.map((o) => ({ ...o })) } : {}),
  };
  if (!src.content) return { source: base, warning: null };
  const bytes = src.content.encoding === 'utf-8' ? new TextEncoder().encode(src.content.data) : fromBase64(src.content.data);
  if (!bytes) throw invalid(file, 'source.content.data', 'not valid base64');
  const actual = sha256Hex(bytes);
  const warning: Warning | null = actual === src.sha256 ? null : {
    code: 'source-changed',
    message: `the table stored in this project does not match the SHA-256 recorded when it was saved (${src.sha256.slice(0, 12)}… recorded, ${actual.slice(0, 12)}… found): it was changed outside Roundwise; the stored table is used as it is now`,
    location: { file },
  };
  return { source: { ...base, sha256: actual, bytes: bytes.length, content: bytes }, warning };
}

function fromDoc(d: ProjectV4Doc, file: string, notes: string[]): Project {
  let source: SourceInfo | null = null;
  let table: IOTable;
  const found = d.source ? sourceFromDoc(d.source, file) : null;
  if (found?.source.content) {
    source = found.source;
    try {
      table = importSource(source as SourceInfo & { content: Uint8Array });
    } catch (e) {
      if (e instanceof InputError) {
        throw new InputError('project-invalid', `the table stored in the project cannot be read: ${e.message}`, { ...e.location, file: `${file} (table ${source.fileName})` });
      }
      throw e;
    }
    if (found.warning) table.warnings.unshift(found.warning);
  } else {
    if (!d.table) throw invalid(file, 'table', 'the project holds neither the source file nor the table');
    checkTableDoc(d.table, file);
    source = found?.source ?? null;
    table = tableFromDoc(d.table, d.roles);
    // Numbers that did not come through the importer get its whole-table checks (negative flows or output, …).
    try {
      validateTable(table, file, { allowNegative: source?.import?.allowNegative ?? false });
    } catch (e) {
      if (e instanceof InputError) throw new InputError('project-invalid', `the table stored in the project cannot be used: ${e.message}`, { ...e.location, file });
      throw e;
    }
  }
  for (const message of notes) table.warnings.push({ code: 'project-migrated', message, location: { file } });
  checkContent(d, table, file);
  return {
    name: d.name, source, table,
    scenarios: d.scenarios.map((sc) => ({
      name: sc.name,
      ...(sc.description !== undefined ? { description: sc.description } : {}),
      phases: sc.phases.map((ph) => ({ ...ph, lines: ph.lines.map((l) => ({ ...l })) })),
    })),
    mixes: d.mixes,
    activities: d.activities,
    margins: d.margins,
    prices: { tableYear: d.prices.tableYear, index: d.prices.index ? { points: d.prices.index.map((x) => ({ ...x })) } : null },
    commuting: d.commuting,
    settings: d.settings,
  };
}

function parsed<T>(r: { success: true; data: T } | { success: false; error: { issues: { path: PropertyKey[]; message: string }[] } }, file: string): T {
  if (!r.success) throw invalid(file, pathText(r.error.issues[0]!.path), r.error.issues[0]!.message);
  return r.data;
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
  const notes: string[] = [];
  let v3: ProjectV3Doc;
  if (version === 4) {
    return fromDoc(parsed(projectSchemas().projectV4Schema.safeParse(raw), fileName), fileName, notes);
  }
  if (version === 3) {
    v3 = parsed(projectSchemas().projectV3Schema.safeParse(raw), fileName);
  } else {
    let v2: ProjectV2Doc;
    if (version === 1) {
      const v1 = parsed(projectSchemas().projectV1Schema.safeParse(raw), fileName);
      const n = v1.table.sectors.length;
      const rows = v1.table.Z;
      const bad = rows.findIndex((r) => r.length !== n);
      if (rows.length !== n || bad >= 0) throw invalid(fileName, bad >= 0 ? `table.Z[${bad}]` : 'table.Z', `expected ${n} rows of ${n} flows`);
      v2 = migrateV1(v1);
    } else {
      v2 = parsed(projectSchemas().projectV2Schema.safeParse(raw), fileName);
    }
    const m = migrateV2(v2);
    v3 = m.doc;
    notes.push(m.note);
  }
  const m4 = migrateV3(v3);
  if (m4.note) notes.push(m4.note);
  return fromDoc(m4.doc, fileName, notes);
}
