// Window options against Electron's security checklist (https://www.electronjs.org/docs/latest/tutorial/security,
// items 2 "Do not enable Node.js integration for remote content", 3 "Enable context isolation", 4 "Enable process
// sandboxing", 6 "Do not disable webSecurity", 8 "Do not enable allowRunningInsecureContent", 9 "Do not enable
// experimental features", 10 "Do not use enableBlinkFeatures", 11 "Do not use allowpopups"/webview).
import { describe, it, expect } from 'vitest';
import { windowOptions, webPreferences } from '../../main/window-options.ts';
import { electronConfig } from '../../electron.config.ts';

describe('BrowserWindow options', () => {
  const opts = windowOptions('/app/dist/main/preload.cjs');
  const wp = opts.webPreferences ?? {};

  it('isolates and sandboxes the renderer, without Node', () => {
    expect(wp.contextIsolation).toBe(true);
    expect(wp.sandbox).toBe(true);
    expect(wp.nodeIntegration).toBe(false);
    expect(wp.nodeIntegrationInWorker).toBe(false);
    expect(wp.nodeIntegrationInSubFrames).toBe(false);
  });

  it('keeps web security on and everything risky off', () => {
    expect(wp.webSecurity).toBe(true);
    expect(wp.allowRunningInsecureContent).toBe(false);
    expect(wp.experimentalFeatures).toBe(false);
    expect(wp.webviewTag).toBe(false);
    expect(wp.navigateOnDragDrop).toBe(false);
    expect(wp).not.toHaveProperty('enableBlinkFeatures');
    expect(wp).not.toHaveProperty('additionalArguments');
  });

  it('uses the preload it is given and no devtools unless asked', () => {
    expect(wp.preload).toBe('/app/dist/main/preload.cjs');
    expect(wp.devTools).toBe(false);
    expect(webPreferences('/p', { devTools: true }).devTools).toBe(true);
  });

  it('takes its size from electron.config.ts and shows only when ready', () => {
    expect(opts.width).toBe(electronConfig.window.width);
    expect(opts.height).toBe(electronConfig.window.height);
    expect(opts.minWidth).toBe(electronConfig.window.minWidth);
    expect(opts.minHeight).toBe(electronConfig.window.minHeight);
    expect(opts.show).toBe(false);
  });
});
