/** Reports: rectangular CSV with an `.about.txt` sidecar of cautions, the analysis JSON, and the verdict in words. */
export { reportFiles, aboutText, type ReportFile, type ReportMeta } from './document.ts';
export { toCsv, formatCell, escapeText, type Cell } from './csv.ts';
export { CAUTIONS } from './cautions.ts';
export { analysisJson } from './analysis-json.ts';
export { analysisReport, ANALYSIS_REPORT_KINDS, type AnalysisReportKind, analysisNotes, multiplierRows, coefficientRows, leontiefRows, viabilityRows, spectrumRows, perronVectorRows, type AnalysisReportContext } from './analysis.ts';
export {
  SCENARIO_CAUTIONS, modelTypeOf, impactRows, impactReport, roundRows, roundSectorRows, roundsNotes, roundsReport, reachText, roundZeroText,
  scenarioMultiplierRows, scenarioMultiplierReport, pathRows, pathReport, comparisonRows, comparisonReport, inputRows, inputsReport,
  type ScenarioReportContext,
} from './scenario.ts';
export { verdictOf, type Verdict } from './verdict.ts';
export { MEASURES, measureValues, measureHeader, linkageClass, LINKAGE_CLASS_NAMES, type Measure, type MeasureKey, type LinkageClass } from './measures.ts';
