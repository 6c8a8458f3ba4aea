// The practitioner's study: taxes and FTE effects, household-income (payroll) lines, activities not in the table,
// purchaser prices with margins, price years, additionality, commuting, and phases over time — each against a
// hand-worked case (arithmetic in the test), an independent inverse (mathjs) or a theorem.
import { describe, expect, it } from 'vitest';
import * as math from 'mathjs';
import { prepareModel, type Availability } from '../../../src/model/index.ts';
import {
  annuityFactor, checkMarginSectors, NO_SHOCK_INPUTS, overTime, parseActivityCsv, parseMarginsCsv, parseShockCsv, priceFactorOf, runPhaseExpanded,
  type Activity, type Margins, type ScenarioLine, type ShockInputs,
} from '../../../src/scenario/index.ts';
import { prepareStudy, runStudyScenario, studyOfTable } from '../../../src/study/index.ts';
import { makeTable, county4 } from '../../support/example-tables.ts';
import { refusal } from '../../support/refusal.ts';
import { onePhase, runScenario } from '../../support/scenario.ts';

const OPEN_ONLY: Availability = { open: true, closed: 'switched off for this test' };
const fd = (sector: string, amount: number, extra: Partial<ScenarioLine> = {}): ScenarioLine => ({ sector, amount, kind: 'final-demand', localShare: 1, ...extra });
const sum = (v: ArrayLike<number>) => Array.from(v).reduce((a, b) => a + b, 0);

/**
 * Two sectors with a taxes row and an FTE row. Z = [[150, 500], [200, 100]], x = [1000, 2000] (the Miller & Blair 2009
 * §2.3 flows, recalled from memory); labour [300, 500], other value added [300, 800], taxes less subsidies [50, 100],
 * jobs [20, 30], FTE [15, 24] (invented).
 */
function taxed() {
  const t = makeTable({
    sectors: ['Agriculture', 'Manufacturing'], Z: [[150, 500], [200, 100]], x: [1000, 2000],
    labour: [300, 500], otherVA: [300, 800], household: [90, 50], otherFD: [260, 1650], employment: [20, 30],
  });
  t.taxes = [{ label: 'Taxes less subsidies', values: Float64Array.from([50, 100]) }];
  t.fte = Float64Array.from([15, 24]);
  return t;
}

describe('taxes and full-time equivalents (closed form on two sectors)', () => {
  it('open model: the taxes effect is the tax coefficients times the output effects; value added includes taxes', () => {
    const pm = prepareModel(taxed());
    const r = runScenario(pm, { name: 's', lines: [fd('Agriculture', 100)] }, OPEN_ONLY);
    // A = [[0.15, 0.25], [0.2, 0.05]]; det(I − A) = 0.85·0.95 − 0.25·0.2 = 0.7575; L = [[0.95, 0.25], [0.2, 0.85]] / 0.7575.
    const x1 = (0.95 * 100) / 0.7575;
    const x2 = (0.2 * 100) / 0.7575;
    expect(r.openOutput[0]).toBeCloseTo(x1, 10);
    expect(r.openOutput[1]).toBeCloseTo(x2, 10);
    // taxes per unit: 50/1000 = 0.05, 100/2000 = 0.05; FTE per unit: 0.015, 0.012.
    expect(r.effects.taxes!.direct[0]).toBeCloseTo(0.05 * 100, 12);
    expect(r.totals.taxes!.total).toBeCloseTo(0.05 * x1 + 0.05 * x2, 10);
    expect(r.totals.fte!.total).toBeCloseTo(0.015 * x1 + 0.012 * x2, 10);
    expect(r.totals.fte!.direct).toBeCloseTo(1.5, 12);
    // value added = (labour + other + taxes) per unit: (300 + 300 + 50)/1000 = 0.65, (500 + 800 + 100)/2000 = 0.7.
    expect(r.totals.valueAdded.total).toBeCloseTo(0.65 * x1 + 0.7 * x2, 10);
  });
  it('closed model: taxes and FTE effects are their coefficients times the closed-model output, sector by sector', () => {
    const pm = prepareModel(taxed());
    const r = runScenario(pm, { name: 's', lines: [fd('Manufacturing', 250)] });
    expect(r.closure).toBe('household');
    r.closedOutput!.forEach((x, j) => {
      expect(r.effects.taxes!.total[j]).toBeCloseTo(pm.coef.taxes![j]! * x, 10);
      expect(r.effects.fte!.total[j]).toBeCloseTo(pm.coef.fte![j]! * x, 10);
    });
    expect(r.effects.taxes!.induced).not.toBeNull();
  });
  it('a table without taxes or FTE rows has no such effects (null), never zeros', () => {
    const t = taxed();
    delete t.taxes;
    delete t.fte;
    const r = runScenario(prepareModel(t), { name: 's', lines: [fd('Agriculture', 10)] });
    expect(r.effects.taxes).toBeNull();
    expect(r.totals.fte).toBeNull();
  });
});

