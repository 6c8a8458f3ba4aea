/**
 * The app's commands as the in-window menu lists them. Their shortcuts come from the bridge's one shortcut table
 * (src/bridge/shortcuts.ts): the desktop shell's native menu and the browser bridge's key handler both use it and
 * deliver the command through `onMenu`, so the renderer never matches keys for these itself.
 */
import { acceleratorFor, type MenuCommand } from '../bridge/index.ts';

export type CommandId = MenuCommand;

export interface CommandInfo {
  id: CommandId;
  label: string;
  /** Shortcut as shown ("Ctrl+O", or "⌘O" on macOS). */
  keys: string;
  menu: 'File' | 'Edit' | 'Help';
}

export const IS_MAC = typeof navigator !== 'undefined' && /Mac|iPhone|iPad/.test(navigator.platform);

/** "CmdOrCtrl+Shift+O" → "Ctrl+Shift+O", or "⌘⇧O" on macOS. */
export function shownKeys(accelerator: string | undefined): string {
  if (!accelerator) return '';
  if (!IS_MAC) return accelerator.replace('CmdOrCtrl', 'Ctrl');
  return accelerator.replace('CmdOrCtrl+', '⌘').replace('Shift+', '⇧');
}

const entry = (id: CommandId, label: string, menu: CommandInfo['menu']): CommandInfo => ({ id, label, menu, keys: shownKeys(acceleratorFor(id)) });

export const COMMANDS: readonly CommandInfo[] = [
  entry('open-table', 'Import table…', 'File'),
  entry('open-project', 'Open project…', 'File'),
  entry('save-project', 'Save project', 'File'),
  entry('save-project-as', 'Save project as…', 'File'),
  entry('export-report', 'Export reports…', 'File'),
  entry('print-brief', 'Print the brief…', 'File'),
  entry('undo', 'Undo', 'Edit'),
  entry('redo', 'Redo', 'Edit'),
  entry('guide', 'Guide', 'Help'),
  entry('about', 'About Roundwise', 'Help'),
];

export function keysOf(id: CommandId): string {
  return COMMANDS.find((c) => c.id === id)?.keys ?? '';
}
