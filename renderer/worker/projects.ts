/**
 * The worker's side of project files: the study saved with the screen's scenarios and choices, the crash-recovery
 * copy's base, and a project opened back into the screens (projectFileOf and studyFromProjectFile, as the CLI's
 * --project).
 */
import { projectFileOf, studyFromProjectFile, type Study } from '../../src/study/index.ts';
import type { ScenarioDraft, StudyChoices, StudyInputsView, TableSource } from './protocol.ts';
import { studyInputsView } from './study-content.ts';
import { load, type Loaded } from './table-loading.ts';
import { studyAt } from './study-state.ts';

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

export const projectsApi = { saveProject, recoveryBase, recoveryBaseJson, openProject };
