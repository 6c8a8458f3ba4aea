/**
 * The productivity verdict in words: one wording for the CLI summary, the JSON, the viability report and the screens.
 * The decision itself is the analysis' (`Viability.productive`, `closedProductive`); this only says it.
 *
 * What the Perron root ρ(A) bounds: the ratio of successive spending rounds tends to ρ(A) (power method), so it is
 * the long-run rate at which rounds shrink; it does not bound the first rounds, whose ratios depend on where the
 * demand starts (Miller & Blair 2009, §2.4 on the power series; Golub & Van Loan 2013, §7.3 on the power method).
 */
import type { Analysis } from '../model/index.ts';

export interface Verdict {
  /** true: productive; false: not productive; null: the tests disagree beyond rounding and cannot decide. */
  productive: boolean | null;
  /** One sentence in plain words. */
  say: string;
  /** Supporting sentences: the long-run rate, Hawkins–Simon, structure, the household-closed model. */
  detail: string[];
}

function pct(v: number): string {
  return `${(v * 100).toFixed(1)} %`;
}

function fixed(v: number): string {
  return v.toFixed(6);
}

export function verdictOf(an: Analysis): Verdict {
  const v = an.viability;
  const [lower, upper] = v.perronRootBounds;
  // The two tests disagree without the disagreement being explained as rounding (non-negative A): undecided.
  const productive: boolean | null = v.verdictNote && !v.negativeFlows && v.productive !== (upper < 1) ? null : v.productive;
  const detail: string[] = [];
  let say: string;
  if (v.productive) {
    say = 'The table is productive: rounds of local spending die out, so the Leontief inverse and the multipliers exist.';
    detail.push(`In the long run each round of local inter-industry buying is about ${pct(v.perronRoot)} of the round before (the Perron root of A, certified between ${fixed(lower)} and ${fixed(upper)}); the first rounds can shrink faster or slower than that, depending on which sectors the demand starts in.`);
  } else {
    say = 'The table is not productive: rounds of spending do not die out, so multipliers and effects are not defined.';
    detail.push(`The Perron root of A is at least ${fixed(lower)}: taken together, the sectors need a dollar or more of local inputs per dollar of output. Check the units and the roles of the rows and columns.`);
  }
  const ff = v.hawkinsSimonDetail.firstFailing;
  detail.push(v.hawkinsSimon
    ? 'Hawkins–Simon condition holds: every leading principal minor of I − A is positive.'
    : `Hawkins–Simon condition fails at the minor of order ${ff?.order ?? '?'} (sector '${an.sectors[ff?.sector ?? 0] ?? '?'}').`);
  if (v.verdictNote) detail.push(v.verdictNote);
  if (!v.irreducible && an.n > 1) detail.push(`The table is reducible: its sectors fall into ${v.blocks.length} groups that do not all buy from one another.`);
  // Plausibility sits beside the decision, never inside it: the verdict says so in the same place.
  const nva = v.negativeValueAdded;
  if (nva.length) {
    const named = nva.slice(0, 5).map((x) => `'${x.label}' (${x.valueAdded.toPrecision(4)} ${an.moneyUnit})`).join(', ');
    detail.push(`But ${nva.length === 1 ? 'one sector buys' : `${nva.length} sectors buy`} more intermediate inputs and imports than ${nva.length === 1 ? 'its' : 'their'} output, so ${nva.length === 1 ? 'its' : 'their'} value added is negative: ${named}${nva.length > 5 ? ', …' : ''}. A real economy has no such sector; check the table before using its multipliers.`);
  }
  for (const m of an.implausibleMultipliers) {
    const top = m.sectors[0];
    if (top) detail.push(`${m.measure === 'output.typeI' ? 'Type I' : 'Type II'} output multipliers above ${m.threshold} in ${m.sectors.length} sector${m.sectors.length === 1 ? '' : 's'} (largest ${top.value.toPrecision(3)}, '${top.label}'): far above what county tables usually show; check the table.`);
  }
  if (v.productive) {
    const closed = an.availability.closed;
    detail.push(closed === true
      ? 'Households closed (Type II): the household-closed model is productive too, so induced effects are available.'
      : `No Type II model: ${closed}.`);
  }
  return { productive, say, detail };
}
