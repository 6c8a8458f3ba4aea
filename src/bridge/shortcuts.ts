/**
 * Keyboard shortcuts for the menu commands, shared by both shells so they can never drift apart: the desktop
 * menu (main/menu.ts) uses `accelerator`, the browser bridge (renderer/bridge/browser.ts) matches key events
 * with `commandForKey`. "Mod" is Cmd on macOS and Ctrl elsewhere.
 */
import type { MenuCommand } from './contract.ts';

export interface Shortcut {
  command: MenuCommand;
  /** Electron accelerator string, also shown in menus and tooltips. */
  accelerator: string;
  key: string;
  shift: boolean;
}

export const SHORTCUTS: readonly Shortcut[] = [
  { command: 'open-table', accelerator: 'CmdOrCtrl+O', key: 'o', shift: false },
  { command: 'open-project', accelerator: 'CmdOrCtrl+Shift+O', key: 'o', shift: true },
  { command: 'save-project', accelerator: 'CmdOrCtrl+S', key: 's', shift: false },
  { command: 'save-project-as', accelerator: 'CmdOrCtrl+Shift+S', key: 's', shift: true },
  { command: 'export-report', accelerator: 'CmdOrCtrl+E', key: 'e', shift: false },
  { command: 'print-brief', accelerator: 'CmdOrCtrl+P', key: 'p', shift: false },
  { command: 'undo', accelerator: 'CmdOrCtrl+Z', key: 'z', shift: false },
  { command: 'redo', accelerator: 'CmdOrCtrl+Shift+Z', key: 'z', shift: true },
];

/** Ctrl+Y is the other common redo on Windows and Linux; accepted, not advertised. */
const EXTRA: readonly Shortcut[] = [{ command: 'redo', accelerator: 'Ctrl+Y', key: 'y', shift: false }];

export function acceleratorFor(command: MenuCommand): string | undefined {
  return SHORTCUTS.find((s) => s.command === command)?.accelerator;
}

/** The fields of a KeyboardEvent that decide a shortcut (kept structural so this stays DOM-free). */
export interface KeyChord {
  key: string;
  ctrlKey: boolean;
  metaKey: boolean;
  shiftKey: boolean;
  altKey: boolean;
}

/** The command a key chord means, or null. On macOS the modifier is Cmd; elsewhere Ctrl. */
export function commandForKey(ev: KeyChord, isMac: boolean): MenuCommand | null {
  const mod = isMac ? ev.metaKey && !ev.ctrlKey : ev.ctrlKey && !ev.metaKey;
  if (!mod || ev.altKey) return null;
  const key = ev.key.toLowerCase();
  for (const s of [...SHORTCUTS, ...(isMac ? [] : EXTRA)]) {
    if (s.key === key && s.shift === ev.shiftKey) return s.command;
  }
  return null;
}

/** Undo/redo inside a text field belong to the field (native text undo), not to the scenario history. */
export function isTextEditing(target: { tagName?: string; isContentEditable?: boolean; type?: string } | null): boolean {
  if (!target) return false;
  if (target.isContentEditable) return true;
  const tag = (target.tagName ?? '').toUpperCase();
  if (tag === 'TEXTAREA') return true;
  if (tag !== 'INPUT') return false;
  const type = (target.type ?? 'text').toLowerCase();
  return !['button', 'checkbox', 'radio', 'range', 'color', 'file', 'submit', 'reset', 'image'].includes(type);
}
