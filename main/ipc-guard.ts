/**
 * Every IPC call from the renderer passes two checks before its handler runs: the sender is our own main frame
 * (app://roundwise, not a sub-frame, not some other page), and its arguments match the bridge contract
 * (src/bridge/validate.ts). Handlers reply with an IpcResult, so refusals reach the UI as one located line.
 */
import type { IpcMainInvokeEvent } from 'electron';
import { isInputError } from '../src/diagnostics/index.ts';
import type { IpcResult } from '../src/bridge/ipc.ts';
import { validateArgs, type ArgsOf, type argSchemas } from '../src/bridge/validate.ts';
import { isAppUrl } from './navigation.ts';

export type Channel = keyof typeof argSchemas;

/** The part of an IPC event the guard reads (structural, so tests pass plain objects). */
export interface SenderLike {
  senderFrame: { url: string; parent: unknown } | null;
}

/** Why a sender is refused, or null when it is our own top-level page. */
export function senderProblem(event: SenderLike): string | null {
  const frame = event.senderFrame;
  if (!frame) return 'the sending frame is gone';
  if (frame.parent) return 'sent from a sub-frame';
  if (!isAppUrl(frame.url)) return `sent from an unexpected page (${frame.url.slice(0, 80)})`;
  return null;
}

export type Handler<K extends Channel, T> = (...args: ArgsOf<K>) => T | Promise<T>;

export interface GuardLog {
  (line: string): void;
}

/** Wrap a handler with the sender and argument checks; errors become IpcResult failures, never thrown at the UI. */
export function guarded<K extends Channel, T>(channel: K, handler: Handler<K, T>, log: GuardLog = (l) => console.warn(l)) {
  return async (event: SenderLike | IpcMainInvokeEvent, ...args: unknown[]): Promise<IpcResult<T>> => {
    const problem = senderProblem(event as SenderLike);
    if (problem) {
      log(`roundwise: refused IPC '${channel}': ${problem}`);
      return { ok: false, error: { code: 'ipc-refused', message: 'request refused: it did not come from the Roundwise window' } };
    }
    const v = validateArgs(channel, args);
    if (!v.ok) {
      log(`roundwise: refused IPC '${channel}': ${v.message}`);
      return { ok: false, error: { code: 'ipc-invalid', message: `request refused: ${v.message}` } };
    }
    try {
      return { ok: true, value: await handler(...v.value) };
    } catch (err) {
      if (isInputError(err)) return { ok: false, error: { code: err.code, message: err.message, location: err.location } };
      log(`roundwise: IPC '${channel}' failed: ${err instanceof Error ? err.message : String(err)}`);
      return { ok: false, error: { code: 'internal', message: 'the desktop shell could not complete the request' } };
    }
  };
}
