/** The table's own spending rounds: one unit of final demand in every sector, round by round (the Overview's chart). */
import { powersOfOnes } from '../model/index.ts';
import { spendingRounds, type RoundsResult } from '../scenario/index.ts';
import type { PreparedStudy } from './prepare.ts';

/** Null with the reason when the table is not productive (the rounds do not die out). */
export function unitDemandRounds(ps: PreparedStudy): { rounds: RoundsResult } | { rounds: null; reason: string } {
  const { analysis, pm, study } = ps;
  const x = analysis.linkages.rowSums;
  if (ps.models.open !== true || x.some((v) => v === null)) {
    return { rounds: null, reason: ps.models.open === true ? 'the Leontief row sums are not defined' : `${ps.models.open}: the rounds do not die out` };
  }
  const n = pm.coef.n;
  // L·1 is the row sums of L, already solved by the analysis (linkages); A·1, A²·1, … often formed by it too (powers.ts).
  const rounds = spendingRounds(pm, new Float64Array(n).fill(1), Float64Array.from(x as number[]), {
    maxRounds: study.settings.rounds.maxRounds, perronRoot: analysis.viability.perronRoot, products: powersOfOnes(pm.coef.A),
  });
  return { rounds };
}
