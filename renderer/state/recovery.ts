/**
 * Crash recovery: while there are unsaved changes, this window keeps a copy of its work through the bridge (desktop:
 * a file per window in the user-data folder; browser: an IndexedDB entry per tab) a moment after each change; saving
 * clears it. The copy is written without the checks a save makes (recovery-copy.ts), so work the app would refuse
 * to save is still kept; when it cannot be written at all, the window says so until a later write succeeds.
 * At start the window looks for a copy left by a window that is gone and offers it, with its date and table; a copy
 * offered here is reserved for this window, and other windows' live copies are never offered or touched.
 */
import { reactive, toRaw, watch } from 'vue';
import { getBridge } from '../bridge/index.ts';
import { engine, CancelledError } from '../worker/client.ts';
import { app, choices, markDirty, messageOf, resetHistory, say } from './app.ts';
import { applyProject } from './project.ts';
import { describeCopy, readRecoveryCopy, recoveryCopyBlob, type RecoveryCopy } from './recovery-copy.ts';
import type { ScenarioDraft } from '../worker/protocol.ts';

/** Quiet time after the last change before the copy is written (edits come in bursts). */
export const AUTOSAVE_DELAY_MS = 1500;

export interface RecoveryOffer {
  /** The copy, or null when it cannot be used (then `damaged` says why, and it can only be discarded). */
  copy: RecoveryCopy | null;
  damaged: string | null;
  /** One sentence: when, which table, how many scenarios. */
  summary: string;
}

export const recovery = reactive({
  /** The copy found at start, waiting for the user's answer. */
  offer: null as RecoveryOffer | null,
  /** Why the copy of the current work could not be kept; shown until a later write succeeds. */
  problem: null as string | null,
});

let timer: ReturnType<typeof setTimeout> | null = null;
/** Writes run one after another, so a slow older copy never lands after a newer one (or after a removal). */
let writes: Promise<void> = Promise.resolve();
/**
 * The project text of the table and settings as a JSON string in a Blob made by the worker, asked for again only when
 * they change (scenario edits are the usual change). The page never holds that text (20 MB at 2,000 sectors): copying
 * or encoding it on every edit froze the window for a second or more.
 */
let base: { table: unknown; choices: string; name: string; json: Blob } | null = null;

async function copyContent(): Promise<Blob> {
  const table = app.table!;
  const name = (app.project?.name ?? table.name ?? 'project').replace(/\.roundwise$/, '');
  const now = choices();
  if (!base || base.table !== toRaw(table) || base.choices !== JSON.stringify(now) || base.name !== name) {
    const json = await engine().call('recoveryBaseJson', { name, choices: now }, null);
    base = { table: toRaw(table), choices: JSON.stringify(now), name, json };
  }
  return recoveryCopyBlob({
    savedAt: new Date().toISOString(),
    tableName: table.name,
    projectName: app.project?.name ?? null,
    scenarios: JSON.parse(JSON.stringify(app.scenarios)) as ScenarioDraft[],
    selected: app.selected,
  }, base.json);
}

async function writeCopy(): Promise<void> {
  const bridge = getBridge();
  if (!app.dirty) {
    recovery.problem = null;
    await bridge.autosave(null).catch(() => undefined); // a copy left behind is only offered, never forced on anyone
    return;
  }
  if (!app.table) return;
  try {
    await bridge.autosave(await copyContent());
    recovery.problem = null;
  } catch (e) {
    if (e instanceof CancelledError) return; // the user stopped the worker; the next change tries again
    recovery.problem = `No crash-recovery copy of the unsaved work could be kept: ${messageOf(e)}. Save the project to be safe.`;
  }
}

function writeNow(): Promise<void> {
  writes = writes.then(writeCopy);
  return writes;
}

function schedule(): void {
  if (timer) clearTimeout(timer);
  timer = setTimeout(() => { timer = null; void writeNow(); }, AUTOSAVE_DELAY_MS);
}

async function lookForCopy(): Promise<void> {
  try {
    const found = await getBridge().recoverAutosave();
    if (!found) return;
    const copy = readRecoveryCopy(found.text);
    recovery.offer = 'damaged' in copy
      ? { copy: null, damaged: copy.damaged, summary: `A recovery copy was found, but it cannot be opened: ${copy.damaged}.` }
      : { copy, damaged: null, summary: describeCopy(copy) };
  } catch {
    // An unreadable copy is no reason to stop the app from opening.
  }
}

/**
 * Look for a copy left by a window that is gone, and keep one while there are unsaved changes. Changes are watched
 * from the start, and copies are written only after the look has ended (the writes queue behind it): watched only
 * after the look, an edit made in the window's first moments was never copied until the next one.
 */
export async function startRecovery(): Promise<void> {
  const looked = lookForCopy();
  writes = writes.then(() => looked);
  watch(() => app.scenarios, schedule, { deep: true });
  watch(() => [app.dirty, app.closure, app.pathDestination, app.table, app.selected], schedule);
  await looked;
}

/** Reopen the recovered work; it stays marked unsaved (it is not the file it came from). */
export async function acceptRecovery(): Promise<void> {
  const offer = recovery.offer;
  if (!offer?.copy) return;
  if (app.dirty && !window.confirm('This window has unsaved changes. Replace them with the recovered work?')) return;
  const copy = offer.copy;
  if (!(await applyProject(copy.project, copy.projectName ?? 'Recovered project'))) {
    recovery.offer = { ...offer, copy: null, damaged: app.importError, summary: `The recovery copy could not be opened: ${app.importError ?? 'unknown reason'}` };
    return;
  }
  if (copy.scenarios) {
    app.scenarios = copy.scenarios;
    app.selected = Math.min(copy.selected, Math.max(0, copy.scenarios.length - 1));
    app.starterOnly = false;
    resetHistory();
  }
  app.project = null;
  recovery.offer = null;
  markDirty(true);
  // The work is now this window's own copy; only once that is written is the offered copy let go.
  await writeNow();
  if (!recovery.problem) await getBridge().discardRecovered().catch(() => undefined);
  say('Recovered the unsaved work of the earlier session');
}

export async function discardRecovery(): Promise<void> {
  recovery.offer = null;
  await getBridge().discardRecovered().catch(() => undefined);
  await lookForCopy(); // more than one window may have been lost
}
