/**
 * The Electron main process: one window on the built UI (app://roundwise/), locked down per Electron's security
 * checklist, with native file dialogs, atomic saves, recent projects, crash recovery, a native menu and the
 * unsaved-changes prompt. The policies live in small pure modules (window-options, navigation, csp, ipc-guard,
 * menu, close-guard, bridge-host) that test/main checks without the Electron binary; this file only wires them up.
 */
import { app, BrowserWindow, dialog, ipcMain, Menu, protocol, session, shell, type WebContents } from 'electron';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { electronConfig } from '../electron.config.ts';
import { CHANNELS, type MenuCommand } from '../src/bridge/contract.ts';
import { createAppHandler } from './app-protocol.ts';
import { createBridgeHost, REPLACE_BUTTONS, replacePrompt, type Dialogs } from './bridge-host.ts';
import { CLOSE_PROMPT, closeAction } from './close-guard.ts';
import { guarded, type Channel } from './ipc-guard.ts';
import type { ArgsOf } from '../src/bridge/validate.ts';
import { menuTemplate } from './menu.ts';
import { APP_ENTRY_URL, APP_SCHEME, isAllowedRequest, navigationDecision } from './navigation.ts';
import { windowOptions } from './window-options.ts';

// dist/main/index.mjs → dist/main/preload.cjs and dist/renderer/
const here = dirname(fileURLToPath(import.meta.url));
const preloadPath = join(here, 'preload.cjs');
const rendererRoot = join(here, '..', 'renderer');
const devTools = !app.isPackaged && process.env.ROUNDWISE_DEVTOOLS === '1';

// Must happen before 'ready': a standard, secure scheme gets a real origin, fetch and module workers.
protocol.registerSchemesAsPrivileged([{ scheme: APP_SCHEME, privileges: { standard: true, secure: true, supportFetchAPI: true } }]);
app.enableSandbox();

let win: BrowserWindow | null = null;

function sendMenu(cmd: MenuCommand): void {
  win?.webContents.send(CHANNELS.menu, cmd);
}

/** Navigation, redirects, new windows and <webview> are refused everywhere; vetted https links go to the system browser. */
function lockDown(contents: WebContents): void {
  const onNavigate = (event: { preventDefault(): void }, url: string) => {
    const decision = navigationDecision(url, { newWindow: false });
    if (decision === 'stay') return;
    event.preventDefault();
    if (decision === 'external') void shell.openExternal(url);
  };
  contents.on('will-navigate', onNavigate);
  contents.on('will-redirect', onNavigate);
  contents.on('will-attach-webview', (event) => event.preventDefault());
  contents.setWindowOpenHandler(({ url }) => {
    if (navigationDecision(url, { newWindow: true }) === 'external') void shell.openExternal(url);
    return { action: 'deny' };
  });
}

function hardenSession(): void {
  const ses = session.defaultSession;
  ses.setPermissionRequestHandler((_wc, _permission, callback) => callback(false));
  ses.setPermissionCheckHandler(() => false);
  ses.webRequest.onBeforeRequest((details, callback) => callback({ cancel: !isAllowedRequest(details.url) }));
  protocol.handle(APP_SCHEME, createAppHandler(rendererRoot));
}

