#!/usr/bin/env node
// Entry of the `roundwise` batch CLI. Runs the bundle in dist/cli/ (built by `npm install`, see bundle.mjs) while it
// is newer than every file under src/; otherwise loads the TypeScript sources through tsx (a development dependency,
// present in a checkout), so an edit is never shadowed by an old bundle. An installed package runs the bundle it ships.
import { existsSync, readdirSync, statSync } from 'node:fs';
import { dirname, join, sep } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const src = join(here, '..');
const bundle = join(src, '..', 'dist', 'cli', 'main.mjs');

// An installed package (unpacked under node_modules) ships sources and bundle from one build, but npm gives unpacked
// files the time of unpacking, so their modification times say nothing there.
const installed = here.split(sep).includes('node_modules');

function bundleIsFresh() {
  let built;
  try {
    built = statSync(bundle).mtimeMs;
  } catch {
    return false;
  }
  if (installed) return true;
  for (const entry of readdirSync(src, { recursive: true })) {
    const path = join(src, String(entry));
    if (/\.(ts|mjs|json)$/.test(path) && statSync(path).mtimeMs > built) return false;
  }
  return true;
}

let main;
if (process.env.ROUNDWISE_FROM_SOURCE !== '1' && bundleIsFresh()) {
  ({ main } = await import(pathToFileURL(bundle).href));
} else {
  // tsx is a development dependency: a checkout has it, an installed package runs the bundle it ships.
  const tsx = await import('tsx/esm/api').catch(() => null);
  if (!tsx) {
    const why = existsSync(bundle) ? 'the CLI bundle is older than the sources' : 'the CLI bundle (dist/cli/main.mjs) is missing';
    process.stderr.write(process.env.ROUNDWISE_FROM_SOURCE === '1'
      ? 'roundwise: ROUNDWISE_FROM_SOURCE=1 needs tsx (a development dependency), which is not installed: unset it, or run `npm install` in the source folder\n'
      : `roundwise: ${why}, and tsx (a development dependency) is not installed to run the sources: run \`npm install\` in the source folder (it builds the bundle), or \`npm run build:cli\`\n`);
    process.exit(1);
  }
  tsx.register();
  ({ main } = await import('./main.ts'));
}
process.exitCode = await main(process.argv.slice(2));
