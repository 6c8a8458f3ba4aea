/**
 * Builds what the desktop app runs, with Vite's JS API and the entries of electron.config.ts:
 * the renderer (renderer/vite.config.ts) to dist/renderer, the main process to an ESM bundle and the sandboxed
 * preload to a CommonJS bundle (a sandboxed preload can only `require('electron')`, so everything else is inlined).
 */
import { build, type InlineConfig } from 'vite';
import { basename, dirname, resolve } from 'node:path';
import { electronConfig } from '../electron.config.ts';

function nodeBundle(root: string, entry: string, outFile: string, format: 'es' | 'cjs'): InlineConfig {
  return {
    configFile: false,
    root,
    logLevel: 'error',
    publicDir: false,
    // Bundle every dependency (zod, the engine) so the output needs nothing but Electron and Node at run time.
    ssr: { noExternal: true, target: 'node' },
    build: {
      ssr: resolve(root, entry),
      outDir: resolve(root, dirname(outFile)),
      emptyOutDir: false,
      target: 'node22',
      minify: false,
      sourcemap: false,
      copyPublicDir: false,
      rolldownOptions: {
        external: ['electron', /^node:/],
        output: { format, entryFileNames: basename(outFile) },
      },
    },
  };
}

export async function buildShell(root: string): Promise<void> {
  const { entries, outputs } = electronConfig;
  await build(nodeBundle(root, entries.main, outputs.main, 'es'));
  await build(nodeBundle(root, entries.preload, outputs.preload, 'cjs'));
}

export async function buildRenderer(root: string): Promise<void> {
  const { entries, outputs } = electronConfig;
  await build({
    configFile: resolve(root, entries.rendererConfig),
    logLevel: 'error',
    build: { outDir: resolve(root, outputs.renderer), emptyOutDir: true },
  });
}

export async function buildDesktop(root: string): Promise<void> {
  await buildRenderer(root);
  await buildShell(root);
}
