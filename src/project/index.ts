/** Project files: one JSON document per study, versioned, validated, migrated; results recomputed on load. */
export {
  createProject, defaultSettings, parseProject, serializeProject, sourceInfo,
  PROJECT_FORMAT, PROJECT_VERSION, type Project, type ProjectSettings, type SourceInfo,
} from './project.ts';
export { migrateV1, type ProjectV1Doc, type ProjectV2Doc } from './schema.ts';
export { sha256Hex, utf8Bytes } from './sha256.ts';
export { roleMapSchema } from './schema.ts';
