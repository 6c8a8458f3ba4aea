// Main-process bridge handlers over scripted dialogs and a temp user-data folder. Reference: the bridge contract
// (src/bridge/contract.ts); the rule that the renderer may only touch paths the user picked is the project's own
// (common practice for sandboxed apps, no source).
import { describe, it, expect, beforeEach, afterEach } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync, existsSync, unlinkSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createBridgeHost, looksLikeProject, type Dialogs } from '../../main/bridge-host.ts';
import { createProject, serializeProject } from '../../src/project/index.ts';
import { importTable, SAMPLE_CSV } from '../../src/table/index.ts';

let dir: string;
let picks: (string | null)[];
let asked: { title: string; defaultName?: string }[];
/** Answers to "replace it?" questions, in order, and the files they named. */
let replies: boolean[];
let replaceAsked: string[];
const dialogs: Dialogs = {
  async openPath(title) { asked.push({ title }); return picks.shift() ?? null; },
  async savePath(title, defaultName) { asked.push({ title, defaultName }); return picks.shift() ?? null; },
  async confirmReplace(path) { replaceAsked.push(path); return replies.shift() ?? false; },
};
/** A minimal text that passes the project check, numbered so tests can tell saves apart. */
const project = (v: number) => `{"format":"roundwise-project","version":2,"v":${v}}`;
const host = () => createBridgeHost({ dialogs, userDataDir: join(dir, 'user-data'), documentsDir: join(dir, 'docs') });

beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'roundwise-host-'));
  picks = [];
  asked = [];
  replies = [];
  replaceAsked = [];
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
    const saved = await h.saveProject('Food plant: 300 jobs', project(1));
    expect(asked[0]?.defaultName).toBe(join(dir, 'docs', 'Food plant- 300 jobs.roundwise'));
    expect(saved).toEqual({ name: 'plan.roundwise', path: `${target}.roundwise` });
    expect(await h.saveProject('ignored', project(2), `${target}.roundwise`)).toEqual(saved);
    expect(readFileSync(`${target}.roundwise`, 'utf8')).toBe(project(2));
    expect((await h.recentProjects())[0]?.ref).toBe(`${target}.roundwise`);
  });

  it('refuses to write to a path the user never picked', async () => {
    const h = host();
    const victim = join(dir, 'victim.txt');
    writeFileSync(victim, 'keep me');
    await expect(h.saveProject('x', project(1), victim)).rejects.toThrowError(/not opened or saved as a project/);
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
    writeFileSync(p, project(1));
    const h = host();
    picks = [p];
    await h.openFile('project');
    const again = host(); // a later session
    expect((await again.openRecent(p))?.text).toBe(project(1));
    await expect(again.saveProject('plan', project(3), p)).resolves.toMatchObject({ path: p }); // on the recent list
    expect(await again.openRecent('/etc/passwd')).toBeNull();
    unlinkSync(p);
    await expect(again.openRecent(p)).rejects.toThrowError(/does not exist/);
    expect(await again.recentProjects()).toEqual([]);
  });

  it('asks, naming the file, before the added extension replaces an existing file', async () => {
    // The native dialog asked only about `county` as typed; `county.csv` is what would be written.
    const csv = join(dir, 'county.csv');
    const proj = join(dir, 'study.roundwise');
    writeFileSync(csv, 'keep me');
    writeFileSync(proj, project(0));
    const h = host();
    picks = [join(dir, 'county'), null];
    replies = [false]; // Cancel: the dialog comes back on the full name, then the user cancels it
    expect(await h.exportFile('Multipliers', 'csv', 'new,report\n')).toBeNull();
    expect(replaceAsked).toEqual([csv]);
    expect(asked[1]?.defaultName).toBe(csv);
    expect(readFileSync(csv, 'utf8')).toBe('keep me');
    picks = [join(dir, 'county')];
    replies = [true];
    expect(await h.exportFile('Multipliers', 'csv', 'new,report\n')).toEqual({ name: 'county.csv', path: csv });
    expect(readFileSync(csv, 'utf8')).toBe('new,report\n');
    picks = [join(dir, 'study'), null];
    replies = [false];
    expect(await h.saveProject('study', project(5))).toBeNull();
    expect(replaceAsked.at(-1)).toBe(proj);
    expect(readFileSync(proj, 'utf8')).toBe(project(0));
  });

  it('does not ask twice when the name was typed in full or nothing is there', async () => {
    const csv = join(dir, 'county.csv');
    writeFileSync(csv, 'old');
    const h = host();
    picks = [csv, join(dir, 'fresh')]; // the dialog itself confirmed county.csv
    await h.exportFile('x', 'csv', 'a\n');
    await h.exportFile('x', 'csv', 'b\n');
    expect(replaceAsked).toEqual([]);
    expect(readFileSync(csv, 'utf8')).toBe('a\n');
    expect(readFileSync(join(dir, 'fresh.csv'), 'utf8')).toBe('b\n');
  });

  it('gives read access, not write access, to a file picked in an open dialog', async () => {
    const csv = join(dir, 'county.csv');
    writeFileSync(csv, 'Sector,A\nA,1\n');
    const h = host();
    picks = [csv, csv];
    await h.openFile('table');
    await expect(h.saveProject('x', 'NOT A TABLE', csv)).rejects.toThrowError(/not opened or saved as a project/);
    await expect(h.saveProject('x', project(1), csv)).rejects.toThrowError(/not opened or saved as a project/);
    await h.openFile('project'); // a CSV picked in the project dialog is still not a project
    await expect(h.saveProject('x', project(1), csv)).rejects.toThrowError(/not opened or saved as a project/);
    expect(await h.recentProjects()).toEqual([]);
    expect(readFileSync(csv, 'utf8')).toBe('Sector,A\nA,1\n');
  });

  it('writes only project content to a project path, by path or through the dialog', async () => {
    const p = join(dir, 'plan.roundwise');
    writeFileSync(p, project(1));
    const h = host();
    picks = [p];
    await h.openFile('project');
    await expect(h.saveProject('plan', 'NOT A TABLE', p)).rejects.toThrowError(/not a Roundwise project.*nothing was written/);
    await expect(h.saveProject('plan', '{"format":"roundwise-project","version":2,"table":{', p)).rejects.toThrowError(/not a Roundwise project/);
    expect(readFileSync(p, 'utf8')).toBe(project(1));
    picks = [join(dir, 'other')];
    await expect(h.saveProject('plan', '[1,2,3]')).rejects.toThrowError(/not a Roundwise project/);
    expect(asked).toHaveLength(1); // refused before a save dialog was shown
    expect(existsSync(join(dir, 'other.roundwise'))).toBe(false);
  });

  it('saves by path only over a project, even for a path on the recent list', async () => {
    const p = join(dir, 'plan.roundwise');
    writeFileSync(p, project(1));
    const h = host();
    picks = [p];
    await h.openFile('project');
    writeFileSync(p, 'Sector,A\nA,1\n'); // since replaced by something else
    await expect(h.saveProject('plan', project(2), p)).rejects.toThrowError(/not opened or saved as a project/);
    expect(readFileSync(p, 'utf8')).toBe('Sector,A\nA,1\n');
    unlinkSync(p); // moved away: saving puts it back
    await expect(h.saveProject('plan', project(3), p)).resolves.toMatchObject({ path: p });
    expect(readFileSync(p, 'utf8')).toBe(project(3));
  });

  it('recognises what the project writer writes, and nothing else', () => {
    const t = importTable(SAMPLE_CSV, { fileName: 'sample.csv' });
    expect(looksLikeProject(serializeProject(createProject(t)))).toBe(true);
    for (const bad of ['', 'NOT A TABLE', 'Sector,A\nA,1\n', '{}', '{"format":"other","version":2}', '[{"format":"roundwise-project"}]', '{"version":2,"format":"roundwise-project"', '\u0000{"format":"roundwise-project",}']) {
      expect(looksLikeProject(bad), JSON.stringify(bad)).toBe(false);
    }
  });

  it('keeps one recovery copy per window, offered to one window only after the app dies', async () => {
    const h = host();
    h.setDirty(1, true);
    expect(h.isDirty(1)).toBe(true);
    expect(h.isDirty(2)).toBe(false);
    h.autosave(1, '{"window":1}');
    h.autosave(2, '{"window":2}');
    expect(h.recoverAutosave(3)).toBeNull(); // both copies belong to windows still open
    // the app dies; the next run offers each copy to one window only
    const next = host();
    const a = next.recoverAutosave(1)?.text;
    const b = next.recoverAutosave(2)?.text;
    expect([a, b].sort()).toEqual(['{"window":1}', '{"window":2}']);
    expect(next.recoverAutosave(3)).toBeNull();
    next.discardRecovered(1);
    expect(host().recoverAutosave(1)?.text).toBe(b); // the other one is still there
    h.closedCleanly(1);
    h.autosave(2, null);
  });

  it('says why, when the recovery copy cannot be written', () => {
    writeFileSync(join(dir, 'user-data'), 'a file where the folder should be');
    expect(() => host().autosave(1, '{"unsaved":1}')).toThrowError(/cannot write: a part of the path is not a folder/);
  });

});
