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

// Libraries loaded on first use: each stand-in (*-on-demand.mjs) takes the place of an import in the bundle and
// `require`s the library, built as one CommonJS file beside the output that holds the stand-in, when first used.
// zod (with src/schema/zod.ts's setting) serves only project files and role maps; ml-matrix only the spectrum of a
// small table written with --out. Compiling them at every start was most of the CLI's start-up (test/bench).
const ON_DEMAND = [
  { importPath: './zod.ts', importedFile: join(here, '..', 'schema', 'zod.ts'), standIn: 'zod-on-demand.mjs', entry: join(here, '..', 'schema', 'zod.ts'), file: 'zod.cjs' },
  { importPath: 'ml-matrix', importedFile: null, standIn: 'ml-matrix-on-demand.mjs', entry: 'ml-matrix', file: 'ml-matrix.cjs' },
];
const onDemand = {
  name: 'on-demand',
  setup(b) {
    for (const d of ON_DEMAND) {
      const filter = new RegExp(`^${d.importPath.replace(/[.\/]/g, (c) => `\\${c}`)}$`);
      b.onResolve({ filter }, (args) => (args.kind === 'import-statement' && !args.importer.endsWith(d.standIn) && (d.importedFile === null || join(args.resolveDir, args.path) === d.importedFile)
        ? { path: join(here, d.standIn) } : undefined));
    }
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
    plugins: [noWoff2, onDemand],
    metafile: true,
  });
  const libraryInputs = [];
  for (const d of ON_DEMAND) {
    const [holder] = Object.entries(result.metafile.outputs).find(([, o]) => Object.keys(o.inputs).some((i) => i.endsWith(d.standIn))) ?? [];
    if (holder === undefined) throw new Error(`${d.standIn} is in no output`);
    const lib = await build({
      entryPoints: [d.entry], outfile: join(dirname(resolve(holder)), d.file),
      bundle: true, platform: 'node', format: 'cjs', target: 'node20', logLevel: 'warning', metafile: true,
    });
    libraryInputs.push(...Object.keys(lib.metafile.inputs));
  }
  copyFileSync(join(here, 'parallel-worker.mjs'), join(out, 'parallel-worker.mjs'));
  copyFileSync(join(here, 'draw-worker.mjs'), join(out, 'draw-worker.mjs'));
  // The sources the bundle was built from, relative to src/ (esbuild's inputs are relative to the working folder).
  // A new source file matters only once an existing one imports it, and that edit makes the importer newer.
  const srcDir = join(here, '..');
  const sources = [...Object.keys(result.metafile.inputs), ...libraryInputs]
    .map((input) => relative(srcDir, resolve(input)))
    .filter((p) => !p.startsWith('..') && !p.includes(':'));
  sources.push(relative(srcDir, join(here, 'parallel-worker.mjs')), relative(srcDir, join(here, 'draw-worker.mjs')), relative(srcDir, join(here, 'roundwise.mjs')));
  writeFileSync(join(out, 'sources.txt'), [...new Set(sources)].sort().join('\n') + '\n');
} catch (e) {
  console.warn(`roundwise: CLI bundle not built (${e instanceof Error ? e.message.split('\n')[0] : e}); the CLI runs from source through tsx`);
}
