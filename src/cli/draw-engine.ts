/**
 * The engine side of a draw helper thread (draw-pool.ts): receives the run's setup, then claims chunks of draws from
 * the shared counter until none are left, posting each chunk back as it is done. Loaded by draw-worker.mjs.
 */
import { parentPort } from 'node:worker_threads';
import { drawChunk, type DrawSetup } from '../study/index.ts';
import { claimChunks, type DrawJob } from './draw-claim.ts';

let setup: DrawSetup | null = null;
parentPort!.on('message', (m: { setup: DrawSetup } | DrawJob) => {
  if ('setup' in m) { setup = m.setup; return; }
  const s = setup!;
  claimChunks(m, (from, to) => {
    const c = drawChunk(s, from, to);
    parentPort!.postMessage({ chunk: c }, [c.values.buffer as ArrayBuffer, c.status.buffer as ArrayBuffer, c.delta.buffer as ArrayBuffer]);
  });
  parentPort!.postMessage({ done: true });
});
parentPort!.postMessage({ ready: true });
