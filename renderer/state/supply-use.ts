/**
 * State of "Start from supply and use tables": the pair (the bundled invented sample until the user picks files), the
 * kind of table and the assumption, the remedy for negatives, the derived table the engine returned and the last
 * refusal. The derived table is a preview: the table in use changes when the planner presses "Use this table" (its
 * CSV loaded like any imported file), or it becomes the larger table of a county estimate.
 */
import { reactive } from 'vue';
import {
  DEFAULT_ASSUMPTION, SUT_DEFAULT_TOLERANCE, SUPPLY_SAMPLE_CSV, SUPPLY_SAMPLE_FILE_NAME, USE_SAMPLE_CSV, USE_SAMPLE_FILE_NAME,
  type Assumption, type NegativesRemedy, type SupplyColumnRole, type SutRoleMap, type SutRoles, type TableBy,
} from '../../src/study/index.ts';
import type { ColumnRole, RowRole } from '../../src/table/index.ts';
import { engine, CancelledError } from '../worker/client.ts';
import type { RegionalFile } from '../worker/regional.ts';
import type { SupplyUseView } from '../worker/supply-use.ts';
import { app, messageOf, say, useTable } from './app.ts';
import { exportReportFiles } from './exporting.ts';
import { regional, setInput } from './regional.ts';

export type PairSlot = 'supply' | 'use';

export const BUNDLED_PAIR: Record<PairSlot, RegionalFile> = {
  supply: { text: SUPPLY_SAMPLE_CSV, fileName: SUPPLY_SAMPLE_FILE_NAME },
  use: { text: USE_SAMPLE_CSV, fileName: USE_SAMPLE_FILE_NAME },
};

export const supplyUse = reactive({
  supply: { ...BUNDLED_PAIR.supply } as RegionalFile,
  supplyBundled: true,
  use: { ...BUNDLED_PAIR.use } as RegionalFile,
  useBundled: true,
  by: 'industry' as TableBy,
  assumption: DEFAULT_ASSUMPTION.industry as Assumption,
  negatives: 'keep' as NegativesRemedy,
  /** Supply–use tolerance in percent, as typed (a string, so a half-typed value is refused without being lost). */
  tolerance: String(SUT_DEFAULT_TOLERANCE * 100),
  /**
   * Roles the planner set (the CLI's --map: supply columns and rows set aside, use-table rows and columns), from the
   * screen's choices or a role map file; the rest are decided by the reader as without a map.
   */
  map: {} as SutRoleMap,
  /** The role map file last read (its roles may since have been changed on screen). */
  mapFileName: null as string | null,
  /**
   * Located refusal of the role map file last picked. Kept apart from `error` (the pair's refusal): the roles, and so
   * the preview, stay as they were, and a derivation still running from an earlier change must not clear it.
   */
  mapError: null as string | null,
  /** Every label's role as the reader decides it with `map` (shown even while the pair is refused). */
  roles: null as SutRoles | null,
  view: null as SupplyUseView | null,
  /** Located one-line refusal of the pair as it stands; the table in use is untouched. */
  error: null as string | null,
  busy: false,
});

export function setPairFile(slot: PairSlot, file: RegionalFile | null): void {
  supplyUse[slot] = file ?? { ...BUNDLED_PAIR[slot] };
  if (slot === 'supply') supplyUse.supplyBundled = file === null;
  else supplyUse.useBundled = file === null;
}

export type RolePart = 'supply' | 'rows' | 'columns';
type RoleOf<P extends RolePart> = P extends 'supply' ? SupplyColumnRole : P extends 'rows' ? RowRole : ColumnRole;

/** Give a label a role (null: back to the reader's own decision); the preview follows. */
export function setSutRole<P extends RolePart>(part: P, label: string, role: RoleOf<P> | null): void {
  const entries = { ...(supplyUse.map[part] ?? {}) } as Record<string, RoleOf<P>>;
  if (role === null) delete entries[label];
  else entries[label] = role;
  const next: SutRoleMap = { ...supplyUse.map };
  if (Object.keys(entries).length) (next as Record<RolePart, unknown>)[part] = entries;
  else delete next[part];
  supplyUse.map = next;
  supplyUse.mapError = null;
}

