// The code cache's own atomic write (code-cache.mjs writeCacheAtomic, the steps of src/node-io/write.ts): a saved
// cache loads as used, nothing but the cache is left beside the bundle, and a failed write leaves no temp file and
// no cache. (The project's own rules: common practice, no source.)
import { describe, it, expect, beforeEach, afterEach } from 'vitest';
import { mkdirSync, mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { cacheFileOf, loadBundle } from '../../../src/cli/code-cache.mjs';

let dir: string;
beforeEach(() => { dir = mkdtempSync(join(tmpdir(), 'rw-code-cache-')); });
afterEach(() => rmSync(dir, { recursive: true, force: true }));

/** A small CommonJS "bundle" with a function worth caching. */
function bundle(): string {
  const file = join(dir, 'main.cjs');
  writeFileSync(file, 'exports.sum = function (n) { let s = 0; for (let i = 0; i < n; i++) s += i; return s; };\n');
  return file;
}

describe('saving the code cache', () => {
  it('writes the cache under its own name only (no temp left), and the next load uses it', () => {
    const b = bundle();
    const first = loadBundle(b);
    expect(first.cache).toBe('none');
    expect((first.exports as { sum: (n: number) => number }).sum(10)).toBe(45);
    first.saveCache();
    expect(readdirSync(dir).sort()).toEqual(['main.cjs', 'main.cjs.cache']);
    expect(loadBundle(b).cache).toBe('used');
  });

  it('a write that fails (a folder holds the cache\'s name) is passed on, leaving no temp file and no cache', () => {
    const b = bundle();
    mkdirSync(cacheFileOf(b));
    writeFileSync(join(cacheFileOf(b), 'keep'), '');
    const loaded = loadBundle(b);
    expect(() => loaded.saveCache()).toThrow();
    expect(readdirSync(dir).sort()).toEqual(['main.cjs', 'main.cjs.cache']);
    expect(readdirSync(cacheFileOf(b))).toEqual(['keep']);
    expect(loadBundle(b).cache).toBe('none');
  });
});
