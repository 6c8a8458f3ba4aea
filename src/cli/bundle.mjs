// Bundles the batch CLI into dist/cli/ (run by `npm install` through the `prepare` script, or `npm run build:cli`).
// Why: loading the TypeScript sources through tsx costs about 0.3 s at every start; the bundle starts in about 0.1 s,
// which is most of a county-sized job. The launcher (roundwise.mjs) uses the bundle only while it is newer than
// every source file it was built from (listed in dist/cli/sources.txt, so the launcher stats those files instead of
// walking src/), and falls back to tsx otherwise, so a stale or missing bundle is never run.
// Never fails an install: on any error it says so in one line and the launcher keeps using tsx.
import { copyFileSync, mkdirSync, rmSync, writeFileSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const out = join(here, '..', '..', 'dist', 'cli');

// The PDF and XLSX libraries are imported on first use (src/deliverables), so they go into chunks of their own that
// only a run writing a brief or a workbook loads; fontkit's brotli decoder (WOFF2 only; the brief embeds TrueType)
// is replaced by a stub. Old chunks are removed first, as their names carry content hashes.
const noWoff2 = {
  name: 'no-woff2',
  setup(b) {
    b.onResolve({ filter: /^brotli\/decompress(\.js)?$/ }, () => ({ path: join(here, '..', 'deliverables', 'no-woff2.ts') }));
  },
};

// zod is loaded on first use (zod-on-demand.mjs replaces src/schema/zod.ts in the bundle): most runs never need it.
const zodOnDemand = {
  name: 'zod-on-demand',
  setup(b) {
    const configured = join(here, '..', 'schema', 'zod.ts');
    b.onResolve({ filter: /^\.\/zod\.ts$/ }, (args) => (args.kind === 'import-statement' && join(args.resolveDir, args.path) === configured ? { path: join(here, 'zod-on-demand.mjs') } : undefined));
  },
};

try {
  const { build } = await import('esbuild');
  rmSync(join(out, 'chunks'), { recursive: true, force: true });
  mkdirSync(out, { recursive: true });
  const result = await build({
    entryPoints: [join(here, 'main.ts'), join(here, 'draw-engine.ts')],
    outdir: out,
    outExtension: { '.js': '.mjs' },
    entryNames: '[name]',
    chunkNames: 'chunks/[name]-[hash]',
    splitting: true,
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    logLevel: 'warning',
    plugins: [noWoff2, zodOnDemand],
    metafile: true,
  });
  // zod, configured as src/schema/zod.ts does, as one CommonJS file beside the output that holds zod-on-demand.mjs.
  const [lazyOut] = Object.entries(result.metafile.outputs).find(([, o]) => Object.keys(o.inputs).some((i) => i.endsWith('zod-on-demand.mjs'))) ?? [];
  if (lazyOut === undefined) throw new Error('zod-on-demand.mjs is in no output');
  const zod = await build({
    entryPoints: [join(here, '..', 'schema', 'zod.ts')], outfile: join(dirname(resolve(lazyOut)), 'zod.cjs'),
    bundle: true, platform: 'node', format: 'cjs', target: 'node20', logLevel: 'warning', metafile: true,
  });
  copyFileSync(join(here, 'parallel-worker.mjs'), join(out, 'parallel-worker.mjs'));
  copyFileSync(join(here, 'draw-worker.mjs'), join(out, 'draw-worker.mjs'));
  // The sources the bundle was built from, relative to src/ (esbuild's inputs are relative to the working folder).
  // A new source file matters only once an existing one imports it, and that edit makes the importer newer.
  const srcDir = join(here, '..');
  const sources = [...Object.keys(result.metafile.inputs), ...Object.keys(zod.metafile.inputs)]
    .map((input) => relative(srcDir, resolve(input)))
    .filter((p) => !p.startsWith('..') && !p.includes(':'));
  sources.push(relative(srcDir, join(here, 'parallel-worker.mjs')), relative(srcDir, join(here, 'draw-worker.mjs')), relative(srcDir, join(here, 'roundwise.mjs')));
  writeFileSync(join(out, 'sources.txt'), [...new Set(sources)].sort().join('\n') + '\n');
} catch (e) {
  console.warn(`roundwise: CLI bundle not built (${e instanceof Error ? e.message.split('\n')[0] : e}); the CLI runs from source through tsx`);
}
