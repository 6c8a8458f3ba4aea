// Atomic writes, size-limited reads, recent list and recovery copy on a real temp folder.
// References: POSIX rename(2) — "If newpath already exists, it will be atomically replaced"; fsync(2).
// The interrupted-save test kills a real writer process between write and rename.
import { describe, it, expect, beforeEach, afterEach } from 'vitest';
import { mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync, mkdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { RecentStore, readTextLimited, removeStaleTemps, writeFileAtomic } from '../../main/file-store.ts';
import { InputError } from '../../src/diagnostics/index.ts';
import { MAX_RECENT } from '../../src/bridge/validate.ts';

let dir: string;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'roundwise-files-'));
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

describe('writeFileAtomic', () => {
  it('replaces the file and leaves no temp file behind', () => {
    const p = join(dir, 'county.roundwise');
    writeFileAtomic(p, 'first');
    writeFileAtomic(p, 'second');
    expect(readFileSync(p, 'utf8')).toBe('second');
    expect(readdirSync(dir)).toEqual(['county.roundwise']);
  });

  it('creates missing folders and writes bytes unchanged', () => {
    const p = join(dir, 'a', 'b', 'chart.png');
    const bytes = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0, 255]);
    writeFileAtomic(p, bytes);
    expect(new Uint8Array(readFileSync(p))).toEqual(bytes);
  });

  it('keeps the previous file when the write fails before the rename', () => {
    const p = join(dir, 'county.roundwise');
    writeFileAtomic(p, 'previous');
    expect(() => writeFileAtomic(p, 'new', { beforeRename: () => { throw Object.assign(new Error('disk'), { code: 'ENOSPC' }); } }))
      .toThrowError(/cannot write: the disk is full/);
    expect(readFileSync(p, 'utf8')).toBe('previous');
    expect(readdirSync(dir)).toEqual(['county.roundwise']);
  });

  it('keeps the previous file when the writer is killed between write and rename', () => {
    const p = join(dir, 'county.roundwise');
    writeFileAtomic(p, 'previous');
    const store = fileURLToPath(new URL('../../main/file-store.ts', import.meta.url));
    const script = `import { writeFileAtomic } from ${JSON.stringify(store)};
writeFileAtomic(${JSON.stringify(p)}, 'x'.repeat(100000), { beforeRename: () => process.kill(process.pid, 'SIGKILL') });`;
    const r = spawnSync(process.execPath, ['--import', 'tsx', '--input-type=module', '-e', script], { encoding: 'utf8' });
    expect(r.signal).toBe('SIGKILL');
    expect(readFileSync(p, 'utf8')).toBe('previous');
    // The complete temp file is left over; the next cleanup removes it.
    expect(readdirSync(dir).length).toBe(2);
    expect(removeStaleTemps(dir, p)).toBe(1);
    expect(readdirSync(dir)).toEqual(['county.roundwise']);
  });

  it('reports an unwritable target as a located refusal', () => {
    mkdirSync(join(dir, 'folder.roundwise'));
    try {
      writeFileAtomic(join(dir, 'folder.roundwise'), 'x');
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(InputError);
      expect((e as InputError).location.file).toBe(join(dir, 'folder.roundwise'));
    }
  });
});

describe('readTextLimited', () => {
  it('reads UTF-8 and drops the byte-order mark, as the browser does', () => {
    const p = join(dir, 't.csv');
    writeFileSync(p, Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from('sector,Farm\n', 'utf8')]));
    const f = readTextLimited(p);
    expect(f).toEqual({ name: 't.csv', path: p, text: 'sector,Farm\n', size: 15 });
  });
  it('refuses a file over the limit before reading it', () => {
    const p = join(dir, 'big.csv');
    writeFileSync(p, 'x'.repeat(2048));
    expect(() => readTextLimited(p, 1024)).toThrowError(/2\.0 KB, larger than the 1\.0 KB limit/);
  });
  it('refuses folders and missing files with short messages', () => {
    expect(() => readTextLimited(dir)).toThrowError(/is a folder, not a file/);
    expect(() => readTextLimited(join(dir, 'nope.csv'))).toThrowError(/no such file/);
  });
});

describe('RecentStore', () => {
  it('keeps the newest first, without duplicates, capped', () => {
    const s = new RecentStore(dir, () => new Date('2026-03-01T00:00:00Z'));
    for (let i = 0; i < MAX_RECENT + 3; i++) s.add(join(dir, `p${i}.roundwise`));
    s.add(join(dir, 'p5.roundwise'));
    const list = s.list();
    expect(list).toHaveLength(MAX_RECENT);
    expect(list[0]).toEqual({ name: 'p5.roundwise', ref: join(dir, 'p5.roundwise'), when: '2026-03-01T00:00:00.000Z' });
    expect(list.filter((e) => e.name === 'p5.roundwise')).toHaveLength(1);
    expect(new RecentStore(dir).list()).toEqual(list); // persisted
  });
  it('treats a damaged list as empty', () => {
    writeFileSync(join(dir, 'recent-projects.json'), '{not json');
    expect(new RecentStore(dir).list()).toEqual([]);
  });
});
