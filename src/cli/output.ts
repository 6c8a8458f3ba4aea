/**
 * The one output writer of every command: all report files of a run (into --out DIR) and files at paths the user
 * named (--project), each written atomically through src/node-io.
 *  - Nothing is written unless every target passes: a target that is one of the run's input files (same file on
 *    disk, through links too) is refused before the first write, naming both.
 *  - CSV reports start with the UTF-8 byte-order mark unless --no-bom (src/csv csvFileText says why).
 *  - Reports from an earlier run left in the same folder are flagged, not deleted: a Roundwise report is recognised
 *    by its sidecar's first words (ABOUT_SIGNATURE); one this run did not rewrite is listed as stale, with its CSV.
 *    Deleting would destroy files a person may have edited or still cites; listing them is enough to keep an old
 *    report from passing for a new one.
 */
import { readdirSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { ABOUT_SIGNATURE, type ReportFile } from '../report/index.ts';
import { readFileLimited, refuseInputOverwrite, writeFileAtomic, type FileIdentity } from '../node-io/index.ts';
import { InputError } from '../diagnostics/index.ts';
import { csvFileText } from '../csv/index.ts';
import type { NamedFile } from './command.ts';

export interface Written {
  /** Every path written, in order. */
  files: string[];
  /** Roundwise reports in the --out folder that this run did not write (from an earlier run). */
  stale: string[];
}

const ABOUT = '.about.txt';

export function writeOutputs(outDir: string | undefined, reports: readonly ReportFile[], named: readonly NamedFile[], inputs: readonly FileIdentity[], opts: { bom: boolean } = { bom: true }): Written {
  const targets: NamedFile[] = [
    ...(outDir === undefined ? [] : reports.map((f) => ({ path: join(outDir, f.name), content: f.name.endsWith('.csv') ? csvFileText(f.content, opts) : f.content }))),
    ...named,
  ];
  const seen = new Map<string, string>();
  for (const t of targets) {
    const key = resolve(t.path);
    const other = seen.get(key);
    if (other !== undefined) throw new InputError('usage', `two outputs of this run would be the same file: ${other} and ${t.path}; choose another path`, { file: t.path });
    seen.set(key, t.path);
  }
  // Every check before the first write: a refusal leaves the folder exactly as it was.
  for (const t of targets) refuseInputOverwrite(t.path, inputs);
  for (const t of targets) writeFileAtomic(t.path, t.content, { inputs });
  return { files: targets.map((t) => t.path), stale: outDir === undefined ? [] : staleReports(outDir, reports.map((f) => f.name)) };
}

/** Roundwise reports in `dir` (sidecar and CSV) whose names are not among `written`. */
export function staleReports(dir: string, written: readonly string[]): string[] {
  let names: string[];
  try {
    names = readdirSync(dir);
  } catch {
    return [];
  }
  const mine = new Set(written);
  const stale: string[] = [];
  for (const f of names.sort()) {
    if (!f.endsWith(ABOUT) || mine.has(f)) continue;
    let first = '';
    try {
      first = readFileLimited(join(dir, f), { maxBytes: 1 << 20 }).bytes.subarray(0, 200).toString();
    } catch {
      continue; // unreadable or not a regular file: not ours to judge
    }
    if (!first.startsWith(ABOUT_SIGNATURE)) continue;
    const csv = `${f.slice(0, -ABOUT.length)}.csv`;
    if (names.includes(csv) && !mine.has(csv)) stale.push(join(dir, csv));
    stale.push(join(dir, f));
  }
  return stale;
}
