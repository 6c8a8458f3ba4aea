/**
 * Crash-recovery copies on the desktop: one file per window and page load in the user-data folder's `recovery/`.
 * A copy is "live" while the page that writes it is still running; every other copy belongs to a page that is gone
 * (the app was killed, the renderer crashed and was reloaded) and may be offered. Offered copies are reserved for the
 * window they were offered to, so two windows never offer the same one, and Discard in one window never touches
 * another's live copy. The app holds the single-instance lock, so this process knows every live page.
 * Node only (no Electron), so test/main exercises it on a temp folder.
 */
import { lstatSync, readdirSync, unlinkSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { randomBytes } from 'node:crypto';
import type { OpenedFile } from '../src/bridge/contract.ts';
import { readTextLimited, removeStaleTemps, writeFileAtomic } from './file-store.ts';

const SUFFIX = '.roundwise-recovery';
/** The single copy the first desktop versions kept; offered like any copy of a page that is gone. */
const LEGACY_NAME = 'unsaved-project.roundwise';

export class RecoveryStore {
  readonly dir: string;
  /** Distinguishes this process's files from those of earlier runs. */
  private readonly run = randomBytes(6).toString('hex');
  private loads = 0;
  /** Each window's current copy (its page load's), and the copy offered to it. */
  private readonly own = new Map<number, string>();
  private readonly offered = new Map<number, string>();

  constructor(userDataDir: string) {
    this.dir = join(userDataDir, 'recovery');
  }

  /** The file of `windowId`'s current page. */
  private ownFile(windowId: number): string {
    let f = this.own.get(windowId);
    if (!f) {
      f = join(this.dir, `${this.run}-${windowId}-${++this.loads}${SUFFIX}`);
      this.own.set(windowId, f);
    }
    return f;
  }

  write(windowId: number, content: string): void {
    writeFileAtomic(this.ownFile(windowId), content);
  }

  /** Remove `windowId`'s current copy (saved, clean, or closed on purpose). */
  clear(windowId: number): void {
    const f = this.own.get(windowId);
    if (f) remove(f);
  }

  /** The window is closing: its copy is not needed, and a copy offered to it and not answered stays for later. */
  closed(windowId: number): void {
    this.clear(windowId);
    this.own.delete(windowId);
    this.offered.delete(windowId);
  }

  /**
   * A new page was loaded in `windowId` (a reload after its renderer crashed, say): the previous page's copy now
   * belongs to a page that is gone, and its unanswered offer is released.
   */
  pageLoaded(windowId: number): void {
    this.own.delete(windowId);
    this.offered.delete(windowId);
  }

  /** The newest copy of a page that is gone and not reserved by another window, now reserved for `windowId`. */
  claim(windowId: number): OpenedFile | null {
    const already = this.offered.get(windowId);
    if (already) {
      const again = read(already);
      if (again) return again;
      this.offered.delete(windowId);
    }
    const busy = new Set([...this.own.values(), ...this.offered.values()]);
    for (const f of this.candidates()) {
      if (busy.has(f)) continue;
      const copy = read(f);
      if (!copy) continue;
      this.offered.set(windowId, f);
      return copy;
    }
    return null;
  }

  /** Delete the copy offered to `windowId` (discarded, or recovered into the window's own copy). */
  discardOffered(windowId: number): void {
    const f = this.offered.get(windowId);
    if (!f) return;
    this.offered.delete(windowId);
    remove(f);
  }

  /** Copy files in the folder, newest first. */
  private candidates(): string[] {
    let names: string[];
    try {
      names = readdirSync(this.dir);
    } catch {
      return []; // no folder yet: nothing was ever kept
    }
    const found: { path: string; mtime: number }[] = [];
    for (const n of names) {
      if (!(n.endsWith(SUFFIX) || n === LEGACY_NAME) || n.startsWith('.')) continue;
      const path = join(this.dir, n);
      const st = lstatSync(path, { throwIfNoEntry: false });
      if (st?.isFile()) found.push({ path, mtime: st.mtimeMs });
    }
    return found.sort((a, b) => b.mtime - a.mtime).map((f) => f.path);
  }
}

function read(path: string): OpenedFile | null {
  try {
    const f = readTextLimited(path);
    return { name: 'Recovered project', text: f.text, size: f.size };
  } catch {
    return null; // unreadable or too large: skipped, left in place
  }
}

function remove(path: string): void {
  try {
    unlinkSync(path);
  } catch {
    // already gone
  }
  removeStaleTemps(dirname(path), path);
}
