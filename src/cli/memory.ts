/**
 * One full garbage collection once a large table has been imported. The decoded text of the file (as many megabytes
 * as the file: 21 MB at 2,000 sectors) is garbage then, but V8 keeps it until its next full collection, which in a
 * CLI run comes after the coefficients and the factorisation have been allocated (or never): the text then sits in
 * the peak. Collecting here costs 10–50 ms and keeps about the file's size off the peak (test/bench, peak RSS of
 * `analyze` at 2,000 sectors 220 → 200 MB). V8 exposes no collection to a script without --expose-gc, so the flag
 * is set at run time and the function taken from a fresh context (as test runners' leak detectors do).
 */
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';

/** From this file size a collection pays (the same size from which helper threads start early: analyze.ts). */
const COLLECT_FROM_BYTES = 4 << 20;

let collect: (() => void) | null = null;

/** After importing a table file of `tableBytes` bytes: one full collection when the file was large. */
export function collectImportGarbage(tableBytes: number): void {
  if (tableBytes < COLLECT_FROM_BYTES) return;
  if (collect === null) {
    setFlagsFromString('--expose-gc');
    collect = runInNewContext('gc') as () => void;
  }
  collect();
}
