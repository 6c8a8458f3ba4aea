/**
 * Crash recovery: while there are unsaved changes, a copy of the project is written through the bridge
 * (desktop: the user-data folder; browser: localStorage) a moment after each change; saving clears it. When the
 * app starts and finds a copy, the previous session ended with unsaved work: the window offers it back.
 * Until the user answers, nothing is written or cleared, so the copy survives a second crash too.
 */
import { reactive, watch } from 'vue';
import { getBridge } from '../bridge/index.ts';
import { app, markDirty, messageOf, say } from './app.ts';
import { applyProject, projectText } from './project.ts';

/** Quiet time after the last change before the copy is written (edits come in bursts). */
export const AUTOSAVE_DELAY_MS = 1500;

export const recovery = reactive({
  /** The copy found at start, waiting for the user's answer. */
  offer: null as { name: string; text: string } | null,
});

let timer: ReturnType<typeof setTimeout> | null = null;

async function writeCopy(): Promise<void> {
  if (recovery.offer) return;
  const bridge = getBridge();
  try {
    if (app.dirty && app.table) await bridge.autosave(await projectText());
    else if (!app.dirty) await bridge.autosave(null);
  } catch {
    // Best effort: a failed copy must not disturb the work in hand; the next change tries again.
  }
}

function schedule(): void {
  if (timer) clearTimeout(timer);
  timer = setTimeout(() => { timer = null; void writeCopy(); }, AUTOSAVE_DELAY_MS);
}

/** Look for a copy left by an earlier session, then keep one while there are unsaved changes. */
export async function startRecovery(): Promise<void> {
  try {
    const found = await getBridge().recoverAutosave();
    if (found) recovery.offer = { name: found.name, text: found.text };
  } catch {
    // An unreadable copy is no reason to stop the app from opening.
  }
  watch(() => app.scenarios, schedule, { deep: true });
  watch(() => [app.dirty, app.closure, app.table], schedule);
}

/** Reopen the recovered project; it stays marked unsaved (it is not the file it came from). */
export async function acceptRecovery(): Promise<void> {
  const offer = recovery.offer;
  if (!offer) return;
  recovery.offer = null;
  if (await applyProject(offer.text, offer.name)) {
    app.project = null;
    markDirty(true);
    say('Recovered the unsaved work of the earlier session');
  } else {
    say(`The recovery copy could not be opened: ${app.importError ?? messageOf(new Error('unknown'))}`);
  }
}

export async function discardRecovery(): Promise<void> {
  recovery.offer = null;
  await getBridge().autosave(null).catch(() => undefined);
  schedule();
}
