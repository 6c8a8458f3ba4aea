/**
 * What a crash-recovery copy holds: the table and settings as a project with no scenarios (the worker's
 * `recoveryBase`, written without save-time checks), plus the scenarios exactly as the UI held them, the settings, when it was written and
 * the table's name (shown when the copy is offered). A scenario line naming a sector the table does not have is
 * kept as typed: the copy is what was on screen, not what a save would accept.
 * Copies written by the first versions (a plain project file) are read too.
 */
import { LINE_KINDS, PROJECT_FORMAT, TIMINGS, MIGRATED_PHASE } from '../../src/study/index.ts';
import { z } from '../../src/schema/index.ts';
import type { ScenarioDraft } from '../worker/protocol.ts';

export const RECOVERY_FORMAT = 'roundwise-recovery';

export interface RecoveryCopy {
  /** ISO date of the write; null for a copy from the first versions. */
  savedAt: string | null;
  tableName: string | null;
  /** The saved project the work started from, if any (its name only: the copy is never written back there). */
  projectName: string | null;
  /** Project text: the table, source and settings. */
  project: string;
  /** The scenarios as the UI held them; null for a copy from the first versions (they are inside `project`). */
  scenarios: ScenarioDraft[] | null;
  selected: number;
}

const line = z.looseObject({
  sector: z.string(),
  amount: z.number(),
  kind: z.enum(LINE_KINDS as [string, ...string[]]),
  localShare: z.number(),
  note: z.string().optional(),
});
// Version 1 copies: a scenario was one list of lines (before phases); read as one one-time phase, as projects are.
const scenarioV1 = z.object({ name: z.string(), description: z.string().optional(), lines: z.array(line) });
const phase = z.looseObject({ name: z.string(), timing: z.enum(TIMINGS as [string, ...string[]]), lines: z.array(line) });
const scenario = z.object({ name: z.string(), description: z.string().optional(), phases: z.array(phase) });
const common = {
  format: z.literal(RECOVERY_FORMAT),
  savedAt: z.string(),
  tableName: z.string(),
  projectName: z.string().nullable(),
  selected: z.number().int().min(0),
  project: z.string(),
};
const copySchema = z.object({ ...common, version: z.literal(2), scenarios: z.array(scenario) });
const copyV1Schema = z.object({ ...common, version: z.literal(1), scenarios: z.array(scenarioV1) });

function upgradeV1(s: z.infer<typeof scenarioV1>): unknown {
  const { lines, ...rest } = s;
  return { ...rest, phases: [{ name: MIGRATED_PHASE, timing: 'once', lines: lines.map(({ pattern, ...l }) => ({ ...l, ...(typeof pattern === 'string' ? { mix: pattern } : {}) })) }] };
}

/**
 * The copy's text. `projectJson` is `JSON.stringify(c.project)` when the caller keeps it: the project text holds the
 * table's source bytes (20 MB at 2,000 sectors), so escaping it again on every scenario edit would stall the window.
 */
export function writeRecoveryCopy(c: RecoveryCopy & { savedAt: string; tableName: string; scenarios: ScenarioDraft[] }, projectJson?: string): string {
  const head = JSON.stringify({
    format: RECOVERY_FORMAT, version: 2, savedAt: c.savedAt, tableName: c.tableName, projectName: c.projectName,
    selected: c.selected, scenarios: c.scenarios,
  });
  return `${head.slice(0, -1)},"project":${projectJson ?? JSON.stringify(c.project)}}`;
}

/**
 * The copy as a Blob around the project's JSON string literal (`recoveryBaseJson`, a Blob from the worker): the same
 * text as `writeRecoveryCopy`, assembled without the page ever holding the project text.
 */
export function recoveryCopyBlob(c: Omit<RecoveryCopy, 'project'> & { savedAt: string; tableName: string; scenarios: ScenarioDraft[] }, projectJson: Blob): Blob {
  const head = JSON.stringify({
    format: RECOVERY_FORMAT, version: 2, savedAt: c.savedAt, tableName: c.tableName, projectName: c.projectName,
    selected: c.selected, scenarios: c.scenarios,
  });
  return new Blob([`${head.slice(0, -1)},"project":`, projectJson, '}'], { type: 'application/json' });
}

/** The copy, or a reason it cannot be used (damaged, or not a copy at all). */
export function readRecoveryCopy(text: string): RecoveryCopy | { damaged: string } {
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch {
    return { damaged: 'the copy is not valid JSON (it may have been cut short)' };
  }
  const format = typeof raw === 'object' && raw !== null ? (raw as { format?: unknown }).format : undefined;
  if (format === PROJECT_FORMAT) {
    const table = (raw as { table?: { name?: unknown } }).table;
    return { savedAt: null, tableName: typeof table?.name === 'string' ? table.name : null, projectName: null, project: text, scenarios: null, selected: 0 };
  }
  const v1 = typeof raw === 'object' && raw !== null && (raw as { version?: unknown }).version === 1;
  const r = v1 ? copyV1Schema.safeParse(raw) : copySchema.safeParse(raw);
  if (!r.success) {
    const issue = r.error.issues[0];
    return { damaged: `the copy is damaged${issue?.path.length ? ` at ${issue.path.join('.')}` : ''}` };
  }
  const d = r.data;
  const scenarios = (d.version === 1 ? d.scenarios.map(upgradeV1) : d.scenarios) as ScenarioDraft[];
  return { savedAt: d.savedAt, tableName: d.tableName, projectName: d.projectName, project: d.project, scenarios, selected: d.selected };
}

function when(iso: string | null, locale?: string): string {
  const d = iso ? new Date(iso) : null;
  if (!d || Number.isNaN(d.getTime())) return 'at an unknown time';
  return `from ${new Intl.DateTimeFormat(locale, { dateStyle: 'medium', timeStyle: 'short' }).format(d)}`;
}

/** The sentence that offers a copy: when it was written, on which table, how many scenarios. */
export function describeCopy(c: RecoveryCopy, locale?: string): string {
  const parts = [`Unsaved work ${when(c.savedAt, locale)}`];
  if (c.tableName) parts.push(`on the table “${c.tableName}”`);
  if (c.scenarios) parts.push(`with ${c.scenarios.length} scenario${c.scenarios.length === 1 ? '' : 's'}`);
  if (c.projectName) parts.push(`(project ${c.projectName})`);
  return `${parts.join(' ')}: its window closed before it was saved.`;
}
