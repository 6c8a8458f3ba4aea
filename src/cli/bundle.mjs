// Bundles the batch CLI into dist/cli/ (run by `npm install` through the `prepare` script, or `npm run build:cli`).
// Why: loading the TypeScript sources through tsx costs about 0.3 s at every start; the bundle starts in about 0.1 s,
// which is most of a county-sized job. The CLI is one CommonJS file, main.cjs, with V8's code cache of a typical run
// beside it (main.cjs.cache, made last by train-code-cache.mjs; code-cache.mjs loads both); the draw helper threads'
// engine is an ES module, draw-engine.mjs. The launcher (roundwise.mjs) uses the bundle only while it is newer than
// every source file it was built from (listed in dist/cli/sources.txt, so the launcher stats those files instead of
// walking src/), and falls back to tsx otherwise, so a stale or missing bundle is never run.
// Never fails an install: on any error it says so in one line and the launcher keeps using tsx (without a code
// cache, the bundle is compiled as usual).
import { spawnSync } from 'node:child_process';
import { copyFileSync, mkdirSync, rmSync, writeFileSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { cacheFileOf, IMPORT_META_URL } from './code-cache.mjs';

const here = dirname(fileURLToPath(import.meta.url));
const out = join(here, '..', '..', 'dist', 'cli');

// fontkit's brotli decoder (WOFF2 only; the brief embeds TrueType) is replaced by a stub.
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

// The libraries of the brief and the workbook, imported on first use (src/deliverables): built as CommonJS files of
// their own beside main.cjs, which `require`s one when first asked for it (its dynamic imports become requires), so
// a run that writes neither never reads them. Inlined they doubled main.cjs and its code cache (a 500-sector analyze
// 55 ms slower).
const LAZY_LIBRARIES = [
  { importPath: '@cantoo/pdf-lib', file: 'pdf-lib.cjs' },
  { importPath: '@cantoo/fontkit', file: 'fontkit.cjs' },
  { importPath: 'write-excel-file/universal', file: 'write-excel-file.cjs' },
];
const lazyLibraries = {
  name: 'lazy-libraries',
  setup(b) {
    for (const l of LAZY_LIBRARIES) {
      b.onResolve({ filter: new RegExp(`^${l.importPath.replace(/[.\/]/g, (c) => `\\${c}`)}$`) }, (args) => (args.kind === 'dynamic-import' ? { path: l.file, namespace: 'lazy-library' } : undefined));
    }
    // The import becomes an ES module that re-exports the file's exports, default included: outside a "type": "module"
    // package, so esbuild's interop reads the file's ES-module marker as the ES build of the library meant it.
    b.onLoad({ filter: /.*/, namespace: 'lazy-library' }, (args) => ({ contents: `export * from './${args.path}';\nexport { default } from './${args.path}';\n`, loader: 'js', resolveDir: here }));
    b.onResolve({ filter: /\.cjs$/, namespace: 'lazy-library' }, (args) => ({ path: args.path, external: true }));
  },
};

// What the code cache is made from (train-code-cache.mjs): commands on the invented sample data that go through the
// import, the analysis, a scenario with paths and the JSON, i.e. what a typical run compiles.
const sample = (f) => join(here, '..', '..', 'sample-data', f);
const TRAINING = [
  ['analyze', sample('fernhollow-county.csv'), '--json'],
  ['scenario', sample('fernhollow-county.csv'), '--shock', sample('fernhollow-food-plant.csv'), '--paths', 'Farming', '--json'],
];

try {
  const { build } = await import('esbuild');
  // Old outputs first: chunk names carry content hashes, and a cache must never outlive its bundle.
  for (const old of ['chunks', 'main.mjs', 'main.cjs', cacheFileOf('main.cjs')]) rmSync(join(out, old), { recursive: true, force: true });
  mkdirSync(out, { recursive: true });
  const common = { bundle: true, platform: 'node', target: 'node20', logLevel: 'warning', metafile: true };
  // The CLI: one CommonJS file, so that it can be run as a script with V8's code cache (code-cache.mjs).
  const cli = await build({
    ...common,
    entryPoints: [join(here, 'main.ts')],
    outfile: join(out, 'main.cjs'),
    format: 'cjs',
    // ASCII without comments or indentation (names kept): a third less to read, and a one-byte string for V8
    // (code-cache.mjs decodes it as Latin-1 when it is ASCII).
    charset: 'ascii',
    minifyWhitespace: true,
    define: { 'import.meta.url': IMPORT_META_URL },
    supported: { 'dynamic-import': false },
    plugins: [noWoff2, onDemand, lazyLibraries],
  });
  // The draw helper threads' engine (draw-worker.mjs imports it), an ES module as before.
  const drawEngine = await build({
    ...common,
    entryPoints: [join(here, 'draw-engine.ts')],
    outdir: out,
    outExtension: { '.js': '.mjs' },
    entryNames: '[name]',
    chunkNames: 'chunks/[name]-[hash]',
    splitting: true,
    format: 'esm',
    plugins: [noWoff2, onDemand],
  });
  const libraryInputs = [];
  for (const d of ON_DEMAND) {
    const holders = [cli, drawEngine].flatMap((r) => Object.entries(r.metafile.outputs).filter(([, o]) => Object.keys(o.inputs).some((i) => i.endsWith(d.standIn))).map(([f]) => f));
    if (holders.length === 0) throw new Error(`${d.standIn} is in no output`);
    for (const holder of new Set(holders.map((h) => dirname(resolve(h))))) {
      const lib = await build({ ...common, entryPoints: [d.entry], outfile: join(holder, d.file), format: 'cjs' });
      libraryInputs.push(...Object.keys(lib.metafile.inputs));
    }
  }
  for (const l of LAZY_LIBRARIES) {
    const lib = await build({ ...common, entryPoints: [l.importPath], outfile: join(out, l.file), format: 'cjs', conditions: ['import'], mainFields: ['module', 'main'], plugins: [noWoff2] });
    libraryInputs.push(...Object.keys(lib.metafile.inputs));
  }
  copyFileSync(join(here, 'parallel-worker.mjs'), join(out, 'parallel-worker.mjs'));
  copyFileSync(join(here, 'draw-worker.mjs'), join(out, 'draw-worker.mjs'));
  // The sources the bundle was built from, relative to src/ (esbuild's inputs are relative to the working folder).
  // A new source file matters only once an existing one imports it, and that edit makes the importer newer.
  const srcDir = join(here, '..');
  const sources = [...Object.keys(cli.metafile.inputs), ...Object.keys(drawEngine.metafile.inputs), ...libraryInputs]
    .map((input) => relative(srcDir, resolve(input)))
    .filter((p) => !p.startsWith('..') && !p.includes(':'));
  for (const f of ['parallel-worker.mjs', 'draw-worker.mjs', 'roundwise.mjs', 'freshness.mjs', 'code-cache.mjs', 'v8-flags.mjs']) sources.push(relative(srcDir, join(here, f)));
  writeFileSync(join(out, 'sources.txt'), [...new Set(sources)].sort().join('\n') + '\n');
  // The code cache last, from the finished bundle; without it the launcher compiles the bundle as usual.
  const trained = spawnSync(process.execPath, [join(here, 'train-code-cache.mjs'), join(out, 'main.cjs'), JSON.stringify(TRAINING)], { stdio: ['ignore', 'ignore', 'pipe'], encoding: 'utf8', timeout: 120_000 });
  if (trained.status !== 0) console.warn(`roundwise: CLI code cache not made (${(trained.stderr ?? '').trim().split('\n').pop() || trained.error?.message || `status ${trained.status}`}); the CLI runs without it`);
} catch (e) {
  console.warn(`roundwise: CLI bundle not built (${e instanceof Error ? e.message.split('\n')[0] : e}); the CLI runs from source through tsx`);
}
