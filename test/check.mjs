// `npm run check`: lint and both type-checks at once (they are independent; on two cores this takes about the time
// of the slowest). Each tool's output is printed whole when it ends, so the three never interleave; the exit code is
// non-zero when any of them fails. ESLint and tsc keep caches in node_modules/.cache/roundwise, so a warm checkout
// re-checks only what changed.
// `npm test` runs the tests alone (vitest); CI (.ci/run) runs this check and then the tests.
import { spawn } from 'node:child_process';

const jobs = [
  ['lint', 'npm run --silent lint'],
  ['type-check (engine: no DOM, no Node)', 'tsc --noEmit -p src/tsconfig.json'],
  ['type-check (everything, vue-tsc)', 'vue-tsc --noEmit -p tsconfig.json'],
];

const started = Date.now();
const seconds = () => ((Date.now() - started) / 1000).toFixed(1);

function checkJob([name, command]) {
  return new Promise((resolve) => {
    const child = spawn(command, { shell: true, stdio: ['ignore', 'pipe', 'pipe'] });
    let output = '';
    child.stdout.on('data', (d) => { output += d; });
    child.stderr.on('data', (d) => { output += d; });
    child.on('close', (code) => {
      process.stdout.write(`${code === 0 ? 'ok  ' : 'FAIL'} ${name} (${seconds()} s)\n${output.trim() ? `${output.trimEnd()}\n` : ''}`);
      resolve(code);
    });
  });
}

const results = await Promise.all(jobs.map(checkJob));
process.exitCode = results.every((code) => code === 0) ? 0 : 1;
