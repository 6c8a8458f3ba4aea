/** What a CLI command may touch: arguments, output streams and files. Kept small so commands are testable in-process. */
import { readFileSync, writeFileSync, renameSync, mkdirSync, openSync, fsyncSync, closeSync, rmSync, statSync } from 'node:fs';
import { dirname, join, basename } from 'node:path';
import { InputError } from '../diagnostics/index.ts';
import { checkTableSize } from '../table/index.ts';

export interface CliIO {
  stdout: (s: string) => void;
  stderr: (s: string) => void;
}

export const processIO: CliIO = {
  stdout: (s) => process.stdout.write(s),
  stderr: (s) => process.stderr.write(s),
};

export function readText(path: string): string {
  return readFileSync(path, 'utf8');
}

export function readBytes(path: string): Uint8Array {
  return readFileSync(path);
}

function unreadable(e: unknown, path: string): InputError {
  const code = (e as { code?: string }).code;
  const why = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'is a folder, not a file' : code === 'EACCES' ? 'permission denied' : 'cannot be read';
  return new InputError('unreadable-file', why, { file: path });
}

/**
 * Every input file of every command (tables, shocks, role maps, employment, totals, groups): its size is checked
 * against the importer's limit before anything is read, so an oversized file is never loaded into memory, and a
 * missing or unreadable file is a located one-line refusal.
 */
export function readInputFile(path: string): Buffer {
  let size: number;
  try {
    const st = statSync(path);
    if (st.isDirectory()) throw Object.assign(new Error('folder'), { code: 'EISDIR' });
    size = st.size;
  } catch (e) {
    throw unreadable(e, path);
  }
  checkTableSize(size, path);
  try {
    return readFileSync(path);
  } catch (e) {
    throw unreadable(e, path);
  }
}

/**
 * Write a file atomically: to a temporary file beside it, flushed to disk, then renamed over the target, so a crash
 * never leaves half a file (without the flush a power cut can persist the rename before the data). A failed write
 * (full disk) removes the temporary file and leaves the target as it was.
 */
export function writeFileAtomic(path: string, content: string | Uint8Array): void {
  mkdirSync(dirname(path), { recursive: true });
  const tmp = join(dirname(path), `.${basename(path)}.${process.pid}.tmp`);
  try {
    const fd = openSync(tmp, 'w');
    try {
      writeFileSync(fd, content);
      fsyncSync(fd);
    } finally {
      closeSync(fd);
    }
    renameSync(tmp, path);
  } catch (e) {
    rmSync(tmp, { force: true });
    throw e;
  }
}
