// The main process wiring, against a scripted stand-in for the `electron` module (no binary needed): every policy
// of test/main's pure modules must actually be applied. Reference: Electron security checklist
// (https://www.electronjs.org/docs/latest/tutorial/security), items 3–5, 7, 12–15, 17, 18.
import { describe, it, expect, vi, beforeAll, afterAll } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { CHANNELS } from '../../src/bridge/contract.ts';
import { APP_ENTRY_URL } from '../../main/navigation.ts';
import { windowOptions } from '../../main/window-options.ts';

type Fn = (...args: any[]) => any; // eslint-disable-line @typescript-eslint/no-explicit-any

const fake = vi.hoisted(() => {
  const userRoot = `/tmp/roundwise-index-test-${process.pid}-${Date.now()}`;
  const on = () => {
    const handlers = new Map<string, Fn[]>();
    return {
      handlers,
      on: (ev: string, fn: Fn) => { handlers.set(ev, [...(handlers.get(ev) ?? []), fn]); },
      emit: (ev: string, ...args: unknown[]) => (handlers.get(ev) ?? []).map((fn) => fn(...args)),
    };
  };
  const appEvents = on();
  const windows: FakeWindow[] = [];
  class FakeWindow {
    events = on();
    contents = { ...on(), id: windows.length + 1, send: vi.fn(), setWindowOpenHandler: vi.fn(), once: vi.fn() };
    webContents = this.contents;
    loadURL = vi.fn(async () => undefined);
    close = vi.fn(() => this.events.emit('close', { preventDefault: vi.fn() }));
    once = vi.fn();
    show = vi.fn();
    reload = vi.fn();
    constructor(public options: unknown) {
      this.on = this.events.on;
      windows.push(this);
    }
    on: Fn;
    static getAllWindows = () => windows;
  }
  const ipcHandlers = new Map<string, Fn>();
  const ses = {
    setPermissionRequestHandler: vi.fn(),
    setPermissionCheckHandler: vi.fn(),
    webRequest: { onBeforeRequest: vi.fn() },
  };
  let ready: () => void = () => undefined;
  const readyPromise = new Promise<void>((r) => { ready = r; });
  const electron = {
    app: {
      isPackaged: false,
      enableSandbox: vi.fn(),
      requestSingleInstanceLock: vi.fn(() => true),
      setName: vi.fn(),
      on: appEvents.on,
      whenReady: () => readyPromise,
      getPath: vi.fn((name: string) => `${userRoot}/${name}`),
      quit: vi.fn(),
    },
    BrowserWindow: FakeWindow,
    dialog: { showMessageBoxSync: vi.fn(() => 2), showMessageBox: vi.fn(async () => ({ response: 1 })), showOpenDialog: vi.fn(), showSaveDialog: vi.fn() },
    ipcMain: { handle: vi.fn((ch: string, fn: Fn) => { ipcHandlers.set(ch, fn); }) },
    Menu: { buildFromTemplate: vi.fn((t: unknown) => t), setApplicationMenu: vi.fn() },
    protocol: { registerSchemesAsPrivileged: vi.fn(), handle: vi.fn() },
    session: { defaultSession: ses },
    shell: { openExternal: vi.fn(async () => undefined) },
  };
  return { electron, appEvents, windows, ipcHandlers, ses, userRoot, ready: () => ready() };
});
vi.mock('electron', () => fake.electron);

beforeAll(async () => {
  vi.spyOn(console, 'warn').mockImplementation(() => undefined); // refused-IPC log lines, asserted in ipc-guard.test.ts
  await import('../../main/index.ts');
  fake.ready();
  await new Promise((r) => setTimeout(r, 0));
});

afterAll(() => rmSync(fake.userRoot, { recursive: true, force: true }));

const e = fake.electron;

