/**
 * Project file schemas, checked with zod on load. Version 4 is current: scenarios of phases (one-time or annual), the
 * new line kinds and line fields (purchaser prices, price year, displacement and deadweight), spending mixes,
 * activities not in the table, margins, the price index and the table's money year, commuting and the discount rate.
 * Version 3 (the source file itself with its import settings; scenarios as flat line lists; "patterns"), version 2
 * (imported numbers; closure only implied by the path model) and version 1 (nested flow rows, flat source fields,
 * `roleMap`, `share` on scenario lines, no spending mixes) are migrated on load.
 * A new version: add its schema here, a `migrateVn` from the previous one, and bump PROJECT_VERSION.
 */
import { z } from '../schema/index.ts';

export const PROJECT_FORMAT = 'roundwise-project';
export const PROJECT_VERSION = 4;

/**
 * The schemas, built on first use: building them costs more than the rest of the CLI's start-up, and a run that reads
 * no project never needs them (the CLI's bundle also loads zod itself only then: src/cli/bundle.mjs).
 */
function buildSchemas() {
  const num = z.number();
  const rowRole = z.enum(['labourIncome', 'otherValueAdded', 'taxes', 'imports', 'employment', 'fte', 'totalInput', 'ignore']);
  const columnRole = z.enum(['householdConsumption', 'otherFinalDemand', 'totalOutput', 'ignore']);
  const roleMapSchema = z.object({
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
      /** Taxes less subsidies rows (version 4; optional, absent when none). */
      taxes: z.array(labelled).optional(),
      imports: z.array(labelled),
      employment: z.array(num).nullable(),
      /** Full-time equivalents (version 4; optional, absent when none). */
      fte: z.array(num).optional(),
      householdConsumption: z.array(labelled),
      otherFinalDemand: z.array(labelled),
      /** Labour income paid by final-demand columns (household income in the closed model); optional, absent when none. */
      householdIncomeFromFinalDemand: z.array(z.object({ row: z.string(), column: z.string(), value: num })).optional(),
      warnings: z.array(warning),
    };
  }

  // ---- version 2 ----
  const lineV2 = z.object({
    sector: z.string(), amount: num, kind, localShare: num.min(0).max(1),
    note: z.string().optional(), pattern: z.string().optional(),
  });
  const scenarioV2 = z.object({ name: z.string(), description: z.string().optional(), lines: z.array(lineV2) });
  const patternV2 = z.object({ name: z.string(), shares: z.array(z.object({ sector: z.string(), share: num.min(0).max(1) })) });
  const settingsSchema = z.object({
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

  const projectV2Schema = z.object({
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

  // ---- version 1 ----
  const lineV1 = z.object({ sector: z.string(), amount: num, kind, share: num.min(0).max(1), note: z.string().optional() });
  const projectV1Schema = z.object({
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

  // ---- version 3 ----
  const importSettings = z.object({
    layout: z.enum(['matrix', 'long', 'coefficients']).optional(),
    delimiter: z.enum([',', ';', '\t']).optional(),
    decimalMark: z.enum(['.', ',']).optional(),
    roles: roleMapSchema.partial().optional(),
    allowNegative: z.boolean().optional(),
    balanceTolerance: num.positive().optional(),
    name: z.string().optional(),
  });
  /** The source file as read: UTF-8 text when the bytes are valid UTF-8, else base64 of the bytes. */
  const contentV3 = z.object({ encoding: z.enum(['utf-8', 'base64']), data: z.string() });
  const settingsV3Schema = z.object({
    closure: z.enum(['households', 'none']),
    paths: z.object({
      destination: z.string().nullable(),
      maxLength: z.number().int().min(1).max(50),
      minShare: num.min(0).max(1),
      maxPaths: z.number().int().min(1).max(10_000),
    }),
    rounds: z.object({
      maxRounds: z.number().int().min(1).max(10_000),
      /** Relative tolerance of the analysis' rounds-to-tolerance certificate. */
      tolerance: num.positive().lt(1),
    }),
    activeScenario: z.string().nullable(),
  });
  const projectV3Schema = z.object({
    format: z.literal(PROJECT_FORMAT),
    version: z.literal(3),
    name: z.string(),
    source: z.object({
      fileName: z.string(),
      sha256: hash,
      bytes: z.number().int().min(0).optional(),
      import: importSettings,
      content: contentV3.optional(),
    }).nullable(),
    /** The imported numbers, stored only when the source file itself is not (studies migrated from version 2). */
    table: z.object(tableFields(z.array(num))).optional(),
    roles: roleMapSchema,
    scenarios: z.array(scenarioV2),
    patterns: z.array(patternV2),
    settings: settingsV3Schema,
  });

  // ---- version 4 (current) ----
  const share = num.min(0).max(1);
  const year = z.number().int().min(1000).max(9999);
  const lineV4 = z.object({
    sector: z.string(), amount: num, kind: z.enum(['final-demand', 'output', 'jobs', 'labour-income', 'mix', 'activity']), localShare: share,
    prices: z.enum(['producer', 'purchaser']).optional(), priceYear: year.optional(),
    displacement: share.optional(), deadweight: share.optional(),
    note: z.string().optional(), mix: z.string().optional(),
  });
  const phaseV4 = z.object({
    name: z.string().min(1), timing: z.enum(['once', 'annual']), year: year.optional(), years: z.number().int().min(1).max(1000).optional(),
    lines: z.array(lineV4),
  });
  const scenarioV4 = z.object({ name: z.string(), description: z.string().optional(), phases: z.array(phaseV4).min(1) });
  const mixV4 = z.object({ name: z.string().min(1), shares: z.array(z.object({ sector: z.string(), share })) });
  const activityV4 = z.object({
    name: z.string().min(1), output: num.positive(),
    jobs: num.min(0).optional(), fte: num.min(0).optional(), labourIncome: num.optional(), valueAdded: num.optional(), taxes: num.optional(),
    purchases: z.array(z.object({ sector: z.string(), amount: num.min(0), localShare: share })),
  });
  const marginRecord = z.object({ retail: share, wholesale: share, transport: share });
  const marginsV4 = z.object({
    sectors: z.object({ retail: z.string().nullable(), wholesale: z.string().nullable(), transport: z.string().nullable() }),
    localShare: marginRecord,
    rows: z.array(z.object({ sector: z.string(), shares: marginRecord })),
  });
  const settingsV4Schema = settingsV3Schema.extend({
    /** Discount rate for the present value of annual phases (a share per year), or null for none. */
    discountRate: num.min(0).lt(1).nullable(),
  });
  /**
   * The files a source table was derived from (a supply and use pair), each with its SHA-256: an optional key of
   * version 4, so files without it read as before (and a reader before it ignores it).
   */
  const sourceOriginV4 = z.object({ role: z.enum(['supply', 'use']), fileName: z.string(), sha256: hash });
  const projectV4Schema = z.object({
    format: z.literal(PROJECT_FORMAT),
    version: z.literal(4),
    name: z.string(),
    source: z.object({ ...projectV3Schema.shape.source.unwrap().shape, derivedFrom: z.array(sourceOriginV4).optional() }).nullable(),
    table: z.object(tableFields(z.array(num))).optional(),
    roles: roleMapSchema,
    scenarios: z.array(scenarioV4),
    mixes: z.array(mixV4),
    activities: z.array(activityV4),
    margins: marginsV4.nullable(),
    prices: z.object({ tableYear: year.nullable(), index: z.array(z.object({ year, index: num.positive() })).nullable() }),
    commuting: z.object({ overall: share, sectors: z.array(z.object({ sector: z.string(), share })) }),
    settings: settingsV4Schema,
  });
  return { roleMapSchema, projectV1Schema, projectV2Schema, projectV3Schema, projectV4Schema };
}

type Schemas = ReturnType<typeof buildSchemas>;
let built: Schemas | null = null;

/** The project schemas of every version (built once, on first use). */
export function projectSchemas(): Schemas {
  built ??= buildSchemas();
  return built;
}

export type ProjectV1Doc = z.infer<Schemas['projectV1Schema']>;
export type ProjectV2Doc = z.infer<Schemas['projectV2Schema']>;
export type ProjectV3Doc = z.infer<Schemas['projectV3Schema']>;
export type ProjectV4Doc = z.infer<Schemas['projectV4Schema']>;

export const DEFAULT_SETTINGS: ProjectV3Doc['settings'] = {
  closure: 'households',
  paths: { destination: null, maxLength: 6, minShare: 1e-4, maxPaths: 20 },
  rounds: { maxRounds: 200, tolerance: 1e-6 },
  activeScenario: null,
};

const DEFAULT_V2_SETTINGS: ProjectV2Doc['settings'] = {
  paths: { ...DEFAULT_SETTINGS.paths, model: 'open' },
  rounds: { maxRounds: DEFAULT_SETTINGS.rounds.maxRounds },
  activeScenario: null,
};

/**
 * v2 → v3: the numbers stay (no source bytes were kept), the closure becomes a setting. Version 2 recorded it only
 * as the path model ('closed' when the app had households closed); 'open' was also what the command line wrote for a
 * household-closed run, so the migrated closure is the path model read literally, and the study says so.
 */
export function migrateV2(d: ProjectV2Doc): { doc: ProjectV3Doc; note: string } {
  const closure = d.settings.paths.model === 'closed' ? 'households' : 'none';
  const { model: _model, ...paths } = d.settings.paths;
  return {
    doc: {
      format: PROJECT_FORMAT,
      version: 3,
      name: d.name,
      source: d.source ? { fileName: d.source.fileName, sha256: d.source.sha256, ...(d.source.bytes !== undefined ? { bytes: d.source.bytes } : {}), import: { roles: d.roles } } : null,
      table: d.table,
      roles: d.roles,
      scenarios: d.scenarios,
      patterns: d.patterns,
      settings: { closure, paths, rounds: { ...d.settings.rounds, tolerance: DEFAULT_SETTINGS.rounds.tolerance }, activeScenario: d.settings.activeScenario },
    },
    note: `this project was saved by an earlier version that did not record the household closure separately; it was read as ${closure === 'households' ? 'on' : 'off'} from the saved path model — check the closure setting`,
  };
}

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
    settings: { paths: { ...DEFAULT_V2_SETTINGS.paths }, rounds: { ...DEFAULT_V2_SETTINGS.rounds }, activeScenario: null },
  };
}

// ---- version 4 (current) ----

/** The phase every scenario of an older project becomes (its lines, one-time: the shock file's default timing). */
export const MIGRATED_PHASE = 'Phase 1';

/**
 * v3 → v4: each scenario's lines become one one-time phase (a scenario before phases was one list of lines; one-time
 * is what a shock file without a timing column means, so an old file and its migrated study say the same); "patterns"
 * become spending mixes and a line's `pattern` tag its `mix`; no activities, margins, price index, commuting or
 * discount rate.
 */
export function migrateV3(d: ProjectV3Doc): { doc: ProjectV4Doc; note: string | null } {
  return {
    doc: {
      format: PROJECT_FORMAT,
      version: 4,
      name: d.name,
      source: d.source,
      ...(d.table ? { table: d.table } : {}),
      roles: d.roles,
      scenarios: d.scenarios.map((s) => ({
        name: s.name,
        ...(s.description !== undefined ? { description: s.description } : {}),
        phases: [{
          name: MIGRATED_PHASE,
          timing: 'once' as const,
          lines: s.lines.map(({ pattern, ...l }) => ({ ...l, ...(pattern !== undefined ? { mix: pattern } : {}) })),
        }],
      })),
      mixes: d.patterns,
      activities: [],
      margins: null,
      prices: { tableYear: null, index: null },
      commuting: { overall: 0, sectors: [] },
      settings: { ...d.settings, discountRate: null },
    },
    note: d.scenarios.length
      ? `this project was saved before scenarios had phases: each scenario's lines became one one-time phase, '${MIGRATED_PHASE}'; set its timing to annual where the lines recur every year`
      : null,
  };
}
