/**
 * Supply and use tables → a symmetric input–output table: reading the pair (products × industries, with the table
 * importer's dialect and located refusals), the four transformations of Eurostat's Manual (2008, ch. 11) in the
 * notation of Miller & Blair (2009, ch. 5), the negatives they can give and the remedy offered. The result is an
 * ordinary IOTable, so every analysis, scenario and county estimate takes it as it is.
 */
export * from './types.ts';
export { readSupplyUse, supplyUseRoles, SUT_DEFAULT_TOLERANCE, type SutFile, type ReadSutOptions, type SutLabelRole, type SutRoles } from './read.ts';
export { parseSutRoleMap, suggestSupplyRole, namesTotal } from './roles.ts';
export { transform, ASSUMPTION_NAMES, type SymmetricFlows } from './transform.ts';
export { findNegatives, negativesNote, zeroAndBalance, type NegativesReport, type NegativeCell } from './negatives.ts';
export { deriveSymmetric, type DerivedTable, type DeriveOptions } from './symmetric.ts';
export { SUPPLY_SAMPLE_CSV, USE_SAMPLE_CSV, SUPPLY_SAMPLE_FILE_NAME, USE_SAMPLE_FILE_NAME, SUT_SAMPLE_NOTE } from './sample.ts';
