// `--draws`, `--seed`, `--cv`, `--cv-file`, `--share-range`, `--sensitivity` of analyze and scenario: the bands and the
// sensitivity in the summary, --json and --out; the same seed gives the same bands, with one thread or two; values
// checked against what the point estimate itself implies.
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Papa from 'papaparse';
import { runCli } from '../../support/cli.ts';
import { readWorkbook, sampleWithTaxesAndFte } from '../../support/deliverables.ts';

const TABLE = 'sample-data/fernhollow-county.csv';
const dir = mkdtempSync(join(tmpdir(), 'roundwise-unc-'));
// A shock of one phase, so the bands are the top-level `uncertainty` object (a study of several phases gives an array).
const SHOCK = 'test/fixtures/scenario/one-phase/fernhollow-food-plant.csv';
afterAll(() => rmSync(dir, { recursive: true, force: true }));

// eslint-disable-next-line @typescript-eslint/no-explicit-any -- parsed --json output, checked field by field
async function json(...argv: string[]): Promise<any> {
  const r = await runCli([...argv, '--json']);
  expect(r.err, r.err).toBe('');
  expect(r.code).toBe(0);
  return JSON.parse(r.out);
}

describe('scenario --draws', () => {
  it('adds bands around the totals, the point estimate equal to the scenario total and inside its own band at CV 0', async () => {
    const j = await json('scenario', TABLE, '--shock', SHOCK, '--draws', '200', '--seed', '3');
    const u = j.uncertainty;
    expect([u.draws, u.seed, u.cv, u.rejected, u.accepted]).toEqual([200, 3, 0.1, 0, 200]);
    for (const v of ['output', 'valueAdded', 'income', 'employment']) {
      const b = u.totals[v];
      expect(b.point).toBe(j.totals[v].total);
      expect(b.p5).toBeLessThan(b.p50);
      expect(b.p50).toBeLessThan(b.p95);
      expect(b.p95 - b.p5).toBeGreaterThan(0.01 * Math.abs(b.point));
    }
    expect(u.sectors.output).toHaveLength(j.sectors.length);
    expect(u.sectors.output[0].point).toBe(j.effects.output.total[0]);
    const z = (await json('scenario', TABLE, '--shock', SHOCK, '--draws', '20', '--cv', '0')).uncertainty;
    for (const v of ['output', 'employment']) expect([z.totals[v].p5, z.totals[v].p95, z.totals[v].mean]).toEqual([z.totals[v].point, z.totals[v].point, z.totals[v].point]);
  });

  it('gives the same bands for the same seed, in the CLI and through the study as the app calls it', async () => {
    const a = (await json('scenario', TABLE, '--shock', SHOCK, '--draws', '60', '--seed', '11', '--share-range', '0.05')).uncertainty;
    const b = (await json('scenario', TABLE, '--shock', SHOCK, '--draws', '60', '--seed', '11', '--share-range', '0.05')).uncertainty;
    expect(a).toEqual(b);
    const c = (await json('scenario', TABLE, '--shock', SHOCK, '--draws', '60', '--seed', '12', '--share-range', '0.05')).uncertainty;
    expect(c.totals.output.p50).not.toBe(a.totals.output.p50);
  });

  it('writes NAME-bands.csv with its .about.txt into --out', async () => {
    const out = join(dir, 'bands');
    const r = await runCli(['scenario', TABLE, '--shock', SHOCK, '--draws', '40', '--out', out]);
    expect(r.code).toBe(0);
    const csv = Papa.parse<string[]>(readFileSync(join(out, 'fernhollow-food-plant-bands.csv'), 'utf8').replace(/^\uFEFF/, ''), { skipEmptyLines: true }).data;
    expect(csv[0]).toEqual(['what', 'sector', 'variable', 'effect', 'unit', 'point estimate', 'p5', 'p50 (median)', 'p95', 'mean of draws']);
    expect(csv.filter((row) => row[0] === 'sector total' && row[2] === 'output')).toHaveLength(16);
    const about = readFileSync(join(out, 'fernhollow-food-plant-bands.about.txt'), 'utf8');
    expect(about).toMatch(/Monte Carlo bands from 40 draws \(seed 1\)/);
    expect(about).toMatch(/Estimates, not forecasts/);
  });
});

