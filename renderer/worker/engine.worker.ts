/// <reference lib="webworker" />
/**
 * The engine's home in the browser: every import, analysis, scenario and report runs here, off the UI thread.
 * The worker holds the current table and its prepared model; the UI holds only what it shows.
 */
import { isInputError, formatLocated } from '../../src/study/index.ts';
import { api } from './compute.ts';
import type { RpcRequest, RpcResponse } from './rpc.ts';

const scope = self as unknown as DedicatedWorkerGlobalScope;

// Most operations answer at once; the brief and the workbook are promises (their libraries load on first use).
scope.onmessage = async (e: MessageEvent<RpcRequest>) => {
  const { id, op, args } = e.data;
  let res: RpcResponse;
  try {
    const fn = (api as Record<string, (a: unknown) => unknown>)[op];
    if (!fn) throw new Error(`unknown operation '${op}'`);
    res = { id, ok: true, value: await fn(args) };
  } catch (err) {
    if (isInputError(err)) res = { id, ok: false, error: { message: formatLocated(err), refused: true, code: err.code } };
    else {
      const msg = err instanceof Error ? err.message : String(err);
      res = { id, ok: false, error: { message: msg.split('\n')[0] ?? 'internal error', refused: false } };
    }
  }
  // The n×n grids are made fresh for each answer: hand their memory over instead of copying 32 MB at 2,000 sectors.
  const transfer = res.ok && op === 'grid' ? [(res.value as { values: Float64Array }).values.buffer as ArrayBuffer] : [];
  scope.postMessage(res, transfer);
};
