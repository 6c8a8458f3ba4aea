// Browser-mode recovery copies over fake-indexeddb (an in-memory implementation of the IndexedDB API, from the
// registry) and a fake Web Locks API (test/support/fake-locks.ts). Reference: the bridge contract
// (src/bridge/contract.ts: one copy per window, only copies of windows that are gone are offered); the Web Locks
// spec for "a closed page's locks are released". The same code runs against real Chromium in test/e2e/recovery.test.ts.
import 'fake-indexeddb/auto';
import { describe, it, expect, beforeEach } from 'vitest';
import { createStore, get, keys, set, type UseStore } from 'idb-keyval';
import { createRecoverySlots, TAB_PAGE_KEY, type SlotEnv } from '../../../renderer/bridge/recovery-slots.ts';
import { createBrowserBridge, STORAGE_KEYS, type BrowserEnv } from '../../../renderer/bridge/browser.ts';
import { FakeLockBrowser } from '../../support/fake-locks.ts';

let store: UseStore;
let browser: FakeLockBrowser;
let ids: number;
let dbCount = 0;

class MemoryStorage {
  map = new Map<string, string>();
  getItem(k: string) { return this.map.get(k) ?? null; }
  setItem(k: string, v: string) { this.map.set(k, v); }
  removeItem(k: string) { this.map.delete(k); }
}

beforeEach(() => {
  store = createStore(`roundwise-test-${++dbCount}`, 'copies');
  browser = new FakeLockBrowser();
  ids = 0;
});

/** One tab's page: its slots, and a way to kill it. */
function openPage(opts: { session?: MemoryStorage; locks?: boolean; store?: UseStore | null } = {}) {
  const p = browser.page();
  const env: SlotEnv = {
    store: opts.store === undefined ? store : opts.store,
    locks: opts.locks === false ? null : p.locks,
    session: (opts.session ?? new MemoryStorage()) as unknown as Storage,
    newId: () => `page-${++ids}`,
    now: () => new Date(Date.UTC(2026, 4, 1, 12, 0, ids)),
  };
  return { slots: createRecoverySlots(env), die: p.die };
}

describe('browser recovery copies', () => {
  it('never offers a copy of a tab that is still open, and Discard never deletes one', async () => {
    const a = openPage();
    await a.slots.write('work in tab A');
    const b = openPage();
    expect(await b.slots.claim()).toBeNull();
    await b.slots.discardClaimed();
    expect(await keys(store)).toEqual(['page-1']);
  });

  it('offers a closed tab\'s copy to one new tab only, and discarding it leaves live copies alone', async () => {
    const a = openPage();
    await a.slots.write('work in tab A');
    const b = openPage();
    await b.slots.write('work in tab B');
    a.die(); // tab A crashed
    const c = openPage();
    const d = openPage();
    expect((await c.slots.claim())?.text).toBe('work in tab A');
    expect(await d.slots.claim()).toBeNull(); // reserved by C; B's copy is live
    await c.slots.discardClaimed();
    expect((await keys(store)).sort()).toEqual(['page-2']);
    c.die();
    b.die();
    expect((await openPage().slots.claim())?.text).toBe('work in tab B');
  });

  it('keeps the copy as a Blob (no large string cloned on the main thread), and still reads copies kept as text', async () => {
    const a = openPage();
    await a.slots.write('work kept as a blob: é');
    const stored = await get('page-1', store);
    expect((stored as { blob?: unknown }).blob).toBeInstanceOf(Blob);
    a.die();
    const got = await openPage().slots.claim();
    expect(got).toEqual({ name: 'Recovered project', text: 'work kept as a blob: é', size: new TextEncoder().encode('work kept as a blob: é').length });
    await set('page-old', { when: '2026-04-01T10:00:00.000Z', text: 'an earlier version\'s copy' }, store);
    const older = openPage();
    await older.slots.discardClaimed();
    // page-1 is claimed by the page above; a fresh page gets the text-form copy.
    expect((await older.slots.claim())?.text).toBe('an earlier version\'s copy');
  });

  it('offers the newest copy first', async () => {
    const a = openPage();
    await a.slots.write('older');
    const b = openPage();
    await b.slots.write('newer');
    a.die();
    b.die();
    expect((await openPage().slots.claim())?.text).toBe('newer');
  });

  it('says why, when the browser refuses to store the copy', async () => {
    const full: UseStore = (mode, cb) => (mode === 'readwrite' ? Promise.reject(new DOMException('quota', 'QuotaExceededError')) : store(mode, cb));
    await expect(openPage({ store: full }).slots.write('6.9 MB of project')).rejects.toThrowError("the browser's storage for this page is full");
    const none = openPage({ store: null });
    await expect(none.slots.write('x')).rejects.toThrowError(/IndexedDB is unavailable/);
    expect(await none.slots.claim()).toBeNull();
  });

  it('without Web Locks, offers only the copy of this tab\'s previous page', async () => {
    const tab = new MemoryStorage();
    const a = openPage({ session: tab, locks: false });
    await a.slots.write('this tab, before the reload');
    const other = openPage({ locks: false });
    await other.slots.write('another tab');
    expect(tab.getItem(TAB_PAGE_KEY)).toBe('page-1');
    const reloaded = openPage({ session: tab, locks: false });
    expect((await reloaded.slots.claim())?.text).toBe('this tab, before the reload');
    expect(await openPage({ locks: false }).slots.claim()).toBeNull();
  });

  it('moves the single localStorage copy of the first versions into the store and offers it', async () => {
    const local = new MemoryStorage();
    local.setItem(STORAGE_KEYS.legacyAutosave, JSON.stringify({ when: '2026-04-01T10:00:00Z', content: '{"format":"roundwise-project"}' }));
    const p = browser.page();
    const env = {
      window: { addEventListener: () => undefined, removeEventListener: () => undefined, setTimeout: () => 0 },
      document: {}, storage: local, isMac: false, now: () => new Date(),
      recovery: { store, locks: p.locks, session: null, newId: () => `page-${++ids}`, now: () => new Date() },
    } as unknown as BrowserEnv;
    const bridge = createBrowserBridge(env);
    expect((await bridge.recoverAutosave())?.text).toBe('{"format":"roundwise-project"}');
    expect(local.getItem(STORAGE_KEYS.legacyAutosave)).toBeNull();
    await bridge.discardRecovered();
    expect(await keys(store)).toEqual([]);
  });
});
