/**
 * The app's state and the actions on it. Screens read `app` and call the actions; every computation goes to the
 * engine worker. Scenario edits go through `editScenarios` so they can be undone and mark the project unsaved.
 */
import { markRaw, reactive, toRaw, watch } from 'vue';
import { getBridge } from '../bridge/index.ts';
import { engine, plain, CancelledError, EngineError } from '../worker/client.ts';
import type { AnalysisView, FileSource, FlqInputs, PreviewView, ScenarioView, StudyChoices, StudyContent, StudyContentView, StudyInputsView, TableInfo, TableSource } from '../worker/protocol.ts';
import type { ScenarioDraft } from '../worker/protocol.ts';
import { History } from './history.ts';
import { lineReady } from '../../src/study/index.ts';

export type ScreenId = 'overview' | 'import' | 'table' | 'structure' | 'multipliers' | 'scenarios' | 'export' | 'regional' | 'supply-use' | 'guide';

export interface ImportDraft {
  source: TableSource;
  preview: PreviewView | null;
  /** Refusal of the draft as it stands (located message). */
  error: string | null;
}

export type ScenarioResultState = ScenarioView | { error: string } | { waiting: string } | null;

export const app = reactive({
  screen: 'overview' as ScreenId,
  ready: false,
  /** The table in use and where it came from (kept for the project file). */
  table: null as TableInfo | null,
  source: null as TableSource | null,
  analysis: null as AnalysisView | null,
  /** Last import refusal; the previous table stays in use. */
  importError: null as string | null,
  draft: null as ImportDraft | null,
  scenarios: [] as ScenarioDraft[],
  selected: 0,
  /** The phase of the selected scenario being edited and shown. */
  phase: 0,
  /** Study inputs kept in the study's settings: discount rate (share a year, null none), commuting share, table money year. */
  discountRate: null as number | null,
  commutingShare: 0,
  tableYear: null as number | null,
  /** The study's input files in words (mixes, activities, margins, price index, commuting by sector). */
  studyInputs: { mix: null, activity: null, margins: null, 'price-index': null, commuting: null } as StudyInputsView,
  /** The study's own mixes, activities, margins, price index and commuting shares, as the worker last accepted them. */
  content: { mixes: [], activities: [], margins: null, priceIndex: null, commuting: [] } as StudyContent,
  /**
   * Results of each scenario: its view, its refusal (located), or `waiting` when no line has a sector yet. They are
   * `markRaw`: plain data from the worker, read-only on screen, so 2,000-sector vectors get no reactive proxies.
   */
  results: [] as ScenarioResultState[],
  /** True from the moment scenarios or settings change until their results are back: the screen marks them outdated. */
  resultsStale: false,
  /**
   * What the planner typed into the selected scenario that cannot be used (an empty amount, a local share of 150 %),
   * by line and field ("2:share"): never clipped or dropped silently; results are held back until it is fixed.
   */
  inputProblems: {} as Record<string, { message: string; text: string }>,
  /** Type II: include the household closure in scenario results and multipliers (the study's closure setting). */
  closure: true,
  /** Sector the structural paths go to (the study's setting); null: the most affected sector not shocked itself. */
  pathDestination: null as string | null,
  /** True while the scenario list is only the example the app made itself (replaced when the table changes). */
  starterOnly: false,
  dirty: false,
  project: null as { name: string; path?: string } | null,
  /**
   * Sectors of the table used before this one: scenario lines naming one of them (and not a sector of this table)
   * were written for that table, and the Scenarios screen offers to map or drop them.
   */
  previousSectors: [] as readonly string[],
  /** The plain FLQ estimate the table in use came from, this session (FLQ δ sensitivity); null for any other table. */
  flqInputs: null as FlqInputs | null,
  toast: '' as string,
  fatal: '' as string,
});

/**
 * One undo step per user edit of the study's inputs: the scenarios (names, phases, lines), the study choices
 * (discount rate, commuting share, table year) and the study's content (mixes, activities, margins, price index,
 * commuting by sector, whether edited or read from a file). The table, its roles and the closure are not in it.
 */
interface StudyEdit {
  scenarios: ScenarioDraft[];
  selected: number;
  discountRate: number | null;
  commutingShare: number;
  tableYear: number | null;
  content: StudyContent;
}
const history = new History<StudyEdit>();
export const undoState = reactive({ canUndo: false, canRedo: false });

function studyEdit(): StudyEdit {
  return {
    scenarios: app.scenarios, selected: app.selected, discountRate: app.discountRate, commutingShare: app.commutingShare, tableYear: app.tableYear,
    content: app.content,
  };
}

