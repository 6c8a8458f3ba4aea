/**
 * A study made ready to answer questions: one factorisation, one analysis, one verdict, and the models that
 * scenarios may use. Every result of the study (multipliers, scenarios, rounds, paths, reports) is computed from
 * this, so the CLI and the app cannot assemble the pipeline differently.
 */
import { analyzePrepared, coefficients, coefficientsOverFlows, leontiefOf, modelsForClosure, perUnitRows, prepareModel, CLOSURE_OFF, type Analysis, type AnalysisOptions, type Availability, type PreparedModel } from '../model/index.ts';
import { residentShares } from '../scenario/index.ts';
import { verdictOf, type Verdict } from '../report/index.ts';
import type { IOTable } from '../table/index.ts';
import type { Study } from './study.ts';

export interface PreparedStudy {
  study: Study;
  pm: PreparedModel;
  analysis: Analysis;
  verdict: Verdict;
  /** The models scenarios use: the analysis' availability, with the closure switched off when the study says so. */
  models: Availability;
}

export { CLOSURE_OFF };

export interface PrepareOptions {
  /** Full spectrum of A ('auto': up to 400 sectors). */
  spectrum?: AnalysisOptions['spectrum'];
  /** Form the explicit Leontief inverse now (reports of it form it on demand otherwise). */
  inverse?: boolean;
  /**
   * Nothing will read the table's flows again (no project saved from the table's numbers, no draws, no estimate to
   * re-run): the coefficients take the flows' place (`coefficientsOverFlows`), one n×n matrix fewer.
   */
  flowsDone?: boolean;
}

/**
 * The study's commuting shares shape its household-closed model (induced effects use residents' income only), so they
 * are part of the prepared model: every multiplier and scenario of the study uses the same closure.
 */
export function prepareStudy(study: Study, opts: PrepareOptions = {}): PreparedStudy {
  const residentShare = residentShares(study.commuting, study.table.sectors);
  const coef = opts.flowsDone ? coefficientsOverFlows(study.table) : coefficients(study.table);
  const pm = prepareModel(study.table, coef, residentShare ? { residentShare } : {});
  const analysis = analyzePrepared(pm, {
    tolerance: study.settings.rounds.tolerance,
    ...(opts.spectrum !== undefined ? { spectrum: opts.spectrum } : {}),
    ...(opts.inverse ? { inverse: true } : {}),
  });
  return finish(study, pm, analysis);
}

/** The prepared study with new settings or scenarios but the same table: no new factorisation or analysis. */
export function restudy(ps: PreparedStudy, study: Study): PreparedStudy {
  if (study.table !== ps.study.table) return prepareStudy(study);
  if (study.settings.rounds.tolerance !== ps.study.settings.rounds.tolerance) return prepareStudy(study);
  if (!sameCommuting(study.commuting, ps.study.commuting)) return prepareStudy(study);
  return finish(study, ps.pm, ps.analysis);
}

function sameCommuting(a: Study['commuting'], b: Study['commuting']): boolean {
  return a.overall === b.overall && a.sectors.length === b.sectors.length && a.sectors.every((c, k) => c.sector === b.sectors[k]!.sector && c.share === b.sectors[k]!.share);
}

function finish(study: Study, pm: PreparedModel, analysis: Analysis): PreparedStudy {
  return { study, pm, analysis, verdict: verdictOf(analysis), models: modelsForClosure(analysis.availability, study.settings.closure) };
}

/**
 * The study's explicit Leontief inverse L = (I − A)⁻¹: the analysis' when it formed one, else formed now on the same
 * factorisation (leontiefOf, which formLeontief uses too), so the app's grid and the exported report show the same
 * numbers. Without the accuracy ratio: the report computes that (formLeontief), a screen has no use for it. Only for a
 * productive table (the caller checks `models.open`).
 */
export function studyLeontief(ps: PreparedStudy): Float64Array {
  return ps.analysis.leontief ?? leontiefOf(ps.pm);
}

/**
 * The table's value-added, taxes and import rows per unit of output, each row as the table has it (the analysis sums
 * rows of one kind), divided as the engine's coefficients are: the Table screen's coefficient grid shows these.
 */
export function studyCoefficientRows(ps: PreparedStudy): { label: string; what: string; values: Float64Array }[] {
  const t = ps.study.table;
  const x = ps.pm.coef.x;
  const of = (rows: IOTable['labourIncome'] | undefined, what: string) => perUnitRows(rows ?? [], x).map((v) => ({ ...v, what }));
  return [...of(t.labourIncome, 'labour income'), ...of(t.otherValueAdded, 'other value added'), ...of(t.taxes, 'taxes less subsidies'), ...of(t.imports, 'imports')];
}
