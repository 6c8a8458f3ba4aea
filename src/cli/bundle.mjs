// Bundles the batch CLI into dist/cli/ (run by `npm install` through the `prepare` script, or `npm run build:cli`).
// Why: loading the TypeScript sources through tsx costs about 0.3 s at every start; the bundle starts in about 0.1 s,
// which is most of a county-sized job. The launcher (roundwise.mjs) uses the bundle only while it is newer than
// every source file, and falls back to tsx otherwise, so a stale or missing bundle is never run.
// Never fails an install: on any error it says so in one line and the launcher keeps using tsx.
import { copyFileSync, mkdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const out = join(here, '..', '..', 'dist', 'cli');

try {
  const { build } = await import('esbuild');
  mkdirSync(out, { recursive: true });
  await build({
    entryPoints: [join(here, 'main.ts')],
    outfile: join(out, 'main.mjs'),
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    logLevel: 'warning',
  });
  copyFileSync(join(here, 'parallel-worker.mjs'), join(out, 'parallel-worker.mjs'));
} catch (e) {
  console.warn(`roundwise: CLI bundle not built (${e instanceof Error ? e.message.split('\n')[0] : e}); the CLI runs from source through tsx`);
}
