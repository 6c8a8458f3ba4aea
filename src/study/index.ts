/**
 * The application layer: a study (a source table, its settings and scenarios) and everything computed from it.
 * The CLI commands and the app's worker reach the engine only through here.
 */
export {
  studyFromTableFile, studyFromImportedTable, studyFromProjectFile, studyOfTable, projectFileOf, withTable, scenarioNamed, checkStudyInputs,
  type Study, type StudySettings, type StudySource, type ImportSettings, type StudyPrices,
} from './study.ts';
export { prepareStudy, restudy, studyLeontief, studyCoefficientRows, CLOSURE_OFF, type PreparedStudy, type PrepareOptions } from './prepare.ts';
export {
  runStudyScenario, readyLines, lineReady, defaultDestination, tracePaths, compareStudyScenarios, shockInputsOf, tableYearOf, studyModelNotes,
  type ScenarioOutcome, type PhaseOutcome, type TimingTotal, type OutcomeOptions,
} from './scenarios.ts';
export { unitDemandRounds } from './rounds.ts';
export {
  REPORTS, buildReport, tableReport, scenarioReport, comparisonOf, tableReportSet, scenarioReportSet, reportUnavailable, scenarioSlug, phaseSlugs,
  type ReportKind, type ReportEntry, type ScenarioReportKind,
} from './reports.ts';
export { studyAnalysisJson, scenarioJson } from './json.ts';
export { estimateCountyTable, flqOriginOf, type CountyEstimate, type EstimateRequest, type EstimateFile, type FlqOrigin } from './estimate.ts';

// What the front ends need besides the study itself (they import engine code only through this file).
export type Closure = import('./study.ts').StudySettings['closure'];
export { formatLocated, isInputError, InputError, type Location, type Warning } from '../diagnostics/index.ts';
export { previewTable, previewTableBytes, matchKey, ROW_ROLES, COLUMN_ROLES, type IOTable, type TablePreview, type RoleMap, type Delimiter, type DecimalMark } from '../table/index.ts';
export { SAMPLE_CSV, SAMPLE_FILE_NAME, SAMPLE_NOTE } from '../table/index.ts';
export type { ModeKind } from '../model/index.ts';
export {
  CAUTIONS, SCENARIO_CAUTIONS, MEASURES, measuresOf, measureValues, linkageClass, LINKAGE_CLASS_NAMES, aboutText, modelTypeOf, reachText,
  timingText, unitOf, cumulativeUnitOf, VARIABLE_NAMES,
  type ReportFile, type Measure, type MeasureKey, type LinkageClass, type Verdict,
} from '../report/index.ts';
export {
  spreadMix, mixShares, mixesOfTable, tableMixName, parseShockCsv, parseMixCsv, writeMixCsv, parseActivityCsv, writeActivityCsv, checkActivity,
  parseMarginsCsv, writeMarginsCsv, parsePriceIndexCsv, writePriceIndexCsv, parseCommutingCsv, yearOfMoneyUnit, checkDiscountRate,
  VARIABLES, MONEY_VARIABLES, LINE_KINDS, SECTOR_KINDS, TIMINGS, MARGIN_KINDS, DEFAULT_PHASE_NAME, SHOCK_HEADER, MIX_HEADER, ACTIVITY_HEADER,
  MARGINS_HEADER, PRICE_INDEX_HEADER, SAMPLE_SHOCK_CSV, SAMPLE_SHOCK_FILE_NAME,
  type Scenario, type Phase, type Timing, type ScenarioLine, type SpendingMix, type Activity, type Margins, type MarginKind, type PriceIndex,
  type Commuting, type LineKind, type PriceBasis, type Variable, type EffectSplit, type EffectTotals, type OutsideRow, type OverTime,
  type ScenarioMultiplier, type ScenarioResult, type PathAnalysis, type RoundsResult, type ExpandedLine, type TotalsRecord,
} from '../scenario/index.ts';
export { utf8Bytes, sha256Hex, sha256HexPortable, usePlatformSha256 } from '../project/index.ts';