describe('main process', () => {
  it('registers the app scheme as standard and secure, and enforces the sandbox everywhere', () => {
    expect(e.protocol.registerSchemesAsPrivileged).toHaveBeenCalledWith([expect.objectContaining({ scheme: 'app', privileges: expect.objectContaining({ standard: true, secure: true }) })]);
    expect(e.app.enableSandbox).toHaveBeenCalled();
    expect(e.protocol.handle).toHaveBeenCalledWith('app', expect.any(Function));
  });

  it('opens one window with the checked options on the app origin', () => {
    expect(fake.windows).toHaveLength(1);
    const w = fake.windows[0]!;
    expect(w.options).toEqual(windowOptions(expect.stringMatching(/preload\.cjs$/) as unknown as string, { devTools: false }));
    expect(w.loadURL).toHaveBeenCalledWith(APP_ENTRY_URL);
  });

  it('denies every permission request and cancels network requests', () => {
    const cb = vi.fn();
    const [[requestHandler]] = fake.ses.setPermissionRequestHandler.mock.calls as unknown as [[Fn]];
    requestHandler({}, 'media', cb);
    expect(cb).toHaveBeenCalledWith(false);
    const [[check]] = fake.ses.setPermissionCheckHandler.mock.calls as unknown as [[Fn]];
    expect(check({}, 'notifications')).toBe(false);
    const [[before]] = fake.ses.webRequest.onBeforeRequest.mock.calls as unknown as [[Fn]];
    const decide = (url: string) => { let r: unknown; before({ url }, (x: unknown) => { r = x; }); return r; };
    expect(decide('https://example.com/track.js')).toEqual({ cancel: true });
    expect(decide('app://roundwise/assets/a.js')).toEqual({ cancel: false });
  });

  it('blocks navigation, redirects, new windows and webviews in every web contents', () => {
    const contents = { handlers: new Map<string, Fn>(), on(ev: string, fn: Fn) { this.handlers.set(ev, fn); }, setWindowOpenHandler: vi.fn() };
    fake.appEvents.emit('web-contents-created', {}, contents);
    const nav = (ev: string, url: string) => { const event = { preventDefault: vi.fn() }; contents.handlers.get(ev)?.(event, url); return event.preventDefault.mock.calls.length > 0; };
    expect(nav('will-navigate', 'https://evil.example/')).toBe(true);
    expect(nav('will-navigate', 'file:///etc/passwd')).toBe(true);
    expect(nav('will-redirect', 'http://127.0.0.1/')).toBe(true);
    expect(nav('will-navigate', 'app://roundwise/index.html')).toBe(false);
    expect(nav('will-attach-webview', 'app://roundwise/index.html')).toBe(true);
    expect(e.shell.openExternal).not.toHaveBeenCalled();
    expect(nav('will-navigate', 'https://doi.org/10.1017/x')).toBe(true);
    expect(e.shell.openExternal).toHaveBeenCalledWith('https://doi.org/10.1017/x');
    const [[openHandler]] = contents.setWindowOpenHandler.mock.calls as unknown as [[Fn]];
    expect(openHandler({ url: 'https://evil.example/' })).toEqual({ action: 'deny' });
    expect(openHandler({ url: 'app://roundwise/index.html' })).toEqual({ action: 'deny' });
    expect(openHandler({ url: 'https://doi.org/10.1/y' })).toEqual({ action: 'deny' });
    expect(e.shell.openExternal).toHaveBeenLastCalledWith('https://doi.org/10.1/y');
  });

  it('handles every bridge channel, and each handler checks its sender', async () => {
    const channels = Object.entries(CHANNELS).filter(([k]) => k !== 'menu').map(([, v]) => v);
    expect([...fake.ipcHandlers.keys()].sort()).toEqual([...channels].sort());
    for (const ch of channels) {
      const r = await fake.ipcHandlers.get(ch)!({ senderFrame: { url: 'https://evil.example/', parent: null } }, 'table');
      expect(r).toMatchObject({ ok: false, error: { code: 'ipc-refused' } });
    }
  });

  it('asks before closing with unsaved changes', async () => {
    const w = fake.windows[0]!;
    const own = { senderFrame: { url: APP_ENTRY_URL, parent: null }, sender: { id: w.contents.id } };
    const other = { ...own, sender: { id: 99 } };
    expect(await fake.ipcHandlers.get(CHANNELS.setDirty)!(other, true)).toEqual({ ok: true, value: undefined });
    const clean = { preventDefault: vi.fn() };
    w.events.emit('close', clean);
    expect(clean.preventDefault).not.toHaveBeenCalled(); // another window's unsaved changes are not this one's
    await fake.ipcHandlers.get(CHANNELS.setDirty)!(other, false);
    const close = () => { const ev = { preventDefault: vi.fn() }; w.events.emit('close', ev); return ev.preventDefault.mock.calls.length > 0; };
    expect(await fake.ipcHandlers.get(CHANNELS.setDirty)!(own, true)).toEqual({ ok: true, value: undefined });
    e.dialog.showMessageBoxSync.mockReturnValueOnce(2); // Cancel
    expect(close()).toBe(true);
    e.dialog.showMessageBoxSync.mockReturnValueOnce(0); // Save…
    expect(close()).toBe(true);
    expect(w.contents.send).toHaveBeenLastCalledWith(CHANNELS.menu, 'save-project');
    e.dialog.showMessageBoxSync.mockReturnValueOnce(1); // Close without saving
    expect(close()).toBe(true);
    expect(w.close).toHaveBeenCalledTimes(1);
    await fake.ipcHandlers.get(CHANNELS.setDirty)!(own, false);
  });

  it('keeps recovery copies per window, and offers a reloaded page its previous page\'s copy', async () => {
    const w = fake.windows[0]!;
    const own = { senderFrame: { url: APP_ENTRY_URL, parent: null }, sender: { id: w.contents.id } };
    const other = { ...own, sender: { id: 42 } };
    const call = (ev: unknown, ch: string, ...args: unknown[]) => fake.ipcHandlers.get(ch)!(ev, ...args);
    expect(await call(own, CHANNELS.autosave, '{"copy":"of window 1"}')).toEqual({ ok: true, value: undefined });
    expect(await call(other, CHANNELS.recoverAutosave)).toEqual({ ok: true, value: null }); // a live copy
    w.contents.emit('did-navigate'); // the renderer crashed and the window reloaded
    expect(await call(own, CHANNELS.recoverAutosave)).toMatchObject({ ok: true, value: { text: '{"copy":"of window 1"}' } });
    expect(await call(own, CHANNELS.discardRecovered)).toEqual({ ok: true, value: undefined });
    expect(await call(own, CHANNELS.recoverAutosave)).toEqual({ ok: true, value: null });
  });

  it('asks with a native question before an added extension replaces a file', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'roundwise-index-'));
    try {
      const own = { senderFrame: { url: APP_ENTRY_URL, parent: null } };
      writeFileSync(join(dir, 'county.csv'), 'keep me');
      e.dialog.showSaveDialog.mockResolvedValueOnce({ canceled: false, filePath: join(dir, 'county') }).mockResolvedValueOnce({ canceled: true });
      e.dialog.showMessageBox.mockResolvedValueOnce({ response: 1 }); // Cancel
      expect(await fake.ipcHandlers.get(CHANNELS.exportFile)!(own, 'report', 'csv', 'a,b\n')).toEqual({ ok: true, value: null });
      const [, opts] = e.dialog.showMessageBox.mock.calls.at(-1) as unknown as [unknown, { message: string; buttons: string[] }];
      expect(opts.message).toBe('"county.csv" already exists. Replace it?');
      expect(opts.buttons).toEqual(['Replace', 'Cancel']);
      expect(readFileSync(join(dir, 'county.csv'), 'utf8')).toBe('keep me');
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('installs a native menu that sends commands to the window', () => {
    expect(e.Menu.setApplicationMenu).toHaveBeenCalledTimes(1);
  });
});
