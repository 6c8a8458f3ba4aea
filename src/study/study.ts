/**
 * A study: the source table as read (bytes, file name, SHA-256, import settings), its settings (household closure,
 * paths, rounds) and its named scenarios. Studies are created from a table file or a project file, and saved as a
 * project file; every front end (CLI, app) goes through these functions, so a study means the same everywhere.
 */
import { InputError } from '../diagnostics/index.ts';
import {
  createProject, importSource, parseProject, serializeProject, sourceInfo,
  type ImportSettings, type Project, type ProjectSettings, type SourceInfo,
} from '../project/index.ts';
import type { Scenario } from '../scenario/index.ts';

export type Study = Project;
export type StudySettings = ProjectSettings;
export type StudySource = SourceInfo;
export type { ImportSettings };

/** A study of the table in `bytes` (the file as read), with no scenarios yet. */
export function studyFromTableFile(bytes: Uint8Array, fileName: string, settings: ImportSettings = {}, opts: { name?: string; scenarios?: Scenario[] } = {}): Study {
  const source = sourceInfo(fileName, bytes, { import: settings });
  const table = importSource(source as SourceInfo & { content: Uint8Array });
  return createProject(table, { source, ...(opts.name !== undefined ? { name: opts.name } : {}), ...(opts.scenarios ? { scenarios: opts.scenarios } : {}) });
}

/** A study of a table that exists only in memory (an estimate, a test table): no source bytes to keep. */
export function studyOfTable(table: Study['table'], opts: { name?: string; scenarios?: Scenario[] } = {}): Study {
  return createProject(table, { ...(opts.name !== undefined ? { name: opts.name } : {}), ...(opts.scenarios ? { scenarios: opts.scenarios } : {}) });
}

/** The study saved in a project file (any supported version). */
export function studyFromProjectFile(text: string, fileName: string): Study {
  return parseProject(text, fileName);
}

/** The project file text of a study. Refuses a scenario line whose sector the table does not have. */
export function projectFileOf(study: Study): string {
  const known = new Set(study.table.sectors);
  for (const sc of study.scenarios) {
    sc.lines.forEach((l, k) => {
      if (!known.has(l.sector)) {
        throw new InputError('unknown-sector', `scenario '${sc.name}', line ${k + 1}: sector '${l.sector}' is not in this table; change or remove the line before saving`, { rowLabel: l.sector });
      }
    });
  }
  return serializeProject(study);
}

/** The same study with a new table (scenarios and settings kept; a path destination the table lacks is dropped). */
export function withTable(study: Study, table: Study): Study {
  const dest = study.settings.paths.destination;
  const keep = dest !== null && table.table.sectors.includes(dest);
  return {
    ...table,
    name: study.name,
    scenarios: study.scenarios,
    patterns: study.patterns,
    settings: { ...study.settings, paths: { ...study.settings.paths, destination: keep ? dest : null } },
  };
}

/** The scenario of that name, or a located refusal. */
export function scenarioNamed(study: Study, name: string): Scenario {
  const s = study.scenarios.find((x) => x.name === name);
  if (!s) throw new InputError('unknown-scenario', `the study has no scenario '${name}' (it has ${study.scenarios.map((x) => `'${x.name}'`).join(', ') || 'none'})`);
  return s;
}
