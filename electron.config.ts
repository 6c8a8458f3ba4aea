/**
 * The single place for the desktop build: entry points, window defaults and packaging targets.
 * (Filled in by the desktop shell work; see main/.)
 */
export const electronConfig = {
  appId: 'app.roundwise.desktop',
  productName: 'Roundwise',
  entries: { main: 'main/index.ts', preload: 'main/preload.ts', renderer: 'renderer/index.html' },
  window: { width: 1280, height: 800, minWidth: 960, minHeight: 600 },
  packaging: { targets: ['AppImage', 'dmg', 'nsis'] },
} as const;
