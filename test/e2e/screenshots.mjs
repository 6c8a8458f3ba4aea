// `npm run screenshots`: the end-to-end suite with its screenshots (test-output/screenshots/*.png, 1280×800), which
// `npm test` leaves out (harness.ts `shot`). Extra arguments go to vitest, e.g. a file: `npm run screenshots -- test/e2e/app.test.ts`.
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';

const vitest = fileURLToPath(new URL('../../node_modules/vitest/vitest.mjs', import.meta.url));
const r = spawnSync(process.execPath, [vitest, 'run', '--project', 'e2e', ...process.argv.slice(2)], {
  stdio: 'inherit', env: { ...process.env, ROUNDWISE_SCREENSHOTS: '1' },
});
process.exit(r.status ?? 1);
