/**
 * The one reader for every file the product reads (tables, shock files, role maps, employment, totals, groups,
 * projects, the recovery copy): regular files only, and never more than the one size limit in memory.
 *
 * The file is opened non-blocking and checked on the open descriptor (fstat), so a FIFO cannot block the open and
 * a file swapped after a path check cannot slip through; /dev/zero, FIFOs, sockets and folders are refused. The
 * size is checked before a byte is read, and the read itself stops one byte past the limit, because a size can lie
 * (files under /proc report 0, a file can grow while it is read).
 */
import { closeSync, constants, fstatSync, openSync, readSync } from 'node:fs';
import { InputError } from '../diagnostics/index.ts';
import { fileTooLarge, MAX_OPEN_BYTES } from '../bridge/files.ts';
import { fileError } from './errors.ts';

/** Largest file read into memory: the product's one limit (src/bridge/files.ts), the same for every file. */
export const MAX_INPUT_BYTES = MAX_OPEN_BYTES;

/** Which file on disk a read came from, so that a later write can refuse to replace it. */
export interface FileIdentity {
  /** The path as the user gave it (for messages). */
  path: string;
  dev: number;
  ino: number;
}

export interface ReadFile extends FileIdentity {
  bytes: Buffer;
}

export interface ReadOptions {
  maxBytes?: number;
  /** The name used in messages (default: the path as given). */
  shownAs?: string;
  /**
   * Where to read a file of `bytes` (its stated size plus one): a caller's memory of at least that length, or null for a
   * buffer of the reader's own. A file that turns out longer than it stated moves to a buffer of the reader's own.
   */
  into?: (bytes: number) => Uint8Array | null;
}

// Windows has no O_NONBLOCK (and no FIFOs in the file system to block on).
const OPEN_FLAGS = constants.O_RDONLY | (constants.O_NONBLOCK ?? 0);

function tooLarge(size: number, max: number, file: string, exact: boolean): InputError {
  // A size that lied (a /proc file, a growing file) is only known to exceed the limit.
  return fileTooLarge(size, file, exact ? 'nothing was read' : 'it holds more than its stated size; nothing was kept', max);
}

/** Read a whole regular file under the size limit (see the module comment). */
export function readFileLimited(path: string, opts: ReadOptions = {}): ReadFile {
  const max = opts.maxBytes ?? MAX_INPUT_BYTES;
  const file = opts.shownAs ?? path;
  let fd: number;
  try {
    fd = openSync(path, OPEN_FLAGS);
  } catch (err) {
    throw fileError(err, 'read', file);
  }
  try {
    const st = fstatSync(fd);
    if (st.isDirectory()) throw new InputError('not-a-file', 'is a folder, not a file', { file });
    if (!st.isFile()) throw new InputError('not-a-file', 'is not a regular file (a device, pipe or socket); nothing was read', { file });
    if (st.size > max) throw tooLarge(st.size, max, file, true);
    // One byte more than the stated size, to notice a file that is longer than it says.
    const want = Math.min(st.size, max) + 1;
    const given = opts.into?.(want) ?? null;
    let buf = given !== null && given.length >= want ? Buffer.from(given.buffer, given.byteOffset, want) : Buffer.allocUnsafe(want);
    let got = 0;
    for (;;) {
      if (got === buf.length) {
        if (got > max) throw tooLarge(got, max, file, false);
        const grown = Buffer.allocUnsafe(Math.min(max + 1, Math.max(buf.length * 2, 64 * 1024)));
        buf.copy(grown, 0, 0, got);
        buf = grown;
      }
      const n = readSync(fd, buf, got, buf.length - got, null);
      if (n === 0) break;
      got += n;
    }
    return { path, dev: st.dev, ino: st.ino, bytes: got === buf.length ? buf : buf.subarray(0, got) };
  } catch (err) {
    throw fileError(err, 'read', file);
  } finally {
    closeSync(fd);
  }
}
