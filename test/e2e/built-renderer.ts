/**
 * The renderer as shipped, for the e2e suite and the bench: built as `npm run build` builds it (the real renderer
 * config), into a temporary folder, and served by Vite's preview server on a free port of 127.0.0.1; `close` stops the
 * server and deletes the folder. A built app loads in a few requests where the dev server answers hundreds per page.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { build, preview } from 'vite';
import { REPO } from './harness.ts';

/** `minify: false` keeps function names readable in CPU profiles (the profiling scripts in test/bench). */
export async function serveBuiltRenderer(opts: { minify?: boolean } = {}): Promise<{ url: string; close(): Promise<void> }> {
  const configFile = join(REPO, 'renderer', 'vite.config.ts');
  const outDir = mkdtempSync(join(tmpdir(), 'roundwise-built-'));
  await build({ configFile, logLevel: 'error', build: { outDir, emptyOutDir: true, reportCompressedSize: false, ...(opts.minify === false ? { minify: false } : {}) } });
  const server = await preview({ configFile, logLevel: 'error', build: { outDir }, preview: { port: 0, strictPort: false } });
  const url = server.resolvedUrls?.local[0];
  if (!url) throw new Error('the preview server did not report a URL');
  return {
    url,
    async close() {
      await server.close();
      rmSync(outDir, { recursive: true, force: true });
    },
  };
}
