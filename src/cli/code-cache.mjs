// Loads the CLI bundle (dist/cli/main.cjs, one CommonJS file: bundle.mjs) through V8's code cache: the bytecode of
// the functions a typical run compiles, made once by bundle.mjs (train-code-cache.mjs) and stored beside the bundle,
// so a run neither parses the 0.65 MB bundle nor compiles those functions again (README "Performance", sixth CLI
// round). Node 20 has no module compile cache, and V8 caches classic scripts only, hence the CommonJS bundle run
// as a vm.Script. The cache is used only when it is whole and was made from these very bytes (SHA-256 of both in its
// header: V8's own check compares only the source's length), and V8 itself refuses one made by another V8 or under
// other flags; in every other case the bundle is compiled as if there were none. Same bundle, same run either way.
import { isAscii } from 'node:buffer';
import { createHash } from 'node:crypto';
import { readFileSync, renameSync, writeFileSync } from 'node:fs';
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
 * Runs the bundle's top level and returns its exports, with `cache`: 'used', 'rejected' (by V8) or 'none' (no
 * usable file, or `useCache` false), and `saveCache()`, which writes the cache of everything compiled so far
 * (atomically: a reader sees the old file or the new one).
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
      const file = cacheFileOf(bundle);
      const tmp = `${file}.${process.pid}.tmp`;
      writeFileSync(tmp, Buffer.concat([MAGIC, digest, sha256(data), data]));
      renameSync(tmp, file);
    },
  };
}
