// The browser-mode bridge over a scripted stand-in for the page (file input, <a download>, localStorage, key events).
// Reference: the bridge contract (src/bridge/contract.ts); HTML Standard for the input `cancel` event and
// `beforeunload` (preventDefault asks the user before leaving). The same bridge runs in real Chromium in test/e2e.
import { describe, it, expect, vi, beforeEach } from 'vitest';
import { createBrowserBridge, openedFileFromFile, STORAGE_KEYS, type BrowserEnv } from '../../../renderer/bridge/browser.ts';
import { MAX_OPEN_BYTES } from '../../../src/bridge/files.ts';
import { MAX_RECENT } from '../../../src/bridge/validate.ts';
import type { MenuCommand, RoundwiseBridge } from '../../../src/bridge/contract.ts';

type Listener = (ev: any) => void; // eslint-disable-line @typescript-eslint/no-explicit-any

class FakeElement {
  listeners = new Map<string, Listener[]>();
  dataset: Record<string, string> = {};
  style: Record<string, string> = {};
  files: File[] | null = null;
  type = '';
  accept = '';
  href = '';
  download = '';
  rel = '';
  removed = false;
  constructor(public tagName: string, private page: FakePage) {}
  addEventListener(t: string, fn: Listener) { this.listeners.set(t, [...(this.listeners.get(t) ?? []), fn]); }
  fire(t: string, ev: unknown = {}) { for (const fn of this.listeners.get(t) ?? []) fn(ev); }
  click() { this.page.clicked.push(this); }
  remove() { this.removed = true; }
}

class FakePage {
  clicked: FakeElement[] = [];
  winListeners = new Map<string, Listener[]>();
  store = new Map<string, string>();
  blobs: Blob[] = [];
  activeElement: unknown = null;
  quotaFull = false;
  env(): BrowserEnv {
    const page: FakePage = this; // eslint-disable-line @typescript-eslint/no-this-alias -- closures below outlive `this` binding
    const storage = {
      getItem: (k: string) => page.store.get(k) ?? null,
      setItem: (k: string, v: string) => { if (page.quotaFull) throw new Error('QuotaExceededError'); page.store.set(k, v); },
      removeItem: (k: string) => { page.store.delete(k); },
    };
    const doc = {
      createElement: (tag: string) => new FakeElement(tag.toUpperCase(), page),
      body: { append: () => undefined },
      get activeElement() { return page.activeElement; },
    };
    const win = {
      addEventListener: (t: string, fn: Listener) => { page.winListeners.set(t, [...(page.winListeners.get(t) ?? []), fn]); },
      removeEventListener: (t: string, fn: Listener) => { page.winListeners.set(t, (page.winListeners.get(t) ?? []).filter((f) => f !== fn)); },
      setTimeout: () => 0,
    };
    const now = () => new Date('2026-05-01T12:00:00Z');
    // Recovery copies have their own tests (recovery-slots.test.ts); here the store is absent.
    const recovery = { store: null, locks: null, session: null, newId: () => 'page', now };
    return { window: win as unknown as Window, document: doc as unknown as Document, storage: storage as unknown as Storage, isMac: false, now, recovery };
  }
  key(key: string, mods: { ctrlKey?: boolean; shiftKey?: boolean; metaKey?: boolean } = {}) {
    const ev = { key, ctrlKey: false, metaKey: false, shiftKey: false, altKey: false, ...mods, preventDefault: vi.fn(), stopPropagation: vi.fn() };
    for (const fn of this.winListeners.get('keydown') ?? []) fn(ev);
    const handled = ev.preventDefault.mock.calls.length > 0;
    expect(ev.stopPropagation.mock.calls.length > 0).toBe(handled); // a handled chord reaches no other key handler
    return handled;
  }
  lastInput(): FakeElement {
    const el = this.clicked.at(-1);
    if (!el || el.tagName !== 'INPUT') throw new Error('no file input was clicked');
    return el;
  }
}

let page: FakePage;
let bridge: RoundwiseBridge;
beforeEach(() => {
  page = new FakePage();
  vi.spyOn(URL, 'createObjectURL').mockImplementation((b) => { page.blobs.push(b as Blob); return 'blob:fake'; });
  bridge = createBrowserBridge(page.env());
});

describe('openFile', () => {
  it('reads the chosen file, without its byte-order mark', async () => {
    const p = bridge.openFile('table');
    const input = page.lastInput();
    expect(input.type).toBe('file');
    expect(input.accept).toBe('.csv,.tsv,.txt');
    input.files = [new File(['\uFEFFsector,Farm\n'], 'county.csv')];
    input.fire('change');
    expect(await p).toEqual({ name: 'county.csv', text: 'sector,Farm\n', size: 15 });
    expect(input.removed).toBe(true);
  });
  it('returns null on cancel, and when a second Open replaces the first', async () => {
    const first = bridge.openFile('project');
    const second = bridge.openFile('project');
    expect(await first).toBeNull();
    page.lastInput().fire('cancel');
    expect(await second).toBeNull();
  });
  it('refuses a file over the limit before reading it', async () => {
    const huge = { name: 'huge.csv', size: MAX_OPEN_BYTES + 1, text: vi.fn() } as unknown as File;
    await expect(openedFileFromFile(huge)).rejects.toMatchObject({ code: 'file-too-large', location: { file: 'huge.csv' } });
    expect(huge.text).not.toHaveBeenCalled();
  });
});

