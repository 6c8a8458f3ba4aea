/**
 * Project files (src/project: the imported table, its roles, the scenarios and settings, as versioned JSON).
 * The worker writes and reads them with the engine, so what reopens is exactly what was saved.
 */
import { markRaw } from 'vue';
import { getBridge } from '../bridge/index.ts';
import { engine, CancelledError } from '../worker/client.ts';
import { app, choices, markDirty, messageOf, recomputeAll, resetHistory, say } from './app.ts';
import type { ScenarioDraft } from '../worker/protocol.ts';

function suggestedName(): string {
  if (app.project?.name) return app.project.name;
  const base = (app.table?.name ?? 'project').replace(/[^\w\- ]+/g, '').trim() || 'project';
  return `${base}.roundwise`;
}

export async function projectText(): Promise<string> {
  return engine().call('saveProject', {
    name: (app.project?.name ?? app.table?.name ?? 'project').replace(/\.roundwise$/, ''),
    scenarios: JSON.parse(JSON.stringify(app.scenarios)) as ScenarioDraft[],
    choices: choices(),
    active: app.selected,
  }, 'Writing the project…');
}

export async function saveProject(askName: boolean): Promise<boolean> {
  if (!app.table) return false;
  try {
    const text = await projectText();
    const saved = await getBridge().saveProject(suggestedName(), text, askName ? undefined : app.project?.path);
    if (!saved) return false;
    app.project = { name: saved.name, ...(saved.path ? { path: saved.path } : {}) };
    markDirty(false);
    say(`Saved ${saved.name}`);
    return true;
  } catch (e) {
    if (!(e instanceof CancelledError)) say(`Not saved: ${messageOf(e)}`);
    return false;
  }
}

/** Open a project's text: the current one stays when the file is refused. */
export async function applyProject(text: string, fileName: string, path?: string): Promise<boolean> {
  try {
    const r = await engine().call('openProject', { text, fileName }, 'Opening the project…');
    app.table = markRaw(r.table);
    app.analysis = markRaw(r.analysis);
    app.source = r.source;
    app.scenarios = r.scenarios;
    app.selected = r.active;
    app.closure = r.choices.closure === 'households';
    app.pathDestination = r.choices.destination;
    app.phase = 0;
    app.discountRate = r.choices.discountRate ?? null;
    app.commutingShare = r.choices.commutingShare ?? 0;
    app.tableYear = r.choices.tableYear ?? null;
    app.studyInputs = r.inputs;
    app.content = r.content;
    app.importError = null;
    app.draft = null;
    app.project = { name: fileName, ...(path ? { path } : {}) };
    app.starterOnly = false;
    app.previousSectors = []; // the project's scenarios were written for its own table
    resetHistory();
    await recomputeAll();
    markDirty(false);
    say(`Opened ${fileName}`);
    return true;
  } catch (e) {
    if (e instanceof CancelledError) return false;
    app.importError = messageOf(e);
    app.draft = null;
    app.screen = 'import';
    return false;
  }
}

function confirmDiscard(): boolean {
  return !app.dirty || window.confirm('The current project has unsaved changes. Open another and lose them?');
}

export async function openProject(): Promise<void> {
  if (!confirmDiscard()) return;
  const f = await getBridge().openFile('project');
  if (f) await applyProject(f.text, f.name, f.path);
}

export async function openRecent(ref: string): Promise<void> {
  if (!confirmDiscard()) return;
  const f = await getBridge().openRecent(ref);
  if (f) await applyProject(f.text, f.name, f.path);
}
