/** What a CLI command may touch: arguments, output streams and files. Kept small so commands are testable in-process. */
import { readFileLimited } from '../node-io/index.ts';

export { writeFileAtomic } from '../node-io/index.ts';

export interface CliIO {
  stdout: (s: string) => void;
  stderr: (s: string) => void;
}

export const processIO: CliIO = {
  stdout: (s) => process.stdout.write(s),
  stderr: (s) => process.stderr.write(s),
};

/**
 * Every input file of every command (tables, shocks, role maps, employment, totals, groups), through the shared
 * reader: regular files only, the size limit checked before a byte is read; a missing or unreadable file is a
 * located one-line refusal.
 */
export function readInputFile(path: string): Buffer {
  return readFileLimited(path).bytes;
}
