/**
 * Table import: CSV text → validated IOTable. (Being built; the signature is the contract other modules use.)
 */
import { InputError } from '../diagnostics/errors.ts';
import type { IOTable, Layout, RoleMap } from './types.ts';

export type { IOTable, Layout, RoleMap } from './types.ts';

export interface ImportOptions {
  /** Shown in messages ("county.csv:12:4 …"). */
  fileName: string;
  /** Layout; detected when omitted. */
  layout?: Layout;
  /** Overrides of the suggested roles (CLI --map, or the UI's role editor). */
  roles?: Partial<RoleMap>;
  /** Accept negative intermediate flows (some tables carry them for stock changes or scrap). */
  allowNegative?: boolean;
  /** Relative tolerance for the balance check, default 0.001 (0.1 %). */
  balanceTolerance?: number;
  /** Table name; defaults to the file name without extension. */
  name?: string;
}

export function importTable(_text: string, opts: ImportOptions): IOTable {
  throw new InputError('not-implemented', 'table import is not available yet', { file: opts.fileName });
}
