/**
 * A study: the source table as read (bytes, file name, SHA-256, import settings), its settings (household closure,
 * paths, rounds) and its named scenarios. Studies are created from a table file or a project file, and saved as a
 * project file; every front end (CLI, app) goes through these functions, so a study means the same everywhere.
 */
import { InputError } from '../diagnostics/index.ts';
import {
  createProject, importSource, parseProject, serializeProject, sourceInfo,
  type ImportSettings, type Project, type ProjectSettings, type SourceInfo, type StudyPrices,
} from '../project/index.ts';
import {
  checkActivity, checkActivitySectors, checkMargins, checkMarginSectors, checkMixSectors, mixesOfTable, mixShares, residentShares, SECTOR_KINDS, type Scenario,
} from '../scenario/index.ts';

export type Study = Project;
export type StudySettings = ProjectSettings;
export type StudySource = SourceInfo;
export type { ImportSettings, StudyPrices };

/**
 * A study of the table in `bytes` (the file as read), with no scenarios yet. The study keeps the bytes (a project
 * saves them) unless `keepBytes` is false: a run that saves no project then need not hold the file in memory (its
 * name, size and SHA-256 stay in `source`, and a project made of it saves the table's numbers instead).
 */
export function studyFromTableFile(bytes: Uint8Array, fileName: string, settings: ImportSettings = {}, opts: { name?: string; scenarios?: Scenario[]; keepBytes?: boolean } = {}): Study {
  const source = sourceInfo(fileName, bytes, { import: settings });
  const table = importSource(source as SourceInfo & { content: Uint8Array });
  if (opts.keepBytes === false) delete source.content;
  return createProject(table, { source, ...(opts.name !== undefined ? { name: opts.name } : {}), ...(opts.scenarios ? { scenarios: opts.scenarios } : {}) });
}

/**
 * `studyFromTableFile` for a front end that has just imported the same bytes under the same settings (the app's
 * preview of a file, then "Use this table"): `table` is taken as given instead of being read a second time. It must be
 * what `importSource` reads from these bytes (their UTF-8 text, `fileName`, `settings`); the app's test checks the
 * study equals `studyFromTableFile`'s.
 */
export function studyFromImportedTable(bytes: Uint8Array, fileName: string, settings: ImportSettings, table: Study['table']): Study {
  return createProject(table, { source: sourceInfo(fileName, bytes, { import: settings }) });
}

/** A study of a table that exists only in memory (an estimate, a test table): no source bytes to keep. */
export function studyOfTable(table: Study['table'], opts: { name?: string; scenarios?: Scenario[] } = {}): Study {
  return createProject(table, { ...(opts.name !== undefined ? { name: opts.name } : {}), ...(opts.scenarios ? { scenarios: opts.scenarios } : {}) });
}

/** The study saved in a project file (any supported version). */
export function studyFromProjectFile(text: string, fileName: string): Study {
  return parseProject(text, fileName);
}

/**
 * The project file text of a study. Refuses a scenario line whose sector, mix or activity the study does not have, and
 * study content (mixes, activities, margins, commuting) that names a sector the table lacks.
 */
export function projectFileOf(study: Study): string {
  const known = new Set(study.table.sectors);
  const mixes = new Set([...study.mixes, ...mixesOfTable(study.table)].map((m) => m.name));
  const activities = new Set(study.activities.map((a) => a.name));
  for (const sc of study.scenarios) {
    const phaseNames = new Set<string>();
    for (const ph of sc.phases) {
      if (phaseNames.has(ph.name)) throw new InputError('duplicate-name', `scenario '${sc.name}' has two phases named '${ph.name}'; rename one before saving`);
      phaseNames.add(ph.name);
      ph.lines.forEach((l, k) => {
        const where = `scenario '${sc.name}', phase '${ph.name}', line ${k + 1}`;
        if (SECTOR_KINDS.includes(l.kind) && !known.has(l.sector)) {
          throw new InputError('unknown-sector', `${where}: sector '${l.sector}' is not in this table; change or remove the line before saving`, { rowLabel: l.sector });
        }
        if (l.kind === 'mix' && !mixes.has(l.sector)) throw new InputError('unknown-mix', `${where}: the spending mix '${l.sector}' is not in this study`, { rowLabel: l.sector });
        if (l.kind === 'activity' && !activities.has(l.sector)) throw new InputError('unknown-activity', `${where}: the activity '${l.sector}' is not in this study`, { rowLabel: l.sector });
        if (l.kind === 'labour-income' && l.sector !== '') throw new InputError('labour-income-sector', `${where}: a labour-income line has no sector`, { rowLabel: l.sector });
      });
    }
  }
  checkStudyInputs(study);
  return serializeProject(study);
}

/**
 * Refuse study content (mixes, activities, margins, commuting) that cannot be — shares out of range or not summing to
 * 1, an activity buying more than its output, two mixes or activities of one name — or that names a sector the table
 * lacks. The one check for content from files, projects and the app's editors alike.
 */
export function checkStudyInputs(study: Study): void {
  const sectors = study.table.sectors;
  for (const [what, list] of [['spending mix', study.mixes], ['activity', study.activities]] as const) {
    const names = new Set<string>();
    for (const x of list) {
      if (x.name.trim() === '') throw new InputError('missing-label', `a${what === 'activity' ? 'n' : ''} ${what} needs a name`);
      if (names.has(x.name)) throw new InputError('duplicate-name', `two of the study's ${what === 'activity' ? 'activities' : 'spending mixes'} are named '${x.name}'`, { rowLabel: x.name });
      names.add(x.name);
    }
  }
  for (const m of study.mixes) mixShares(m);
  for (const a of study.activities) checkActivity(a);
  if (study.margins) checkMargins(study.margins);
  checkMixSectors(study.mixes, sectors);
  checkActivitySectors(study.activities, sectors);
  if (study.margins) checkMarginSectors(study.margins, sectors);
  residentShares(study.commuting, sectors);
}

/**
 * The same study with a new table: scenarios, mixes, activities, margins, prices and settings kept (lines and content
 * naming sectors the new table lacks are said where they are used); a path destination and commuting shares of
 * sectors the table lacks are dropped.
 */
export function withTable(study: Study, table: Study): Study {
  const dest = study.settings.paths.destination;
  const sectors = new Set(table.table.sectors);
  const keep = dest !== null && sectors.has(dest);
  return {
    ...table,
    name: study.name,
    scenarios: study.scenarios,
    mixes: study.mixes,
    activities: study.activities,
    margins: study.margins,
    prices: study.prices,
    commuting: { overall: study.commuting.overall, sectors: study.commuting.sectors.filter((c) => sectors.has(c.sector)) },
    settings: { ...study.settings, paths: { ...study.settings.paths, destination: keep ? dest : null } },
  };
}

/** The scenario of that name, or a located refusal. */
export function scenarioNamed(study: Study, name: string): Scenario {
  const s = study.scenarios.find((x) => x.name === name);
  if (!s) throw new InputError('unknown-scenario', `the study has no scenario '${name}' (it has ${study.scenarios.map((x) => `'${x.name}'`).join(', ') || 'none'})`);
  return s;
}
