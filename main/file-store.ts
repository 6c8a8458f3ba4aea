/**
 * Files on disk for the desktop shell: atomic writes, size-limited reads and the recent-projects list in the
 * user-data folder (crash-recovery copies: recovery-store.ts). Node only (no Electron), so test/main exercises it
 * on a temp folder.
 */
import { basename, join } from 'node:path';
import type { OpenedFile, RecentEntry } from '../src/bridge/contract.ts';
import { addRecent, parseRecentList } from '../src/bridge/validate.ts';
import { MAX_INPUT_BYTES, readFileLimited, removeStaleTemps, writeFileAtomic } from '../src/node-io/index.ts';

// The writer and the reader are the shared Node I/O module's (src/node-io), the same as the CLI's.
export { removeStaleTemps, writeFileAtomic };

/** Read a text file under the size limit (src/node-io readFileLimited: regular files only, checked before reading). */
export function readTextLimited(path: string, maxBytes: number = MAX_INPUT_BYTES): OpenedFile {
  const name = basename(path);
  const { bytes } = readFileLimited(path, { maxBytes, shownAs: name });
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
      return parseRecentList(JSON.parse(readFileLimited(this.file).bytes.toString('utf8')));
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
