/** What a CLI command may touch: arguments, output streams and files. Kept small so commands are testable in-process. */
import { readFileSync, writeFileSync, renameSync, mkdirSync } from 'node:fs';
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

/** Write a file atomically: to a temporary file beside it, then rename over the target, so a crash never leaves half a file. */
export function writeFileAtomic(path: string, content: string | Uint8Array): void {
  mkdirSync(dirname(path), { recursive: true });
  const tmp = join(dirname(path), `.${basename(path)}.${process.pid}.tmp`);
  writeFileSync(tmp, content);
  renameSync(tmp, path);
}
