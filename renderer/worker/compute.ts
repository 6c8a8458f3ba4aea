/**
 * The worker's side of the app: one prepared study (src/study) and the operations the screens call on it. Every
 * number comes from the study layer, the same functions the CLI uses; this file only keeps the state, applies the
 * screen's choices to the study, and hands results to views.ts for shaping. Runs under Node in test/renderer too.
 */
import {
  buildReport, InputError, luInverse, prepareStudy, previewTable as enginePreview, previewTableBytes, projectFileOf, readyLines, REPORTS,
  reportUnavailable, restudy, runStudyScenario, SAMPLE_CSV, SAMPLE_FILE_NAME, SAMPLE_NOTE, spreadMix, studyFromProjectFile,
  studyFromImportedTable, studyFromTableFile, utf8Bytes, sha256HexPortable, usePlatformSha256, withTable, filesOnly, checkStudyInputs, mixesOfTable, writeMixCsv, parseShockCsv, SAMPLE_SHOCK_CSV, SAMPLE_SHOCK_FILE_NAME, parseActivityCsv, parseCommutingCsv, parseMarginsCsv, mixesFromFile, parsePriceIndexCsv, scenarioSlug, studyBrief, studyBriefDocument, studyWorkbook,
  type BriefDocument, type BriefFonts, type IOTable, type Paper, type ImportSettings, type PreparedStudy, type ReportFile, type ReportKind, type Scenario, type ScenarioLine, type SpendingMix, type Study,
} from '../../src/study/index.ts';
import type { AnalysisView, FileSource, GridView, PathsView, PreviewView, ScenarioDraft, ScenarioView, StudyChoices, StudyContent, StudyContentView, StudyInputKind, StudyInputsView, TableInfo, TableSource, TextSource } from './protocol.ts';
import { analysisView, gridMargins, pathsView, previewView, scenarioView, tableInfo } from './views.ts';
import { regionalApi } from './regional.ts';
import { howSureMemory, uncertaintyApi } from './uncertainty.ts';
import { supplyUseApi } from './supply-use.ts';
import { bridgeApi, bridgeOf } from './bridges.ts';
import type { RegionalFile } from './regional.ts';

export const SAMPLE_FILE = SAMPLE_FILE_NAME;

let state: PreparedStudy | null = null;

function current(): PreparedStudy {
  if (!state) throw new Error('no table is loaded');
  return state;
}

function importSettings(src: TableSource): ImportSettings {
  return {
    ...(src.roles ? { roles: src.roles } : {}), ...(src.layout ? { layout: src.layout as ImportSettings['layout'] } : {}), ...(src.name ? { name: src.name } : {}),
    ...(src.delimiter ? { delimiter: src.delimiter } : {}), ...(src.decimalMark ? { decimalMark: src.decimalMark } : {}),
  };
}

/**
 * The study as the screens have it now: the loaded table with the screen's scenarios and choices. A new commuting share
 * means a new household row, so a new factorisation: kept as the worker's state, so it is made once per change.
 */
function studyAt(choices: StudyChoices, scenarios: Scenario[] = []): PreparedStudy {
  const ps = current();
  const s = ps.study.settings;
  const next = restudy(ps, {
    ...ps.study,
    scenarios: scenarios.map(readyLines),
    settings: {
      ...s, closure: choices.closure, paths: { ...s.paths, destination: choices.destination },
      ...(choices.discountRate !== undefined ? { discountRate: choices.discountRate } : {}),
    },
    ...(choices.commutingShare !== undefined ? { commuting: { ...ps.study.commuting, overall: choices.commutingShare } } : {}),
    ...(choices.tableYear !== undefined ? { prices: { ...ps.study.prices, tableYear: choices.tableYear } } : {}),
  });
  if (next.pm !== ps.pm) state = next;
  return next;
}

