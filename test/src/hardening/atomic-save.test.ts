/**
 * Interrupted saves, for the one atomic writer (src/node-io, which the CLI and the desktop shell both use): a
 * writer killed between write and rename, killed at random moments of a large write, or failing half-way with a full
 * disk leaves the previous file byte for byte as it was; a link planted at the temporary name is never followed.
 * The writer runs in a child process (test/fixtures/hardening/atomic-child.ts, bundled once by esbuild so that each
 * child starts in plain Node in tens of milliseconds instead of compiling TypeScript) so that it can really be killed.
 */
import { execFile } from 'node:child_process';
import { lstatSync, mkdtempSync, readdirSync, readFileSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { build } from 'esbuild';

const CHILD = fileURLToPath(new URL('../../fixtures/hardening/atomic-child.ts', import.meta.url));
const dir = mkdtempSync(join(tmpdir(), 'roundwise-atomic-'));
const bundled = join(dir, 'atomic-child.mjs');
beforeAll(async () => {
  await build({ entryPoints: [CHILD], outfile: bundled, bundle: true, platform: 'node', format: 'esm', target: 'node20', logLevel: 'silent' });
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const OLD = '{"format":"roundwise-project","version":2,"name":"previous save"}\n';

interface Run {
  code: number | null;
  signal: NodeJS.Signals | null;
  stdout: string;
}

/** Run the child writer; `killAfterMs` kills it from outside (SIGKILL) after that long. */
function runChild(target: string, fault: string, size: number, fill: string, killAfterMs?: number): Promise<Run> {
  return new Promise((resolve) => {
    const child = execFile(process.execPath, [bundled, target, fault, String(size), fill], (_err, stdout) => {
      resolve({ code: child.exitCode, signal: child.signalCode, stdout: String(stdout) });
    });
    if (killAfterMs !== undefined) setTimeout(() => child.kill('SIGKILL'), killAfterMs);
  });
}

function fresh(name: string): string {
  const target = join(dir, name);
  writeFileSync(target, OLD);
  return target;
}

const temporaries = (name: string) => readdirSync(dir).filter((f) => f.startsWith(`.${name}.`));

describe('interrupted saves leave the previous file intact', () => {
  it('an uninterrupted save replaces the file whole and leaves no temporary file', async () => {
    const target = fresh('ok.json');
    const r = await runChild(target, 'none', 100_000, 'a');
    expect(r.stdout).toBe('saved\n');
    expect(readFileSync(target, 'utf8')).toBe('a'.repeat(100_000));
    expect(temporaries('ok.json')).toEqual([]);
  });

  it('a writer killed between write and rename: the previous file is unchanged', async () => {
    const target = fresh('killed.json');
    const r = await runChild(target, 'kill-before-rename', 100_000, 'b');
    expect(r.signal).toBe('SIGKILL');
    expect(readFileSync(target, 'utf8')).toBe(OLD);
    // The complete new content is left in a temporary file beside it; the next save still works.
    const next = await runChild(target, 'none', 10, 'c');
    expect(next.stdout).toBe('saved\n');
    expect(readFileSync(target, 'utf8')).toBe('cccccccccc');
  });

  it('a writer killed at any moment of a large write: the file is the previous one or the new one, whole', async () => {
    const target = fresh('random.json');
    const size = 40_000_000;
    const seen = new Set<string>();
    // Delays spread from before the write starts to after it ends (the child starts in some 50 ms, then builds and
    // writes 40 MB).
    for (const delay of [20, 60, 100, 150, 220, 320, 500]) {
      const before = readFileSync(target, 'utf8');
      const fill = delay % 2 ? 'd' : 'e';
      const r = await runChild(target, 'none', size, fill, delay);
      const after = readFileSync(target, 'utf8');
      const whole = after === before || after === fill.repeat(size);
      expect(whole, `after a kill at ${delay} ms (${r.signal ?? r.code}) the file has ${after.length} characters`).toBe(true);
      seen.add(r.signal ?? 'finished');
    }
    expect(seen.has('SIGKILL')).toBe(true);
  }, 60_000);

  it('a disk that fills half-way through the write: the previous file is unchanged and no temporary file is left', async () => {
    const target = fresh('full.json');
    const r = await runChild(target, 'enospc-midway', 100_000, 'f');
    expect(r.stdout).toBe('failed: write-failed\n');
    expect(readFileSync(target, 'utf8')).toBe(OLD);
    expect(temporaries('full.json')).toEqual([]);
  });
});

describe('the temporary file cannot be hijacked', () => {
  it('a link planted at the temporary name is not followed: its target and the file being saved stay unchanged', async () => {
    const target = fresh('planted.json');
    const victim = join(dir, 'victim.txt');
    writeFileSync(victim, 'not yours');
    // With the random part fixed at zeros, the writer's temporary name is known in advance: plant a link there.
    const planted = join(dir, `.planted.json.${'0'.repeat(16)}.roundwise-tmp`);
    symlinkSync(victim, planted);
    const r = await runChild(target, 'fixed-random', 1000, 'g');
    expect(r.stdout).toBe('failed: write-failed\n');
    expect(readFileSync(victim, 'utf8')).toBe('not yours');
    expect(readFileSync(target, 'utf8')).toBe(OLD);
    expect(lstatSync(planted).isSymbolicLink()).toBe(true);
  });
});
