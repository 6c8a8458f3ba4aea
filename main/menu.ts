/**
 * The native menu. Built as a plain template (types only from electron) so tests check every command and
 * accelerator without the binary; accelerators come from src/bridge/shortcuts.ts, the same table the browser
 * bridge uses, so both modes answer the same keys.
 */
import type { MenuItemConstructorOptions } from 'electron';
import type { MenuCommand } from '../src/bridge/contract.ts';
import { acceleratorFor } from '../src/bridge/shortcuts.ts';

export interface MenuOptions {
  isMac: boolean;
  appName: string;
  devTools: boolean;
}

export function menuTemplate(send: (cmd: MenuCommand) => void, opts: MenuOptions): MenuItemConstructorOptions[] {
  const item = (label: string, command: MenuCommand): MenuItemConstructorOptions => {
    const accelerator = acceleratorFor(command);
    return { label, click: () => send(command), ...(accelerator ? { accelerator } : {}) };
  };
  const sep: MenuItemConstructorOptions = { type: 'separator' };
  const template: MenuItemConstructorOptions[] = [];
  if (opts.isMac) {
    template.push({
      label: opts.appName,
      submenu: [item(`About ${opts.appName}`, 'about'), sep, { role: 'hide' }, { role: 'hideOthers' }, { role: 'unhide' }, sep, { role: 'quit' }],
    });
  }
  template.push(
    {
      label: '&File',
      submenu: [
        item('Import table…', 'open-table'),
        item('Open project…', 'open-project'),
        sep,
        item('Save project', 'save-project'),
        item('Save project as…', 'save-project-as'),
        sep,
        item('Export report…', 'export-report'),
        item('Print the brief…', 'print-brief'),
        ...(opts.isMac ? [] : [sep, { role: 'quit' } as MenuItemConstructorOptions]),
      ],
    },
    {
      label: '&Edit',
      submenu: [item('Undo', 'undo'), item('Redo', 'redo'), sep, { role: 'cut' }, { role: 'copy' }, { role: 'paste' }, { role: 'selectAll' }],
    },
    {
      label: '&View',
      submenu: [
        { role: 'resetZoom' }, { role: 'zoomIn' }, { role: 'zoomOut' }, sep, { role: 'togglefullscreen' },
        ...(opts.devTools ? [sep, { role: 'toggleDevTools' } as MenuItemConstructorOptions] : []),
      ],
    },
    ...(opts.isMac ? [{ role: 'windowMenu' } as MenuItemConstructorOptions] : []),
    { label: '&Help', submenu: [item('Guide', 'guide'), ...(opts.isMac ? [] : [item(`About ${opts.appName}`, 'about')])] },
  );
  return template;
}
