/**
 * Project files: the table's source text and roles, the scenarios and the closure switch, as JSON. Opening a
 * project re-imports its table through the engine, so what reopens is exactly what was saved.
 */
import { getBridge } from '../bridge/index.ts';
import { app, markDirty, messageOf, recomputeAll, resetHistory, say, useTable } from './app.ts';
import type { ScenarioDraft, TableSource } from '../worker/compute.ts';

export const PROJECT_FORMAT = 'roundwise-project';
export const PROJECT_VERSION = 1;

export interface ProjectFile {
  format: typeof PROJECT_FORMAT;
  version: number;
  savedAt: string;
  table: TableSource;
  scenarios: ScenarioDraft[];
  closure: boolean;
}

export function projectText(): string {
  if (!app.source) throw new Error('no table to save');
  const p: ProjectFile = {
    format: PROJECT_FORMAT,
    version: PROJECT_VERSION,
    savedAt: new Date().toISOString(),
    table: { text: app.source.text, fileName: app.source.fileName, ...(app.source.roles ? { roles: app.source.roles } : {}), ...(app.source.layout ? { layout: app.source.layout } : {}) },
    scenarios: JSON.parse(JSON.stringify(app.scenarios)) as ScenarioDraft[],
    closure: app.closure,
  };
  return JSON.stringify(p, null, 2);
}

export function parseProject(text: string, fileName: string): ProjectFile {
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (e) {
    throw new Error(`${fileName}: not a project file (${messageOf(e)})`);
  }
  const p = data as Partial<ProjectFile>;
  if (!p || p.format !== PROJECT_FORMAT) throw new Error(`${fileName}: not a Roundwise project file`);
  if (typeof p.version !== 'number' || p.version > PROJECT_VERSION) throw new Error(`${fileName}: project version ${String(p.version)} is newer than this app understands`);
  if (!p.table || typeof p.table.text !== 'string' || typeof p.table.fileName !== 'string') throw new Error(`${fileName}: the project has no table`);
  if (!Array.isArray(p.scenarios)) throw new Error(`${fileName}: the project has no scenario list`);
  return { format: PROJECT_FORMAT, version: p.version, savedAt: String(p.savedAt ?? ''), table: p.table, scenarios: p.scenarios, closure: p.closure !== false };
}

export async function saveProject(askName: boolean): Promise<boolean> {
  const name = app.project?.name ?? `${(app.table?.name ?? 'project').replace(/[^\w\- ]+/g, '').trim() || 'project'}.roundwise.json`;
  const saved = await getBridge().saveProject(name, projectText(), askName ? undefined : app.project?.path);
  if (!saved) return false;
  app.project = { name: saved.name, ...(saved.path ? { path: saved.path } : {}) };
  markDirty(false);
  say(`Saved ${saved.name}`);
  return true;
}

export async function applyProject(text: string, fileName: string, path?: string): Promise<boolean> {
  let p: ProjectFile;
  try {
    p = parseProject(text, fileName);
  } catch (e) {
    app.importError = messageOf(e);
    app.screen = 'import';
    return false;
  }
  app.closure = p.closure;
  app.scenarios = p.scenarios;
  app.selected = 0;
  const ok = await useTable(p.table);
  if (!ok) {
    app.screen = 'import';
    return false;
  }
  resetHistory();
  app.project = { name: fileName, ...(path ? { path } : {}) };
  markDirty(false);
  await recomputeAll();
  say(`Opened ${fileName}`);
  return true;
}

export async function openProject(): Promise<void> {
  if (app.dirty && !window.confirm('The current project has unsaved changes. Open another and lose them?')) return;
  const f = await getBridge().openFile('project');
  if (f) await applyProject(f.text, f.name, f.path);
}

export async function openRecent(ref: string): Promise<void> {
  if (app.dirty && !window.confirm('The current project has unsaved changes. Open another and lose them?')) return;
  const f = await getBridge().openRecent(ref);
  if (f) await applyProject(f.text, f.name, f.path);
}