describe('household-income (payroll) lines', () => {
  const t = county4();
  const pm = prepareModel(t);
  const payroll: ScenarioLine = { sector: '', amount: 500, kind: 'labour-income', localShare: 1 };
  it('act only through household spending: no direct or indirect effect in any sector; induced = the closed inverse\'s household column × amount (mathjs)', () => {
    const r = runScenario(pm, { name: 'pensions', lines: [payroll] });
    for (const v of ['output', 'valueAdded', 'income', 'employment'] as const) {
      expect(r.effects[v]!.direct.every((x) => x === 0), v).toBe(true);
      expect(r.effects[v]!.indirect.every((x) => x === 0), v).toBe(true);
    }
    // The open-model effect of a payroll is zero.
    expect(r.openOutput.every((x) => x === 0)).toBe(true);
    // Independent: Ā = [[A, c], [h, 0]], x̄ = (I − Ā)⁻¹ (0, …, 0, 500).
    const n = t.n;
    const { A, h } = pm.coef;
    const hc = pm.closed!.hc;
    const Abar = math.zeros(n + 1, n + 1) as math.Matrix;
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) Abar.set([i, j], A[i * n + j]!);
      Abar.set([i, n], hc[i]!);
      Abar.set([n, i], h[i]!);
    }
    const Lbar = math.inv(math.subtract(math.identity(n + 1), Abar) as math.Matrix);
    for (let i = 0; i < n; i++) expect(r.effects.output.induced![i]).toBeCloseTo((Lbar.get([i, n]) as number) * 500, 9);
    // The income paid is a direct effect on a row of its own, in no sector.
    expect(r.outside).toEqual([expect.objectContaining({ kind: 'labour-income', direct: expect.objectContaining({ income: 500, output: 0 }) })]);
    expect(r.totals.income.direct).toBe(500);
    expect(r.totals.output.direct).toBe(0);
  });
  it('is refused without a household closure, and when it names a sector', () => {
    expect(refusal(() => runScenario(pm, { name: 's', lines: [payroll] }, OPEN_ONLY)).code).toBe('no-household-closure');
    expect(refusal(() => runScenario(pm, { name: 's', lines: [{ ...payroll, sector: 'Retail' }] })).code).toBe('labour-income-sector');
    const e = refusal(() => parseShockCsv('sector,amount,kind\nRetail,5,labour-income\n', 'shock.csv'));
    expect(e.code).toBe('labour-income-sector');
    expect(e.location).toMatchObject({ file: 'shock.csv', line: 2, column: 1 });
  });
});

describe('an activity not in the table', () => {
  const pm = prepareModel(county4());
  const plant: Activity = {
    name: 'Research station', output: 1000, jobs: 12, labourIncome: 300,
    purchases: [{ sector: 'Farms', amount: 200, localShare: 0.5 }, { sector: 'Services', amount: 100, localShare: 1 }],
  };
  const inputs: ShockInputs = { ...NO_SHOCK_INPUTS, activities: [plant] };
  it('its own output, jobs and income are direct on a row of their own; its local purchases are indirect demand on the sectors', () => {
    const r = runScenario(pm, { name: 's', lines: [{ sector: 'Research station', amount: 500, kind: 'activity', localShare: 1 }] }, OPEN_ONLY, inputs);
    // Half a budget year: purchases × 0.5, local shares applied: Farms 200·0.5·0.5 = 50, Services 100·0.5·1 = 50.
    expect(Array.from(r.shock.dfIndirect)).toEqual([50, 0, 0, 50]);
    expect(r.effects.output.direct.every((x) => x === 0)).toBe(true);
    const row = r.outside.find((o) => o.kind === 'activity')!;
    expect(row.direct).toMatchObject({ output: 500, income: 150, employment: 6, valueAdded: (1000 - 300) * 0.5 });
    expect(r.totals.output.direct).toBe(500);
    // Indirect = the open model's response to the purchases: L·dfIndirect, all of it.
    expect(sum(r.effects.output.indirect)).toBeCloseTo(sum(r.openOutput), 9);
  });
});

describe('activity files', () => {
  it('purchases adding up to more than the output are refused at the line that passes it', () => {
    const e = refusal(() => parseActivityCsv('item,sector,amount\noutput,,100\npurchase,Farms,60\npurchase,Services,50\n', 'station.csv'));
    expect(e.code).toBe('activity-purchases-exceed-output');
    expect(e.location).toMatchObject({ file: 'station.csv', line: 4 });
  });
});

