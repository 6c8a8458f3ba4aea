// The preload exposes exactly the bridge contract and nothing of Electron. References: Electron security checklist
// item 3 (context isolation: expose a narrow API via contextBridge, never ipcRenderer itself) and the bridge contract.
import { describe, it, expect, vi, beforeAll } from 'vitest';
import { CHANNELS, type MenuCommand, type RoundwiseBridge } from '../../src/bridge/contract.ts';

const fake = vi.hoisted(() => {
  const listeners = new Map<string, (event: unknown, ...args: unknown[]) => void>();
  const invoke = vi.fn(async (channel: string, ...args: unknown[]): Promise<unknown> => ({ ok: true, value: { channel, args } }));
  const exposed: Record<string, unknown> = {};
  const doc = { activeElement: null as unknown, execCommand: vi.fn() };
  (globalThis as Record<string, unknown>).document = doc;
  return {
    listeners, invoke, exposed, doc,
    electron: {
      contextBridge: { exposeInMainWorld: vi.fn((key: string, api: unknown) => { exposed[key] = api; }) },
      ipcRenderer: { invoke, on: vi.fn((ch: string, fn: (event: unknown, ...args: unknown[]) => void) => { listeners.set(ch, fn); }) },
    },
  };
});
vi.mock('electron', () => fake.electron);

let bridge: RoundwiseBridge;
beforeAll(async () => {
  await import('../../main/preload.ts');
  bridge = fake.exposed.roundwise as RoundwiseBridge;
});

describe('preload', () => {
  it('exposes one object, with the contract methods only', () => {
    expect(fake.electron.contextBridge.exposeInMainWorld).toHaveBeenCalledTimes(1);
    expect(Object.keys(fake.exposed)).toEqual(['roundwise']);
    expect(Object.keys(bridge).sort()).toEqual(['autosave', 'discardRecovered', 'exportFile', 'mode', 'onMenu', 'openFile', 'openRecent', 'recentProjects', 'recoverAutosave', 'saveProject', 'setDirty'].sort());
    expect(bridge.mode).toBe('desktop');
    for (const v of Object.values(bridge)) expect(v).not.toBe(fake.electron.ipcRenderer);
  });

  it('sends each call on its channel and unwraps the reply', async () => {
    expect(await bridge.openFile('table')).toEqual({ channel: CHANNELS.openFile, args: ['table'] });
    expect(await bridge.saveProject('p', '{}')).toEqual({ channel: CHANNELS.saveProject, args: ['p', '{}'] });
    expect(await bridge.saveProject('p', '{}', '/a/p.roundwise')).toEqual({ channel: CHANNELS.saveProject, args: ['p', '{}', '/a/p.roundwise'] });
    expect(await bridge.exportFile('r', 'csv', 'a')).toEqual({ channel: CHANNELS.exportFile, args: ['r', 'csv', 'a'] });
    expect(await bridge.openRecent('/a/p.roundwise')).toEqual({ channel: CHANNELS.openRecent, args: ['/a/p.roundwise'] });
    expect(await bridge.autosave(null)).toEqual({ channel: CHANNELS.autosave, args: [null] });
    // A recovery copy handed over as a Blob reaches the shell as its text (IPC arguments are checked as strings).
    expect(await bridge.autosave(new Blob(['{"copy":', '1}']))).toEqual({ channel: CHANNELS.autosave, args: ['{"copy":1}'] });
    expect(await bridge.discardRecovered()).toEqual({ channel: CHANNELS.discardRecovered, args: [] });
    bridge.setDirty(true);
    expect(fake.invoke).toHaveBeenLastCalledWith(CHANNELS.setDirty, true);
  });

  it('turns a refusal into one located line', async () => {
    fake.invoke.mockResolvedValueOnce({ ok: false, error: { code: 'file-too-large', message: 'file is 200.0 MB, larger than the 128.0 MB limit', location: { file: 'big.csv' } } });
    await expect(bridge.openFile('table')).rejects.toThrowError(/^big\.csv: file is 200\.0 MB/);
    fake.invoke.mockResolvedValueOnce('garbage');
    await expect(bridge.recentProjects()).rejects.toThrowError('the desktop shell sent an unexpected reply');
  });

  it('forwards known menu commands only, and leaves undo in text fields to the field', () => {
    const got: MenuCommand[] = [];
    const off = bridge.onMenu((c) => got.push(c));
    const send = fake.listeners.get(CHANNELS.menu);
    expect(send).toBeDefined();
    send?.({}, 'save-project');
    send?.({}, 'rm -rf');
    send?.({}, { toString: () => 'undo' });
    fake.doc.activeElement = { tagName: 'INPUT', type: 'text' };
    send?.({}, 'undo');
    expect(fake.doc.execCommand).toHaveBeenCalledWith('undo');
    fake.doc.activeElement = null;
    send?.({}, 'redo');
    off();
    send?.({}, 'open-table');
    expect(got).toEqual(['save-project', 'redo']);
  });
});
