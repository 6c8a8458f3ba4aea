/**
 * Files on disk for the desktop shell: atomic writes, size-limited reads, the recent-projects list and the
 * crash-recovery copy in the user-data folder. Node only (no Electron), so test/main exercises it on a temp folder.
 */
import { closeSync, fsyncSync, openSync, readFileSync, renameSync, statSync, unlinkSync, writeSync, mkdirSync, readdirSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { randomBytes } from 'node:crypto';
import { InputError } from '../src/diagnostics/index.ts';
import type { OpenedFile, RecentEntry } from '../src/bridge/contract.ts';
import { MAX_OPEN_BYTES, formatBytes } from '../src/bridge/files.ts';
import { addRecent, parseRecentList } from '../src/bridge/validate.ts';
import { fileError } from './file-errors.ts';

export interface AtomicWriteHooks {
  /** Called after the temp file is written and synced, before the rename (tests simulate a crash here). */
  beforeRename?: (tmpPath: string) => void;
}

const TMP_SUFFIX = '.roundwise-tmp';

/**
 * Write `data` to `path` so that, whatever happens, `path` holds either the old content or the complete new one:
 * write a temp file in the same folder, fsync it, rename it over the target (atomic on POSIX and NTFS), then fsync
 * the folder so the rename itself survives a power cut.
 */
export function writeFileAtomic(path: string, data: string | Uint8Array, hooks: AtomicWriteHooks = {}): void {
  const dir = dirname(path);
  const tmp = join(dir, `.${basename(path)}.${process.pid}.${randomBytes(4).toString('hex')}${TMP_SUFFIX}`);
  try {
    mkdirSync(dir, { recursive: true });
    const fd = openSync(tmp, 'wx', 0o644);
    try {
      const buf = typeof data === 'string' ? Buffer.from(data, 'utf8') : data;
      let off = 0;
      while (off < buf.length) off += writeSync(fd, buf, off, buf.length - off);
      fsyncSync(fd);
    } finally {
      closeSync(fd);
    }
    hooks.beforeRename?.(tmp);
    renameSync(tmp, path);
  } catch (err) {
    try {
      unlinkSync(tmp);
    } catch {
      // the temp file was never created or is already gone
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

/** Remove temp files left by writes that were interrupted (a crash between write and rename). */
export function removeStaleTemps(dir: string, target: string): number {
  let removed = 0;
  try {
    for (const f of readdirSync(dir)) {
      if (f.startsWith(`.${basename(target)}.`) && f.endsWith(TMP_SUFFIX)) {
        unlinkSync(join(dir, f));
        removed++;
      }
    }
  } catch {
    // folder missing or unreadable: nothing to clean
  }
  return removed;
}

/** Read a text file under the size limit; the limit is checked before a byte is read. */
export function readTextLimited(path: string, maxBytes: number = MAX_OPEN_BYTES): OpenedFile {
  const name = basename(path);
  let size: number;
  try {
    const st = statSync(path);
    if (!st.isFile()) throw new InputError('not-a-file', 'this is not a regular file', { file: name });
    size = st.size;
  } catch (err) {
    throw fileError(err, 'read', name);
  }
  if (size > maxBytes) {
    throw new InputError('file-too-large', `file is ${formatBytes(size)}, larger than the ${formatBytes(maxBytes)} limit; nothing was read`, { file: name });
  }
  let bytes: Buffer;
  try {
    bytes = readFileSync(path);
  } catch (err) {
    throw fileError(err, 'read', name);
  }
  // Same decoding as the browser's File.text(): UTF-8, invalid bytes replaced, byte-order mark dropped.
  const text = new TextDecoder('utf-8', { fatal: false, ignoreBOM: false }).decode(bytes);
  return { name, path, text, size: bytes.length };
}

/** The recent-projects list, kept as JSON in the user-data folder. */
export class RecentStore {
  readonly file: string;
  constructor(userDataDir: string, private readonly now: () => Date = () => new Date()) {
    this.file = join(userDataDir, 'recent-projects.json');
  }

  list(): RecentEntry[] {
    try {
      return parseRecentList(JSON.parse(readFileSync(this.file, 'utf8')));
    } catch {
      return []; // missing or damaged: start a fresh list rather than fail
    }
  }

  add(path: string): RecentEntry[] {
    const list = addRecent(this.list(), { name: basename(path), ref: path, when: this.now().toISOString() });
    this.save(list);
    return list;
  }

  remove(ref: string): RecentEntry[] {
    const list = this.list().filter((e) => e.ref !== ref);
    this.save(list);
    return list;
  }

  private save(list: RecentEntry[]): void {
    try {
      writeFileAtomic(this.file, `${JSON.stringify(list, null, 2)}\n`);
    } catch {
      // The list is a convenience: failing to store it must not fail the open or save that triggered it.
    }
  }
}

/** The crash-recovery copy of an unsaved project, in the user-data folder. */
export class AutosaveStore {
  readonly file: string;
  constructor(userDataDir: string) {
    this.file = join(userDataDir, 'recovery', 'unsaved-project.roundwise');
  }

  write(content: string): void {
    writeFileAtomic(this.file, content);
  }

  clear(): void {
    try {
      unlinkSync(this.file);
    } catch {
      // already gone
    }
    removeStaleTemps(dirname(this.file), this.file);
  }

  read(): OpenedFile | null {
    try {
      const f = readTextLimited(this.file);
      return { name: 'Recovered project', text: f.text, size: f.size };
    } catch {
      return null;
    }
  }
}
