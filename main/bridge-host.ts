/**
 * The main-process side of the bridge: one handler per IPC channel, over injected dialogs and folders so
 * test/main runs them against a temp folder with scripted dialogs. The renderer never names a path the user did
 * not pick, and reading is not writing: a file picked in an open dialog is readable only; saving to a given path
 * works only for a project picked in a save dialog this session, opened as a project, or on the recent list — and
 * only with content that is a Roundwise project.
 */
import { closeSync, lstatSync, openSync, readSync } from 'node:fs';
import { basename, dirname, resolve } from 'node:path';
import type { ExportKind, FileKind, OpenedFile, RecentEntry, SavedFile } from '../src/bridge/contract.ts';
import { BINARY_EXPORTS } from '../src/bridge/contract.ts';
import { EXPORT_TYPES, OPEN_EXTENSIONS, OPEN_FILTER_NAMES, PROJECT_EXTENSION, projectFileName, withExtension } from '../src/bridge/files.ts';
import { sanitizeFileName, stripDataUrl } from '../src/bridge/validate.ts';
import { InputError } from '../src/diagnostics/index.ts';
import { PROJECT_FORMAT } from '../src/project/index.ts';
import { readTextLimited, RecentStore, writeFileAtomic } from './file-store.ts';
import { RecoveryStore } from './recovery-store.ts';

export interface DialogFilter {
  name: string;
  extensions: string[];
}

/** The native dialogs, reduced to what the handlers need (path or null when cancelled). */
export interface Dialogs {
  openPath(title: string, filters: DialogFilter[]): Promise<string | null>;
  savePath(title: string, defaultName: string, filters: DialogFilter[]): Promise<string | null>;
  /** Ask whether to replace the existing file at `path` (full path; the question names the file and its folder). */
  confirmReplace(path: string): Promise<boolean>;
}

/**
 * Project files begin `{ "format": "roundwise-project", …` (src/project writes the format key first) and end with
 * `}`. A cheap check, not a parse: enough that a save to a granted path can only ever put a project there.
 */
const PROJECT_HEAD = new RegExp(`^\\s*\\{\\s*"format"\\s*:\\s*"${PROJECT_FORMAT}"\\s*,`);
export function looksLikeProject(text: string): boolean {
  return PROJECT_HEAD.test(text.slice(0, 200)) && text.trimEnd().endsWith('}');
}

/** The question asked before replacing a file the native dialog did not ask about (the extension was added after). */
export const REPLACE_BUTTONS = ['Replace', 'Cancel'] as const;
export function replacePrompt(path: string): { message: string; detail: string } {
  return {
    message: `"${basename(path)}" already exists. Replace it?`,
    detail: `The folder ${dirname(path)} already has a file named "${basename(path)}". Replacing it overwrites what it holds.`,
  };
}

/**
 * True when `path` is missing (a saved project was moved away: saving recreates it) or begins like a project. A save
 * by path replaces only a project: a recent-list entry that now names some other file is not written over.
 */
function missingOrProject(path: string): boolean {
  let fd: number;
  try {
    fd = openSync(path, 'r');
  } catch (err) {
    return (err as { code?: string }).code === 'ENOENT';
  }
  try {
    const head = Buffer.alloc(200);
    const n = readSync(fd, head, 0, head.length, 0);
    return PROJECT_HEAD.test(head.subarray(0, n).toString('utf8'));
  } catch {
    return false;
  } finally {
    closeSync(fd);
  }
}

/** True when something (a file, a folder, even a dangling link) is at `path`. */
function occupied(path: string): boolean {
  return lstatSync(path, { throwIfNoEntry: false }) !== undefined;
}

export interface BridgeHostDeps {
  dialogs: Dialogs;
  userDataDir: string;
  /** Default folder for save dialogs (Documents). */
  documentsDir: string;
  now?: () => Date;
}

export interface BridgeHost {
  openFile(kind: FileKind): Promise<OpenedFile | null>;
  saveProject(name: string, content: string, path?: string): Promise<SavedFile | null>;
  exportFile(name: string, kind: ExportKind, content: string): Promise<SavedFile | null>;
  recentProjects(): Promise<RecentEntry[]>;
  openRecent(ref: string): Promise<OpenedFile | null>;
  /** The rest is per window (`windowId`: the sender's web contents id): dirty flags and recovery copies. */
  setDirty(windowId: number, dirty: boolean): void;
  /** Unsaved changes in the window, as last reported by its UI. */
  isDirty(windowId: number): boolean;
  autosave(windowId: number, content: string | null): void;
  recoverAutosave(windowId: number): OpenedFile | null;
  discardRecovered(windowId: number): void;
  /** A new page was loaded in the window (a reload after a renderer crash): the old page's copy may now be offered. */
  pageLoaded(windowId: number): void;
  /** The window is closing on purpose (clean, or the user chose to discard): its recovery copy is not needed. */
  closedCleanly(windowId: number): void;
}

