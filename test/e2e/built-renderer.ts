/**
 * The renderer as shipped, for the e2e suite and the bench: built as `npm run build` builds it (the real renderer
 * config), into a temporary folder, and served as static files on a free port of 127.0.0.1; `close` stops the server
 * and deletes the folder. A built app loads in a few requests where the dev server answers hundreds per page.
 *
 * The server listens at once and holds each request until the build is done (`ready`), so the e2e suite's global
 * setup returns at once and the engine tests run while Vite builds (the sequencer in vitest.config.ts runs the e2e
 * files last). A failed build answers every request with 500 and the build's message, which `ready` also rejects with.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { readFile } from 'node:fs/promises';
import { createServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { extname, join, normalize, sep } from 'node:path';
import { build } from 'vite';
import { REPO } from './harness.ts';

/** Content types of what the build writes (a module script needs a JavaScript type; WebAssembly streaming needs its own). */
const TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8', '.js': 'text/javascript; charset=utf-8', '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8', '.json': 'application/json', '.wasm': 'application/wasm', '.svg': 'image/svg+xml',
  '.png': 'image/png', '.ico': 'image/x-icon', '.woff2': 'font/woff2', '.woff': 'font/woff', '.ttf': 'font/ttf',
  '.csv': 'text/csv; charset=utf-8', '.txt': 'text/plain; charset=utf-8',
};

export interface BuiltRenderer {
  url: string;
  /** Settles when the build is done (rejects with its error). */
  ready: Promise<void>;
  close(): Promise<void>;
}

/** `minify: false` keeps function names readable in CPU profiles (the profiling scripts in test/bench). */
export async function serveBuiltRenderer(opts: { minify?: boolean } = {}): Promise<BuiltRenderer> {
  const configFile = join(REPO, 'renderer', 'vite.config.ts');
  const outDir = mkdtempSync(join(tmpdir(), 'roundwise-built-'));
  const ready = build({ configFile, logLevel: 'error', build: { outDir, emptyOutDir: true, reportCompressedSize: false, ...(opts.minify === false ? { minify: false } : {}) } })
    .then(() => undefined);
  ready.catch(() => {}); // reported to each request and to whoever awaits `ready`
  const server = createServer((req, res) => {
    ready.then(async () => {
      const path = decodeURIComponent(new URL(req.url ?? '/', 'http://x').pathname);
      const file = normalize(join(outDir, path.endsWith('/') ? `${path}index.html` : path));
      if (!file.startsWith(outDir + sep)) { res.writeHead(403).end(); return; }
      const body = await readFile(file).catch(() => null);
      if (body === null) { res.writeHead(404).end(); return; }
      res.writeHead(200, { 'content-type': TYPES[extname(file)] ?? 'application/octet-stream', 'cache-control': 'no-cache' }).end(body);
    }, (e: unknown) => {
      res.writeHead(500, { 'content-type': 'text/plain; charset=utf-8' }).end(`the renderer's build failed: ${String(e)}`);
    }).catch(() => res.destroy());
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}/`,
    ready,
    async close() {
      await ready.catch(() => {});
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      rmSync(outDir, { recursive: true, force: true });
    },
  };
}