/** The study's input files in words, for the Scenarios screen. */
function studyInputsView(study: Study): StudyInputsView {
  const names = (list: { name: string }[], one: string, many: string) => (list.length ? `${list.length} ${list.length === 1 ? one : many}: ${list.map((x) => x.name).join(', ')}` : null);
  const m = study.margins;
  const idx = study.prices.index;
  const years = idx ? idx.points.map((p) => p.year).sort((a, b) => a - b) : [];
  return {
    mix: names(study.mixes, 'mix', 'mixes'),
    activity: names(study.activities, 'activity', 'activities'),
    margins: m ? `${m.rows.length} sector${m.rows.length === 1 ? '' : 's'} with margins; retail earned by ${m.sectors.retail ?? '—'}, wholesale by ${m.sectors.wholesale ?? '—'}, transport by ${m.sectors.transport ?? '—'}` : null,
    'price-index': years.length ? `${years.length} year${years.length === 1 ? '' : 's'}, ${years[0]}–${years.at(-1)}` : null,
    commuting: study.commuting.sectors.length ? `${study.commuting.sectors.length} sector${study.commuting.sectors.length === 1 ? '' : 's'} listed` : null,
  };
}

/** File origins say where a file's rows were; content the app keeps (and edits, and undoes) has none. */
const ORIGIN_KEYS = new Set(['origin', 'itemOrigins', 'sectorOrigin']);
function withoutOrigins<T>(x: T): T {
  return JSON.parse(JSON.stringify(x, (k, v: unknown) => (ORIGIN_KEYS.has(k) ? undefined : v))) as T;
}

function contentOf(study: Study): StudyContent {
  return withoutOrigins({ mixes: study.mixes, activities: study.activities, margins: study.margins, priceIndex: study.prices.index, commuting: study.commuting.sectors });
}

/** Keep the study with new content, checked by the study layer as a save would be (located refusals; nothing kept then). */
function useContent(study: Study): StudyContentView {
  checkStudyInputs(study);
  state = restudy(current(), study);
  return { table: tableInfo(study, study.source?.fileName ?? study.table.name), inputs: studyInputsView(study), content: contentOf(study) };
}

/**
 * Read one of the study's input files (replacing the one before; spending mixes and activities of the same name are
 * replaced, others kept), or remove it (`text` null). Checked against the table like a save would (located refusals).
 * A mix file may name codes of an outside classification, read through `bridge` (`code,sector[,share]`).
 */
function setStudyInput(args: { kind: StudyInputKind; text: string | null; fileName: string; bridge?: RegionalFile | null }): StudyContentView {
  const study: Study = { ...current().study };
  const { kind, text, fileName } = args;
  const keep = <T extends { name: string }>(old: T[], add: T[]) => [...old.filter((x) => !add.some((y) => y.name === x.name)), ...add];
  if (kind === 'mix') study.mixes = text === null ? [] : keep(study.mixes, mixesFromFile(text, fileName, args.bridge ? bridgeOf(args.bridge, study.table.sectors) : null));
  else if (kind === 'activity') study.activities = text === null ? [] : keep(study.activities, parseActivityCsv(text, fileName));
  else if (kind === 'margins') study.margins = text === null ? null : parseMarginsCsv(text, fileName);
  else if (kind === 'price-index') study.prices = { ...study.prices, index: text === null ? null : parsePriceIndexCsv(text, fileName) };
  else study.commuting = { ...study.commuting, sectors: text === null ? [] : parseCommutingCsv(text, fileName) };
  return useContent(study);
}

/** The study's content as the app's editors (or undo) leave it: every part replaced, then checked as a whole. */
function setStudyContent(c: StudyContent): StudyContentView {
  const study = current().study;
  return useContent({
    ...study, mixes: c.mixes, activities: c.activities, margins: c.margins,
    prices: { ...study.prices, index: c.priceIndex }, commuting: { ...study.commuting, sectors: c.commuting },
  });
}

/** Spending mixes as a mix file (writeMixCsv: mix,sector,share; `names` null: the study's own), for the app's export. */
function mixFile(args: { names: string[] | null }): { name: string; text: string } {
  const { study } = current();
  const all = [...study.mixes, ...mixesOfTable(study.table)];
  const mixes = args.names === null ? study.mixes : args.names.map((n) => {
    const m = all.find((x) => x.name === n);
    if (!m) throw new InputError('unknown-mix', `the study has no spending mix '${n}'`, { rowLabel: n });
    return m;
  });
  if (mixes.length === 0) throw new InputError('empty', 'the study has no spending mixes of its own to export');
  return { name: `${scenarioSlug(mixes.length === 1 ? mixes[0]!.name : `${study.name || study.table.name} mixes`)}.csv`, text: writeMixCsv(mixes) };
}

