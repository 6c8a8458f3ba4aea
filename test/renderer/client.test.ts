// The engine client: progress shows only after ~300 ms, Cancel rejects the running call at once, and the fresh
// worker gets the table back (the last state-setting call is replayed). A fake Worker stands in for the real one.
import { afterEach, describe, expect, it, vi } from 'vitest';
import { EngineClient, CancelledError, EngineError, progress, SLOW_MS } from '../../renderer/worker/client.ts';
import type { RpcRequest, RpcResponse } from '../../renderer/worker/rpc.ts';

class FakeWorker {
  static made: FakeWorker[] = [];
  posted: RpcRequest[] = [];
  terminated = false;
  onmessage: ((e: MessageEvent<RpcResponse>) => void) | null = null;
  onerror: ((e: ErrorEvent) => void) | null = null;
  constructor() { FakeWorker.made.push(this); }
  postMessage(m: RpcRequest): void { this.posted.push(m); }
  terminate(): void { this.terminated = true; }
  reply(r: RpcResponse): void { this.onmessage?.({ data: r } as MessageEvent<RpcResponse>); }
}

afterEach(() => {
  vi.useRealTimers();
  FakeWorker.made = [];
});

function client(): EngineClient {
  return new EngineClient(() => new FakeWorker() as unknown as Worker);
}

describe('engine client', () => {
  it('shows progress only for work longer than the threshold', async () => {
    vi.useFakeTimers();
    const c = client();
    const w = FakeWorker.made[0]!;
    const p = c.call('grid', { which: 'A' }, 'Reading…');
    expect(progress.visible).toBe(false);
    vi.advanceTimersByTime(SLOW_MS - 50);
    expect(progress.visible).toBe(false);
    vi.advanceTimersByTime(100);
    expect(progress.visible).toBe(true);
    expect(progress.label).toBe('Reading…');
    w.reply({ id: w.posted[0]!.id, ok: true, value: 42 });
    await expect(p).resolves.toBe(42);
    expect(progress.visible).toBe(false);
  });

  it('cancels: the call rejects, the worker is replaced and the loaded table replayed', async () => {
    const c = client();
    const w1 = FakeWorker.made[0]!;
    const load = c.call('loadTable', { text: 't', fileName: 'a.csv' });
    w1.reply({ id: w1.posted[0]!.id, ok: true, value: { table: {} } });
    await load;
    const slow = c.call('grid', { which: 'L' });
    c.cancel();
    await expect(slow).rejects.toBeInstanceOf(CancelledError);
    expect(w1.terminated).toBe(true);
    const w2 = FakeWorker.made[1]!;
    expect(w2.posted.map((m) => m.op)).toEqual(['loadTable']);
    expect(w2.posted[0]!.args).toEqual({ text: 't', fileName: 'a.csv' });
  });

  it('replays an opened project, the latest state-setting call, after a cancel', async () => {
    const c = client();
    const w1 = FakeWorker.made[0]!;
    const load = c.call('loadSample', {});
    w1.reply({ id: w1.posted[0]!.id, ok: true, value: {} });
    await load;
    const open = c.call('openProject', { text: '{}', fileName: 'p.roundwise' });
    w1.reply({ id: w1.posted[1]!.id, ok: true, value: {} });
    await open;
    const slow = c.call('grid', { which: 'L' });
    c.cancel();
    await expect(slow).rejects.toBeInstanceOf(CancelledError);
    expect(FakeWorker.made[1]!.posted.map((m) => m.op)).toEqual(['openProject']);
  });

  it('passes a refusal on as a located message, not a stack trace', async () => {
    const c = client();
    const w = FakeWorker.made[0]!;
    const p = c.call('previewTable', { text: '', fileName: 'x.csv' });
    w.reply({ id: w.posted[0]!.id, ok: false, error: { message: 'x.csv:1:1: the file is empty', refused: true, code: 'empty' } });
    const err = await p.catch((e: unknown) => e);
    expect(err).toBeInstanceOf(EngineError);
    expect((err as EngineError).message).toBe('x.csv:1:1: the file is empty');
    expect((err as EngineError).refused).toBe(true);
  });
});
