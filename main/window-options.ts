/**
 * The BrowserWindow options, built from electron.config.ts and Electron's security checklist
 * (https://www.electronjs.org/docs/latest/tutorial/security): isolated, sandboxed renderer without Node, web
 * security on, no insecure content, no <webview>, no experimental or Blink features, no drag-and-drop navigation.
 * Pure (types only from electron) so test/main asserts every setting without the Electron binary.
 */
import type { BrowserWindowConstructorOptions, WebPreferences } from 'electron';
import { electronConfig } from '../electron.config.ts';

export function webPreferences(preloadPath: string, opts: { devTools: boolean }): WebPreferences {
  return {
    preload: preloadPath,
    contextIsolation: true,
    sandbox: true,
    nodeIntegration: false,
    nodeIntegrationInWorker: false,
    nodeIntegrationInSubFrames: false,
    webSecurity: true,
    allowRunningInsecureContent: false,
    experimentalFeatures: false,
    webviewTag: false,
    navigateOnDragDrop: false,
    safeDialogs: true,
    spellcheck: false,
    devTools: opts.devTools,
  };
}

export function windowOptions(preloadPath: string, opts: { devTools: boolean } = { devTools: false }): BrowserWindowConstructorOptions {
  const w = electronConfig.window;
  return {
    width: w.width,
    height: w.height,
    minWidth: w.minWidth,
    minHeight: w.minHeight,
    title: w.title,
    backgroundColor: w.backgroundColor,
    // Shown on 'ready-to-show', so the user never sees an empty white frame.
    show: false,
    autoHideMenuBar: false,
    webPreferences: webPreferences(preloadPath, opts),
  };
}
