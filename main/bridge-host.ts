/**
 * The main-process side of the bridge: one handler per IPC channel, over injected dialogs and folders so
 * test/main runs them against a temp folder with scripted dialogs. The renderer never names a path the user did
 * not pick: saving to a given path, or reopening a recent project, only works for paths this session's dialogs
 * returned or that are on the recent list.
 */
import { basename, extname, resolve } from 'node:path';
import type { ExportKind, FileKind, OpenedFile, RecentEntry, SavedFile } from '../src/bridge/contract.ts';
import { EXPORT_TYPES, OPEN_EXTENSIONS, OPEN_FILTER_NAMES, PROJECT_EXTENSION, projectFileName, withExtension } from '../src/bridge/files.ts';
import { sanitizeFileName, stripDataUrl } from '../src/bridge/validate.ts';
import { InputError } from '../src/diagnostics/index.ts';
import { AutosaveStore, readTextLimited, RecentStore, writeFileAtomic } from './file-store.ts';

export interface DialogFilter {
  name: string;
  extensions: string[];
}

/** The native dialogs, reduced to what the handlers need (path or null when cancelled). */
export interface Dialogs {
  openPath(title: string, filters: DialogFilter[]): Promise<string | null>;
  savePath(title: string, defaultName: string, filters: DialogFilter[]): Promise<string | null>;
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
  setDirty(dirty: boolean): void;
  autosave(content: string | null): void;
  recoverAutosave(): OpenedFile | null;
  /** Unsaved changes, as last reported by the UI. */
  isDirty(): boolean;
  /** The window is closing on purpose (clean, or the user chose to discard): the recovery copy is not needed. */
  closedCleanly(): void;
}

export function createBridgeHost(deps: BridgeHostDeps): BridgeHost {
  const recent = new RecentStore(deps.userDataDir, deps.now);
  const recovery = new AutosaveStore(deps.userDataDir);
  /** Paths the user picked in a dialog this session; only these may be written without asking again. */
  const granted = new Set<string>();
  let dirty = false;

  const grant = (p: string): string => {
    const abs = resolve(p);
    granted.add(abs);
    return abs;
  };

  const projectFilters: DialogFilter[] = [{ name: OPEN_FILTER_NAMES.project, extensions: [PROJECT_EXTENSION] }];

  return {
    async openFile(kind) {
      const picked = await deps.dialogs.openPath(kind === 'table' ? 'Import a flow table' : 'Open a project', [
        { name: OPEN_FILTER_NAMES[kind], extensions: [...OPEN_EXTENSIONS[kind]] },
        { name: 'All files', extensions: ['*'] },
      ]);
      if (!picked) return null;
      const path = grant(picked);
      const file = readTextLimited(path);
      if (kind === 'project') recent.add(path);
      return file;
    },

    async saveProject(name, content, path) {
      let target: string;
      if (path !== undefined) {
        target = resolve(path);
        if (!granted.has(target)) {
          throw new InputError('path-not-granted', 'this file was not opened or saved in this session; use Save As', { file: basename(path) });
        }
      } else {
        const suggested = projectFileName(sanitizeFileName(name));
        const picked = await deps.dialogs.savePath('Save project', resolve(deps.documentsDir, suggested), projectFilters);
        if (!picked) return null;
        target = grant(extname(picked) ? picked : projectFileName(picked));
      }
      writeFileAtomic(target, content);
      recent.add(target);
      return { name: basename(target), path: target };
    },

    async exportFile(name, kind, content) {
      const type = EXPORT_TYPES[kind];
      const suggested = withExtension(sanitizeFileName(name), type.extension);
      const picked = await deps.dialogs.savePath('Export', resolve(deps.documentsDir, suggested), [{ name: type.filterName, extensions: [type.extension] }]);
      if (!picked) return null;
      const target = resolve(extname(picked) ? picked : withExtension(picked, type.extension));
      writeFileAtomic(target, kind === 'png' ? Buffer.from(stripDataUrl(content), 'base64') : content);
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
        grant(entry.ref);
        recent.add(entry.ref);
        return file;
      } catch (err) {
        if (err instanceof InputError && err.code === 'read-failed') recent.remove(entry.ref);
        throw err;
      }
    },

    setDirty(value) {
      dirty = value;
    },

    autosave(content) {
      if (content === null) recovery.clear();
      else recovery.write(content);
    },

    recoverAutosave() {
      return recovery.read();
    },

    isDirty: () => dirty,

    closedCleanly() {
      recovery.clear();
    },
  };
}