function syncUndo(): void {
  undoState.canUndo = history.canUndo;
  undoState.canRedo = history.canRedo;
}

let toastTimer: ReturnType<typeof setTimeout> | null = null;
export function say(msg: string): void {
  app.toast = msg;
  if (toastTimer) clearTimeout(toastTimer);
  toastTimer = setTimeout(() => { app.toast = ''; }, 3500);
}

export function messageOf(e: unknown): string {
  if (e instanceof EngineError) return e.message;
  if (e instanceof Error) return e.message;
  return String(e);
}

function markDirty(d: boolean): void {
  app.dirty = d;
  getBridge().setDirty(d);
}

// ---- table ----

export async function loadSample(): Promise<void> {
  try {
    const r = await engine().call('loadSample', {}, 'Opening the sample county…');
    if (!sameContent(app.source, r.source)) app.project = null; // another study, as in useTable
    app.previousSectors = markRaw([...(app.table?.sectors ?? []), ...app.previousSectors.filter((x) => !app.table?.sectors.includes(x))]);
    app.table = markRaw(r.table);
    app.source = r.source;
    app.analysis = markRaw(r.analysis);
    app.content = r.content;
    app.ready = true;
    if (app.scenarios.length === 0 || app.starterOnly) {
      app.scenarios = [r.starter];
      app.selected = 0;
      app.starterOnly = true;
    }
    await recomputeAll();
  } catch (e) {
    if (!(e instanceof CancelledError)) app.fatal = messageOf(e);
  }
}

/** Open a file for import: show its preview on the Import screen. */
export async function beginImport(source: TableSource): Promise<void> {
  app.screen = 'import';
  app.importError = null;
  app.draft = { source, preview: null, error: null };
  await refreshPreview();
}

/** A file picked or dropped in the window, as a source the worker reads itself (FileSource). */
let fileCount = 0;
export function fileSource(file: File): FileSource {
  return { file, id: `${Date.now()}-${++fileCount}`, fileName: file.name };
}

/** The same table file: the same text, or the same picked file. */
function sameContent(a: TableSource | null, b: TableSource): boolean {
  if (!a) return false;
  return 'file' in a ? 'file' in b && toRaw(a.file) === toRaw(b.file) : 'text' in b && a.text === b.text;
}

export async function refreshPreview(): Promise<void> {
  const d = app.draft;
  if (!d) return;
  try {
    const src = plain(d.source);
    d.preview = 'file' in src ? await engine().call('previewFile', src, 'Reading the file…') : await engine().call('previewTable', src, 'Reading the file…');
    d.error = d.preview.refusal;
  } catch (e) {
    if (e instanceof CancelledError) return;
    d.preview = null;
    d.error = messageOf(e);
  }
}

export async function setDraftRole(kind: 'rows' | 'columns', label: string, role: string): Promise<void> {
  const d = app.draft;
  if (!d) return;
  const roles: Record<'rows' | 'columns', Record<string, string>> = { rows: { ...(d.source.roles?.rows ?? {}) }, columns: { ...(d.source.roles?.columns ?? {}) } };
  roles[kind][label] = role;
  const sectors = d.source.roles?.sectors;
  d.source = { ...d.source, roles: { ...roles, ...(sectors?.length ? { sectors } : {}) } as TableSource['roles'] };
  await refreshPreview();
}

/**
 * Read a label found as a row and as a column as a sector (`sector` true), or give it back the roles the label rules
 * suggest: the role map's "sectors" list, which overrides the words of the label.
 */
export async function setDraftSector(label: string, sector: boolean): Promise<void> {
  const d = app.draft;
  if (!d) return;
  const r = d.source.roles ?? {};
  const without = <T>(rec: Record<string, T> | undefined) => Object.fromEntries(Object.entries(rec ?? {}).filter(([l]) => l !== label));
  const sectors = (r.sectors ?? []).filter((l) => l !== label);
  if (sector) sectors.push(label);
  d.source = { ...d.source, roles: { rows: without(r.rows), columns: without(r.columns), ...(sectors.length ? { sectors } : {}) } as TableSource['roles'] };
  await refreshPreview();
}

/** Force a delimiter or decimal mark (undefined: let the importer decide again). */
export async function setDraftDialect(part: 'delimiter' | 'decimalMark', value: string | undefined): Promise<void> {
  const d = app.draft;
  if (!d) return;
  const next: TableSource = { ...d.source };
  if (value === undefined) delete next[part];
  else if (part === 'delimiter') next.delimiter = value as NonNullable<TableSource['delimiter']>;
  else next.decimalMark = value as NonNullable<TableSource['decimalMark']>;
  d.source = next;
  await refreshPreview();
}

