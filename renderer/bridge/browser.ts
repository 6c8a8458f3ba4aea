/**
 * The bridge in browser mode (`npm run web`, or `npm start` without the Electron binary): the same contract as the
 * desktop preload, built from what a web page has: a file input to open, a download to save or export, localStorage
 * for recent projects, IndexedDB and Web Locks for the crash-recovery copies (recovery-slots.ts), `beforeunload` for
 * the unsaved-changes prompt, and key events for the menu shortcuts. The environment is injectable so tests can drive
 * it without a browser.
 */
import type { ExportKind, FileKind, MenuCommand, OpenedFile, RecentEntry, RoundwiseBridge, SavedFile } from '../../src/bridge/contract.ts';
import { BINARY_EXPORTS } from '../../src/bridge/contract.ts';
import { EXPORT_TYPES, MAX_OPEN_BYTES, OPEN_EXTENSIONS, fileTooLarge, projectFileName, withExtension } from '../../src/bridge/files.ts';
import { commandForKey, isTextEditing } from '../../src/bridge/shortcuts.ts';
import { addRecent, parseRecentList, sanitizeFileName } from '../../src/bridge/validate.ts';
import { createStore, set } from 'idb-keyval';
import { createRecoverySlots, type SlotEnv } from './recovery-slots.ts';

/** localStorage keys; project copies are stored under PROJECT_PREFIX + file name. */
export const STORAGE_KEYS = {
  recent: 'roundwise:recent',
  /** Where the first versions kept their one recovery copy; moved into the recovery store when found. */
  legacyAutosave: 'roundwise:autosave',
  projectPrefix: 'roundwise:project:',
} as const;

/** The IndexedDB database and object store of the recovery copies. */
export const RECOVERY_DB = { name: 'roundwise-recovery', store: 'copies' } as const;

/** Project copies larger than this are downloaded but not kept in localStorage (its quota is a few MB). */
export const MAX_STORED_PROJECT_CHARS = 1_500_000;

export interface BrowserEnv {
  window: Window;
  document: Document;
  storage: Storage | null;
  isMac: boolean;
  now: () => Date;
  /** Crash-recovery storage (IndexedDB, Web Locks, sessionStorage). */
  recovery: SlotEnv;
}

function defaultEnv(): BrowserEnv {
  let storage: Storage | null = null;
  try {
    storage = window.localStorage;
  } catch {
    storage = null; // storage disabled (privacy mode): recent projects and recovery are simply unavailable
  }
  const platform = (navigator as Navigator & { userAgentData?: { platform?: string } }).userAgentData?.platform ?? navigator.platform ?? '';
  const now = () => new Date();
  return { window, document, storage, isMac: /mac|iphone|ipad/i.test(platform), now, recovery: recoveryEnv(now) };
}

function recoveryEnv(now: () => Date): SlotEnv {
  let session: Storage | null = null;
  try {
    session = window.sessionStorage;
  } catch {
    session = null;
  }
  return {
    store: typeof indexedDB === 'undefined' ? null : createStore(RECOVERY_DB.name, RECOVERY_DB.store),
    locks: navigator.locks ?? null, // absent outside secure contexts
    session,
    newId: () => crypto.randomUUID(),
    now,
  };
}

/** Strip the byte-order mark so both shells hand the importer the same text. */
function stripBom(text: string): string {
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}

function utf8Length(text: string): number {
  return new TextEncoder().encode(text).length;
}

/** Read a File (from the file input or a drop) under the shared size limit. */
export async function openedFileFromFile(file: File): Promise<OpenedFile> {
  if (file.size > MAX_OPEN_BYTES) {
    throw fileTooLarge(file.size, file.name);
  }
  return { name: file.name, text: stripBom(await file.text()), size: file.size };
}

/** Decode base64 (optionally a `data:image/png;base64,` URL) to bytes. */
export function base64ToBytes(b64: string): Uint8Array {
  const body = b64.replace(/^data:[^,]*;base64,/, '');
  const bin = atob(body);
  const out = new Uint8Array(bin.length);
  for (let i = 0; i < bin.length; i++) out[i] = bin.charCodeAt(i);
  return out;
}

