#!/usr/bin/env node
// Entry of the `roundwise` batch CLI. Runs the bundle in dist/cli/ (built by `npm install`, see bundle.mjs) while it
// is newer than every source file it was built from; otherwise loads the TypeScript sources through tsx (a development
// dependency, present in a checkout), so an edit is never shadowed by an old bundle. An installed package runs the
// bundle it ships.
import { existsSync } from 'node:fs';
import { dirname, join, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import { loadBundle } from './code-cache.mjs';
import { bundleIsFresh } from './freshness.mjs';
import { setCliFlags } from './v8-flags.mjs';

setCliFlags();

const here = dirname(fileURLToPath(import.meta.url));
const src = join(here, '..');
const bundle = join(src, '..', 'dist', 'cli', 'main.cjs');

// An installed package: unpacked under node_modules (freshness.mjs).
const installed = here.split(sep).includes('node_modules');

let main;
let outputStreamFailed;
if (process.env.ROUNDWISE_FROM_SOURCE !== '1' && bundleIsFresh(bundle, src, installed)) {
  // Through its code cache when there is a good one (code-cache.mjs).
  ({ main, outputStreamFailed } = loadBundle(bundle).exports);
} else {
  // tsx is a development dependency: a checkout has it, an installed package runs the bundle it ships.
  const tsx = await import('tsx/esm/api').catch(() => null);
  if (!tsx) {
    const why = existsSync(bundle) ? 'the CLI bundle is older than the sources' : 'the CLI bundle (dist/cli/main.cjs) is missing';
    // Not a usage error (exit 1) nor refused input (2): the installation is broken, so the internal-error code of
    // main.ts (EXIT.internal, 70), in one line saying how to mend it.
    process.stderr.write(process.env.ROUNDWISE_FROM_SOURCE === '1'
      ? 'roundwise: internal error: ROUNDWISE_FROM_SOURCE=1 needs tsx (a development dependency), which is not installed: unset it, or run `npm install` in the source folder\n'
      : `roundwise: internal error: ${why} and tsx is not installed to run the sources: rebuild it with \`npm run build:cli\` in the source folder\n`);
    process.exit(70);
  }
  tsx.register();
  ({ main, outputStreamFailed } = await import('./main.ts'));
}
// A closed pipe or a full disk behind stdout or stderr: a line or a quiet end, never a stack trace (main.ts).
for (const [stream, name] of [[process.stdout, 'standard output'], [process.stderr, 'standard error']]) {
  stream.on('error', (err) => {
    const { message, code: status } = outputStreamFailed(err, name, process.argv.slice(2), process.exitCode ?? 0);
    if (message && stream !== process.stderr) process.stderr.write(message);
    process.exit(status);
  });
}
const code = await main(process.argv.slice(2));
process.exitCode = code;
// Out as soon as stdout and stderr have taken everything written (their callbacks): Node's own way out, once the event
// loop is empty, also tears the heap and the environment down first, about 11 ms of a 500-sector run (paired runs,
// README "Performance", sixth CLI round). Everything a command writes to files is written before main returns. A
// stream that failed (a closed pipe, a full disk) never calls back here: its 'error' handler above ends the run.
let streams = 2;
const flushed = (err) => { if (err) streams = -1; else if (--streams === 0) process.exit(code); };
process.stdout.write('', flushed);
process.stderr.write('', flushed);