describe('scenario --draws and --sensitivity on a table with taxes and full-time equivalents', () => {
  it('bands every variable the scenario has, each named and in its own unit, in the summary and in --out', async () => {
    const table = join(dir, 'taxes-fte.csv');
    writeFileSync(table, sampleWithTaxesAndFte().text);
    const out = join(dir, 'bands-taxes-fte');
    const r = await runCli(['scenario', table, '--shock', SHOCK, '--draws', '20', '--sensitivity', '--out', out]);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    const bandsTable = r.out.slice(r.out.indexOf('How sure: Monte Carlo bands'));
    for (const name of ['output', 'value added', 'labour income', 'employment', 'taxes less subsidies', 'full-time equivalents']) {
      expect(bandsTable, name).toMatch(new RegExp(`^${name} +[-\\d.]+ +[-\\d.]+`, 'm'));
    }
    const csv = Papa.parse<string[]>(readFileSync(join(out, 'fernhollow-food-plant-bands.csv'), 'utf8').replace(/^\uFEFF/, ''), { skipEmptyLines: true }).data;
    const unitOf = (variable: string) => new Set(csv.filter((row) => row[2] === variable).map((row) => row[4]));
    expect(unitOf('full-time equivalents')).toEqual(new Set(['FTE']));
    expect(unitOf('employment')).toEqual(new Set(['jobs']));
    expect(unitOf('taxes less subsidies')).toEqual(new Set(['thousand dollars']));
    const sens = Papa.parse<string[]>(readFileSync(join(out, 'fernhollow-food-plant-sensitivity.csv'), 'utf8').replace(/^\uFEFF/, ''), { skipEmptyLines: true }).data;
    expect(sens[0]).toContain('full-time equivalents at low (FTE)');
  });
});

describe('scenario --draws --xlsx', () => {
  it('puts the bands into the workbook', async () => {
    const book = join(dir, 'book.xlsx');
    const r = await runCli(['scenario', TABLE, '--shock', SHOCK, '--draws', '30', '--sensitivity', '--xlsx', book]);
    expect(r.code, r.err).toBe(0);
    expect(readWorkbook(readFileSync(book)).names).toEqual(expect.arrayContaining(['Uncertainty bands', 'Sensitivity']));
  });
});

describe('scenario --sensitivity', () => {
  it('sorts assumptions by swing; the closure swing is the induced effect and a local share swing is its demand times the multiplier', async () => {
    const shock = join(dir, 'visitors.csv');
    writeFileSync(shock, 'sector,amount,kind,local_share\nAccommodation and food service,8000,final-demand,0.9\nWholesale and retail trade,4000,final-demand,0.6\n');
    const j = await json('scenario', TABLE, '--shock', shock, '--sensitivity', '--share-step', '0.05');
    const items = j.sensitivity.items as { kind: string; assumption: string; swing: { output: number }; low: unknown; high: unknown }[];
    const swings = items.map((i) => Math.abs(i.swing.output));
    expect(swings).toEqual([...swings].sort((x, y) => y - x));
    const closure = items.find((i) => i.kind === 'closure')!;
    expect(Math.abs(closure.swing.output - j.totals.output.induced)).toBeLessThan(1e-9 * Math.abs(j.totals.output.induced));
    // Effects are linear in final demand: moving one line's local share from s − h to s + h (within 0–1) changes total
    // output by (its amount × the share moved) times its sector's Type II output multiplier (from analyze).
    const an = await json('analyze', TABLE);
    const lines = j.lines as { sector: string; amount: number; kind: string; localShare: number }[];
    const k = lines.findIndex((l) => l.kind === 'final-demand' && l.localShare > 0.05 && l.localShare < 0.95);
    expect(k).toBeGreaterThanOrEqual(0);
    const line = lines[k]!;
    const item = items.find((i) => i.assumption === `local share of '${line.sector}' (line ${k + 1})`)!;
    const m = an.multipliers.output.typeII[an.sectors.indexOf(line.sector)];
    expect(item.swing.output / (line.amount * 0.1 * m) - 1).toBeCloseTo(0, 9);
    expect(items.filter((i) => i.kind === 'local-share')).toHaveLength(2);
  });
});