interface Loaded { table: TableInfo; analysis: AnalysisView; starter: ScenarioDraft; content: StudyContent }

/** The study prepared (factorisation, analysis) and what the screens get of it, without making it the worker's state. */
function prepared(study: Study): { ps: PreparedStudy; views: Loaded } {
  const ps = prepareStudy(study);
  return { ps, views: { table: tableInfo(study, study.source?.fileName ?? study.table.name), analysis: analysisView(ps), starter: starter(study), content: contentOf(study) } };
}

function load(study: Study): Loaded {
  const { ps, views } = prepared(study);
  state = ps;
  dropPreview({}); // what was read or prepared ahead for a preview belongs to the state before
  return views;
}

function starter(study: Study): ScenarioDraft {
  const s = study.table.sectors;
  const food = s.find((x) => /food/i.test(x));
  return {
    name: food ? 'New food plant' : 'Example scenario',
    phases: [{ name: food ? 'Operating' : 'Phase 1', timing: food ? 'annual' : 'once', lines: [{ sector: food ?? s[0] ?? '', amount: 1000, kind: 'final-demand', localShare: 1 }] }],
  };
}

/**
 * Import the table file's bytes under the source's settings and make it the study (keeping the study's other inputs);
 * `table`: what the preview of the same bytes and settings read, taken instead of reading them again.
 */
function studyOfBytes(bytes: Uint8Array, src: TableSource, table: IOTable | null = null): Study {
  const study = table ? studyFromImportedTable(bytes, src.fileName, importSettings(src), table) : studyFromTableFile(bytes, src.fileName, importSettings(src));
  if (src.derivedFrom?.length) study.source = { ...study.source!, derivedFrom: src.derivedFrom.map((o) => ({ ...o })) };
  return state ? withTable(state.study, study) : study;
}

function loadTable(src: TextSource): Loaded {
  return load(studyOfBytes(utf8Bytes(src.text), src));
}

/** The engine's import options for a table source: its file name (located messages) and the screen's settings. */
function importOptions(src: TableSource): ImportSettings & { fileName: string } {
  return { fileName: src.fileName, ...importSettings(src) };
}

function previewTable(src: TextSource): PreviewView {
  dropPreview({});
  return previewView(enginePreview(src.text, importOptions(src)), src);
}

/**
 * The last picked file the worker read: its bytes, as the file holds them, and their SHA-256. A file is previewed,
 * perhaps with other roles, then imported: it is read and hashed once. The bytes are what the study keeps and
 * fingerprints (the CLI's rule: the SHA-256 of the file itself, byte order mark and all); the table is read from
 * them as UTF-8 text by the engine, which decodes only what it cannot read from the bytes themselves. The hash is the
 * platform's (Web Crypto), started as soon as the file is read, so it is ready by the time "Use this table" is pressed.
 */
let lastFile: { id: string; bytes: Uint8Array; sha256: Promise<string> } | null = null;

async function readFile(src: FileSource): Promise<NonNullable<typeof lastFile>> {
  if (lastFile?.id === src.id) return lastFile;
  lastFile = null;
  const bytes = new Uint8Array(await src.file.arrayBuffer());
  lastFile = { id: src.id, bytes, sha256: platformSha256(bytes) };
  return lastFile;
}

/** Hex SHA-256 by Web Crypto (native, off this thread), or the engine's own code where Web Crypto is missing. */
async function platformSha256(bytes: Uint8Array): Promise<string> {
  const subtle = globalThis.crypto?.subtle;
  if (!subtle) return sha256HexPortable(bytes);
  const digest = new Uint8Array(await subtle.digest('SHA-256', bytes as Uint8Array<ArrayBuffer>));
  return Array.from(digest, (b) => b.toString(16).padStart(2, '0')).join('');
}

/**
 * The table the last preview of a picked file read, and the settings it was read under: "Use this table" right after
 * takes it instead of reading 20 MB again (the preview reads the bytes as the import does: previewTableBytes).
 */
