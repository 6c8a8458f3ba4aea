/**
 * The worker's side of the app: one prepared study (src/study) and the operations the screens call on it. Every
 * number comes from the study layer, the same functions the CLI uses; this file only keeps the state, applies the
 * screen's choices to the study, and hands results to views.ts for shaping. Runs under Node in test/renderer too.
 */
import {
  buildReport, InputError, luInverse, prepareStudy, previewTable as enginePreview, projectFileOf, readyLines, REPORTS,
  reportUnavailable, restudy, runStudyScenario, SAMPLE_CSV, SAMPLE_FILE_NAME, SAMPLE_NOTE, spreadMix, studyFromProjectFile,
  studyFromTableFile, utf8Bytes, withTable, filesOnly, scenarioSlug, studyBrief, studyBriefDocument, studyWorkbook,
  type BriefDocument, type BriefFonts, type Paper, type ImportSettings, type PreparedStudy, type ReportFile, type ReportKind, type Scenario, type ScenarioLine, type SpendingMix, type Study,
} from '../../src/study/index.ts';
import type { AnalysisView, GridView, PathsView, PreviewView, ScenarioDraft, ScenarioView, StudyChoices, TableInfo, TableSource } from './protocol.ts';
import { analysisView, pathsView, previewView, scenarioView, tableInfo } from './views.ts';
import { regionalApi } from './regional.ts';
import { supplyUseApi } from './supply-use.ts';

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

/** The study as the screens have it now: the loaded table with the screen's scenarios and choices. */
function studyAt(choices: StudyChoices, scenarios: Scenario[] = []): PreparedStudy {
  const ps = current();
  const s = ps.study.settings;
  return restudy(ps, {
    ...ps.study,
    scenarios: scenarios.map(readyLines),
    settings: { ...s, closure: choices.closure, paths: { ...s.paths, destination: choices.destination } },
  });
}

function load(study: Study): { table: TableInfo; analysis: AnalysisView; starter: ScenarioDraft } {
  const ps = prepareStudy(study);
  state = ps;
  return { table: tableInfo(study, study.source?.fileName ?? study.table.name), analysis: analysisView(ps), starter: starter(study) };
}

function starter(study: Study): ScenarioDraft {
  const s = study.table.sectors;
  const food = s.find((x) => /food/i.test(x));
  return {
    name: food ? 'New food plant' : 'Example scenario',
    phases: [{ name: food ? 'Operating' : 'Phase 1', timing: food ? 'annual' : 'once', lines: [{ sector: food ?? s[0] ?? '', amount: 1000, kind: 'final-demand', localShare: 1 }] }],
  };
}

function loadTable(src: TableSource): { table: TableInfo; analysis: AnalysisView; starter: ScenarioDraft } {
  const study = studyFromTableFile(utf8Bytes(src.text), src.fileName, importSettings(src));
  return load(state ? withTable(state.study, study) : study);
}

function previewTable(src: TableSource): PreviewView {
  return previewView(enginePreview(src.text, { fileName: src.fileName, ...importSettings(src) }), src);
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
  const { pm, study, models } = current();
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
  return { which: args.which, n: pm.coef.n, sectors: pm.coef.sectors, values, max };
}

function reports(args: { scenarios: ScenarioDraft[]; choices: StudyChoices }): { kind: ReportKind; label: string; what: string; scope: string; unavailable: string | null }[] {
  const ps = studyAt(args.choices, args.scenarios);
  return REPORTS.map((r) => ({ ...r, unavailable: reportUnavailable(ps, r.kind) }));
}

function report(args: { kind: ReportKind; scenario?: ScenarioDraft; scenarios: ScenarioDraft[]; choices: StudyChoices }): ReportFile[] {
  const ps = studyAt(args.choices, args.scenarios);
  return filesOnly(buildReport(ps, args.kind, { date: new Date().toISOString(), ...(args.scenario ? { scenario: readyLines(args.scenario) } : {}) }));
}

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
  const document = studyBriefDocument(ps, o, date);
  return { name: `${scenarioSlug(o.scenario.name)}-brief.pdf`, pdf: await studyBrief(ps, o, { date, paper: args.paper, fonts: args.fonts }), document };
}

/** The workbook of the study, with the scenario's sheets when one is given (studyWorkbook, as `--xlsx`). */
async function workbook(args: { scenario?: ScenarioDraft; scenarios: ScenarioDraft[]; choices: StudyChoices; date?: string }): Promise<{ name: string; xlsx: Uint8Array }> {
  const ps = studyAt(args.choices, args.scenarios);
  const o = args.scenario ? outcomeOf(ps, args.scenario) : null;
  const name = `${scenarioSlug(o ? o.scenario.name : ps.study.table.name)}.xlsx`;
  return { name, xlsx: await studyWorkbook(ps, o, { date: args.date ?? new Date().toISOString() }) };
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

function openProject(args: { text: string; fileName: string }): { table: TableInfo; analysis: AnalysisView; scenarios: ScenarioDraft[]; choices: StudyChoices; active: number; name: string; source: TableSource | null } {
  const study = studyFromProjectFile(args.text, args.fileName);
  const loaded = load(study);
  const active = Math.max(0, study.scenarios.findIndex((s) => s.name === study.settings.activeScenario));
  return {
    ...loaded, scenarios: study.scenarios, choices: { closure: study.settings.closure, destination: study.settings.paths.destination }, active, name: study.name,
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
  };
}

function spread(args: { mix: SpendingMix; amount: number; localShare: number }): ScenarioLine[] {
  return spreadMix(args.mix, args.amount, { localShare: args.localShare });
}

export const api = {
  loadSample(_: Record<string, never>): { table: TableInfo; analysis: AnalysisView; source: TableSource; starter: ScenarioDraft; note: string } {
    const source: TableSource = { text: SAMPLE_CSV, fileName: SAMPLE_FILE, name: 'Fernhollow County (invented sample)' };
    return { ...loadTable(source), source, note: SAMPLE_NOTE };
  },
  previewTable,
  loadTable,
  runScenario,
  spread,
  paths,
  grid,
  reports,
  report,
  brief,
  workbook,
  saveProject,
  recoveryBase,
  openProject,
  ...regionalApi,
  ...supplyUseApi,
};
