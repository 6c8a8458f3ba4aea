/**
 * The worker's one prepared study (src/study): the table in use with its inputs, factorised and analysed once, and the
 * screen's choices applied to it. Every other worker module reads it here and replaces it only through keepStudy.
 */
import { readyLines, restudy, type PreparedStudy, type Scenario } from '../../src/study/index.ts';
import type { StudyChoices } from './protocol.ts';

let state: PreparedStudy | null = null;

/** The study in use; a call that needs one before any table is loaded is refused. */
export function current(): PreparedStudy {
  if (!state) throw new Error('no table is loaded');
  return state;
}

/** The study in use, or null before any table is loaded (to tell whether it changed meanwhile). */
export function currentOrNull(): PreparedStudy | null {
  return state;
}

/** Make `ps` the study in use (null: the worker as it starts). */
export function keepStudy(ps: PreparedStudy | null): void {
  state = ps;
}

/**
 * The study as the screens have it now: the loaded table with the screen's scenarios and choices. A new commuting share
 * means a new household row, so a new factorisation: kept as the worker's state, so it is made once per change.
 */
export function studyAt(choices: StudyChoices, scenarios: Scenario[] = []): PreparedStudy {
  const ps = current();
  const s = ps.study.settings;
  const next = restudy(ps, {
    ...ps.study,
    scenarios: scenarios.map(readyLines),
    settings: {
      ...s, closure: choices.closure, paths: { ...s.paths, destination: choices.destination },
      ...(choices.discountRate !== undefined ? { discountRate: choices.discountRate } : {}),
    },
    ...(choices.commutingShare !== undefined ? { commuting: { ...ps.study.commuting, overall: choices.commutingShare } } : {}),
    ...(choices.tableYear !== undefined ? { prices: { ...ps.study.prices, tableYear: choices.tableYear } } : {}),
  });
  if (next.pm !== ps.pm) state = next;
  return next;
}

