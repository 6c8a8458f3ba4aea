// The `roundwise` launcher: the bundle built by `npm install` (src/cli/bundle.mjs) must give exactly what the
// TypeScript sources give, and is used only while it is newer than the sources, or always in an installed package
// (common practice, no source: the reference is the project's own source run through tsx).
import { describe, it, expect, beforeAll } from 'vitest';
import { execFileSync, spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { closeSync, copyFileSync, existsSync, openSync, mkdirSync, mkdtempSync, readFileSync, rmSync, statSync, utimesSync, writeFileSync, cpSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { runCli } from '../../support/cli.ts';
import { bundleIsFresh } from '../../../src/cli/freshness.mjs';

const root = fileURLToPath(new URL('../../..', import.meta.url));
const bin = 'src/cli/roundwise.mjs';

/** An installed package's CLI under `pkg`: the whole bundle folder (main.cjs, its code cache, the workers, the
 * libraries loaded on first use) and the launcher's own files. */
function installedCopy(pkg: string): void {
  mkdirSync(join(pkg, 'src', 'cli'), { recursive: true });
  mkdirSync(join(pkg, 'dist', 'cli'), { recursive: true });
  cpSync(join(root, 'dist', 'cli'), join(pkg, 'dist', 'cli'), { recursive: true });
  for (const f of ['roundwise.mjs', 'freshness.mjs', 'code-cache.mjs', 'v8-flags.mjs']) copyFileSync(join(root, 'src', 'cli', f), join(pkg, 'src', 'cli', f));
}

function run(env: Record<string, string>, ...args: string[]) {
  return spawnSync(process.execPath, [bin, ...args], { cwd: root, env: { ...process.env, ...env }, encoding: 'utf8' });
}

/** The bundle's `analyze --json` of the sample, through the launcher: run once, the reference of several tests. */
let sampleRun: ReturnType<typeof run> | undefined;
const sampleAnalysis = () => (sampleRun ??= run({}, 'analyze', 'sample-data/fernhollow-county.csv', '--json'));

/**
 * `npm install` builds the bundle (the `prepare` script); it is built again here only when the launcher would not run
 * it, or when the build's own scripts changed since (2–3 core-seconds saved on a fresh clone's `npm test`).
 */
function bundleNeedsBuild(): boolean {
  const bundle = join(root, 'dist', 'cli', 'main.cjs');
  if (!bundleIsFresh(bundle, join(root, 'src'), false)) return true;
  const cache = statSync(`${bundle}.cache`, { throwIfNoEntry: false });
  return cache === undefined || ['bundle.mjs', 'train-code-cache.mjs'].some((f) => statSync(join(root, 'src', 'cli', f)).mtimeMs > cache.mtimeMs);
}

describe('roundwise launcher', () => {
  beforeAll(() => { if (bundleNeedsBuild()) execFileSync(process.execPath, ['src/cli/bundle.mjs'], { cwd: root }); }, 60_000);

  it('has the bundle, its code cache and the workers, newer than every source they were built from', () => {
    expect(bundleNeedsBuild()).toBe(false);
    expect(existsSync(`${root}/dist/cli/main.cjs`)).toBe(true);
    expect(existsSync(`${root}/dist/cli/parallel-worker.mjs`)).toBe(true);
    expect(statSync(`${root}/dist/cli/main.cjs`).size).toBeGreaterThan(10_000);
    expect(statSync(`${root}/dist/cli/main.cjs.cache`).size).toBeGreaterThan(10_000);
  });

  it('bundle and sources print the same analysis and the same refusal', async () => {
    const fromBundle = sampleAnalysis();
    const fromSource = run({ ROUNDWISE_FROM_SOURCE: '1' }, 'analyze', 'sample-data/fernhollow-county.csv', '--json');
    expect(fromBundle.status).toBe(0);
    expect(fromSource.status).toBe(0);
    expect(fromBundle.stdout).toBe(fromSource.stdout);
    // The refusal from the sources run in this process (the launcher's way to the sources is the run above: each
    // run through tsx compiles the CLI again, about 3 core-seconds).
    const badB = run({}, 'scenario', 'sample-data/fernhollow-county.csv', '--shock', 'test/fixtures/scenario/shock-unknown.csv');
    const badS = await runCli(['scenario', 'sample-data/fernhollow-county.csv', '--shock', 'test/fixtures/scenario/shock-unknown.csv']);
    expect(badB.status).toBe(2);
    expect(badB.status).toBe(badS.code);
    expect(badB.stderr).toBe(badS.err);
  }, 60_000);

  it('a checkout runs its bundle only while no source it was built from is newer (the list in dist/cli/sources.txt)', () => {
    // A copy outside node_modules and without tsx: a stale bundle is then refused in one line instead of run.
    const dir = mkdtempSync(join(tmpdir(), 'rw-checkout-'));
    try {
      cpSync(join(root, 'src'), join(dir, 'src'), { recursive: true });
      cpSync(join(root, 'dist', 'cli'), join(dir, 'dist', 'cli'), { recursive: true });
      const listed = readFileSync(join(dir, 'dist', 'cli', 'sources.txt'), 'utf8').split('\n').filter((l) => l !== '');
      expect(listed).toContain('cli/main.ts');
      expect(listed).toContain('linalg/lu.ts');
      const now = Date.now() / 1000;
      utimesSync(join(dir, 'dist', 'cli', 'main.cjs'), now, now);
      const launch = () => spawnSync(process.execPath, [join(dir, bin), '--help'], { cwd: dir, encoding: 'utf8' });
      const stale = 'roundwise: internal error: the CLI bundle is older than the sources and tsx is not installed to run the sources: rebuild it with `npm run build:cli` in the source folder\n';
      for (const p of listed) utimesSync(join(dir, 'src', p), now - 60, now - 60);
      expect(launch().status).toBe(0);
      // A file the bundle was not built from (not imported by any of its sources) does not make it stale.
      writeFileSync(join(dir, 'src', 'cli', 'unused-note.ts'), '// not imported\n');
      utimesSync(join(dir, 'src', 'cli', 'unused-note.ts'), now + 60, now + 60);
      expect(launch().status).toBe(0);
      // An edited source does, and so does a deleted one.
      utimesSync(join(dir, 'src', 'linalg', 'lu.ts'), now + 60, now + 60);
      expect(launch()).toMatchObject({ status: 70, stderr: stale });
      utimesSync(join(dir, 'src', 'linalg', 'lu.ts'), now - 60, now - 60);
      expect(launch().status).toBe(0);
      rmSync(join(dir, 'src', 'model', 'rounds.ts'));
      expect(launch()).toMatchObject({ status: 70, stderr: stale });
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  }, 60_000);

  it('an installed package (unpacked under node_modules, without tsx) runs its bundle whatever the file times', () => {
    // npm gives unpacked files the time of unpacking, so a source file may look newer than the bundle.
    const dir = mkdtempSync(join(tmpdir(), 'rw-installed-'));
    try {
      const pkg = join(dir, 'node_modules', 'roundwise');
      mkdirSync(join(pkg, 'src', 'cli'), { recursive: true });
      mkdirSync(join(pkg, 'dist', 'cli'), { recursive: true });
      installedCopy(pkg);
      writeFileSync(join(pkg, 'src', 'cli', 'main.ts'), '// unpacked after the bundle\n');
      const later = new Date(Date.now() + 60_000);
      utimesSync(join(pkg, 'src', 'cli', 'main.ts'), later, later);
      const launch = () => spawnSync(process.execPath, [join(pkg, bin), 'analyze', join(root, 'sample-data', 'fernhollow-county.csv'), '--json'], { cwd: dir, encoding: 'utf8' });
      const ok = launch();
      expect(ok.stderr).toBe('');
      expect(ok.status).toBe(0);
      expect(ok.stdout).toBe(sampleAnalysis().stdout);
      // Without the bundle, and without tsx to run the sources: one line saying how to rebuild, and the internal-error
      // status of main.ts (70; exit 1 is a usage error, README "Exit status").
      rmSync(join(pkg, 'dist', 'cli', 'main.cjs'));
      const missing = launch();
      expect(missing.status).toBe(70);
      expect(missing.stdout).toBe('');
      expect(missing.stderr).toBe('roundwise: internal error: the CLI bundle (dist/cli/main.cjs) is missing and tsx is not installed to run the sources: rebuild it with `npm run build:cli` in the source folder\n');
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  }, 60_000);
  it('runs the same with a good, missing, stale, damaged or refused code cache (only the time differs)', () => {
    const dir = mkdtempSync(join(tmpdir(), 'rw-cache-'));
    try {
      const pkg = join(dir, 'node_modules', 'roundwise');
      installedCopy(pkg);
      const bundle = join(pkg, 'dist', 'cli', 'main.cjs');
      const cache = `${bundle}.cache`;
      const good = readFileSync(cache);
      const args = ['analyze', join(root, 'sample-data', 'fernhollow-county.csv'), '--json'];
      const launch = (flags: string[] = []) => spawnSync(process.execPath, [...flags, join(pkg, bin), ...args], { cwd: dir, encoding: 'utf8' });
      // The launcher's own steps for an installed package (V8 flags, then the bundle through code-cache.mjs), in one
      // process: what the CLI prints with the cache as it is now, and how the loader fared with it (used, rejected
      // by V8, or none) on the last line of stderr. One process per case instead of a probe and a launch.
      const loadAndRun = (flags: string[] = []) => spawnSync(process.execPath, [...flags, '--input-type=module', '-e',
        `import { loadBundle } from ${JSON.stringify(pathToFileURL(join(pkg, 'src', 'cli', 'code-cache.mjs')).href)};
         import { setCliFlags } from ${JSON.stringify(pathToFileURL(join(pkg, 'src', 'cli', 'v8-flags.mjs')).href)};
         setCliFlags(); const { exports, cache } = loadBundle(${JSON.stringify(bundle)});
         process.exitCode = await exports.main(${JSON.stringify(args)}); process.stderr.write('code cache: ' + cache);`], { cwd: dir, encoding: 'utf8' });
      const want = sampleAnalysis().stdout;
      const same = (cache: 'used' | 'rejected' | 'none', flags: string[] = []) => {
        const r = loadAndRun(flags);
        expect(r.stderr).toBe(`code cache: ${cache}`);
        expect(r.status).toBe(0);
        expect(r.stdout).toBe(want);
      };
      const launchSame = () => {
        const r = launch();
        expect(r.stderr).toBe('');
        expect(r.status).toBe(0);
        expect(r.stdout).toBe(want);
      };
      same('used');
      launchSame();
      // Other V8 flags than the cache was made under: V8 refuses it.
      same('rejected', ['--stack-size=900']);
      // Damaged: a byte of the data flipped, or cut short; another build's (the bundle changed since); not there.
      const flipped = Buffer.from(good);
      flipped[flipped.length - 100] = flipped[flipped.length - 100]! ^ 0xff;
      for (const bytes of [flipped, good.subarray(0, good.length >> 1), good.subarray(0, 20)]) {
        writeFileSync(cache, bytes);
        same('none');
      }
      // Garbage with a header that matches it: not V8's format, refused by V8 itself.
      const garbage = Buffer.alloc(4096, 7);
      const head = good.subarray(0, good.indexOf(10) + 1);
      writeFileSync(cache, Buffer.concat([head, good.subarray(head.length, head.length + 32), createHash('sha256').update(garbage).digest(), garbage]));
      same('rejected');
      writeFileSync(cache, good);
      writeFileSync(bundle, Buffer.concat([readFileSync(bundle), Buffer.from('\n// another build\n')]));
      same('none');
      rmSync(cache);
      same('none');
      launchSame();
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  }, 60_000);
  it.runIf(existsSync('/dev/full'))('ends with the commands\' status, and never as a success when its output could not be written', () => {
    // The launcher leaves as soon as stdout and stderr have flushed; a stream that failed must still fail the run.
    const args = [bin, 'analyze', 'sample-data/fernhollow-county.csv', '--json'];
    const full = openSync('/dev/full', 'w');
    try {
      const r = spawnSync(process.execPath, args, { cwd: root, stdio: ['ignore', full, 'pipe'], encoding: 'utf8' });
      // As a refused write: exit 2 and one line in the one error table's words, no stack trace.
      expect(r.status).toBe(2);
      expect(r.stderr).toBe('roundwise analyze: standard output: cannot write: the disk is full\n');
    } finally {
      closeSync(full);
    }
    // A reader that stops early (`… | head`) closes the pipe: the run ends quietly with its own status.
    // (`true` has exited before the run writes: its write meets a closed pipe, EPIPE. stderr and the status go to
    // bash's own stdout, fd 3.)
    const piped = spawnSync('bash', ['-c', 'exec 3>&1; "$0" "$@" 2>&3 | true; echo "status ${PIPESTATUS[0]}"', process.execPath, ...args], { cwd: root, encoding: 'utf8' });
    expect(piped.stdout).toBe('status 0\n');
    expect(sampleAnalysis().status).toBe(0);
    expect(run({}, 'analyze', 'no-such-table.csv').status).toBe(2);
  }, 60_000);
});

