// IPC sender and argument checks. References: Electron security checklist item 17 "Validate the sender of all IPC
// messages"; the bridge contract (src/bridge/contract.ts) for argument shapes.
import { describe, it, expect } from 'vitest';
import { guarded, senderProblem } from '../../main/ipc-guard.ts';
import { InputError } from '../../src/diagnostics/index.ts';

const top = (url: string) => ({ senderFrame: { url, parent: null } });
const own = top('app://roundwise/index.html');

describe('senderProblem', () => {
  it('trusts only our own top-level frame', () => {
    expect(senderProblem(own)).toBeNull();
    expect(senderProblem(top('https://evil.example/'))).toMatch(/unexpected page/);
    expect(senderProblem(top('file:///tmp/x.html'))).toMatch(/unexpected page/);
    expect(senderProblem(top('app://other/index.html'))).toMatch(/unexpected page/);
    expect(senderProblem({ senderFrame: { url: 'app://roundwise/index.html', parent: {} } })).toMatch(/sub-frame/);
    expect(senderProblem({ senderFrame: null })).toMatch(/gone/);
  });
});

describe('guarded handlers', () => {
  it('runs the handler with validated arguments and wraps its value', async () => {
    const calls: unknown[][] = [];
    const h = guarded('openFile', (kind) => {
      calls.push([kind]);
      return { name: 'a.csv', text: 'x', size: 1 };
    }, () => undefined);
    expect(await h(own, 'table')).toEqual({ ok: true, value: { name: 'a.csv', text: 'x', size: 1 } });
    expect(calls).toEqual([['table']]);
  });

  it('refuses foreign senders without running the handler', async () => {
    let ran = false;
    const log: string[] = [];
    const h = guarded('setDirty', () => { ran = true; }, (l) => log.push(l));
    const r = await h(top('https://evil.example/'), true);
    expect(r).toMatchObject({ ok: false, error: { code: 'ipc-refused' } });
    expect(ran).toBe(false);
    expect(log[0]).toMatch(/refused IPC 'setDirty'/);
  });

  it('refuses malformed arguments without running the handler', async () => {
    let ran = false;
    const h = guarded('exportFile', () => { ran = true; return null; }, () => undefined);
    expect(await h(own, 'x', 'exe', 'MZ')).toMatchObject({ ok: false, error: { code: 'ipc-invalid' } });
    expect(await h(own)).toMatchObject({ ok: false, error: { code: 'ipc-invalid' } });
    expect(await h(own, 'x', 'csv', { length: 3 })).toMatchObject({ ok: false, error: { code: 'ipc-invalid' } });
    expect(ran).toBe(false);
  });

  it('passes InputErrors through as located refusals and hides other failures', async () => {
    const located = guarded('openRecent', () => { throw new InputError('file-too-large', 'too big', { file: 'big.csv' }); }, () => undefined);
    expect(await located(own, '/x/big.csv')).toEqual({ ok: false, error: { code: 'file-too-large', message: 'too big', location: { file: 'big.csv' } } });
    const log: string[] = [];
    const crash = guarded('recentProjects', () => { throw new TypeError('secret internals at /home/u'); }, (l) => log.push(l));
    const r = await crash(own);
    expect(r).toEqual({ ok: false, error: { code: 'internal', message: 'the desktop shell could not complete the request' } });
    expect(log[0]).toContain('secret internals');
  });
});