interface PreviewRead { id: string; settings: string; table: IOTable }
let lastPreview: PreviewRead | null = null;
const settingsKey = (src: TableSource) => JSON.stringify([src.fileName, importSettings(src)]);

async function previewFile(src: FileSource): Promise<PreviewView> {
  const f = await readFile(src);
  dropPreview({});
  const p = previewTableBytes(f.bytes, importOptions(src));
  if (p.table) {
    const preview: PreviewRead = { id: src.id, settings: settingsKey(src), table: p.table };
    lastPreview = preview;
    const from = state;
    setTimeout(() => { void prepareAhead(src, preview, from).catch(() => undefined); }, 0); // after this answer is sent
  }
  return previewView(p, src);
}

/**
 * The study of the last previewed file, prepared while the planner reads the preview (its factorisation and analysis
 * are most of "Use this table" at 2,000 sectors), with the worker's state it was made from: loadFile takes it when
 * that preview is the one accepted and the state is unchanged; anything else discards it. A refusal is left to
 * loadFile to report.
 */
let ahead: { preview: PreviewRead; from: PreparedStudy | null; ps: PreparedStudy; views: Loaded } | null = null;

async function prepareAhead(src: FileSource, preview: PreviewRead, from: PreparedStudy | null): Promise<void> {
  const f = await readFile(src);
  const hex = await f.sha256;
  if (lastPreview !== preview || state !== from) return; // another preview, or another table, came first
  const r = withSha256(f.bytes, hex, () => prepared(studyOfBytes(f.bytes, src, preview.table)));
  if (lastPreview === preview && state === from) ahead = { preview, from, ...r };
}

/** The preview is gone (discarded, or another file previewed): so is what was read or prepared for it. */
function dropPreview(_: Record<string, never>): void {
  lastPreview = null;
  ahead = null;
}

/** Run `fn` with the study fingerprinting `bytes` by the hash already made; anything else is hashed as usual. */
function withSha256<T>(bytes: Uint8Array, hex: string, fn: () => T): T {
  usePlatformSha256((d) => (d === bytes ? hex : sha256HexPortable(d)));
  try {
    return fn();
  } finally {
    usePlatformSha256(null);
  }
}

async function loadFile(src: FileSource): Promise<Loaded> {
  const f = await readFile(src);
  const hex = await f.sha256;
  const settings = settingsKey(src);
  const done = ahead?.preview.id === src.id && ahead.preview.settings === settings && ahead.from === state ? ahead : null;
  const table = lastPreview?.id === src.id && lastPreview.settings === settings ? lastPreview.table : null;
  dropPreview({});
  if (done) {
    state = done.ps;
    return done.views;
  }
  return withSha256(f.bytes, hex, () => load(studyOfBytes(f.bytes, src, table)));
}

/**
 * The lines numbered as on screen (within their phase), so a refusal says "line 2 (row 'Transprot'): …" even after
 * blank lines are left out.
 */
function onScreen(s: ScenarioDraft): Scenario {
  return { ...s, phases: s.phases.map((p) => ({ ...p, lines: p.lines.map((l, k) => (l.origin ? l : { ...l, origin: { line: k + 1 } })) })) };
}

function runScenario(args: { scenario: ScenarioDraft; choices: StudyChoices }): ScenarioView {
  return scenarioView(runStudyScenario(studyAt(args.choices), readyLines(onScreen(args.scenario))));
}

/** Paths of one phase to the study's chosen sector (`choices.destination`), or to the default one when none is chosen. */
function paths(args: { scenario: ScenarioDraft; phase?: number; choices: StudyChoices }): PathsView {
  const o = runStudyScenario(studyAt(args.choices), readyLines(onScreen(args.scenario)), { paths: 'default' });
  const p = o.phases[Math.min(args.phase ?? 0, o.phases.length - 1)]!;
  return pathsView(p.paths!);
}

