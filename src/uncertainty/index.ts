/**
 * Uncertainty and sensitivity: Monte Carlo bands for multipliers and scenario totals (every draw recomputed in full
 * through the model and scenario layers), and one-at-a-time sensitivity of a scenario's headline totals.
 */
export * from './settings.ts';
export { parseCvCsv, sigmaOf, cvProblem, MAX_CV, type CvRule } from './cv.ts';
export { Stream, PURPOSE } from './random.ts';
export { quantileSorted, meanOf, bandOf, type Band } from './quantiles.ts';
export { perturbTable } from './perturb.ts';
export {
  MULTIPLIER_KEYS, PARTS, SECTOR_VARIABLES, DRAW_STATUS, bandVariables, layoutOf, localShareGroups, shareRange, planDraws, pointEstimate, runDraws,
  type MultiplierKey, type Part, type SectorVariable, type DrawSetup, type DrawContext, type DrawChunk, type DrawPlan, type DrawStatus, type Layout,
} from './draws.ts';
export { summarise, MIN_ACCEPTED, REJECTED_WARNING_SHARE, type PointBand, type ScenarioBands, type Rejections, type UncertaintyResult } from './bands.ts';
export { startRun, runUncertainty, type RunOptions } from './run.ts';
export { sensitivity, DEFAULT_SHARE_STEP, DEFAULT_MARGIN_STEP, type SensitivityResult, type SensitivityItem, type SensitivitySide, type SensitivityOptions, type Totals } from './sensitivity.ts';
export { multiplierBandReport, scenarioBandReport, sensitivityReport, multiplierBandsJson, scenarioBandsJson, sensitivityJson, type BandReportContext } from './output.ts';
