/** Short, located messages for file-system failures (no stack traces, no raw errno dumps). */
import { InputError } from '../src/diagnostics/index.ts';

const REASONS: Record<string, string> = {
  ENOENT: 'the file or its folder does not exist',
  EACCES: 'permission denied',
  EPERM: 'permission denied',
  EROFS: 'the disk is read-only',
  ENOSPC: 'the disk is full',
  EDQUOT: 'the disk quota is exhausted',
  EISDIR: 'this is a folder, not a file',
  ENOTDIR: 'a part of the path is not a folder',
  EBUSY: 'the file is in use by another program',
  EMFILE: 'too many open files',
  ENAMETOOLONG: 'the file name is too long',
};

/** An InputError for a failed file operation on `file`; InputErrors pass through unchanged. */
export function fileError(err: unknown, action: 'read' | 'write', file: string): InputError {
  if (err instanceof InputError) return err;
  const code = typeof err === 'object' && err !== null && 'code' in err ? String((err as { code: unknown }).code) : '';
  const reason = REASONS[code] ?? (err instanceof Error ? err.message : 'unknown error');
  return new InputError(action === 'read' ? 'read-failed' : 'write-failed', `could not ${action} the file: ${reason}`, { file });
}