describe('purchaser prices and margins', () => {
  const pm = prepareModel(county4());
  const margins: Margins = {
    sectors: { retail: 'Retail', wholesale: 'Services', transport: 'Services' },
    localShare: { retail: 1, wholesale: 0.5, transport: 1 },
    rows: [{ sector: 'Food processing', shares: { retail: 0.3, wholesale: 0.1, transport: 0.05 } }],
  };
  const inputs: ShockInputs = { ...NO_SHOCK_INPUTS, margins };
  it('the producer value and the margins add up to the purchaser amount; local shares then apply', () => {
    const { result, expanded } = runPhaseExpanded(pm, { name: 's', lines: [fd('Food processing', 100, { prices: 'purchaser', localShare: 0.8 })] }, OPEN_ONLY, inputs);
    const parts = expanded[0]!.components;
    expect(sum(parts.map((c) => c.gross))).toBeCloseTo(100, 12);
    // producer 100·(1 − 0.45) = 55 at 0.8 local → 44; retail 30 → Retail; wholesale 10 at 0.5 + transport 5 → Services 10.
    expect(Array.from(result.shock.df)).toEqual([0, 44, 30, 10]);
  });
  it('the margins file: shares are read by column, and the purchaser price split is the one above', () => {
    const m = parseMarginsCsv('sector,retail,wholesale,transport\nmargin sector,Retail,Services,Services\nlocal share,1,0.5,1\nFood processing,0.3,0.1,0.05\n', 'margins.csv');
    expect(m).toMatchObject({ sectors: margins.sectors, localShare: margins.localShare, rows: [{ sector: 'Food processing', shares: margins.rows[0]!.shares }] });
  });
  it('a margins row whose shares exceed 1, or naming a sector the table lacks, is refused at its line and field', () => {
    const e = refusal(() => parseMarginsCsv('sector,retail,wholesale,transport\nmargin sector,Retail,Services,Services\nFood processing,0.7,0.2,0.2\n', 'margins.csv'));
    expect(e.code).toBe('margins-exceed');
    expect(e.location).toMatchObject({ file: 'margins.csv', line: 3, column: 4, rowLabel: 'Food processing' });
    const unknown = parseMarginsCsv('sector,retail\nmargin sector,Retail\nMining,0.2\n', 'margins.csv');
    const u = refusal(() => checkMarginSectors(unknown, pm.coef.sectors));
    expect(u.code).toBe('margins-unknown-sector');
    expect(u.location).toMatchObject({ file: 'margins.csv', line: 3, rowLabel: 'Mining' });
  });
  it('refused without margins, and on a line kind that is not spending', () => {
    expect(refusal(() => runScenario(pm, { name: 's', lines: [fd('Retail', 1, { prices: 'purchaser' })] })).code).toBe('margins-missing');
    expect(refusal(() => runScenario(pm, { name: 's', lines: [{ sector: 'Retail', amount: 1, kind: 'output', localShare: 1, prices: 'purchaser' }] }, OPEN_ONLY, inputs)).code).toBe('prices-not-applicable');
  });
});

describe('price years', () => {
  const pm = prepareModel(county4());
  const inputs: ShockInputs = { ...NO_SHOCK_INPUTS, priceIndex: { points: [{ year: 2020, index: 100 }, { year: 2024, index: 125 }] }, tableYear: { year: 2024, source: 'given' } };
  it('converts an amount to the table\'s money year exactly: 80 in 2020 money is 80 × 125/100 = 100', () => {
    expect(priceFactorOf(fd('Retail', 80, { priceYear: 2020 }), inputs)).toBe(1.25);
    const a = runScenario(pm, { name: 's', lines: [fd('Retail', 80, { priceYear: 2020 })] }, OPEN_ONLY, inputs);
    const b = runScenario(pm, { name: 's', lines: [fd('Retail', 100)] }, OPEN_ONLY, inputs);
    expect(Array.from(a.openOutput)).toEqual(Array.from(b.openOutput));
  });
  it('refuses a year missing from the index, and a price year without an index or table year, at the line\'s field', () => {
    const s = parseShockCsv('sector,amount,price_year\nRetail,80,2019\n', 'shock.csv');
    const e = refusal(() => runScenario(pm, s, OPEN_ONLY, inputs));
    expect(e.code).toBe('price-year-missing');
    expect(e.location).toMatchObject({ file: 'shock.csv', line: 2, column: 3 });
    expect(refusal(() => runScenario(pm, s, OPEN_ONLY)).code).toBe('no-price-index');
    expect(refusal(() => runScenario(pm, s, OPEN_ONLY, { ...inputs, tableYear: null })).code).toBe('table-year-unknown');
  });
});