// The table-building commands (regionalize, balance, aggregate) and the app's "Larger table" screen use these steps.
export {
  DEFAULT_FLQ_DELTA, LQ_METHODS, REGIONAL_SAMPLE_NOTE, NATIONAL_SAMPLE_CSV, NATIONAL_SAMPLE_FILE_NAME, EMPLOYMENT_SAMPLE_CSV, EMPLOYMENT_SAMPLE_FILE_NAME, GROUPS_SAMPLE_CSV, GROUPS_SAMPLE_FILE_NAME, aggregateTable, balanceTable, parseGroupMapping, parseLabelledMatrix,
  parseTotals, ras, RAS_DEFAULT_MAX_ITERATIONS, RAS_DEFAULT_TOLERANCE,
  type LqMethod, type RegionalResult, type AggregationResult, type RasResult, type LabelledMatrix,
} from '../regional/index.ts';
export { importTable, writeTableCsv } from '../table/index.ts';
export { reportFiles, type ReportMeta, type Cell } from '../report/index.ts';
export { visibleText } from '../diagnostics/index.ts';
export { PROJECT_FORMAT, MIGRATED_PHASE } from '../project/index.ts';

// Supply and use tables → a symmetric table (the `sut` command and the "Start from supply and use tables" screen).
export {
  symmetricFromSupplyUse, studyFromSupplyUse, supplyUseTotals, supplyUseRolesOf, assumptionOf, SYMMETRIC_TABLE_FILE,
  type SupplyUseRequest, type SymmetricFromSupplyUse,
} from './supply-use.ts';
export {
  ASSUMPTIONS, ASSUMPTION_BY, ASSUMPTION_NAMES, DEFAULT_ASSUMPTION, TABLE_BY, NEGATIVES_REMEDIES, SUT_DEFAULT_TOLERANCE, SUPPLY_COLUMN_ROLES, parseSutRoleMap,
  SUPPLY_SAMPLE_CSV, USE_SAMPLE_CSV, SUPPLY_SAMPLE_FILE_NAME, USE_SAMPLE_FILE_NAME, SUT_SAMPLE_NOTE,
  type Assumption, type TableBy, type NegativesRemedy, type SutRoleMap, type NegativesReport, type ProductBalance, type SutRoles, type SutLabelRole, type SupplyColumnRole,
} from '../sut/index.ts';

// Where a table came from: its file and SHA-256, and the supply and use pair it was derived from.
export { sourceContext, sourceOriginsOf } from './source.ts';
export { originLines, type SourceOrigin } from '../report/index.ts';
export type { ProjectSourceOrigin } from '../project/index.ts';
// Classification bridges: employment, shock and spending-mix files that name codes instead of sectors.
export { readBridge, bridgeSummary, employmentByBridge, scenarioByBridge, spendingMixByBridge, shockFromFile, mixesFromFile, type Bridge, type BridgeSummary } from './bridges.ts';
export { BRIDGE_SAMPLE_CSV, BRIDGE_SAMPLE_FILE_NAME, EMPLOYMENT_BY_CODE_SAMPLE_CSV, EMPLOYMENT_BY_CODE_SAMPLE_FILE_NAME } from '../classification/index.ts';

// How sure the numbers are (Monte Carlo bands, one-at-a-time sensitivity).
export { drawSetupOf, beginStudyBands, drawChunk, studyBands, studySensitivity, bandReports, sensitivityReports, type SensitivityRequest, type BandsRequest, type BandsRun } from './uncertainty.ts';
export {
  defaultSettings as defaultUncertaintySettings, checkSettings as checkUncertaintySettings, parseCvCsv, multiplierBandsJson, scenarioBandsJson, sensitivityJson,
  drawsProblem, seedProblem, cvProblem, shareRangeProblem, deltaRangeProblem, DEFAULT_DRAWS, DEFAULT_SEED, DEFAULT_CV, DEFAULT_SHARE_STEP, DEFAULT_MARGIN_STEP, MIN_DRAWS, MAX_DRAWS, MAX_CV, MIN_ACCEPTED,
  MULTIPLIER_KEYS as BAND_MULTIPLIER_KEYS,
  type UncertaintySettings, type UncertaintyResult, type DrawSetup, type DrawChunk, type ScenarioBands, type PointBand, type SensitivityResult, type SensitivityItem, type RunOptions, type CvRule,
} from '../uncertainty/index.ts';

// The brief (PDF) and the workbook (XLSX).
export {
  studyBrief, studyBriefDocument, studyWorkbook, briefInputOf, baseEconomy, phasesOf, bandSentences, type BriefOptions, type HowSure,
} from './deliverables.ts';
export {
  BRIEF_FONT_FILES, PAPERS, ROUNDING_NOTE, councilNumber, dateText, shareText, documentText,
  type Paper, type BriefFonts, type BriefDocument, type BriefBlock, type BriefTable, type BriefBars,
} from '../deliverables/index.ts';
export { csvFileText, UTF8_BOM } from '../csv/index.ts';
export { filesOnly } from '../report/index.ts';
