/**
 * Project file schemas, checked with zod on load. Version 2 is current; version 1 (the first layout: nested flow rows,
 * flat source fields, `roleMap`, `share` on scenario lines, no spending patterns) is migrated on load.
 * A new version: add its schema here, a `migrateVn` from the previous one, and bump PROJECT_VERSION.
 */
import { z } from '../schema/index.ts';

export const PROJECT_FORMAT = 'roundwise-project';
export const PROJECT_VERSION = 2;

const num = z.number();
const rowRole = z.enum(['labourIncome', 'otherValueAdded', 'imports', 'employment', 'totalInput', 'ignore']);
const columnRole = z.enum(['householdConsumption', 'otherFinalDemand', 'totalOutput', 'ignore']);
export const roleMapSchema = z.object({
  rows: z.record(z.string(), rowRole),
  columns: z.record(z.string(), columnRole),
  /** Labels made sectors whatever their words (src/table RoleMap.sectors); optional, so older files read as before. */
  sectors: z.array(z.string()).optional(),
});
const labelled = z.object({ label: z.string(), values: z.array(num) });
const location = z.object({
  file: z.string().optional(), line: z.number().int().optional(), column: z.number().int().optional(),
  rowLabel: z.string().optional(), columnLabel: z.string().optional(),
});
const warning = z.object({ code: z.string(), message: z.string(), location: location.optional() });
const kind = z.enum(['final-demand', 'output', 'jobs']);
const hash = z.string().regex(/^[0-9a-f]{64}$/, 'expected 64 lower-case hex digits');

function tableFields<F extends z.ZodType>(flows: F) {
  return {
    name: z.string(),
    sectors: z.array(z.string().min(1)).min(1),
    moneyUnit: z.string(),
    layout: z.enum(['matrix', 'long', 'coefficients']),
    Z: flows,
    x: z.array(num),
    labourIncome: z.array(labelled),
    otherValueAdded: z.array(labelled),
    imports: z.array(labelled),
    employment: z.array(num).nullable(),
    householdConsumption: z.array(labelled),
    otherFinalDemand: z.array(labelled),
    /** Labour income paid by final-demand columns (household income in the closed model); optional, absent when none. */
    householdIncomeFromFinalDemand: z.array(z.object({ row: z.string(), column: z.string(), value: num })).optional(),
    warnings: z.array(warning),
  };
}

// ---- version 2 (current) ----
const lineV2 = z.object({
  sector: z.string(), amount: num, kind, localShare: num.min(0).max(1),
  note: z.string().optional(), pattern: z.string().optional(),
});
const scenarioV2 = z.object({ name: z.string(), description: z.string().optional(), lines: z.array(lineV2) });
const patternV2 = z.object({ name: z.string(), shares: z.array(z.object({ sector: z.string(), share: num.min(0).max(1) })) });
export const settingsSchema = z.object({
  paths: z.object({
    destination: z.string().nullable(),
    maxLength: z.number().int().min(1).max(50),
    minShare: num.min(0).max(1),
    maxPaths: z.number().int().min(1),
    model: z.enum(['open', 'closed']),
  }),
  rounds: z.object({ maxRounds: z.number().int().min(1).max(10_000) }),
  activeScenario: z.string().nullable(),
});

export const projectV2Schema = z.object({
  format: z.literal(PROJECT_FORMAT),
  version: z.literal(2),
  name: z.string(),
  source: z.object({ fileName: z.string(), sha256: hash, bytes: z.number().int().min(0).optional() }).nullable(),
  table: z.object(tableFields(z.array(num))),
  roles: roleMapSchema,
  scenarios: z.array(scenarioV2),
  patterns: z.array(patternV2),
  settings: settingsSchema,
});
export type ProjectV2Doc = z.infer<typeof projectV2Schema>;

// ---- version 1 ----
const lineV1 = z.object({ sector: z.string(), amount: num, kind, share: num.min(0).max(1), note: z.string().optional() });
export const projectV1Schema = z.object({
  format: z.literal(PROJECT_FORMAT),
  version: z.literal(1),
  name: z.string(),
  sourceFile: z.string().nullable(),
  sourceHash: hash.nullable(),
  table: z.object(tableFields(z.array(z.array(num)))),
  roleMap: roleMapSchema,
  scenarios: z.array(z.object({ name: z.string(), lines: z.array(lineV1) })),
  settings: z.object({}).loose(),
});
export type ProjectV1Doc = z.infer<typeof projectV1Schema>;

export const DEFAULT_SETTINGS: ProjectV2Doc['settings'] = {
  paths: { destination: null, maxLength: 6, minShare: 1e-4, maxPaths: 20, model: 'open' },
  rounds: { maxRounds: 200 },
  activeScenario: null,
};

/** v1 → v2: flatten the flow rows, gather the source fields, rename roleMap and share, add patterns and settings. */
export function migrateV1(d: ProjectV1Doc): ProjectV2Doc {
  const { Z, ...table } = d.table;
  return {
    format: PROJECT_FORMAT,
    version: 2,
    name: d.name,
    source: d.sourceFile !== null && d.sourceHash !== null ? { fileName: d.sourceFile, sha256: d.sourceHash } : null,
    table: { ...table, Z: Z.flat() },
    roles: d.roleMap,
    scenarios: d.scenarios.map((s) => ({
      name: s.name,
      lines: s.lines.map((l) => ({ sector: l.sector, amount: l.amount, kind: l.kind, localShare: l.share, ...(l.note !== undefined ? { note: l.note } : {}) })),
    })),
    patterns: [],
    settings: structuredCloneSettings(DEFAULT_SETTINGS),
  };
}

function structuredCloneSettings(s: ProjectV2Doc['settings']): ProjectV2Doc['settings'] {
  return { paths: { ...s.paths }, rounds: { ...s.rounds }, activeScenario: s.activeScenario };
}
