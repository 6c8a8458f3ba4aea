/**
 * The worker's side of the app: one prepared study (src/study, kept by study-state.ts) and the operations the screens
 * call on it. Every number comes from the study layer, the same functions the CLI uses; the worker's modules only keep
 * the state, apply the screen's choices to the study, and hand results to views.ts for shaping. This file holds the
 * scenario and export operations and gathers every module's into one `api`. Runs under Node in test/renderer too.
 */
import {
  buildReport, filesOnly, InputError, parseShockCsv, readyLines, REPORTS, reportUnavailable, runStudyScenario, SAMPLE_SHOCK_CSV, studyLeontief,
  SAMPLE_SHOCK_FILE_NAME, scenarioSlug, spreadMix, studyBrief, studyBriefDocument, studyWorkbook,
  type BriefDocument, type BriefFonts, type Paper, type PreparedStudy, type ReportFile, type ReportKind, type Scenario, type ScenarioLine, type SpendingMix,
} from '../../src/study/index.ts';
import type { GridView, PathsView, ScenarioDraft, ScenarioView, StudyChoices } from './protocol.ts';
import { gridMargins, pathsView, scenarioView } from './views.ts';
import { regionalApi } from './regional.ts';
import { howSureMemory, uncertaintyApi } from './uncertainty.ts';
import { supplyUseApi } from './supply-use.ts';
import { bridgeApi } from './bridges.ts';
import { studyContentApi } from './study-content.ts';
import { forgetFiles, tableLoadingApi } from './table-loading.ts';
import { projectsApi } from './projects.ts';
import { current, keepStudy, studyAt } from './study-state.ts';

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
    // The study's explicit inverse, formed only when the grid is asked for: the one the Leontief-inverse report exports.
    values = studyLeontief(ps);
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
  keepStudy(null);
  forgetFiles();
}

export const api = {
  ...tableLoadingApi,
  runScenario,
  spread,
  exampleScenario,
  ...studyContentApi,
  paths,
  grid,
  reports,
  report,
  brief,
  workbook,
  ...projectsApi,
  ...regionalApi,
  ...uncertaintyApi(studyAt, howSure),
  ...supplyUseApi,
  ...bridgeApi(current),
};
