/**
 * State of "Start from a larger table": the chosen inputs (bundled samples until the user picks files), the method and
 * δ, the estimate the engine returned, and the last refusal. The estimate is only a preview: the table in use changes
 * when the planner presses "Use this table", which loads the estimate's CSV like any imported file.
 */
import { type LqMethod, BRIDGE_SAMPLE_CSV, BRIDGE_SAMPLE_FILE_NAME, EMPLOYMENT_BY_CODE_SAMPLE_CSV, EMPLOYMENT_BY_CODE_SAMPLE_FILE_NAME, DEFAULT_FLQ_DELTA, EMPLOYMENT_SAMPLE_CSV, EMPLOYMENT_SAMPLE_FILE_NAME, GROUPS_SAMPLE_CSV, GROUPS_SAMPLE_FILE_NAME, NATIONAL_SAMPLE_CSV, NATIONAL_SAMPLE_FILE_NAME } from '../../src/study/index.ts';
import { reactive } from 'vue';
import { engine, CancelledError } from '../worker/client.ts';
import type { RegionalFile, RegionalView } from '../worker/regional.ts';
import type { FlqInputs } from '../worker/protocol.ts';
import { app, messageOf, say, useTable } from './app.ts';
import { exportReportFiles } from './exporting.ts';

export type InputSlot = 'national' | 'employment' | 'rows' | 'columns' | 'groups' | 'bridge';

export const BUNDLED: Record<'national' | 'employment' | 'groups' | 'bridge' | 'employmentByCode', RegionalFile> = {
  national: { text: NATIONAL_SAMPLE_CSV, fileName: NATIONAL_SAMPLE_FILE_NAME },
  employment: { text: EMPLOYMENT_SAMPLE_CSV, fileName: EMPLOYMENT_SAMPLE_FILE_NAME },
  groups: { text: GROUPS_SAMPLE_CSV, fileName: GROUPS_SAMPLE_FILE_NAME },
  bridge: { text: BRIDGE_SAMPLE_CSV, fileName: BRIDGE_SAMPLE_FILE_NAME },
  employmentByCode: { text: EMPLOYMENT_BY_CODE_SAMPLE_CSV, fileName: EMPLOYMENT_BY_CODE_SAMPLE_FILE_NAME },
};

export const regional = reactive({
  national: { ...BUNDLED.national } as RegionalFile,
  nationalBundled: true,
  employment: { ...BUNDLED.employment } as RegionalFile,
  employmentBundled: true,
  method: 'flq' as LqMethod,
  /** As typed: a string, so a half-typed or out-of-range value can be refused without losing it. */
  delta: String(DEFAULT_FLQ_DELTA),
  useBalance: false,
  rows: null as RegionalFile | null,
  columns: null as RegionalFile | null,
  useGroups: false,
  groups: null as RegionalFile | null,
  /** Employment by codes of another classification, read through a bridge `code,sector[,share]`. */
  useBridge: false,
  bridge: null as RegionalFile | null,
  view: null as RegionalView | null,
  /** The inputs of `view` when it is a plain FLQ estimate (no RAS, no grouping, no bridge): FLQ δ can then be varied on it. */
  viewFlq: null as FlqInputs | null,
  /** Located one-line refusal of the inputs as they stand; the table in use is untouched. */
  error: null as string | null,
  busy: false,
});

/** δ as a number, or a refusal in words (FLQ only). */
export function deltaValue(): { value: number } | { error: string } {
  const s = regional.delta.trim().replace(',', '.');
  const v = s === '' ? Number.NaN : Number(s);
  if (!Number.isFinite(v)) return { error: `δ '${regional.delta}' is not a number; give a value between 0 and 1 (0.3 is the usual default)` };
  if (v < 0 || v > 1) return { error: `δ must lie between 0 and 1 (got ${v})` };
  return { value: v };
}

export function setInput(slot: InputSlot, file: RegionalFile | null): void {
  if (slot === 'national') { regional.national = file ?? { ...BUNDLED.national }; regional.nationalBundled = file === null; }
  else if (slot === 'employment') { regional.employment = file ?? { ...(regional.useBridge ? BUNDLED.employmentByCode : BUNDLED.employment) }; regional.employmentBundled = file === null; }
  else regional[slot] = file;
}

/** Employment by codes through a bridge, or by sector; the bundled employment follows (jobs by code, or by sector). */
export function setUseBridge(on: boolean): void {
  regional.useBridge = on;
  if (regional.employmentBundled) regional.employment = { ...(on ? BUNDLED.employmentByCode : BUNDLED.employment) };
}

let seq = 0;
/** Recompute the estimate from the inputs as they stand. Refusals are kept as the located message. */
export async function estimate(): Promise<void> {
  const my = ++seq;
  const d = regional.method === 'flq' ? deltaValue() : { value: DEFAULT_FLQ_DELTA };
  if ('error' in d) {
    regional.view = null;
    regional.error = d.error;
    return;
  }
  const balance = regional.useBalance && regional.rows && regional.columns ? { rows: regional.rows, columns: regional.columns } : null;
  const groups = regional.useGroups ? regional.groups ?? BUNDLED.groups : null;
  const bridge = regional.useBridge ? regional.bridge ?? BUNDLED.bridge : null;
  regional.busy = true;
  try {
    const v = await engine().call('buildRegional', {
      national: regional.national, employment: regional.employment, method: regional.method, delta: d.value, balance, groups, bridge,
    }, 'Estimating the county table…');
    if (my !== seq) return;
    regional.view = v;
    regional.viewFlq = regional.method === 'flq' && !balance && !groups && !bridge
      ? { national: { ...regional.national }, employment: { ...regional.employment }, delta: d.value } : null;
    regional.error = null;
  } catch (e) {
    if (my !== seq || e instanceof CancelledError) return;
    regional.view = null;
    regional.error = messageOf(e);
  } finally {
    if (my === seq) regional.busy = false;
  }
}

/** Make the estimate the table in use: loaded from its CSV like any imported file. */
export async function acceptEstimate(): Promise<boolean> {
  const v = regional.view;
  if (!v) return false;
  const flq = regional.viewFlq;
  const ok = await useTable({ text: v.result.csv, fileName: v.result.fileName });
  if (ok) {
    app.flqInputs = flq;
    say(`Now using ${v.result.fileName}`);
    app.screen = 'overview';
  } else {
    // The refusal belongs to this screen, not to the Import screen's file.
    regional.error = app.importError;
    app.importError = null;
  }
  return ok;
}

/** The county table as CSV (reads back with Import) and its notes, through the bridge (save dialog or download). */
export async function exportEstimate(): Promise<void> {
  const v = regional.view;
  if (!v) return;
  const base = v.result.fileName.replace(/\.csv$/, '');
  await exportReportFiles([{ name: v.result.fileName, content: v.result.csv }, { name: `${base}.about.txt`, content: v.result.about }]);
}
