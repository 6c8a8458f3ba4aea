/** IOTable → CSV in the labelled-matrix layout, which importTable reads back to the same table. (Being built.) */
import type { IOTable } from './types.ts';

export function writeTableCsv(_t: IOTable): string {
  throw new Error('writeTableCsv is not available yet');
}