function registerIpc(): ReturnType<typeof createBridgeHost> {
  const dialogs: Dialogs = {
    async openPath(title, filters) {
      const opts = { title, filters, properties: ['openFile' as const] };
      const r = win ? await dialog.showOpenDialog(win, opts) : await dialog.showOpenDialog(opts);
      return r.canceled ? null : (r.filePaths[0] ?? null);
    },
    async savePath(title, defaultPath, filters) {
      const opts = { title, defaultPath, filters, properties: ['createDirectory' as const, 'showOverwriteConfirmation' as const] };
      const r = win ? await dialog.showSaveDialog(win, opts) : await dialog.showSaveDialog(opts);
      return r.canceled || !r.filePath ? null : r.filePath;
    },
    async confirmReplace(path) {
      const opts = { type: 'warning' as const, noLink: true, ...replacePrompt(path), buttons: [...REPLACE_BUTTONS], defaultId: 1, cancelId: 1 };
      const r = win ? await dialog.showMessageBox(win, opts) : await dialog.showMessageBox(opts);
      return r.response === 0;
    },
  };
  const host = createBridgeHost({ dialogs, userDataDir: app.getPath('userData'), documentsDir: app.getPath('documents') });
  const handle = <K extends Channel>(channel: K, fn: Parameters<typeof guarded<K, unknown>>[1]) => ipcMain.handle(CHANNELS[channel], guarded(channel, fn));
  /** A handler that also needs to know which window is asking (dirty flags and recovery copies are per window). */
  const handleForWindow = <K extends Channel>(channel: K, fn: (windowId: number, ...args: ArgsOf<K>) => unknown) =>
    ipcMain.handle(CHANNELS[channel], (event, ...args: unknown[]) => guarded(channel, (...a: ArgsOf<K>) => fn(event.sender.id, ...a))(event, ...args));
  handle('openFile', (kind) => host.openFile(kind));
  handle('saveProject', (name, content, path) => host.saveProject(name, content, path));
  handle('exportFile', (name, kind, content) => host.exportFile(name, kind, content));
  handle('recentProjects', () => host.recentProjects());
  handle('openRecent', (ref) => host.openRecent(ref));
  handleForWindow('setDirty', (id, dirty) => host.setDirty(id, dirty));
  handleForWindow('autosave', (id, content) => host.autosave(id, content));
  handleForWindow('recoverAutosave', (id) => host.recoverAutosave(id));
  handleForWindow('discardRecovered', (id) => host.discardRecovered(id));
  return host;
}

function createWindow(host: ReturnType<typeof createBridgeHost>): void {
  const w = new BrowserWindow(windowOptions(preloadPath, { devTools }));
  const id = w.webContents.id;
  win = w;
  w.once('ready-to-show', () => w.show());
  let closingOnPurpose = false;
  w.on('close', (event) => {
    if (closingOnPurpose) return;
    if (closeAction(host.isDirty(id)) === 'close') {
      host.closedCleanly(id);
      return;
    }
    event.preventDefault();
    const choice = dialog.showMessageBoxSync(w, { type: 'question', noLink: true, ...CLOSE_PROMPT, buttons: [...CLOSE_PROMPT.buttons] });
    const action = closeAction(true, choice);
    if (action === 'save-first') sendMenu('save-project');
    if (action === 'discard-and-close') {
      closingOnPurpose = true;
      host.closedCleanly(id);
      w.close();
    }
  });
  w.on('closed', () => {
    if (win === w) win = null;
  });
  // A reload (after a renderer crash) starts a new page: the old page's recovery copy is then offered to it.
  w.webContents.on('did-navigate', () => host.pageLoaded(id));
  w.webContents.on('render-process-gone', (_e, details) => {
    if (details.reason === 'clean-exit') return;
    // The recovery copy is still on disk, so reloading lets the UI offer it.
    const choice = dialog.showMessageBoxSync(w, { type: 'error', message: 'The Roundwise window stopped unexpectedly.', detail: 'Reload it? Unsaved work can be recovered.', buttons: ['Reload', 'Quit'], defaultId: 0, cancelId: 1 });
    if (choice === 0) w.reload();
    else app.quit();
  });
  void w.loadURL(APP_ENTRY_URL);
}

if (!app.requestSingleInstanceLock()) {
  app.quit();
} else {
  app.setName(electronConfig.productName);
  app.on('second-instance', () => {
    if (win) {
      if (win.isMinimized()) win.restore();
      win.focus();
    }
  });
  app.on('web-contents-created', (_event, contents) => lockDown(contents));
  app.on('window-all-closed', () => {
    if (process.platform !== 'darwin') app.quit();
  });
  void app.whenReady().then(() => {
    hardenSession();
    const host = registerIpc();
    const isMac = process.platform === 'darwin';
    Menu.setApplicationMenu(Menu.buildFromTemplate(menuTemplate(sendMenu, { isMac, appName: electronConfig.productName, devTools })));
    createWindow(host);
    app.on('activate', () => {
      if (BrowserWindow.getAllWindows().length === 0) createWindow(host);
    });
  });
}
