// Desktop crash-recovery copies on a real temp folder: one copy per window and page load; only copies of pages that
// are gone are offered, each to one window; discarding an offered copy never touches a live one. The rule is the
// project's own (common practice for multi-window editors, no source).
import { describe, it, expect, beforeEach, afterEach } from 'vitest';
import { mkdirSync, mkdtempSync, readdirSync, rmSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { RecoveryStore } from '../../main/recovery-store.ts';

let dir: string;
beforeEach(() => { dir = mkdtempSync(join(tmpdir(), 'roundwise-recovery-')); });
afterEach(() => rmSync(dir, { recursive: true, force: true }));

const files = () => readdirSync(join(dir, 'recovery')).sort();

describe('RecoveryStore', () => {
  it('never offers a live copy, in this window or another', () => {
    const s = new RecoveryStore(dir);
    s.write(1, 'one');
    s.write(2, 'two');
    expect(s.claim(1)).toBeNull();
    expect(s.claim(3)).toBeNull();
    s.discardOffered(3); // nothing offered: nothing deleted
    expect(files()).toHaveLength(2);
  });

  it('offers the copy of a page that was reloaded (after a renderer crash) to the new page', () => {
    const s = new RecoveryStore(dir);
    s.write(1, 'before the crash');
    s.pageLoaded(1);
    expect(s.claim(1)?.text).toBe('before the crash');
    s.write(1, 'the new page'); // the new page keeps its own copy meanwhile: the offered one is untouched
    expect(files()).toHaveLength(2);
    expect(s.claim(2)).toBeNull(); // reserved for window 1
    s.discardOffered(1);
    expect(files()).toHaveLength(1);
    expect(new RecoveryStore(dir).claim(1)?.text).toBe('the new page');
  });

  it('offers the newest copy first, each to one window, and the first versions\' single copy too', () => {
    mkdirSync(join(dir, 'recovery'));
    writeFileSync(join(dir, 'recovery', 'unsaved-project.roundwise'), 'legacy');
    writeFileSync(join(dir, 'recovery', '.unsaved-project.roundwise.123.ab.roundwise-tmp'), 'half a temp file');
    utimesSync(join(dir, 'recovery', 'unsaved-project.roundwise'), new Date('2020-01-01'), new Date('2020-01-01'));
    new RecoveryStore(dir).write(7, 'newer');
    const s = new RecoveryStore(dir); // a later run
    expect(s.claim(1)?.text).toBe('newer');
    expect(s.claim(1)?.text).toBe('newer'); // asked again (the page reloaded its offer): the same copy
    expect(s.claim(2)?.text).toBe('legacy');
    expect(s.claim(3)).toBeNull(); // the temp file is never offered
  });

  it('removes a window\'s copy when it closes on purpose, and keeps a copy offered to it and not answered', () => {
    new RecoveryStore(dir).write(1, 'old run');
    const s = new RecoveryStore(dir);
    s.write(5, 'mine');
    expect(s.claim(5)?.text).toBe('old run');
    s.closed(5);
    expect(files()).toHaveLength(1);
    expect(s.claim(6)?.text).toBe('old run');
  });
});
