// Makes the bundle's code cache (code-cache.mjs): run by bundle.mjs in a child process (its output discarded) as
// `node train-code-cache.mjs BUNDLE ARGS_JSON`, under the CLI's V8 flags; runs the CLI's main on each argument list
// in ARGS_JSON (commands on the invented sample data), then stores the bytecode of everything they compiled.
import { loadBundle } from './code-cache.mjs';
import { setCliFlags } from './v8-flags.mjs';

setCliFlags();
const [bundle, runs] = [process.argv[2], JSON.parse(process.argv[3])];
const loaded = loadBundle(bundle, { useCache: false });
for (const args of runs) {
  const code = await loaded.exports.main(args);
  if (code !== 0) throw new Error(`roundwise ${args.join(' ')} exited with ${code}`);
}
loaded.saveCache();
