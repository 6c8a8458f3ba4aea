/**
 * The preload script (sandboxed, context-isolated): exposes exactly one object, `window.roundwise`, implementing the
 * bridge contract over ipcRenderer.invoke. No Electron or Node object reaches the page; menu commands from main are
 * checked against the known list before the UI hears them. Bundled to CommonJS (sandboxed preloads cannot load ESM
 * or anything but 'electron'), see main/build.ts.
 */
import { contextBridge, ipcRenderer } from 'electron';
import { CHANNELS, type MenuCommand, type RoundwiseBridge } from '../src/bridge/contract.ts';
import { isMenuCommand, unwrapIpcResult } from '../src/bridge/ipc.ts';
import { isTextEditing } from '../src/bridge/shortcuts.ts';
import { InputError, formatLocated } from '../src/diagnostics/index.ts';

/**
 * contextBridge copies an Error's message only (not code or location), so a refusal crosses as an Error whose
 * message is already the located line: `formatLocated(err)` in the UI gives the same text in both modes.
 */
async function call<T>(channel: string, ...args: unknown[]): Promise<T> {
  const reply: unknown = await ipcRenderer.invoke(channel, ...args);
  try {
    return unwrapIpcResult<T>(reply);
  } catch (err) {
    throw new Error(err instanceof InputError ? formatLocated(err) : 'the desktop shell refused the request');
  }
}

const handlers = new Set<(cmd: MenuCommand) => void>();

ipcRenderer.on(CHANNELS.menu, (_event, cmd: unknown) => {
  if (!isMenuCommand(cmd)) return;
  // Undo/redo while typing in a field belong to the field, as in any desktop app.
  if ((cmd === 'undo' || cmd === 'redo') && isTextEditing(document.activeElement as HTMLInputElement | null)) {
    document.execCommand(cmd);
    return;
  }
  for (const h of [...handlers]) h(cmd);
});

const bridge: RoundwiseBridge = {
  mode: 'desktop',
  openFile: (kind) => call(CHANNELS.openFile, kind),
  saveProject: (name, content, path) => (path === undefined ? call(CHANNELS.saveProject, name, content) : call(CHANNELS.saveProject, name, content, path)),
  exportFile: (name, kind, content) => call(CHANNELS.exportFile, name, kind, content),
  recentProjects: () => call(CHANNELS.recentProjects),
  openRecent: (ref) => call(CHANNELS.openRecent, ref),
  setDirty: (dirty) => {
    void call(CHANNELS.setDirty, dirty === true).catch(() => undefined);
  },
  onMenu: (handler) => {
    if (typeof handler !== 'function') return () => undefined;
    handlers.add(handler);
    return () => {
      handlers.delete(handler);
    };
  },
  autosave: async (content) => call(CHANNELS.autosave, content !== null && typeof content === 'object' ? await content.text() : content),
  recoverAutosave: () => call(CHANNELS.recoverAutosave),
  discardRecovered: () => call(CHANNELS.discardRecovered),
};

contextBridge.exposeInMainWorld('roundwise', bridge);
