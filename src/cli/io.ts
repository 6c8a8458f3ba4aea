/** What a CLI command may touch: arguments, output streams and files. Kept small so commands are testable in-process. */
import { readFileSync, writeFileSync, renameSync, mkdirSync, openSync, fsyncSync, closeSync, rmSync } from 'node:fs';
import { dirname, join, basename } from 'node:path';

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