export function createBridgeHost(deps: BridgeHostDeps): BridgeHost {
  const recent = new RecentStore(deps.userDataDir, deps.now);
  const recovery = new RecoveryStore(deps.userDataDir);
  /**
   * Project files the renderer may save to by path: picked in a project save dialog or opened as a project this
   * session (the recent list also counts). Files picked in an open dialog are only read: never added here.
   */
  const writable = new Set<string>();
  const dirty = new Map<number, boolean>();

  const mayWrite = (abs: string): boolean => writable.has(abs) || recent.list().some((e) => resolve(e.ref) === abs);

  const requireProject = (content: string, file: string): void => {
    if (!looksLikeProject(content)) {
      throw new InputError('not-a-project', `refused to save: the content is not a Roundwise project (it must start with {"format": "${PROJECT_FORMAT}"); nothing was written`, { file });
    }
  };

  /**
   * A save dialog whose answer gets the expected extension (`withExt`) before anything is checked. The native dialog
   * only asked about the name as typed, so when adding the extension lands on an existing file, ask again, naming
   * it; "Cancel" reopens the dialog on that name.
   */
  async function pickSaveTarget(title: string, suggested: string, filters: DialogFilter[], withExt: (p: string) => string): Promise<string | null> {
    let defaultPath = suggested;
    for (;;) {
      const picked = await deps.dialogs.savePath(title, defaultPath, filters);
      if (!picked) return null;
      const target = resolve(withExt(picked));
      if (target === resolve(picked) || !occupied(target)) return target;
      if (await deps.dialogs.confirmReplace(target)) return target;
      defaultPath = target;
    }
  }

  const projectFilters: DialogFilter[] = [{ name: OPEN_FILTER_NAMES.project, extensions: [PROJECT_EXTENSION] }];

  return {
    async openFile(kind) {
      const picked = await deps.dialogs.openPath(kind === 'table' ? 'Import a flow table' : 'Open a project', [
        { name: OPEN_FILTER_NAMES[kind], extensions: [...OPEN_EXTENSIONS[kind]] },
        { name: 'All files', extensions: ['*'] },
      ]);
      if (!picked) return null;
      const path = resolve(picked);
      const file = readTextLimited(path);
      // Only a file that is a project becomes a project the UI may save over ("Save" after "Open project").
      if (kind === 'project' && looksLikeProject(file.text)) {
        writable.add(path);
        recent.add(path);
      }
      return file;
    },

    async saveProject(name, content, path) {
      let target: string;
      if (path !== undefined) {
        target = resolve(path);
        if (!mayWrite(target) || !missingOrProject(target)) {
          throw new InputError('path-not-granted', 'this file was not opened or saved as a project; use Save As', { file: basename(path) });
        }
        requireProject(content, basename(target));
      } else {
        const suggested = projectFileName(sanitizeFileName(name));
        requireProject(content, suggested); // before the dialog: no point asking where to put something refused
        const picked = await pickSaveTarget('Save project', resolve(deps.documentsDir, suggested), projectFilters, projectFileName);
        if (!picked) return null;
        target = picked;
        writable.add(target);
      }
      writeFileAtomic(target, content);
      recent.add(target);
      return { name: basename(target), path: target };
    },

    async exportFile(name, kind, content) {
      const type = EXPORT_TYPES[kind];
      const suggested = withExtension(sanitizeFileName(name), type.extension);
      const filters = [{ name: type.filterName, extensions: [type.extension] }];
      const target = await pickSaveTarget('Export', resolve(deps.documentsDir, suggested), filters, (p) => withExtension(p, type.extension));
      if (!target) return null;
      writeFileAtomic(target, BINARY_EXPORTS.includes(kind) ? Buffer.from(stripDataUrl(content), 'base64') : content);
      return { name: basename(target), path: target };
    },

    async recentProjects() {
      return recent.list();
    },

    async openRecent(ref) {
      const entry = recent.list().find((e) => e.ref === ref);
      if (!entry) return null; // not on our list: never read a path the renderer made up
      try {
        const file = readTextLimited(entry.ref);
        writable.add(resolve(entry.ref));
        recent.add(entry.ref);
        return file;
      } catch (err) {
        if (err instanceof InputError && err.code === 'read-failed') recent.remove(entry.ref);
        throw err;
      }
    },

    setDirty(windowId, value) {
      dirty.set(windowId, value);
    },

    isDirty: (windowId) => dirty.get(windowId) === true,

    autosave(windowId, content) {
      if (content === null) recovery.clear(windowId);
      else recovery.write(windowId, content);
    },

    recoverAutosave: (windowId) => recovery.claim(windowId),

    discardRecovered: (windowId) => recovery.discardOffered(windowId),

    pageLoaded(windowId) {
      dirty.delete(windowId);
      recovery.pageLoaded(windowId);
    },

    closedCleanly(windowId) {
      dirty.delete(windowId);
      recovery.closed(windowId);
    },
  };
}
