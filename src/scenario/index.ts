/** Demand-shock scenarios: lines, effects (direct / indirect / induced / total), spending rounds, structural paths. */
export * from './types.ts';
export { resolveShock, spreadPattern, PATTERN_SUM_TOLERANCE } from './lines.ts';
export { solveMixed, type MixedSolution } from './mixed.ts';
export { runScenario } from './effects.ts';
export { spendingRounds, COVERAGE_TARGETS, MAX_SPENDING_ROUNDS, type RoundsOptions, type RoundsResult } from './rounds.ts';
export { structuralPaths, HOUSEHOLD_POLE_LABEL, MAX_PATH_VISITS, type PathOptions, type PathAnalysis, type StructuralPath } from './paths.ts';
export { compareScenarios, type ScenarioComparison } from './compare.ts';
export { parseShockCsv } from './shock-csv.ts';
export { checkShock, shockNotes } from './shock-checks.ts';
export { analyseScenario, type ScenarioAnalysis } from './analysis.ts';