/** Read a role map file (JSON, as the CLI's --map); a refusal is shown and the roles stay as they were. */
export async function loadSutMap(file: RegionalFile): Promise<void> {
  try {
    supplyUse.map = await engine().call('readSutMap', file, 'Reading the role map…');
    supplyUse.mapFileName = file.fileName;
    supplyUse.mapError = null;
  } catch (e) {
    if (e instanceof CancelledError) return;
    supplyUse.mapError = messageOf(e);
  }
}

/** Back to the roles the reader decides by itself. */
export function resetSutMap(): void {
  supplyUse.map = {};
  supplyUse.mapFileName = null;
  supplyUse.mapError = null;
}

/** The roles set on screen as a role map file (JSON) that `roundwise sut --map` and "Read a role map…" read back. */
export async function exportSutMap(): Promise<void> {
  await exportReportFiles([{ name: 'supply-use-roles.json', content: `${JSON.stringify(supplyUse.map, null, 2)}\n` }]);
}

/** Switch the kind of table; the assumption follows to that kind's default (the one without negatives). */
export function setBy(by: TableBy): void {
  supplyUse.by = by;
  supplyUse.assumption = DEFAULT_ASSUMPTION[by];
}

/** The tolerance as a fraction, or a refusal in words. */
export function toleranceValue(): { value: number } | { error: string } {
  const t = supplyUse.tolerance.trim().replace(',', '.').replace(/\s*%$/, '');
  const v = t === '' ? Number.NaN : Number(t);
  if (!Number.isFinite(v)) return { error: `the tolerance '${supplyUse.tolerance}' is not a number; give a percentage such as 0.1` };
  if (!(v > 0 && v < 100)) return { error: `the tolerance must lie between 0 and 100 % (got ${v})` };
  return { value: v / 100 };
}

let seq = 0;
/** Derive the symmetric table from the pair as it stands. Refusals are kept as the located message. */
export async function derive(): Promise<void> {
  const my = ++seq;
  const tol = toleranceValue();
  if ('error' in tol) {
    supplyUse.view = null;
    supplyUse.error = tol.error;
    return;
  }
  supplyUse.busy = true;
  try {
    // The roles first: when the pair is refused for a label without one, the planner sees it and can give it one.
    try {
      const roles = await engine().call('sutRoles', { supply: supplyUse.supply, use: supplyUse.use, map: supplyUse.map });
      if (my === seq) supplyUse.roles = roles;
    } catch (e) {
      if (e instanceof CancelledError) return;
      if (my === seq) supplyUse.roles = null; // a file that cannot be read at all: the derivation below says why
    }
    const v = await engine().call('buildSymmetric', {
      supply: supplyUse.supply, use: supplyUse.use, by: supplyUse.by, assumption: supplyUse.assumption, negatives: supplyUse.negatives, tolerance: tol.value, map: supplyUse.map,
    }, 'Deriving the symmetric table…');
    if (my !== seq) return;
    supplyUse.view = v;
    supplyUse.error = null;
  } catch (e) {
    if (my !== seq || e instanceof CancelledError) return;
    supplyUse.view = null;
    supplyUse.error = messageOf(e);
  } finally {
    if (my === seq) supplyUse.busy = false;
  }
}

/** Make the derived table the table in use: loaded from its CSV like any imported file. */
export async function acceptSymmetric(): Promise<boolean> {
  const v = supplyUse.view;
  if (!v || v.result.hasNegatives) return false;
  const ok = await useTable({ text: v.result.csv, fileName: v.result.fileName, name: v.result.name, derivedFrom: v.sources });
  if (ok) {
    say(`Now using ${v.result.fileName}`);
    app.screen = 'overview';
  } else {
    supplyUse.error = app.importError;
    app.importError = null;
  }
  return ok;
}

/** Hand the derived table to "Start from a larger table" as its national table. */
export function useAsLargerTable(): void {
  const v = supplyUse.view;
  if (!v || v.result.hasNegatives) return;
  setInput('national', { text: v.result.csv, fileName: v.result.fileName });
  regional.view = null;
  app.screen = 'regional';
  say(`${v.result.fileName} is the larger table of the county estimate`);
}

/** The derived table as CSV (reads back with Import) and its notes, through the bridge (save dialog or download). */
export async function exportSymmetric(): Promise<void> {
  const v = supplyUse.view;
  if (!v) return;
  await exportReportFiles([{ name: v.result.fileName, content: v.result.csv }, { name: v.result.fileName.replace(/\.csv$/, '.about.txt'), content: v.result.about }]);
}
