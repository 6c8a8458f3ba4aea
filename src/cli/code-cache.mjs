// Loads the CLI bundle (dist/cli/main.cjs, one CommonJS file: bundle.mjs) through V8's code cache: the bytecode of
// the functions a typical run compiles, made once by bundle.mjs (train-code-cache.mjs) and stored beside the bundle,
// so a run neither parses the 0.65 MB bundle nor compiles those functions again (README "Performance", sixth CLI
// round). Node 20 has no module compile cache, and V8 caches classic scripts only, hence the CommonJS bundle run
// as a vm.Script. The cache is used only when it is whole and was made from these very bytes (SHA-256 of both in its
// header: V8's own check compares only the source's length), and V8 itself refuses one made by another V8 or under
// other flags; in every other case the bundle is compiled as if there were none. Same bundle, same run either way.
import { isAscii } from 'node:buffer';
import { createHash, randomBytes } from 'node:crypto';
import { closeSync, fsyncSync, openSync, readFileSync, renameSync, unlinkSync, writeSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname } from 'node:path';
import { pathToFileURL } from 'node:url';
import { Script } from 'node:vm';

/** What `import.meta.url` becomes in the CommonJS bundle (bundle.mjs `define`): the bundle's file URL, passed in. */
export const IMPORT_META_URL = '__importMetaUrl';

const MAGIC = Buffer.from('roundwise V8 code cache 1\n');
const DIGEST = 32;

function sha256(bytes) {
  return createHash('sha256').update(bytes).digest();
}

export function cacheFileOf(bundle) {
  return `${bundle}.cache`;
}

/** The cached data for the bundle whose bytes have SHA-256 `digest`, or undefined (missing, another build's, damaged). */
function cachedDataFor(bundle, digest) {
  let file;
  try {
    file = readFileSync(cacheFileOf(bundle));
  } catch {
    return undefined;
  }
  const m = MAGIC.length;
  if (file.length <= m + 2 * DIGEST || !file.subarray(0, m).equals(MAGIC) || !file.subarray(m, m + DIGEST).equals(digest)) return undefined;
  const data = file.subarray(m + 2 * DIGEST);
  return sha256(data).equals(file.subarray(m + DIGEST, m + 2 * DIGEST)) ? data : undefined;
}

/**
 * Writes the cache file atomically, by the steps of the project's one atomic writer (src/node-io/write.ts): a temp
 * file with a random name in the same folder, created exclusively ('wx': never follows a link planted at that name),
 * written whole and flushed, renamed over the target, then the folder flushed so the rename survives a power cut.
 * This file cannot import that writer: it is plain JavaScript run before the bundle is loaded, also in an installed
 * package, which has no TypeScript loader. On any failure the temp file is removed and the error passed on (bundle.mjs
 * then warns and the CLI runs without a cache; a reader never sees a partial file either way).
 */
function writeCacheAtomic(file, data) {
  const tmp = `${file}.${randomBytes(8).toString('hex')}.tmp`;
  let fd;
  try {
    fd = openSync(tmp, 'wx', 0o644);
    let off = 0;
    while (off < data.length) off += writeSync(fd, data, off, data.length - off);
    fsyncSync(fd);
    closeSync(fd);
    fd = undefined;
    renameSync(tmp, file);
  } catch (err) {
    if (fd !== undefined) closeSync(fd);
    try { unlinkSync(tmp); } catch { /* never made, or already gone */ }
    throw err;
  }
  if (process.platform === 'win32') return; // folders cannot be opened for fsync on Windows; NTFS journals the rename
  try {
    const dir = openSync(dirname(file), 'r');
    try { fsyncSync(dir); } finally { closeSync(dir); }
  } catch {
    // some file systems refuse fsync on a folder; the rename has happened either way
  }
}

/**
 * Runs the bundle's top level and returns its exports, with `cache`: 'used', 'rejected' (by V8) or 'none' (no
 * usable file, or `useCache` false), and `saveCache()`, which writes the cache of everything compiled so far
 * (atomically: a reader sees the old file or the new one; writeCacheAtomic).
 */
export function loadBundle(bundle, { useCache = true } = {}) {
  const bytes = readFileSync(bundle);
  const digest = sha256(bytes);
  const cachedData = useCache ? cachedDataFor(bundle, digest) : undefined;
  // The module wrapper on the bundle's first line, so line numbers in stack traces are the file's.
  // ASCII (bundle.mjs makes it so) is its own Latin-1 text, decoded without UTF-8's checks into a one-byte string.
  const source = `(function (exports, require, module, __filename, __dirname, ${IMPORT_META_URL}) {${bytes.toString(isAscii(bytes) ? 'latin1' : 'utf8')}\n})`;
  const script = new Script(source, { filename: bundle, ...(cachedData ? { cachedData } : {}) });
  const module = { exports: {} };
  script.runInThisContext()(module.exports, createRequire(bundle), module, bundle, dirname(bundle), pathToFileURL(bundle).href);
  return {
    exports: module.exports,
    cache: cachedData === undefined ? 'none' : script.cachedDataRejected ? 'rejected' : 'used',
    saveCache() {
      const data = script.createCachedData();
      writeCacheAtomic(cacheFileOf(bundle), Buffer.concat([MAGIC, digest, sha256(data), data]));
    },
  };
}
