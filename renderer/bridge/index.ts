/**
 * The one way the UI reaches files, menus and the window: `getBridge()`. In the desktop app the preload script has
 * exposed `window.roundwise`; in browser mode the same contract is implemented with web APIs. Nothing else in the
 * renderer needs to know which one it has.
 */
import type { RoundwiseBridge } from '../../src/bridge/contract.ts';
import { createBrowserBridge } from './browser.ts';

declare global {
  interface Window {
    /** Set by main/preload.ts (contextBridge) in the desktop app only. */
    readonly roundwise?: RoundwiseBridge;
  }
}

let bridge: RoundwiseBridge | undefined;

export function getBridge(): RoundwiseBridge {
  if (!bridge) {
    const exposed = typeof window !== 'undefined' ? window.roundwise : undefined;
    bridge = exposed && exposed.mode === 'desktop' ? exposed : createBrowserBridge();
  }
  return bridge;
}

export { openedFileFromFile } from './browser.ts';
export type { ExportKind, FileKind, MenuCommand, OpenedFile, RecentEntry, RoundwiseBridge, SavedFile } from '../../src/bridge/contract.ts';
export { SHORTCUTS, acceleratorFor } from '../../src/bridge/shortcuts.ts';
export { MAX_OPEN_BYTES } from '../../src/bridge/files.ts';
