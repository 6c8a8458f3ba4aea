/** The report layer's public API: report rows, the CSV + sidecar document, cautions, and the analysis JSON. */
export * from './analysis-json.ts';
export * from './analysis.ts';
export * from './cautions.ts';
export * from './document.ts';
export * from './scenario.ts';
export { toCsv, formatCell, escapeText, type Cell } from '../csv/index.ts';
