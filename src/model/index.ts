/** The model: coefficients, the prepared factorisation, viability, multipliers and linkages of one table. */
export { analyzeTable, analyzePrepared, type Analysis, type AnalysisOptions, type Viability, type AccuracyChecks, type CoefficientsOut, type BlockInfo } from './analysis.ts';
export { prepareModel, solveOpen, solveOpenTransposed, solveClosed, solveClosedTransposed, closedBorder, type PreparedModel, type ClosedBorder } from './prepared.ts';
export { coefficients, type Coefficients } from './coefficients.ts';
export type { Availability, Multipliers, Linkages, NullNote, Values } from './multipliers.ts';
export { perronRoot } from './perron.ts';
export type { Mode, ModeKind } from './spectrum.ts';
export { formLeontief } from './leontief.ts';
