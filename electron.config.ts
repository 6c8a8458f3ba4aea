/**
 * The single place for the desktop build: entry points, build outputs, window defaults, the app's own origin,
 * the vetted external links and packaging targets. Read by main/ (window, protocol, navigation rules) and by
 * main/launch.ts (what to build and run).
 */
export const electronConfig = {
  appId: 'app.roundwise.desktop',
  productName: 'Roundwise',
  /** Sources, relative to the repository root. */
  entries: { main: 'main/index.ts', preload: 'main/preload.ts', renderer: 'renderer/index.html', rendererConfig: 'renderer/vite.config.ts' },
  /** Build outputs (gitignored), relative to the repository root. Main is ESM, the sandboxed preload must be CommonJS. */
  outputs: { dir: 'dist', renderer: 'dist/renderer', main: 'dist/main/index.mjs', preload: 'dist/main/preload.cjs' },
  /** The packaged UI is served from this privileged custom scheme only (never file:// or the network). */
  origin: { scheme: 'app', host: 'roundwise' },
  window: { width: 1280, height: 800, minWidth: 960, minHeight: 600, backgroundColor: '#ffffff', title: 'Roundwise' },
  /**
   * Links the app may hand to the system browser (shell.openExternal): https only, exact host, path prefix.
   * Everything else a page tries to open or navigate to is refused.
   */
  externalLinks: [{ host: 'doi.org', pathPrefix: '/' }],
  packaging: { targets: ['AppImage', 'dmg', 'nsis'], files: ['dist/**', 'package.json'] },
} as const;

export type ElectronConfig = typeof electronConfig;