function grid(args: { which: 'Z' | 'A' | 'L' }): GridView {
  const ps = current();
  const { pm, study, models } = ps;
  let values: Float64Array;
  if (args.which === 'Z') values = Float64Array.from(study.table.Z);
  else if (args.which === 'A') values = Float64Array.from(pm.coef.A);
  else {
    if (models.open !== true) throw new InputError('not-productive', `the Leontief inverse is not shown: ${models.open}`);
    // The explicit inverse only when the grid is asked for: the blocked inverse on the existing factorisation.
    values = luInverse(pm.openLU);
  }
  let max = 0;
  for (let k = 0; k < values.length; k++) if (values[k]! > max) max = values[k]!;
  return { which: args.which, n: pm.coef.n, sectors: pm.coef.sectors, values, max, ...gridMargins(ps, args.which, values) };
}

function reports(args: { scenarios: ScenarioDraft[]; choices: StudyChoices }): { kind: ReportKind; label: string; what: string; scope: string; unavailable: string | null }[] {
  const ps = studyAt(args.choices, args.scenarios);
  return REPORTS.map((r) => ({ ...r, unavailable: reportUnavailable(ps, r.kind) }));
}

function report(args: { kind: ReportKind; scenario?: ScenarioDraft; scenarios: ScenarioDraft[]; choices: StudyChoices }): ReportFile[] {
  const ps = studyAt(args.choices, args.scenarios);
  return filesOnly(buildReport(ps, args.kind, { date: new Date().toISOString(), ...(args.scenario ? { scenario: readyLines(args.scenario) } : {}) }));
}

/** Bands and sensitivity the user computed, which the brief and the workbook of the same study and scenario include. */
const howSure = howSureMemory();

/** The scenario's outcome as the CLI computes it: structural paths only when the study names their destination. */
function outcomeOf(ps: PreparedStudy, scenario: ScenarioDraft) {
  return runStudyScenario(ps, readyLines(scenario), { paths: ps.study.settings.paths.destination });
}

/**
 * The scenario's brief: the PDF (made by the study layer's studyBrief, as `roundwise scenario --brief`) and its
 * document, which the print view shows. The fonts come from the UI (fetched once from the app's assets).
 */
async function brief(args: { scenario: ScenarioDraft; scenarios: ScenarioDraft[]; choices: StudyChoices; paper: Paper; fonts: BriefFonts; date?: string }): Promise<{ name: string; pdf: Uint8Array; document: BriefDocument }> {
  const ps = studyAt(args.choices, args.scenarios);
  const o = outcomeOf(ps, args.scenario);
  const date = args.date ?? new Date().toISOString();
  const sure = howSure.of(ps, args.scenario);
  const document = studyBriefDocument(ps, o, date, sure);
  return { name: `${scenarioSlug(o.scenario.name)}-brief.pdf`, pdf: await studyBrief(ps, o, { date, paper: args.paper, fonts: args.fonts }, sure), document };
}

/** The workbook of the study, with the scenario's sheets when one is given (studyWorkbook, as `--xlsx`). */
async function workbook(args: { scenario?: ScenarioDraft; scenarios: ScenarioDraft[]; choices: StudyChoices; date?: string }): Promise<{ name: string; xlsx: Uint8Array }> {
  const ps = studyAt(args.choices, args.scenarios);
  const o = args.scenario ? outcomeOf(ps, args.scenario) : null;
  const name = `${scenarioSlug(o ? o.scenario.name : ps.study.table.name)}.xlsx`;
  return { name, xlsx: await studyWorkbook(ps, o, { date: args.date ?? new Date().toISOString() }, howSure.of(ps, args.scenario ?? null)) };
}

function saveProject(args: { name: string; scenarios: ScenarioDraft[]; choices: StudyChoices; active: number }): string {
  const { study } = studyAt(args.choices, args.scenarios);
  return projectFileOf({ ...study, name: args.name, settings: { ...study.settings, activeScenario: args.scenarios[args.active]?.name ?? null } });
}

/**
 * The table, its source and the settings as a project with no scenarios, for the crash-recovery copy: no save-time
 * checks, so a scenario line that no longer matches the table can never stop the copy. The scenarios travel beside
 * it as the UI holds them (renderer/state/recovery-copy.ts).
 */
function recoveryBase(args: { name: string; choices: StudyChoices }): string {
  const { study } = studyAt(args.choices);
  return projectFileOf({ ...study, name: args.name, scenarios: [] });
}

