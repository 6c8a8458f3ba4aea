/**
 * The one table of file-system failures in words (errno code → short reason), for the CLI and the desktop shell
 * alike: a refusal names the file and says what went wrong, never a raw errno dump or a stack trace.
 */
import { InputError } from '../diagnostics/index.ts';

const REASONS: Record<string, string> = {
  ENOENT: 'no such file (it or its folder does not exist)',
  EACCES: 'permission denied',
  EPERM: 'permission denied',
  EROFS: 'the disk is read-only',
  ENOSPC: 'the disk is full',
  EDQUOT: 'the disk quota is exhausted',
  EFBIG: 'the file is too large for the disk',
  EIO: 'the disk reported an input/output error',
  EISDIR: 'is a folder, not a file',
  ENOTDIR: 'a part of the path is not a folder',
  EEXIST: 'a file of that name appeared while writing',
  EBUSY: 'the file is in use by another program',
  ETXTBSY: 'the file is in use by another program',
  EMFILE: 'too many open files',
  ENFILE: 'too many open files',
  ENAMETOOLONG: 'the file name is too long',
  ELOOP: 'too many symbolic links in the path',
  EXDEV: 'the temporary file and the target are on different disks',
};

/** The errno code of a Node file-system error ('' when there is none). */
export function errnoCode(err: unknown): string {
  return typeof err === 'object' && err !== null && 'code' in err ? String((err as { code: unknown }).code) : '';
}

/** Short words for a failed file operation: the table's reason, or the first line of the error's own message. */
export function fsReason(err: unknown): string {
  const code = errnoCode(err);
  const known = REASONS[code];
  if (known) return known;
  const first = err instanceof Error ? err.message.split('\n')[0]! : '';
  return first ? first.slice(0, 120) : code ? `error ${code}` : 'unknown error';
}

/**
 * An InputError for a failed read or write of `file` (as the user named it); InputErrors pass through unchanged.
 * Reads say only the reason ("county.csv: no such file or folder"); writes say that nothing was written there.
 */
export function fileError(err: unknown, action: 'read' | 'write', file: string): InputError {
  if (err instanceof InputError) return err;
  return action === 'read'
    ? new InputError('read-failed', fsReason(err), { file })
    : new InputError('write-failed', `cannot write: ${fsReason(err)}`, { file });
}