describe('scenario --sensitivity with margins', () => {
  it('varies each margin\'s shares and local share; the swings are the money moved times the Type II multipliers', async () => {
    // Invented margins: food bought at purchaser prices, 20 % retail and 10 % wholesale margin (both earned by trade,
    // half of it locally), 5 % transport.
    const shock = join(dir, 'food-purchases.csv');
    writeFileSync(shock, 'sector,amount,kind,local_share,prices\nFood processing,1000,final-demand,1,purchaser\n');
    const margins = join(dir, 'margins.csv');
    writeFileSync(margins, 'sector,retail,wholesale,transport\nmargin sector,Wholesale and retail trade,Wholesale and retail trade,Transport and warehousing\nlocal share,0.5,0.5,1\nFood processing,0.2,0.1,0.05\n');
    const j = await json('scenario', TABLE, '--shock', shock, '--margins', margins, '--sensitivity', '--margin-step', '0.25');
    const items = j.sensitivity.items as { kind: string; assumption: string; swing: { output: number } }[];
    expect(j.sensitivity.marginStep).toBe(0.25);
    expect(items.filter((i) => i.kind === 'margin-share').map((i) => i.assumption).sort()).toEqual(['retail margin shares (every sector\'s, together)', 'transport margin shares (every sector\'s, together)', 'wholesale margin shares (every sector\'s, together)']);
    // Effects are linear in final demand (Miller & Blair 2009, ch. 2: x = L·f): scaling the retail share 0.2 by
    // 0.75 and by 1.25 moves 1000 × 0.2 × 0.5 = 100 from the producer value (local share 1, food processing) to the retail
    // margin (local share 0.5, trade), so the swing is 100 × (0.5·m_trade − m_food) with the Type II output multipliers.
    const an = await json('analyze', TABLE);
    const m = (s: string) => an.multipliers.output.typeII[an.sectors.indexOf(s)] as number;
    const retail = items.find((i) => i.assumption.startsWith('retail margin shares'))!;
    expect(retail.swing.output / (100 * (0.5 * m('Wholesale and retail trade') - m('Food processing'))) - 1).toBeCloseTo(0, 9);
    // The retail margin's local share 0.5 ± 0.1 (the share step): 1000 × 0.2 × 0.2 = 40 of demand on trade.
    const local = items.find((i) => i.assumption === 'local share of the retail margin')!;
    expect(local.swing.output / (40 * m('Wholesale and retail trade')) - 1).toBeCloseTo(0, 9);
  });
});