/**
 * The same project text as a JSON string literal in a Blob: what the crash-recovery copy embeds. Escaped and encoded
 * here, so the window's main thread never holds the 20 MB text of a 2,000-sector table (a Blob crosses by reference).
 */
function recoveryBaseJson(args: { name: string; choices: StudyChoices }): Blob {
  return new Blob([JSON.stringify(recoveryBase(args))], { type: 'application/json' });
}

function openProject(args: { text: string; fileName: string }): Loaded & { scenarios: ScenarioDraft[]; choices: StudyChoices; active: number; name: string; source: TableSource | null; inputs: StudyInputsView } {
  const study = studyFromProjectFile(args.text, args.fileName);
  const loaded = load(study);
  const active = Math.max(0, study.scenarios.findIndex((s) => s.name === study.settings.activeScenario));
  return {
    ...loaded, scenarios: study.scenarios, active, name: study.name,
    choices: {
      closure: study.settings.closure, destination: study.settings.paths.destination, discountRate: study.settings.discountRate,
      commutingShare: study.commuting.overall, tableYear: study.prices.tableYear,
    },
    inputs: studyInputsView(study),
    source: sourceOf(study),
  };
}

/**
 * The table's source as the Import screen edits it, when the study keeps the file's bytes (so "Change roles" works
 * after a project is opened too). The bytes are decoded as the importer reads them (UTF-8, byte order mark kept).
 */
function sourceOf(study: Study): TableSource | null {
  const src = study.source;
  if (!src?.content) return null;
  const imp = src.import ?? {};
  return {
    text: new TextDecoder('utf-8', { ignoreBOM: true }).decode(src.content),
    fileName: src.fileName,
    ...(imp.roles ? { roles: imp.roles } : {}),
    ...(imp.layout ? { layout: imp.layout } : {}),
    ...(imp.name ? { name: imp.name } : {}),
    ...(imp.delimiter ? { delimiter: imp.delimiter } : {}),
    ...(imp.decimalMark ? { decimalMark: imp.decimalMark } : {}),
    ...(src.derivedFrom?.length ? { derivedFrom: src.derivedFrom.map((o) => ({ ...o })) } : {}),
  };
}

/**
 * The bundled two-phase example (building the plant once, operating it yearly) as a scenario of the screen, or null
 * when the table in use lacks a sector it names (it is written for the sample county). Lines lose their file line.
 */
function exampleScenario(_: Record<string, never>): ScenarioDraft | null {
  const s = parseShockCsv(SAMPLE_SHOCK_CSV, SAMPLE_SHOCK_FILE_NAME);
  const sectors = new Set(current().study.table.sectors);
  if (s.phases.some((p) => p.lines.some((l) => !sectors.has(l.sector)))) return null;
  return { ...s, name: 'Food plant, built then operated', phases: s.phases.map((p) => ({ ...p, lines: p.lines.map(({ origin: _origin, ...l }) => l) })) };
}

function spread(args: { mix: SpendingMix; amount: number; localShare: number }): ScenarioLine[] {
  return spreadMix(args.mix, args.amount, { localShare: args.localShare });
}

/**
 * The worker as it starts: no study, no file read, no preview. The shell tests drive this module in one module graph
 * (vitest.config.ts) and call it before each file, so no file sees another's table.
 */
export function resetWorker(): void {
  state = null;
  lastFile = null;
  dropPreview({});
}

export const api = {
  loadSample(_: Record<string, never>): Loaded & { source: TableSource; note: string } {
    const source: TextSource = { text: SAMPLE_CSV, fileName: SAMPLE_FILE, name: 'Fernhollow County (invented sample)' };
    return { ...loadTable(source), source, note: SAMPLE_NOTE };
  },
  previewTable,
  previewFile,
  loadTable,
  loadFile,
  dropPreview,
  runScenario,
  spread,
  exampleScenario,
  setStudyInput,
  setStudyContent,
  mixFile,
  paths,
  grid,
  reports,
  report,
  brief,
  workbook,
  saveProject,
  recoveryBase,
  recoveryBaseJson,
  openProject,
  ...regionalApi,
  ...uncertaintyApi(studyAt, howSure),
  ...supplyUseApi,
  ...bridgeApi(current),
};
