// The `roundwise` launcher: the bundle built by `npm install` (src/cli/bundle.mjs) must give exactly what the
// TypeScript sources give, and is used only while it is newer than the sources (common practice, no source: the
// reference is the project's own source run through tsx).
import { describe, it, expect, beforeAll } from 'vitest';
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, statSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('../../..', import.meta.url));
const bin = 'src/cli/roundwise.mjs';

function run(env: Record<string, string>, ...args: string[]) {
  return spawnSync(process.execPath, [bin, ...args], { cwd: root, env: { ...process.env, ...env }, encoding: 'utf8' });
}

describe('roundwise launcher', () => {
  beforeAll(() => { execFileSync(process.execPath, ['src/cli/bundle.mjs'], { cwd: root }); }, 60_000);

  it('builds the bundle', () => {
    expect(existsSync(`${root}/dist/cli/main.mjs`)).toBe(true);
    expect(existsSync(`${root}/dist/cli/parallel-worker.mjs`)).toBe(true);
    expect(statSync(`${root}/dist/cli/main.mjs`).size).toBeGreaterThan(10_000);
  });

  it('bundle and sources print the same analysis and the same refusal', () => {
    const fromBundle = run({}, 'analyze', 'sample-data/fernhollow-county.csv', '--json');
    const fromSource = run({ ROUNDWISE_FROM_SOURCE: '1' }, 'analyze', 'sample-data/fernhollow-county.csv', '--json');
    expect(fromBundle.status).toBe(0);
    expect(fromSource.status).toBe(0);
    expect(fromBundle.stdout).toBe(fromSource.stdout);
    const badB = run({}, 'scenario', 'sample-data/fernhollow-county.csv', '--shock', 'test/fixtures/scenario/shock-unknown.csv');
    const badS = run({ ROUNDWISE_FROM_SOURCE: '1' }, 'scenario', 'sample-data/fernhollow-county.csv', '--shock', 'test/fixtures/scenario/shock-unknown.csv');
    expect(badB.status).toBe(2);
    expect(badB.status).toBe(badS.status);
    expect(badB.stderr).toBe(badS.stderr);
  }, 60_000);
});