export async function setDraftLayout(layout: string | undefined): Promise<void> {
  const d = app.draft;
  if (!d) return;
  d.source = { ...d.source, layout };
  await refreshPreview();
}

/** Accept the draft: the new table replaces the old only when the engine accepts it. */
export async function acceptImport(): Promise<boolean> {
  const d = app.draft;
  if (!d) return false;
  return useTable(d.source);
}

export async function useTable(source: TableSource): Promise<boolean> {
  try {
    const src = plain(source);
    const r = 'file' in src ? await engine().call('loadFile', src, 'Importing the table…') : await engine().call('loadTable', src, 'Importing the table…');
    // Another file is another study: the opened project's name no longer applies (Save asks for one). New roles for
    // the same file keep it.
    if (!sameContent(app.source, source)) app.project = null;
    app.previousSectors = markRaw([...(app.table?.sectors ?? []), ...app.previousSectors.filter((x) => !app.table?.sectors.includes(x))]);
    app.table = markRaw(r.table);
    app.source = source;
    app.flqInputs = null;
    app.analysis = markRaw(r.analysis);
    app.content = r.content;
    app.importError = null;
    app.draft = null;
    if (app.pathDestination !== null && !r.table.sectors.includes(app.pathDestination)) app.pathDestination = null;
    if (app.starterOnly) {
      app.scenarios = [r.starter];
      app.selected = 0;
    }
    markDirty(true);
    await recomputeAll();
    return true;
  } catch (e) {
    if (e instanceof CancelledError) return false;
    app.importError = messageOf(e);
    if (app.draft) app.draft.error = app.importError;
    return false;
  }
}

export function discardDraft(): void {
  app.draft = null;
  app.importError = null;
  void engine().call('dropPreview', {}, null).catch(() => undefined); // the worker's copy of the preview's table and study
}

export async function openTable(): Promise<void> {
  const f = await getBridge().openFile('table');
  if (f) await beginImport({ text: f.text, fileName: f.name });
}

// ---- scenarios ----

export function editScenarios(fn: (s: ScenarioDraft[]) => void, select?: number): void {
  history.record(studyEdit());
  app.starterOnly = false;
  const copy = JSON.parse(JSON.stringify(app.scenarios)) as ScenarioDraft[];
  fn(copy);
  app.scenarios = copy;
  if (select !== undefined) app.selected = select;
  app.selected = Math.min(Math.max(0, app.selected), Math.max(0, copy.length - 1));
  clampPhase();
  syncUndo();
  markDirty(true);
}

/** `base`, or `base (2)`, `base (3)`… : the first name no scenario of the study has yet. */
export function uniqueScenarioName(base: string): string {
  const names = new Set(app.scenarios.map((s) => s.name));
  if (!names.has(base)) return base;
  for (let k = 2; ; k++) if (!names.has(`${base} (${k})`)) return `${base} (${k})`;
}

/** Keep the phase index inside the selected scenario's phases. */
export function clampPhase(): void {
  const n = app.scenarios[app.selected]?.phases.length ?? 1;
  app.phase = Math.min(Math.max(0, app.phase), Math.max(0, n - 1));
}

/** One study choice (discount rate, commuting share, table year) set by the user: one undoable edit. */
export function editChoice(fn: () => void): void {
  history.record(studyEdit());
  fn();
  syncUndo();
  markDirty(true);
}

function showContent(r: StudyContentView): void {
  app.table = markRaw(r.table);
  app.studyInputs = r.inputs;
  app.content = r.content;
}

/**
 * Content changes and undo/redo run one after another: each waits for the worker's answer before the next takes its
 * snapshot, so two quick Ctrl+Z never restore from a half-applied state.
 */
let queue: Promise<unknown> = Promise.resolve();
function inTurn<T>(step: () => Promise<T>): Promise<T> {
  const next = queue.then(step, step);
  queue = next.catch(() => undefined);
  return next;
}

/**
 * Change the study's content (an editor's save, a file read or removed): the worker checks it as a whole through the
 * study layer; only accepted content becomes one undoable edit (with `after`'s changes to the scenarios, e.g. lines
 * following a renamed mix). A refusal (located message) is thrown to the caller.
 */
export function editStudyContent(call: () => Promise<StudyContentView>, after?: () => void): Promise<void> {
  return inTurn(async () => {
    const before = studyEdit();
    const r = await call();
    history.record(before);
    showContent(r);
    after?.();
    syncUndo();
    markDirty(true);
  });
}

