/**
 * The typed bridge between the UI (renderer/) and the desktop shell (main/). Types and pure validators only:
 * main/preload.ts exposes an object of this shape as `window.roundwise` in Electron; renderer/bridge/browser.ts
 * implements the same shape with file inputs, downloads and localStorage in browser mode. The renderer only
 * ever talks to a RoundwiseBridge, never asks which one it has.
 */

/**
 * A crash-recovery copy handed over as a Blob (20 MB of text at 2,000 sectors): the browser stores it as it is,
 * without copying the text on the page's main thread; the desktop preload reads it to text for the shell.
 */
export interface RecoveryContent {
  readonly size: number;
  text(): Promise<string>;
}

export interface OpenedFile {
  /** File name shown to the user (no folder in browser mode). */
  name: string;
  /** Full path in desktop mode, undefined in browser mode. */
  path?: string;
  /** Raw content as UTF-8 text (tables and projects are text). */
  text: string;
  /** Size in bytes, for the size limit and progress. */
  size: number;
}

export interface SavedFile {
  name: string;
  path?: string;
}

export interface RecentEntry {
  name: string;
  /** Desktop: full path. Browser: a key of the local store. */
  ref: string;
  /** ISO date of the last open or save. */
  when: string;
}

export type FileKind = 'table' | 'project';
export type ExportKind = 'csv' | 'txt' | 'png' | 'json' | 'pdf' | 'xlsx';

/** Export kinds whose content crosses the bridge as base64 of the file's bytes (the others are text, written UTF-8). */
export const BINARY_EXPORTS: readonly ExportKind[] = ['png', 'pdf', 'xlsx'];

/** Commands the native menu (desktop) or the in-window menu (browser) sends to the UI. */
export type MenuCommand =
  | 'open-table' | 'open-project' | 'save-project' | 'save-project-as'
  | 'export-report' | 'print-brief' | 'undo' | 'redo' | 'guide' | 'about';

export interface RoundwiseBridge {
  readonly mode: 'desktop' | 'browser';
  /** Ask the user for a file; null when cancelled. */
  openFile(kind: FileKind): Promise<OpenedFile | null>;
  /** Save a project: to `path` when given (desktop "Save"), else ask. Written atomically (temp file + rename). */
  saveProject(suggestedName: string, content: string, path?: string): Promise<SavedFile | null>;
  /** Export a report or chart: a save dialog in desktop mode, a download in browser mode. `content` is text, or base64 for the binary kinds (BINARY_EXPORTS). */
  exportFile(suggestedName: string, kind: ExportKind, content: string): Promise<SavedFile | null>;
  recentProjects(): Promise<RecentEntry[]>;
  openRecent(ref: string): Promise<OpenedFile | null>;
  /** Tell the shell whether there are unsaved changes, so closing the window can ask first. */
  setDirty(dirty: boolean): void;
  /** Subscribe to menu commands; returns an unsubscribe function. */
  onMenu(handler: (cmd: MenuCommand) => void): () => void;
  /**
   * Keep this window's crash-recovery copy (one per window and page load; never a saved project file); `null` removes
   * it (after a save, or when the project is clean). Call it debounced while dirty. Rejects, with the reason, when
   * the copy cannot be written (disk or browser storage full, storage unavailable), so the UI can say so.
   */
  autosave(content: string | RecoveryContent | null): Promise<void>;
  /**
   * A recovery copy left by a window that is gone (crashed, killed, reloaded), or null when there is none. The copy
   * is reserved for this window until `discardRecovered()`, so no other window offers it; copies of windows still
   * open are never offered.
   */
  recoverAutosave(): Promise<OpenedFile | null>;
  /** Delete the copy `recoverAutosave()` offered (the user discarded it, or recovered it and it is now this window's). */
  discardRecovered(): Promise<void>;
}

/** IPC channel names, one per bridge method that crosses the process boundary. */
export const CHANNELS = {
  openFile: 'roundwise:open-file',
  saveProject: 'roundwise:save-project',
  exportFile: 'roundwise:export-file',
  recentProjects: 'roundwise:recent-projects',
  openRecent: 'roundwise:open-recent',
  setDirty: 'roundwise:set-dirty',
  autosave: 'roundwise:autosave',
  recoverAutosave: 'roundwise:recover-autosave',
  discardRecovered: 'roundwise:discard-recovered',
  menu: 'roundwise:menu',
} as const;