describe('additionality (gross and net)', () => {
  it('net effects are the gross ones × (1 − displacement)(1 − deadweight), by linearity', () => {
    const study = studyOfTable(county4());
    const o = runStudyScenario(prepareStudy(study), onePhase('s', [fd('Retail', 200, { displacement: 0.25, deadweight: 0.2 })]));
    const p = o.phases[0]!;
    expect(p.net).not.toBeNull();
    const f = 0.75 * 0.8;
    p.result.effects.output.total.forEach((g, i) => expect(p.net!.effects.output.total[i]).toBeCloseTo(g * f, 9));
  });
  it('refuses a share outside [0, 1] at its field', () => {
    const e = refusal(() => parseShockCsv('sector,amount,displacement\nRetail,1,1.5\n', 'shock.csv'));
    expect(e.code).toBe('additionality-range');
    expect(e.location).toMatchObject({ line: 2, column: 3 });
  });
});

describe('commuting', () => {
  it('with every worker commuting in, no labour income is re-spent in the county: induced effects are zero', () => {
    const study = { ...studyOfTable(county4()), commuting: { overall: 1, sectors: [] } };
    const p = runStudyScenario(prepareStudy(study), onePhase('s', [fd('Retail', 200)])).phases[0]!;
    expect(p.result.closure).toBe('household');
    p.result.effects.output.induced!.forEach((x) => expect(Math.abs(x)).toBeLessThan(1e-12));
  });
  it('a smaller resident share gives smaller induced effects (less income re-spent)', () => {
    const run = (share: number) => runStudyScenario(prepareStudy({ ...studyOfTable(county4()), commuting: { overall: share, sectors: [] } }), onePhase('s', [fd('Retail', 200)])).phases[0]!.result.totals.output.induced!;
    expect(run(0.3)).toBeLessThan(run(0));
    expect(run(0.6)).toBeLessThan(run(0.3));
  });
});

describe('phases over time', () => {
  it('present value is the ordinary annuity Σ_{t=1..n} a/(1 + r)^t = a·(1 − (1 + r)^−n)/r (closed form)', () => {
    for (const [r, n] of [[0.035, 20], [0.07, 1], [0.1, 40]] as const) {
      expect(annuityFactor(r, n)).toBeCloseTo((1 - (1 + r) ** -n) / r, 12);
    }
    expect(annuityFactor(0, 7)).toBe(7);
    const totals = { output: { direct: 10, indirect: 5, induced: 2, total: 17 }, employment: { direct: 1, indirect: 0.5, induced: 0.25, total: 1.75 } };
    const o = overTime({ timing: 'annual', years: 20 }, totals, 0.035)!;
    expect(o.cumulative.output!.total).toBe(340);
    expect(o.cumulative.employment!.total).toBe(35);
    expect(o.presentValue!.output!.total).toBeCloseTo(17 * (1 - 1.035 ** -20) / 0.035, 10);
    // Head counts are not discounted.
    expect(o.presentValue!.employment).toBeUndefined();
    expect(overTime({ timing: 'once' }, totals, 0.035)).toBeNull();
  });
  it('a study of a one-time and an annual phase reports each; sums only across phases of the same timing', () => {
    const s = parseShockCsv([
      'sector,amount,kind,phase,timing,year,years',
      'Services,1200,final-demand,Building,once,2026,',
      'Food processing,25,jobs,Operating,annual,2027,20',
      'Retail,300,final-demand,Visitors,annual,2027,20',
    ].join('\n'), 'plant.csv');
    expect(s.phases.map((p) => [p.name, p.timing, p.year, p.years])).toEqual([['Building', 'once', 2026, undefined], ['Operating', 'annual', 2027, 20], ['Visitors', 'annual', 2027, 20]]);
    const o = runStudyScenario(prepareStudy(studyOfTable(county4())), s);
    expect(o.phases.map((p) => p.label)).toEqual(['plant — Building', 'plant — Operating', 'plant — Visitors']);
    expect(o.byTiming.map((t) => t.timing)).toEqual(['annual']);
    const [, op, vis] = o.phases;
    expect(o.byTiming[0]!.gross.output!.total).toBeCloseTo(op!.result.totals.output.total + vis!.result.totals.output.total, 9);
    expect(op!.overTime!.cumulative.output!.total).toBeCloseTo(20 * op!.result.totals.output.total, 9);
  });
  it('refuses a one-time phase given a number of years, at the line and field', () => {
    const e = refusal(() => parseShockCsv('sector,amount,phase,timing,years\nRetail,1,Build,once,5\n', 'shock.csv'));
    expect(e.code).toBe('phase-field-mixed');
    expect(e.location).toMatchObject({ file: 'shock.csv', line: 2, column: 5 });
  });
  it('refuses a phase whose lines mix timings, at the line and field', () => {
    const e = refusal(() => parseShockCsv('sector,amount,phase,timing\nRetail,1,Build,once\nServices,2,Build,annual\n', 'shock.csv'));
    expect(e.code).toBe('phase-timing-mixed');
    expect(e.location).toMatchObject({ file: 'shock.csv', line: 3, column: 4 });
  });
});
