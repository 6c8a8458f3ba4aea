// `npm run check`: lint and both type-checks at once (they are independent; on two cores this takes about the time
// of the slowest). Each tool's output is printed whole when it ends, so the three never interleave; the exit code is
// non-zero when any of them fails. ESLint and tsc keep caches in node_modules/.cache/roundwise, so a warm checkout
// re-checks only what changed.
// `npm test` is `node test/check.mjs --with-tests`: the same checks while vitest runs every project, its output
// streamed as it comes. Vitest alone keeps about one of the two cores busy on average (the e2e files mostly wait for
// the browser), so the checks cost almost no extra time beside it.
import { spawn } from 'node:child_process';

const jobs = [
  ['lint', 'npm run --silent lint'],
  ['type-check (engine: no DOM, no Node)', 'tsc --noEmit -p src/tsconfig.json'],
  ['type-check (everything, vue-tsc)', 'vue-tsc --noEmit -p tsconfig.json'],
];
const withTests = process.argv.includes('--with-tests');

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

function tests() {
  return new Promise((resolve) => {
    const child = spawn('vitest run', { shell: true, stdio: 'inherit' });
    child.on('close', (code) => resolve(code));
  });
}

const results = await Promise.all([...jobs.map(checkJob), ...(withTests ? [tests()] : [])]);
if (withTests) process.stdout.write(`checks and tests finished in ${seconds()} s\n`);
process.exitCode = results.every((code) => code === 0) ? 0 : 1;
