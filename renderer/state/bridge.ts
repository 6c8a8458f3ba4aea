/**
 * State of the Scenarios screen's classification bridge: the bridge file (`code,sector[,share]`, or the bundled
 * invented sample), what it covers of the table in use, and the last refusal or reading. Shock files read through it
 * become a new scenario (undoable, as any edit); spending-mix files read through it join the study's mixes. The
 * bridge itself is not part of the study: what it made (lines and mixes by sector) is, as with the CLI's --bridge.
 */
import { reactive } from 'vue';
import { BRIDGE_SAMPLE_CSV, BRIDGE_SAMPLE_FILE_NAME, type BridgeSummary } from '../../src/study/index.ts';
import { engine, CancelledError } from '../worker/client.ts';
import type { RegionalFile } from '../worker/regional.ts';
import { app, editScenarios, editStudyContent, messageOf, say, uniqueScenarioName } from './app.ts';

export const SAMPLE_BRIDGE: RegionalFile = { text: BRIDGE_SAMPLE_CSV, fileName: BRIDGE_SAMPLE_FILE_NAME };

export const bridge = reactive({
  file: null as RegionalFile | null,
  bundled: false,
  summary: null as BridgeSummary | null,
  /** Located one-line refusal of the bridge or of the last file read through it. */
  error: null as string | null,
  /** What the last file read through the bridge became, in words. */
  done: null as string | null,
});

/** Use a bridge file (null: none); read against the table in use at once, so a bad row is shown before any use. */
export async function setBridgeFile(file: RegionalFile | null, bundled = false): Promise<void> {
  bridge.file = file;
  bridge.bundled = bundled;
  bridge.done = null;
  await checkBridge();
}

/** Read the bridge again (the table in use may have changed: its sectors are what the bridge must name). */
export async function checkBridge(): Promise<void> {
  bridge.summary = null;
  bridge.error = null;
  const file = bridge.file;
  if (!file || !app.table) return;
  try {
    const s = await engine().call('checkBridge', { bridge: file }, 'Reading the bridge…');
    if (bridge.file === file) bridge.summary = s;
  } catch (e) {
    if (!(e instanceof CancelledError) && bridge.file === file) bridge.error = messageOf(e);
  }
}

/**
 * A shock file (the CLI's --shock columns) as a new scenario, undoable as any edit; its sector column read through
 * the bridge `via` when given (codes), as sector labels otherwise. Says in words what it became; refusals are thrown.
 */
export async function addShockFileScenario(file: RegionalFile, via: RegionalFile | null): Promise<string> {
  const s = await engine().call('readShockFile', { text: file.text, fileName: file.fileName, bridge: via }, 'Reading the shock file…');
  const lines = s.phases.reduce((a, p) => a + p.lines.length, 0);
  s.name = uniqueScenarioName(s.name);
  editScenarios((list) => { list.push(s); }, app.scenarios.length);
  app.phase = 0;
  say(`Added scenario ${s.name}`);
  return `${file.fileName} → scenario “${s.name}”: ${lines} line${lines === 1 ? '' : 's'} by sector in ${s.phases.length} phase${s.phases.length === 1 ? '' : 's'}`;
}

/** A shock file whose sector column holds codes: translated through the bridge, added as a new scenario. */
export async function readShockByCodes(file: RegionalFile): Promise<boolean> {
  if (!bridge.file) return false;
  bridge.error = null;
  bridge.done = null;
  try {
    bridge.done = await addShockFileScenario(file, bridge.file);
    return true;
  } catch (e) {
    if (!(e instanceof CancelledError)) bridge.error = messageOf(e);
    return false;
  }
}

/** A spending-mix file whose sector column holds codes: translated through the bridge, joined to the study's mixes. */
export async function readMixByCodes(file: RegionalFile): Promise<boolean> {
  if (!bridge.file) return false;
  bridge.error = null;
  bridge.done = null;
  try {
    const via = bridge.file;
    await editStudyContent(() => engine().call('setStudyInput', { kind: 'mix', text: file.text, fileName: file.fileName, bridge: via }, 'Reading the spending mixes…'));
    bridge.done = `${file.fileName} → ${app.studyInputs.mix ?? 'no mixes'}`;
    return true;
  } catch (e) {
    if (!(e instanceof CancelledError)) bridge.error = messageOf(e);
    return false;
  }
}
