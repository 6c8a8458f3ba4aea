// Main-process bridge handlers over scripted dialogs and a temp user-data folder. Reference: the bridge contract
// (src/bridge/contract.ts); the rule that the renderer may only touch paths the user picked is the project's own
// (common practice for sandboxed apps, no source).
import { describe, it, expect, beforeEach, afterEach } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync, existsSync, unlinkSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createBridgeHost, type Dialogs } from '../../main/bridge-host.ts';

let dir: string;
let picks: (string | null)[];
let asked: { title: string; defaultName?: string }[];
const dialogs: Dialogs = {
  async openPath(title) { asked.push({ title }); return picks.shift() ?? null; },
  async savePath(title, defaultName) { asked.push({ title, defaultName }); return picks.shift() ?? null; },
};
const host = () => createBridgeHost({ dialogs, userDataDir: join(dir, 'user-data'), documentsDir: join(dir, 'docs') });

beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'roundwise-host-'));
  picks = [];
  asked = [];
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

describe('bridge host', () => {
  it('opens a picked table and returns null when the dialog is cancelled', async () => {
    const p = join(dir, 'county.csv');
    writeFileSync(p, 'a,b\n');
    const h = host();
    picks = [p, null];
    expect(await h.openFile('table')).toEqual({ name: 'county.csv', path: p, text: 'a,b\n', size: 4 });
    expect(await h.openFile('table')).toBeNull();
    expect(await h.recentProjects()).toEqual([]); // tables are not projects
  });

  it('saves through the dialog with a safe suggested name, then saves in place', async () => {
    const h = host();
    const target = join(dir, 'out', 'plan');
    picks = [target];
    const saved = await h.saveProject('Food plant: 300 jobs', '{"v":1}');
    expect(asked[0]?.defaultName).toBe(join(dir, 'docs', 'Food plant- 300 jobs.roundwise'));
    expect(saved).toEqual({ name: 'plan.roundwise', path: `${target}.roundwise` });
    expect(await h.saveProject('ignored', '{"v":2}', `${target}.roundwise`)).toEqual(saved);
    expect(readFileSync(`${target}.roundwise`, 'utf8')).toBe('{"v":2}');
    expect((await h.recentProjects())[0]?.ref).toBe(`${target}.roundwise`);
  });

  it('refuses to write to a path the user never picked', async () => {
    const h = host();
    const victim = join(dir, 'victim.txt');
    writeFileSync(victim, 'keep me');
    await expect(h.saveProject('x', 'overwritten', victim)).rejects.toThrowError(/not opened or saved in this session/);
    expect(readFileSync(victim, 'utf8')).toBe('keep me');
  });

  it('exports text and PNG bytes', async () => {
    const h = host();
    picks = [join(dir, 'report.csv'), join(dir, 'chart')];
    await h.exportFile('Multipliers', 'csv', 'sector,output\n');
    const png = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
    expect(await h.exportFile('Chart', 'png', `data:image/png;base64,${png.toString('base64')}`)).toEqual({ name: 'chart.png', path: join(dir, 'chart.png') });
    expect(readFileSync(join(dir, 'report.csv'), 'utf8')).toBe('sector,output\n');
    expect(readFileSync(join(dir, 'chart.png'))).toEqual(png);
  });

  it('reopens recent projects only from its own list, and forgets vanished ones', async () => {
    const p = join(dir, 'plan.roundwise');
    writeFileSync(p, '{"v":1}');
    const h = host();
    picks = [p];
    await h.openFile('project');
    const again = host(); // a later session
    expect((await again.openRecent(p))?.text).toBe('{"v":1}');
    await expect(again.saveProject('plan', '{"v":3}', p)).resolves.toMatchObject({ path: p }); // granted by reopening
    expect(await again.openRecent('/etc/passwd')).toBeNull();
    unlinkSync(p);
    await expect(again.openRecent(p)).rejects.toThrowError(/does not exist/);
    expect(await again.recentProjects()).toEqual([]);
  });

  it('keeps a recovery copy while dirty and drops it on a clean close', async () => {
    const h = host();
    h.setDirty(true);
    expect(h.isDirty()).toBe(true);
    h.autosave('{"unsaved":1}');
    // a crash: the next session finds the copy
    expect(host().recoverAutosave()?.text).toBe('{"unsaved":1}');
    h.closedCleanly();
    expect(host().recoverAutosave()).toBeNull();
    h.autosave('{"unsaved":2}');
    h.autosave(null);
    expect(existsSync(join(dir, 'user-data', 'recovery', 'unsaved-project.roundwise'))).toBe(false);
  });
});