export function createBrowserBridge(env: BrowserEnv = defaultEnv()): RoundwiseBridge {
  const { window: win, document: doc, storage } = env;
  let dirty = false;
  const recoverySlots = createRecoverySlots(env.recovery);
  const handlers = new Set<(cmd: MenuCommand) => void>();

  function readJson<T>(key: string): T | null {
    if (!storage) return null;
    try {
      const raw = storage.getItem(key);
      return raw === null ? null : (JSON.parse(raw) as T);
    } catch {
      return null; // a damaged entry is treated as absent, never thrown at the user
    }
  }

  function writeItem(key: string, value: string): boolean {
    if (!storage) return false;
    try {
      storage.setItem(key, value);
      return true;
    } catch {
      return false; // quota exceeded: the download still happened, only the local copy is missing
    }
  }

  /** A copy left in localStorage by the first versions becomes a copy of a page that is gone, offered like any other. */
  async function moveLegacyCopy(): Promise<void> {
    const old = readJson<{ when?: unknown; content?: unknown }>(STORAGE_KEYS.legacyAutosave);
    if (!old || typeof old.content !== 'string' || !env.recovery.store) return;
    const when = typeof old.when === 'string' ? old.when : new Date(0).toISOString();
    try {
      await set(`legacy-${env.recovery.newId()}`, { when, text: old.content }, env.recovery.store);
      storage?.removeItem(STORAGE_KEYS.legacyAutosave);
    } catch {
      // left where it is; the next start tries again
    }
  }

  function loadRecent(): RecentEntry[] {
    return parseRecentList(readJson<unknown>(STORAGE_KEYS.recent)).filter((e) => e.ref.startsWith(STORAGE_KEYS.projectPrefix));
  }

  /** Keep a copy of a project so "recent projects" can reopen it without a file dialog. */
  function remember(name: string, text: string): void {
    if (text.length > MAX_STORED_PROJECT_CHARS) return;
    const ref = STORAGE_KEYS.projectPrefix + name;
    if (!writeItem(ref, text)) return;
    const before = loadRecent();
    const list = addRecent(before, { name, ref, when: env.now().toISOString() });
    for (const dropped of before) if (!list.some((e) => e.ref === dropped.ref)) storage?.removeItem(dropped.ref);
    writeItem(STORAGE_KEYS.recent, JSON.stringify(list));
  }

  function download(name: string, blob: Blob): void {
    const url = URL.createObjectURL(blob);
    const a = doc.createElement('a');
    a.href = url;
    a.download = name;
    a.rel = 'noopener';
    a.style.display = 'none';
    doc.body.append(a);
    a.click();
    a.remove();
    // Revoke later: revoking at once can cancel the download in some browsers.
    win.setTimeout(() => URL.revokeObjectURL(url), 60_000);
  }

  /** Cancels the file input still waiting for the user, if any (a second Open replaces the first). */
  let cancelPending: (() => void) | null = null;

  function openFile(kind: FileKind): Promise<OpenedFile | null> {
    cancelPending?.();
    return new Promise<OpenedFile | null>((resolve, reject) => {
      const input = doc.createElement('input');
      input.type = 'file';
      input.accept = OPEN_EXTENSIONS[kind].map((e) => `.${e}`).join(',');
      input.dataset.roundwiseOpen = kind;
      input.style.display = 'none';
      let settled = false;
      const settle = (run: () => void): void => {
        if (settled) return;
        settled = true;
        if (cancelPending === cancel) cancelPending = null;
        input.remove();
        run();
      };
      const cancel = (): void => settle(() => resolve(null));
      cancelPending = cancel;
      input.addEventListener('change', () => {
        const file = input.files?.[0];
        if (!file) return settle(() => resolve(null));
        openedFileFromFile(file).then(
          (opened) => settle(() => {
            if (kind === 'project') remember(opened.name, opened.text);
            resolve(opened);
          }),
          (err: unknown) => settle(() => reject(err)),
        );
      });
      input.addEventListener('cancel', cancel);
      doc.body.append(input);
      input.click();
    });
  }

  async function saveProject(suggestedName: string, content: string): Promise<SavedFile | null> {
    const name = projectFileName(sanitizeFileName(suggestedName));
    download(name, new Blob([content], { type: 'application/json' }));
    remember(name, content);
    return { name };
  }

  async function exportFile(suggestedName: string, kind: ExportKind, content: string): Promise<SavedFile | null> {
    const type = EXPORT_TYPES[kind];
    const name = withExtension(sanitizeFileName(suggestedName), type.extension);
    const body: BlobPart = BINARY_EXPORTS.includes(kind) ? (base64ToBytes(content) as Uint8Array<ArrayBuffer>) : content;
    download(name, new Blob([body], { type: type.mime }));
    return { name };
  }

  async function openRecent(ref: string): Promise<OpenedFile | null> {
    const entry = loadRecent().find((e) => e.ref === ref);
    const text = entry && storage ? storage.getItem(ref) : null;
    if (!entry || text === null) return null;
    remember(entry.name, text);
    return { name: entry.name, text, size: utf8Length(text) };
  }

  function onKey(ev: KeyboardEvent): void {
    const cmd = commandForKey(ev, env.isMac);
    if (!cmd || handlers.size === 0) return;
    if ((cmd === 'undo' || cmd === 'redo') && isTextEditing(doc.activeElement as HTMLInputElement | null)) return;
    // The bridge owns the menu shortcuts, as the native menu does in the desktop app: keep the browser's own
    // Open/Save dialogs out of the way, and stop the chord here (capture phase) so no page handler runs it twice.
    ev.preventDefault();
    ev.stopPropagation();
    for (const h of [...handlers]) h(cmd);
  }

  win.addEventListener('beforeunload', (ev: BeforeUnloadEvent) => {
    if (!dirty) return;
    ev.preventDefault();
    ev.returnValue = ''; // older browsers need a value to show their "leave page?" prompt
  });

  return {
    mode: 'browser',
    openFile,
    saveProject,
    exportFile,
    recentProjects: async () => loadRecent(),
    openRecent,
    setDirty(value: boolean) {
      dirty = value === true;
    },
    onMenu(handler) {
      if (handlers.size === 0) win.addEventListener('keydown', onKey, true);
      handlers.add(handler);
      return () => {
        handlers.delete(handler);
        if (handlers.size === 0) win.removeEventListener('keydown', onKey, true);
      };
    },
    async autosave(content) {
      // In the browser a recovery copy is a Blob (renderer/state/recovery.ts); a string is stored as one too.
      await recoverySlots.write(content !== null && typeof content === 'object' ? (content as Blob) : content);
    },
    async recoverAutosave() {
      await moveLegacyCopy();
      return recoverySlots.claim();
    },
    async discardRecovered() {
      await recoverySlots.discardClaimed();
    },
  };
}
