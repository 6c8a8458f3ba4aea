// The CLI bundle's stand-in for src/schema/zod.ts (bundle.mjs puts it in its place): the same configured `z`, loaded
// on first use instead of at start-up. zod is half of what the CLI would load, and compiling and running it was most
// of the CLI's start-up (about 0.1 s of CPU a run, test/bench); only project files, role maps and supply–use maps need
// it, and their schemas are built on first use (src/project/schema.ts). bundle.mjs builds src/schema/zod.ts with zod
// into zod.cjs beside the bundle file that holds this module. Bundle-only: never run from source.
import { createRequire } from 'node:module';

const require = createRequire(import.meta.url);
let loaded;

export const z = new Proxy({}, { get: (_target, key) => (loaded ??= require('./zod.cjs').z)[key] });
