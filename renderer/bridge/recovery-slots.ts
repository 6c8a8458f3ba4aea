/**
 * Crash-recovery copies in browser mode: one IndexedDB entry per page load (IndexedDB, not localStorage, whose
 * quota of about 5 MB is smaller than a large project). Each page holds a Web Lock named after its own entry for
 * as long as it lives (https://w3c.github.io/web-locks/); an entry whose lock is free belongs to a page that is gone
 * (closed, crashed, reloaded) and may be offered. The page offering it takes its lock until the user answers, so
 * two tabs never offer the same copy, and Discard in one tab never touches another tab's live copy.
 * Without Web Locks (a page not served from a secure context) only this tab's previous page's copy is offered,
 * known from sessionStorage.
 */
import { InputError } from '../../src/study/index.ts';
import { del, entries, get, set, type UseStore } from 'idb-keyval';
import type { OpenedFile } from '../../src/bridge/contract.ts';

/** sessionStorage key: the id of this tab's current page's copy. */
export const TAB_PAGE_KEY = 'roundwise:recovery-page';
const LOCK_PREFIX = 'roundwise-recovery:';

/** Where the copies and locks live; each part null when the browser does not offer it. */
export interface SlotEnv {
  store: UseStore | null;
  locks: LockManager | null;
  session: Storage | null;
  newId: () => string;
  now: () => Date;
}

/**
 * A stored copy. New copies keep their text as a Blob: putting a 20 MB string into IndexedDB clones it on the page's
 * main thread on every write (a freeze of a second or more after each scenario edit at 2,000 sectors), while a Blob
 * is encoded once and handed to the storage by reference. Copies written as `text` by earlier versions are read too.
 */
type Slot = { when: string; text: string } | { when: string; blob: Blob };

export interface RecoverySlots {
  write(content: string | Blob | null): Promise<void>;
  claim(): Promise<OpenedFile | null>;
  discardClaimed(): Promise<void>;
}

function isSlot(v: unknown): v is Slot {
  if (typeof v !== 'object' || v === null || typeof (v as Slot).when !== 'string') return false;
  return typeof (v as { text?: unknown }).text === 'string' || (v as { blob?: unknown }).blob instanceof Blob;
}

function textOf(slot: Slot): Promise<string> {
  return 'text' in slot ? Promise.resolve(slot.text) : slot.blob.text();
}

async function opened(slot: Slot): Promise<OpenedFile> {
  const text = await textOf(slot);
  return { name: 'Recovered project', text, size: 'blob' in slot ? slot.blob.size : utf8Length(text) };
}

/** Take the lock `name` if nobody holds it; the returned function releases it. Null when it is held elsewhere. */
function tryHold(locks: LockManager, name: string): Promise<(() => void) | null> {
  return new Promise((resolve, reject) => {
    locks.request(name, { ifAvailable: true }, (lock) => {
      if (!lock) {
        resolve(null);
        return undefined;
      }
      return new Promise<void>((release) => resolve(() => release()));
    }).catch(reject);
  });
}

function reason(err: unknown): string {
  const name = err instanceof Error || (typeof DOMException !== 'undefined' && err instanceof DOMException) ? (err as Error).name : '';
  if (name === 'QuotaExceededError') return "the browser's storage for this page is full";
  return err instanceof Error && err.message ? err.message : 'the browser refused to store it';
}

function utf8Length(text: string): number {
  return new TextEncoder().encode(text).length;
}

export function createRecoverySlots(env: SlotEnv): RecoverySlots {
  const { store, locks, session } = env;
  const ownId = env.newId();
  let previousInTab: string | null = null;
  try {
    previousInTab = session?.getItem(TAB_PAGE_KEY) ?? null;
    session?.setItem(TAB_PAGE_KEY, ownId);
  } catch {
    // sessionStorage disabled: only the Web Locks path can find copies of pages that are gone
  }
  // Held for the page's whole life; taken before the first write, so a live copy is never free for others.
  const ownLock: Promise<unknown> = locks ? tryHold(locks, LOCK_PREFIX + ownId).catch(() => null) : Promise.resolve(null);
  let claimed: { id: string; release: () => void } | null = null;

  async function claimable(id: string): Promise<(() => void) | null> {
    if (locks) return tryHold(locks, LOCK_PREFIX + id).catch(() => null);
    return id === previousInTab ? () => undefined : null;
  }

  return {
    async write(content) {
      if (!store) {
        throw new InputError('recovery-unavailable', 'this browser lets the page keep no data (IndexedDB is unavailable or disabled)');
      }
      await ownLock;
      try {
        if (content === null) await del(ownId, store);
        else await set(ownId, { when: env.now().toISOString(), blob: typeof content === 'string' ? new Blob([content], { type: 'application/json' }) : content } satisfies Slot, store);
      } catch (err) {
        throw new InputError('recovery-write-failed', reason(err));
      }
    },

    async claim() {
      if (!store) return null;
      await ownLock;
      if (claimed) {
        const again = await get(claimed.id, store).catch(() => undefined);
        if (isSlot(again)) return opened(again);
        claimed.release();
        claimed = null;
      }
      let all: [IDBValidKey, unknown][];
      try {
        all = await entries(store);
      } catch {
        return null; // storage unreadable: nothing to offer, and no reason to stop the app
      }
      const gone = all
        .filter((e): e is [string, Slot] => typeof e[0] === 'string' && e[0] !== ownId && isSlot(e[1]))
        .sort((a, b) => b[1].when.localeCompare(a[1].when));
      for (const [id] of gone) {
        const release = await claimable(id);
        if (!release) continue;
        // Read again under the lock: the tab that held it a moment ago may have deleted it.
        const slot = await get(id, store).catch(() => undefined);
        if (!isSlot(slot)) {
          release();
          continue;
        }
        claimed = { id, release };
        return opened(slot);
      }
      return null;
    },

    async discardClaimed() {
      const c = claimed;
      if (!c || !store) return;
      claimed = null;
      try {
        await del(c.id, store);
      } finally {
        c.release();
      }
    },
  };
}
