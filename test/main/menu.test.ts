// The native menu: every command reachable, accelerators identical to the browser bridge's table
// (src/bridge/shortcuts.ts); platform conventions (app menu on macOS, Quit under File elsewhere) are common practice, no source.
import { describe, it, expect } from 'vitest';
import type { MenuItemConstructorOptions } from 'electron';
import { menuTemplate } from '../../main/menu.ts';
import { SHORTCUTS } from '../../src/bridge/shortcuts.ts';
import { MENU_COMMANDS } from '../../src/bridge/ipc.ts';
import type { MenuCommand } from '../../src/bridge/contract.ts';

function flatten(items: MenuItemConstructorOptions[]): MenuItemConstructorOptions[] {
  return items.flatMap((i) => [i, ...(Array.isArray(i.submenu) ? flatten(i.submenu) : [])]);
}

function clickAll(isMac: boolean): { sent: MenuCommand[]; items: MenuItemConstructorOptions[] } {
  const sent: MenuCommand[] = [];
  const items = flatten(menuTemplate((c) => sent.push(c), { isMac, appName: 'Roundwise', devTools: false }));
  for (const i of items) if (i.click) (i.click as () => void)();
  return { sent, items };
}

describe('menu template', () => {
  for (const isMac of [false, true]) {
    it(`sends every menu command exactly once (${isMac ? 'macOS' : 'Windows/Linux'})`, () => {
      const { sent } = clickAll(isMac);
      expect([...sent].sort()).toEqual([...MENU_COMMANDS].sort());
    });
  }
  it('uses the shared accelerators', () => {
    const { items } = clickAll(false);
    for (const s of SHORTCUTS) {
      const item = items.find((i) => i.accelerator === s.accelerator);
      expect(item, s.accelerator).toBeDefined();
    }
  });
  it('offers devtools only when enabled', () => {
    const roles = (devTools: boolean) => flatten(menuTemplate(() => undefined, { isMac: false, appName: 'R', devTools })).map((i) => i.role);
    expect(roles(false)).not.toContain('toggleDevTools');
    expect(roles(true)).toContain('toggleDevTools');
  });
  it('has no reload item (it would discard the open project)', () => {
    const roles = flatten(menuTemplate(() => undefined, { isMac: false, appName: 'R', devTools: true })).map((i) => i.role);
    expect(roles).not.toContain('reload');
    expect(roles).not.toContain('forceReload');
  });
});