async function restore(s: StudyEdit): Promise<void> {
  app.inputProblems = {};
  app.scenarios = s.scenarios;
  app.selected = s.selected;
  app.discountRate = s.discountRate;
  app.commutingShare = s.commutingShare;
  app.tableYear = s.tableYear;
  clampPhase();
  syncUndo();
  markDirty(true);
  if (JSON.stringify(s.content) === JSON.stringify(app.content)) return;
  try {
    showContent(await engine().call('setStudyContent', JSON.parse(JSON.stringify(s.content)) as StudyContent));
  } catch (e) {
    // Content of an earlier table may name sectors this table lacks: said, and the content stays as it is.
    if (!(e instanceof CancelledError)) say(`Not restored: ${messageOf(e)}`);
  }
}

export function undo(): Promise<void> {
  return inTurn(async () => {
    const s = history.undo(studyEdit());
    if (s) await restore(s);
  });
}

export function redo(): Promise<void> {
  return inTurn(async () => {
    const s = history.redo(studyEdit());
    if (s) await restore(s);
  });
}

/** The screen's choices as the study's settings. */
export function choices(): StudyChoices {
  return {
    closure: app.closure ? 'households' : 'none', destination: app.pathDestination,
    discountRate: app.discountRate, commutingShare: app.commutingShare, tableYear: app.tableYear,
  };
}

let recomputeSeq = 0;
/** Each table the worker gave (app.table is replaced with every new table or content): a number for inputsKey. */
const tableIds = new WeakMap<object, number>();
let tableCount = 0;
/** Everything the results depend on, as one string: the table, the scenarios, the study choices and content. */
function inputsKey(): string {
  const t = app.table!;
  if (!tableIds.has(t)) tableIds.set(t, ++tableCount);
  return JSON.stringify([tableIds.get(t), app.scenarios, choices(), app.studyInputs, app.content]);
}
/** The inputs of the results on screen, and the computation under way (null: none). */
let shownKey = '';
let running: { key: string; done: Promise<void> } | null = null;
/** A change came while a computation was under way: compute once more when it ends, from the inputs as they are then. */
let changedMeanwhile = false;

/**
 * Results follow the inputs: every change of scenarios, closure or table recomputes them (cheap solves). A call with
 * the inputs of the results on screen, or of the computation under way, computes nothing again.
 */
export function recomputeAll(): Promise<void> {
  if (!app.table) return Promise.resolve();
  const key = inputsKey();
  if (running?.key === key) return running.done;
  if (!running && key === shownKey) {
    app.resultsStale = false;
    return Promise.resolve();
  }
  const seq = ++recomputeSeq;
  const done = computeResults(seq, key).finally(() => {
    if (running?.done !== done) return;
    running = null;
    if (changedMeanwhile) {
      changedMeanwhile = false;
      void recomputeAll();
    }
  });
  running = { key, done };
  return done;
}

async function computeResults(seq: number, key: string): Promise<void> {
  const out: ScenarioResultState[] = [];
  for (const s of app.scenarios) {
    const lines = s.phases.flatMap((p) => p.lines);
    if (lines.length > 0 && !lines.some(lineReady)) {
      out.push({ waiting: lines.length === 1 ? 'Choose the sector of the line above to see the effects.' : 'Choose the sector of a line above to see the effects.' });
      continue;
    }
    try {
      out.push(markRaw(await engine().call('runScenario', { scenario: JSON.parse(JSON.stringify(s)) as ScenarioDraft, choices: choices() }, 'Computing scenario effects…')));
    } catch (e) {
      if (e instanceof CancelledError) return;
      out.push({ error: messageOf(e) });
    }
    if (seq !== recomputeSeq) return;
  }
  app.results = out;
  app.resultsStale = inputsKey() !== key; // inputs changed meanwhile: shown as outdated until their own results come
  shownKey = key;
}

// No waiting time after a change (the amount fields commit on change, not per keystroke): a change during a
// computation waits for it to end, so a burst of changes (Ctrl+Z held down) queues at most one more computation.
watch(() => [app.scenarios, app.closure, app.discountRate, app.commutingShare, app.tableYear, app.studyInputs, app.content], () => {
  app.resultsStale = true;
  if (running) changedMeanwhile = true;
  else void recomputeAll();
}, { deep: true });

/** Note (or clear, with null) a value typed into the selected scenario that cannot be used, with the text as typed. */
export function setInputProblem(key: string, problem: { message: string; text: string } | null): void {
  const next = { ...app.inputProblems };
  if (problem === null) delete next[key];
  else next[key] = problem;
  app.inputProblems = next;
}

// What is shown in the fields after these is the scenario as it stands, so earlier typing problems no longer apply.
watch(() => [app.selected, app.phase, app.table], () => { app.inputProblems = {}; });

export function resetHistory(): void {
  history.clear();
  syncUndo();
}

export { markDirty };
