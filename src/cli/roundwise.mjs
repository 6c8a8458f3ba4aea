#!/usr/bin/env node
// Entry of the `roundwise` batch CLI. Runs the bundle in dist/cli/ (built by `npm install`, see bundle.mjs) while it
// is newer than every file under src/; otherwise loads the TypeScript sources through tsx, so an edit is never
// shadowed by an old bundle.
import { readdirSync, statSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const src = join(here, '..');
const bundle = join(src, '..', 'dist', 'cli', 'main.mjs');

function bundleIsFresh() {
  let built;
  try {
    built = statSync(bundle).mtimeMs;
  } catch {
    return false;
  }
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
  const { register } = await import('tsx/esm/api');
  register();
  ({ main } = await import('./main.ts'));
}
process.exitCode = await main(process.argv.slice(2));
