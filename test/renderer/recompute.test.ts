// Scenario results follow their inputs (renderer/state/app.ts): a change is computed at once (no waiting time), the
// same inputs are never computed twice (the table's load and the change watcher both ask), and a burst of changes
// during a computation queues one more computation, from the inputs as they are when it ends. A fake engine stands
// in for the worker; each call waits until the test answers it.
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { nextTick } from 'vue';
import type { ScenarioDraft, TableInfo } from '../../renderer/worker/protocol.ts';

interface Call { op: string; args: { scenario: ScenarioDraft }; answer: (v: unknown) => void }
const calls: Call[] = [];

vi.mock('../../renderer/worker/client.ts', () => ({
  engine: () => ({ call: (op: string, args: Call['args']) => new Promise((answer) => { calls.push({ op, args, answer }); }) }),
  plain: <T>(v: T) => v,
  CancelledError: class extends Error {},
  EngineError: class extends Error {},
}));
vi.mock('../../renderer/bridge/index.ts', () => ({ getBridge: () => ({ setDirty() {} }) }));

const { app, editScenarios, recomputeAll } = await import('../../renderer/state/app.ts');

const line = (amount: number) => ({ sector: 'Farming', amount, kind: 'final-demand' as const, localShare: 1 });
const scenario = (amount: number): ScenarioDraft => ({ name: 'S', phases: [{ name: 'P', timing: 'once', lines: [line(amount)] }] });
const view = (amount: number) => ({ name: `result of ${amount}`, phases: [], byTiming: [], model: [] });
/** Let the watcher and the promise chains run. */
const settle = async () => { for (let k = 0; k < 5; k++) { await nextTick(); await Promise.resolve(); } };
const amountOf = (c: Call) => c.args.scenario.phases[0]!.lines[0]!.amount;

beforeEach(async () => {
  await settle();
  calls.length = 0;
});

describe('scenario results follow their inputs', () => {
  it('computes once for a new table, though the loader and the change watcher both ask', async () => {
    app.table = { name: 't', sectors: ['Farming'] } as unknown as TableInfo;
    app.scenarios = [scenario(100)];
    const loaded = recomputeAll();
    await settle();
    expect(calls.map((c) => c.op)).toEqual(['runScenario']);
    calls[0]!.answer(view(100));
    await loaded;
    await settle();
    expect(calls).toHaveLength(1);
    expect(app.results).toEqual([view(100)]);
    expect(app.resultsStale).toBe(false);
    await recomputeAll(); // same inputs: nothing to compute
    expect(calls).toHaveLength(1);
  });

  it('computes a change at once, and after a burst of changes only the latest inputs', async () => {
    editScenarios((s) => { s[0]!.phases[0]!.lines[0]!.amount = 200; });
    await settle();
    expect(calls.map(amountOf)).toEqual([200]); // no timer to wait for
    expect(app.resultsStale).toBe(true);
    editScenarios((s) => { s[0]!.phases[0]!.lines[0]!.amount = 300; });
    editScenarios((s) => { s[0]!.phases[0]!.lines[0]!.amount = 400; });
    await settle();
    expect(calls.map(amountOf)).toEqual([200]); // waits for the computation under way
    calls[0]!.answer(view(200));
    await settle();
    expect(calls.map(amountOf)).toEqual([200, 400]);
    expect(app.results).toEqual([view(200)]);
    expect(app.resultsStale).toBe(true); // shown as outdated: the inputs are 400 now
    calls[1]!.answer(view(400));
    await settle();
    expect(app.results).toEqual([view(400)]);
    expect(app.resultsStale).toBe(false);
    expect(calls).toHaveLength(2);
  });
});