describe('saving, exporting and recent projects', () => {
  it('downloads a project under a safe name and lists it as recent', async () => {
    expect(await bridge.saveProject('Plan: mill closure', '{"v":1}')).toEqual({ name: 'Plan- mill closure.roundwise' });
    const a = page.clicked.at(-1)!;
    expect(a.tagName).toBe('A');
    expect(a.download).toBe('Plan- mill closure.roundwise');
    expect(await page.blobs.at(-1)!.text()).toBe('{"v":1}');
    const recent = await bridge.recentProjects();
    expect(recent).toEqual([{ name: 'Plan- mill closure.roundwise', ref: `${STORAGE_KEYS.projectPrefix}Plan- mill closure.roundwise`, when: '2026-05-01T12:00:00.000Z' }]);
    expect(await bridge.openRecent(recent[0]!.ref)).toEqual({ name: 'Plan- mill closure.roundwise', text: '{"v":1}', size: 7 });
    expect(await bridge.openRecent('roundwise:project:never-saved')).toBeNull();
  });
  it('keeps a project name that already has a project extension', async () => {
    expect(await bridge.saveProject('County.roundwise.json', '{}')).toEqual({ name: 'County.roundwise.json' });
  });
  it('caps the recent list and drops the stored copies that fall off it', async () => {
    for (let i = 0; i < MAX_RECENT + 2; i++) await bridge.saveProject(`p${i}`, `{"i":${i}}`);
    expect(await bridge.recentProjects()).toHaveLength(MAX_RECENT);
    expect(page.store.has(`${STORAGE_KEYS.projectPrefix}p0.roundwise`)).toBe(false);
    expect(page.store.has(`${STORAGE_KEYS.projectPrefix}p${MAX_RECENT + 1}.roundwise`)).toBe(true);
  });
  it('still downloads when the local store is full', async () => {
    page.quotaFull = true;
    expect(await bridge.saveProject('big', '{}')).toEqual({ name: 'big.roundwise' });
    expect(await bridge.recentProjects()).toEqual([]);
  });
  it('exports PNG content as decoded bytes', async () => {
    const bytes = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];
    await bridge.exportFile('chart', 'png', `data:image/png;base64,${btoa(String.fromCharCode(...bytes))}`);
    const blob = page.blobs.at(-1)!;
    expect(blob.type).toBe('image/png');
    expect([...new Uint8Array(await blob.arrayBuffer())]).toEqual(bytes);
    expect(page.clicked.at(-1)!.download).toBe('chart.png');
  });
});

describe('unsaved changes and recovery', () => {
  it('asks before leaving only while dirty', () => {
    const leave = () => { const ev = { preventDefault: vi.fn(), returnValue: undefined as unknown }; for (const fn of page.winListeners.get('beforeunload') ?? []) fn(ev); return ev.preventDefault.mock.calls.length > 0; };
    expect(leave()).toBe(false);
    bridge.setDirty(true);
    expect(leave()).toBe(true);
    bridge.setDirty(false);
    expect(leave()).toBe(false);
  });
  it('keeps no recovery copy in localStorage, and says so when it has nowhere to keep one', async () => {
    await expect(bridge.autosave('{"unsaved":true}')).rejects.toThrowError(/IndexedDB is unavailable/);
    expect([...page.store.keys()]).toEqual([]);
    page.store.set(STORAGE_KEYS.legacyAutosave, '{broken');
    expect(await bridge.recoverAutosave()).toBeNull();
  });
});

describe('menu shortcuts', () => {
  it('turns the shared shortcuts into menu commands while subscribed', () => {
    const got: MenuCommand[] = [];
    const off = bridge.onMenu((c) => got.push(c));
    expect(page.key('o', { ctrlKey: true })).toBe(true);
    expect(page.key('S', { ctrlKey: true, shiftKey: true })).toBe(true);
    expect(page.key('y', { ctrlKey: true })).toBe(true);
    expect(page.key('x', { ctrlKey: true })).toBe(false);
    page.activeElement = { tagName: 'INPUT', type: 'text' };
    expect(page.key('z', { ctrlKey: true })).toBe(false); // the field's own undo
    expect(page.key('s', { ctrlKey: true })).toBe(true);
    off();
    expect(page.key('o', { ctrlKey: true })).toBe(false);
    expect(got).toEqual(['open-table', 'save-project-as', 'redo', 'save-project']);
  });
});
