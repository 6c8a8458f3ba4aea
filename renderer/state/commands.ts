/**
 * The app's commands with their keyboard shortcuts, in one list: the in-window menu shows them, the key handler
 * runs them, and the desktop shell's native menu sends the same names (MenuCommand) through the bridge.
 */
export type CommandId =
  | 'open-table' | 'open-project' | 'save-project' | 'save-project-as' | 'export-report'
  | 'undo' | 'redo' | 'about';

export interface CommandInfo {
  id: CommandId;
  label: string;
  /** Shortcut as shown, with "Ctrl" read as Cmd on macOS. */
  keys: string;
  menu: 'File' | 'Edit' | 'Help';
}

export const IS_MAC = typeof navigator !== 'undefined' && /Mac|iPhone|iPad/.test(navigator.platform);
const MOD = IS_MAC ? '⌘' : 'Ctrl+';
const SHIFT = IS_MAC ? '⇧' : 'Shift+';

export const COMMANDS: readonly CommandInfo[] = [
  { id: 'open-table', label: 'Import table…', keys: `${MOD}O`, menu: 'File' },
  { id: 'open-project', label: 'Open project…', keys: `${MOD}${SHIFT}O`, menu: 'File' },
  { id: 'save-project', label: 'Save project', keys: `${MOD}S`, menu: 'File' },
  { id: 'save-project-as', label: 'Save project as…', keys: `${MOD}${SHIFT}S`, menu: 'File' },
  { id: 'export-report', label: 'Export reports…', keys: `${MOD}E`, menu: 'File' },
  { id: 'undo', label: 'Undo scenario edit', keys: `${MOD}Z`, menu: 'Edit' },
  { id: 'redo', label: 'Redo scenario edit', keys: IS_MAC ? `${MOD}${SHIFT}Z` : 'Ctrl+Y', menu: 'Edit' },
  { id: 'about', label: 'About Roundwise', keys: '', menu: 'Help' },
];

/** Which command a key event asks for, or null. Undo/redo inside a text field stay with the field. */
export function commandForKey(e: KeyboardEvent): CommandId | null {
  const mod = IS_MAC ? e.metaKey : e.ctrlKey;
  if (!mod || e.altKey) return null;
  const k = e.key.toLowerCase();
  const inField = e.target instanceof HTMLElement && (e.target.tagName === 'INPUT' || e.target.tagName === 'TEXTAREA');
  if (k === 'o') return e.shiftKey ? 'open-project' : 'open-table';
  if (k === 's') return e.shiftKey ? 'save-project-as' : 'save-project';
  if (k === 'e') return 'export-report';
  if (inField) return null;
  if (k === 'z') return e.shiftKey ? 'redo' : 'undo';
  if (k === 'y') return 'redo';
  return null;
}
