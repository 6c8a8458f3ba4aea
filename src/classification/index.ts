/**
 * Classification bridges: codes of an outside classification mapped to a table's sectors (with shares where a code
 * spans several), so employment, shock and spending-mix files may name codes instead of sector labels.
 */
export { parseBridgeCsv, translateCode, BRIDGE_SHARE_TOLERANCE, type Bridge, type BridgeCode, type BridgeTarget } from './bridge.ts';
export { BRIDGE_SAMPLE_CSV, BRIDGE_SAMPLE_FILE_NAME, EMPLOYMENT_BY_CODE_SAMPLE_CSV, EMPLOYMENT_BY_CODE_SAMPLE_FILE_NAME } from './sample.ts';
