/**
 * What an IPC call returns across the process boundary. Errors travel as data (code, message, location) rather
 * than as thrown exceptions, because Electron reduces a thrown error to "Error invoking remote method …: …";
 * the preload turns a refusal back into an InputError so the UI shows one located line, never a stack trace.
 */
import { InputError, isErrorCode, type ErrorCode, type Location } from '../diagnostics/index.ts';
import type { MenuCommand } from './contract.ts';

export interface IpcFailure {
  code: ErrorCode;
  message: string;
  location?: Location;
}

export type IpcResult<T> = { ok: true; value: T } | { ok: false; error: IpcFailure };

export const MENU_COMMANDS: readonly MenuCommand[] = [
  'open-table', 'open-project', 'save-project', 'save-project-as', 'export-report', 'print-brief', 'undo', 'redo', 'guide', 'about',
];

export function isMenuCommand(x: unknown): x is MenuCommand {
  return typeof x === 'string' && (MENU_COMMANDS as readonly string[]).includes(x);
}

/** Unwrap an IPC result: the value, or an InputError carrying the refusal. Anything malformed is a refusal too. */
export function unwrapIpcResult<T>(r: unknown): T {
  if (typeof r === 'object' && r !== null && 'ok' in r) {
    const res = r as IpcResult<T>;
    if (res.ok) return res.value;
    const e = res.error ?? { code: 'ipc-failed', message: 'the desktop shell refused the request' };
    // A code this build does not know (a newer shell) still arrives as a refusal, under the generic code.
    throw new InputError(isErrorCode(e.code) ? e.code : 'ipc-failed', String(e.message), e.location ?? {});
  }
  throw new InputError('ipc-failed', 'the desktop shell sent an unexpected reply');
}
