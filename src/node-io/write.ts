/**
 * The one atomic writer for the CLI and the desktop shell. Whatever happens (crash, kill, full disk), the target
 * holds either its old content or the complete new one:
 *  1. symbolic links are resolved first, so saving through a link updates the file it points to and keeps the
 *     link (a link owned by another user is not followed: in a shared folder it may have been planted);
 *  2. the new content goes to a temporary file with a random name in the target's folder, created exclusively
 *     (O_CREAT|O_EXCL, 'wx'), which never follows a link planted at that name;
 *  3. it gets the existing file's permission bits, is written whole and flushed (fsync);
 *  4. it is renamed over the target (atomic on POSIX and NTFS), and the folder is flushed so the rename itself
 *     survives a power cut (without the flushes a power cut can persist the rename before the data).
 * A target that is one of the run's input files is refused before anything is written.
 */
import { randomBytes } from 'node:crypto';
import { closeSync, existsSync, fchmodSync, fsyncSync, lstatSync, mkdirSync, openSync, readdirSync, readlinkSync, renameSync, statSync, unlinkSync, writeSync } from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';
import { InputError } from '../diagnostics/index.ts';
import { errnoCode, fileError } from './errors.ts';
import type { FileIdentity } from './read.ts';

export interface AtomicWriteOptions {
  /** Files this run read: the write is refused when the target is one of them (same file on disk). */
  inputs?: readonly FileIdentity[];
  /** Called after the temp file is written and synced, before the rename (tests simulate a crash here). */
  beforeRename?: (tmpPath: string) => void;
}

export const TMP_SUFFIX = '.roundwise-tmp';
/** Longest part of the target's name kept in the temp name, so the temp name stays within 255 bytes. */
const NAME_PART = 100;
const MAX_LINKS = 40;
const TEMP_ATTEMPTS = 8;

const tempPrefix = (target: string) => `.${basename(target).slice(0, NAME_PART)}.`;

/**
 * The file a write to `path` really replaces: `path` itself, or what its chain of symbolic links points to (a link
 * to a file that does not exist yet creates that file, as any editor does). The folders on the way may be links.
 */
export function resolveWriteTarget(path: string): string {
  let p = resolve(path);
  for (let hops = 0; hops < MAX_LINKS; hops++) {
    let st;
    try {
      st = lstatSync(p);
    } catch (err) {
      if (errnoCode(err) === 'ENOENT') return p; // a new file (its folder is created on write)
      throw fileError(err, 'write', path);
    }
    if (!st.isSymbolicLink()) return p;
    const uid = process.getuid?.();
    if (uid !== undefined && st.uid !== uid && st.uid !== 0) {
      throw new InputError('write-failed', 'is a symbolic link owned by another user; it is not followed and nothing was written', { file: path });
    }
    p = resolve(dirname(p), readlinkSync(p));
  }
  throw fileError(Object.assign(new Error('ELOOP'), { code: 'ELOOP' }), 'write', path);
}

/** The input among `inputs` that `target` (already resolved) is, if any: same device and inode. */
export function sameFileAs(target: string, inputs: readonly FileIdentity[]): FileIdentity | undefined {
  if (!inputs.length) return undefined;
  let st;
  try {
    st = statSync(target);
  } catch {
    return undefined; // does not exist yet: cannot be an input
  }
  return inputs.find((f) => f.dev === st.dev && f.ino === st.ino);
}

/** Refuse to write over a file this run read (the message names both). */
export function refuseInputOverwrite(path: string, inputs: readonly FileIdentity[]): void {
  const hit = sameFileAs(resolveWriteTarget(path), inputs);
  if (hit) {
    throw new InputError('output-is-input', `is the input file ${hit.path}; nothing was written (choose another output folder or name)`, { file: path });
  }
}

function openTemp(dir: string, target: string, mode: number): { tmp: string; fd: number } {
  for (let attempt = 1; ; attempt++) {
    const tmp = join(dir, `${tempPrefix(target)}${randomBytes(8).toString('hex')}${TMP_SUFFIX}`);
    try {
      return { tmp, fd: openSync(tmp, 'wx', mode) };
    } catch (err) {
      // EEXIST: something (perhaps a planted link) holds that name; never open it, draw another name.
      if (errnoCode(err) !== 'EEXIST' || attempt >= TEMP_ATTEMPTS) throw err;
    }
  }
}

/**
 * The folder and any missing parents, one level at a time. Node's own `recursive: true` loops for ever where mkdir
 * answers ENOENT although the parent exists (a folder asked for under /proc): a hang instead of a message.
 */
function makeFolders(dir: string): void {
  const missing: string[] = [];
  for (let d = dir; !existsSync(d); d = dirname(d)) {
    missing.push(d);
    if (dirname(d) === d) break;
  }
  for (const d of missing.reverse()) {
    try {
      mkdirSync(d);
    } catch (err) {
      if (errnoCode(err) !== 'EEXIST') throw err; // made meanwhile by another run: as good
    }
  }
}

/** Write `data` to `path` atomically (see the module comment). Failures are located InputErrors ('write-failed'). */
export function writeFileAtomic(path: string, data: string | Uint8Array, opts: AtomicWriteOptions = {}): void {
  const target = resolveWriteTarget(path);
  if (opts.inputs) refuseInputOverwrite(path, opts.inputs);
  const dir = dirname(target);
  let tmp: string | undefined;
  try {
    makeFolders(dir);
    let mode: number | undefined;
    try {
      const st = statSync(target);
      if (st.isDirectory()) throw Object.assign(new Error('EISDIR'), { code: 'EISDIR' });
      if (!st.isFile()) throw new InputError('write-failed', 'is not a regular file (a device, pipe or socket); it was not replaced', { file: path });
      mode = st.mode & 0o7777;
    } catch (err) {
      if (errnoCode(err) !== 'ENOENT') throw err;
    }
    const opened = openTemp(dir, target, mode ?? 0o666);
    tmp = opened.tmp;
    const fd = opened.fd;
    try {
      // open() applies the umask; the existing file's bits are restored exactly.
      if (mode !== undefined) fchmodSync(fd, mode);
      const buf = typeof data === 'string' ? Buffer.from(data, 'utf8') : data;
      let off = 0;
      while (off < buf.length) off += writeSync(fd, buf, off, buf.length - off);
      fsyncSync(fd);
    } finally {
      closeSync(fd);
    }
    opts.beforeRename?.(tmp);
    renameSync(tmp, target);
  } catch (err) {
    if (tmp !== undefined) {
      try {
        unlinkSync(tmp);
      } catch {
        // already gone
      }
    }
    throw fileError(err, 'write', path);
  }
  syncFolder(dir);
}

function syncFolder(dir: string): void {
  if (process.platform === 'win32') return; // folders cannot be opened for fsync on Windows; NTFS journals the rename
  try {
    const fd = openSync(dir, 'r');
    try {
      fsyncSync(fd);
    } finally {
      closeSync(fd);
    }
  } catch {
    // some file systems refuse fsync on a folder; the rename has happened either way
  }
}

/** Remove temp files left beside `target` by writes that were interrupted (a crash between write and rename). */
export function removeStaleTemps(dir: string, target: string): number {
  let removed = 0;
  try {
    for (const f of readdirSync(dir)) {
      if (f.startsWith(tempPrefix(target)) && f.endsWith(TMP_SUFFIX)) {
        unlinkSync(join(dir, f));
        removed++;
      }
    }
  } catch {
    // folder missing or unreadable: nothing to clean
  }
  return removed;
}
