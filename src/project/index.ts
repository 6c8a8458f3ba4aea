/** Project files: one JSON document per study, versioned, validated, migrated; results recomputed on load. */
export {
  createProject, defaultSettings, importSource, parseProject, serializeProject, sourceInfo,
  PROJECT_FORMAT, PROJECT_VERSION, type ImportSettings, type Project, type ProjectSettings, type SourceInfo, type SourceOrigin as ProjectSourceOrigin, type StudyPrices,
} from './project.ts';
export { migrateV1, migrateV2, migrateV3, MIGRATED_PHASE, type ProjectV1Doc, type ProjectV2Doc, type ProjectV3Doc, type ProjectV4Doc } from './schema.ts';
export { sha256Hex, sha256HexPortable, usePlatformSha256, utf8Bytes } from './sha256.ts';
export { toBase64, fromBase64 } from './base64.ts';