describe('scenario --sensitivity on an FLQ estimate', () => {
  const national = 'sample-data/national-table.csv';
  const employment = 'sample-data/fernhollow-employment.csv';
  const estimateAt = async (delta: string, name: string): Promise<string> => {
    const out = join(dir, name);
    const r = await runCli(['regionalize', national, '--employment', employment, '--method', 'flq', '--delta', delta, '--out', out]);
    expect(r.code, r.err).toBe(0);
    return join(out, 'regional-table.csv');
  };

  it('re-runs the estimate at the ends of the δ range: each side is the scenario on the estimate made at that δ', async () => {
    const county = await estimateAt('0.25', 'flq-25');
    const shock = join(dir, 'flq-shock.csv');
    writeFileSync(shock, 'sector,amount,kind,local_share\nConstruction,5000,final-demand,0.8\n');
    const j = await json('scenario', county, '--shock', shock, '--sensitivity', '--flq-national', national, '--flq-employment', employment, '--flq-delta', '0.25', '--delta-range', '0.15,0.4');
    const item = (j.sensitivity.items as { kind: string; base: string; low: { setting: string; totals: { output: number } }; high: { setting: string; totals: { output: number } } }[]).find((i) => i.kind === 'flq-delta')!;
    expect([item.base, item.low.setting, item.high.setting]).toEqual(['0.25', 'δ = 0.15', 'δ = 0.4']);
    // Independently: the estimate made by regionalize at δ = 0.15 and 0.4, the same scenario run on each.
    for (const [delta, side] of [['0.15', item.low], ['0.4', item.high]] as const) {
      const other = await json('scenario', await estimateAt(delta, `flq-${delta}`), '--shock', shock);
      expect(side.totals.output / other.totals.output.total - 1).toBeCloseTo(0, 9);
    }
    // Draws of δ: bands from tables estimated at δ within the range.
    const d = await json('scenario', county, '--shock', shock, '--draws', '20', '--cv', '0', '--flq-national', national, '--flq-employment', employment, '--flq-delta', '0.25', '--delta-range', '0.2,0.3');
    expect(d.uncertainty.deltaRange).toEqual([0.2, 0.3]);
    expect(d.uncertainty.deltaDraws).toBe(20);
    expect(d.uncertainty.deltaDrawn[0]).toBeGreaterThanOrEqual(0.2);
    expect(d.uncertainty.deltaDrawn[1]).toBeLessThanOrEqual(0.3);
  }, 120_000);

  it('refuses a table that the named estimate does not reproduce, and FLQ options without --flq-national', async () => {
    const county = await estimateAt('0.25', 'flq-25b');
    const shock = join(dir, 'flq-shock.csv');
    const r = await runCli(['scenario', county, '--shock', shock, '--sensitivity', '--flq-national', national, '--flq-employment', employment, '--flq-delta', '0.3']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/the table is not the FLQ estimate \(δ = 0\.3\)/);
    const u = await runCli(['scenario', county, '--shock', shock, '--sensitivity', '--delta-range', '0.1,0.2']);
    expect(u.code).toBe(1);
    expect(u.err).toMatch(/--delta-range needs --flq-national/);
  }, 120_000);
});

describe('analyze --draws', () => {
  it('adds a band per sector and multiplier; at CV 0 each is its point estimate', async () => {
    const j = await json('analyze', TABLE, '--draws', '20', '--cv', '0');
    const u = j.uncertainty;
    expect(u.sectors).toEqual(j.sectors);
    expect(u.multipliers['output.typeI'].map((b: { point: number }) => b.point)).toEqual(j.multipliers.output.typeI);
    for (const b of u.multipliers['output.typeII'] as { point: number; p5: number; p50: number; p95: number }[]) expect([b.p5, b.p50, b.p95]).toEqual([b.point, b.point, b.point]);
  });

  it('reads a CV file and refuses its bad lines where they are', async () => {
    const cv = join(dir, 'cv.csv');
    writeFileSync(cv, 'row,column,cv\n*,*,0\nFarming,*,0.2\n');
    const u = (await json('analyze', TABLE, '--draws', '40', '--cv-file', cv)).uncertainty;
    expect(u.cvFile).toBe('cv.csv');
    writeFileSync(cv, 'row,column,cv\nFarmin,*,0.2\n');
    const r = await runCli(['analyze', TABLE, '--draws', '40', '--cv-file', cv]);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/cv\.csv:2:1.*no sector or labour-income row 'Farmin'/);
  });

  it('refuses out-of-range settings and settings without --draws as usage mistakes', async () => {
    for (const [argv, msg] of [
      [['--draws', '5'], /--draws must be a whole number from 20 to 100000/],
      [['--draws', '50', '--cv', '3'], /--cv must be a number from 0 to 2/],
      [['--seed', '4'], /--seed needs --draws N/],
    ] as const) {
      const r = await runCli(['analyze', TABLE, ...argv]);
      expect(r.code).toBe(1);
      expect(r.err).toMatch(msg);
    }
  });
});
