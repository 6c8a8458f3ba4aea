/**
 * The analysis as one plain JSON object (`roundwise analyze --json`, the UI's JSON export). Keys of README's
 * "Command line" section; arrays in sector order; a value that is not defined is null (with its reason in
 * `nullReasons`), never NaN or Infinity.
 */
import type { Analysis, NullNote, Values } from '../model/index.ts';

type Json = null | boolean | number | string | Json[] | { [k: string]: Json };

function num(x: number | null | undefined): number | null {
  return x === null || x === undefined || !Number.isFinite(x) ? null : x;
}

function arr(v: Values | Float64Array | null): (number | null)[] | null {
  if (!v) return null;
  return Array.from(v as ArrayLike<number | null>, (x) => num(x));
}

export function analysisJson(an: Analysis): { [k: string]: Json } {
  const v = an.viability;
  const m = an.multipliers;
  const l = an.linkages;
  const label = (i: number): string => an.sectors[i]!;
  const note = (nn: NullNote): Json => ({ measure: nn.measure, sectors: nn.sectors === 'all' ? 'all' : nn.sectors.map(label), reason: nn.reason });
  const ff = v.hawkinsSimonDetail.firstFailing;
  return {
    table: an.tableName,
    moneyUnit: an.moneyUnit,
    sectors: [...an.sectors],
    viability: {
      perronRoot: num(v.perronRoot),
      perronRootBounds: [num(v.perronRootBounds[0]), num(v.perronRootBounds[1])],
      hawkinsSimon: v.hawkinsSimon,
      irreducible: v.irreducible,
      productive: v.productive,
      perronRootClosed: num(v.perronRootClosed),
      roundsToTolerance: v.roundsToTolerance,
      tolerance: v.tolerance,
      perronRootClosedBounds: v.perronRootClosedBounds ? [num(v.perronRootClosedBounds[0]), num(v.perronRootClosedBounds[1])] : null,
      closedProductive: v.closedProductive,
      verdictNote: v.verdictNote,
      hawkinsSimonFirstFailing: ff ? { order: ff.order, sector: label(ff.sector), pivot: num(ff.pivot) } : null,
      period: v.period,
      primitive: v.primitive,
      blocks: v.blocks.map((b) => ({ sectors: b.sectors.map(label), period: b.period, perronRootBounds: [num(b.perronRootBounds[0]), num(b.perronRootBounds[1])] })),
      rightPerronVector: arr(v.rightPerronVector),
      leftPerronVector: arr(v.leftPerronVector),
      negativeFlows: v.negativeFlows,
      spectrum: v.spectrum ? v.spectrum.map((s) => ({ re: num(s.re), im: num(s.im), modulus: num(s.modulus), kind: s.kind })) : null,
      spectrumNote: v.spectrumNote,
      closedModel: {
        usable: v.closedModel.usable, status: v.closedModel.status, reason: v.closedModel.reason, accuracyNote: v.closedModel.accuracyNote,
        schur: num(v.closedModel.schur), schurRoundingBound: num(v.closedModel.schurRoundingBound),
      },
      series: an.series.converges ? { converges: true, kind: null, reason: null } : { converges: false, kind: an.series.kind, reason: an.series.reason },
      negativeValueAdded: v.negativeValueAdded.map((f) => ({
        sector: f.label, output: num(f.output), intermediateInputs: num(f.intermediateInputs), imports: num(f.imports), valueAdded: num(f.valueAdded),
      })),
    },
    implausibleMultipliers: an.implausibleMultipliers.map((f) => ({
      measure: f.measure, threshold: f.threshold, sectors: f.sectors.map((s) => ({ sector: s.label, value: num(s.value) })),
    })),
    multipliers: {
      output: { typeI: arr(m.output.typeI), typeII: arr(m.output.typeII) },
      income: { simple: arr(m.income.simple), typeI: arr(m.income.typeI), total: arr(m.income.total), typeII: arr(m.income.typeII) },
      employment: { simple: arr(m.employment.simple), typeI: arr(m.employment.typeI), total: arr(m.employment.total), typeII: arr(m.employment.typeII) },
      valueAdded: { simple: arr(m.valueAdded.simple), total: arr(m.valueAdded.total) },
      // Only when the table has a taxes or FTE row (existing keys are a contract; these are added).
      ...(m.taxes ? { taxes: { simple: arr(m.taxes.simple), total: arr(m.taxes.total) } } : {}),
      ...(m.fte ? { fte: { simple: arr(m.fte.simple), typeI: arr(m.fte.typeI), total: arr(m.fte.total), typeII: arr(m.fte.typeII) } } : {}),
    },
    linkages: { backward: arr(l.backward), forward: arr(l.forward), keySectors: l.keySectors.map(label) },
    checks: {
      condition: num(an.checks.condition),
      solveResidual: num(an.checks.solveResidual),
      inverseResidual: num(an.checks.inverseResidual),
      closedSolveResidual: num(an.checks.closedSolveResidual),
      residualThreshold: an.checks.residualThreshold,
    },
    nullReasons: [...m.notes, ...l.notes].map(note),
    warnings: an.warnings.map((w) => {
      const out: { [k: string]: Json } = { code: w.code, message: w.message };
      if (w.location) out.location = { ...w.location } as { [k: string]: Json };
      return out;
    }),
  };
}
