/**
 * Demand-shock scenarios: phases of lines, effects (direct / indirect / induced / total), spending rounds, structural
 * paths, and the small files that describe a shock (shock, mix, activity, margins, price-index, commuting files).
 */
export * from './types.ts';
export { resolveShock, expandLine, spreadMix, mixShares, priceFactorOf, lineWhere, MIX_SUM_TOLERANCE, type ExpandedLine, type LineComponent } from './lines.ts';
export { solveMixed, type MixedSolution } from './mixed.ts';
export { runPhase, runPhaseExpanded, type ScenarioModels, type PhaseRunOptions } from './effects.ts';
export { annuityFactor, checkDiscountRate, overTime, sumTotals, type OverTime, type TotalsRecord } from './timing.ts';
export { spendingRounds, COVERAGE_TARGETS, MAX_SPENDING_ROUNDS, type RoundsOptions, type RoundsResult } from './rounds.ts';
export { structuralPaths, HOUSEHOLD_POLE_LABEL, MAX_PATH_VISITS, type PathOptions, type PathAnalysis, type StructuralPath } from './paths.ts';
export { compareScenarios, type ScenarioComparison, type ComparisonEntry } from './compare.ts';
export { parseShockCsv, SHOCK_HEADER, DEFAULT_PHASE_NAME } from './shock-csv.ts';
export { parseMixCsv, writeMixCsv, checkMixSectors, MIX_HEADER } from './mix-csv.ts';
export { parseActivityCsv, writeActivityCsv, checkActivity, checkActivitySectors, ACTIVITY_HEADER } from './activity-csv.ts';
export { parseMarginsCsv, writeMarginsCsv, checkMargins, checkMarginSectors, MARGINS_HEADER } from './margins-csv.ts';
export { parsePriceIndexCsv, writePriceIndexCsv, yearOfMoneyUnit, PRICE_INDEX_HEADER } from './prices-csv.ts';
export { parseCommutingCsv, residentShares, commutingText, NO_COMMUTING, type Commuting } from './commuting-csv.ts';
export { checkShock, shockNotes, amountText } from './shock-checks.ts';
export { mixesOfTable, tableMixName } from './table-mixes.ts';
export { SAMPLE_SHOCK_CSV, SAMPLE_SHOCK_FILE_NAME } from './sample.ts';
