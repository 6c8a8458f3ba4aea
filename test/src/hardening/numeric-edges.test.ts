/**
 * Numerical edges of the tables planners bring: singular I − A (ρ(A) = 1 exactly), ρ(A) just above 1, nearly singular,
 * reducible and periodic coefficient matrices, a sector with zero output and no inputs, magnitudes from 1e-300 to
 * 1e300, an all-zero table. Each gives a defined, explained result — a located refusal, or numbers with notes — and
 * no NaN or Infinity anywhere in the engine's results, the scenario JSON or the CSV reports.
 * The tables are small invented ones whose properties are plain by construction (stated beside each).
 */
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { InputError } from '../../../src/diagnostics/index.ts';
import { prepareModel } from '../../../src/model/index.ts';
import { onePhase, runScenario } from '../../support/scenario.ts';
import { analyzeTable } from '../../../src/model/index.ts';
import { analysisJson } from '../../../src/report/index.ts';
import { prepareStudy, runStudyScenario, studyOfTable } from '../../../src/study/index.ts';
import { importTable } from '../../../src/table/index.ts';
import { EDGE_TABLES } from './edge-tables.ts';
import { expectCliRefusal, nonFinite, nonFiniteText } from '../../support/fuzz-tables.ts';
import { runCli } from '../../support/cli.ts';

const dir = mkdtempSync(join(tmpdir(), 'roundwise-edges-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const SHOCK = 'sector,amount\r\nA,100\r\n';

async function scenarioCli(name: keyof typeof EDGE_TABLES, extra: string[] = []) {
  const table = join(dir, `${name}.csv`);
  writeFileSync(table, EDGE_TABLES[name]);
  const shock = join(dir, 'shock.csv');
  writeFileSync(shock, SHOCK);
  return runCli(['scenario', table, '--shock', shock, ...extra]);
}

/** The analysis through the engine and `roundwise analyze` (--json and --out): no NaN or Infinity anywhere. */
async function expectFiniteAnalysis(name: keyof typeof EDGE_TABLES) {
  const t = importTable(EDGE_TABLES[name], { fileName: `${name}.csv` });
  const an = analyzeTable(t, { inverse: true });
  expect(nonFinite(an)).toEqual([]);
  expect(nonFinite(analysisJson(an))).toEqual([]);
  const table = join(dir, `${name}.csv`);
  writeFileSync(table, EDGE_TABLES[name]);
  const json = await runCli(['analyze', table, '--json']);
  expect(json.code, json.err).toBe(0);
  expect(nonFiniteText(json.out)).toEqual([]);
  const out = join(dir, `analysis-${name}`);
  const rep = await runCli(['analyze', table, '--out', out]);
  expect(rep.code, rep.err).toBe(0);
  for (const f of readdirSync(out)) expect(nonFiniteText(readFileSync(join(out, f), 'utf8')), f).toEqual([]);
  return { an, json: JSON.parse(json.out) as { viability: Record<string, unknown> }, warnings: json.err };
}

/** The scenario through the engine and through the CLI (--json and --out): all finite, every CSV free of NaN/Infinity text. */
async function expectFiniteEverywhere(name: keyof typeof EDGE_TABLES) {
  const t = importTable(EDGE_TABLES[name], { fileName: `${name}.csv` });
  const outcome = runStudyScenario(prepareStudy(studyOfTable(t)), onePhase('s', [{ sector: 'A', amount: 100, kind: 'final-demand', localShare: 1 }]), { paths: t.sectors[t.n - 1]! });
  expect(nonFinite(outcome)).toEqual([]);
  const analysis = outcome.phases[0]!;
  const json = await scenarioCli(name, ['--json', '--paths', t.sectors[t.n - 1]!]);
  expect(json.code, json.err).toBe(0);
  expect(nonFiniteText(json.out)).toEqual([]);
  const out = join(dir, `out-${name}`);
  const rep = await scenarioCli(name, ['--out', out]);
  expect(rep.code, rep.err).toBe(0);
  for (const f of readdirSync(out)) expect(nonFiniteText(readFileSync(join(out, f), 'utf8')), f).toEqual([]);
  const analysed = await expectFiniteAnalysis(name);
  return { table: t, analysis, json: JSON.parse(json.out) as Record<string, unknown>, analysed };
}

function refusalCode(f: () => unknown): string {
  try {
    f();
  } catch (e) {
    expect(e).toBeInstanceOf(InputError);
    return (e as InputError).code;
  }
  throw new Error('not refused');
}

const shockA = { name: 's', lines: [{ sector: 'A', amount: 100, kind: 'final-demand' as const, localShare: 1 }] };

describe('numerical edges', () => {
  it('ρ(A) = 1 exactly: I − A is singular — scenarios are refused with an explanation; the analysis says not productive', async () => {
    const pm = prepareModel(importTable(EDGE_TABLES.rhoOne, { fileName: 'rhoOne.csv' }));
    expect(pm.openLU.singular).toBe(true);
    expect(refusalCode(() => runScenario(pm, shockA))).toBe('not-productive');
    const r = await scenarioCli('rhoOne');
    expectCliRefusal(r, 'scenario');
    expect(r.err).toContain('I − A is singular');
    const { json, warnings } = await expectFiniteAnalysis('rhoOne');
    expect(json.viability).toMatchObject({ productive: false, hawkinsSimon: false, roundsToTolerance: null });
    expect(warnings).toMatch(/not productive/);
  });

  it('ρ(A) = 1.1: scenarios are refused as not productive (their effects would be negative); the analysis says why', async () => {
    const pm = prepareModel(importTable(EDGE_TABLES.rhoAbove, { fileName: 'rhoAbove.csv' }));
    expect(refusalCode(() => runScenario(pm, shockA))).toBe('not-productive');
    const r = await scenarioCli('rhoAbove');
    expectCliRefusal(r, 'scenario');
    expect(r.err).toContain('the table is not productive');
    const { json, warnings } = await expectFiniteAnalysis('rhoAbove');
    expect(json.viability).toMatchObject({ productive: false, hawkinsSimon: false, roundsToTolerance: null });
    expect(json.viability.perronRoot as number).toBeCloseTo(1.1, 12); // eigenvalues 0.6 ± 0.5
    expect(warnings).toMatch(/Perron root 1\.10000/);
  });

  it('nearly singular I − A (condition about 2e12): results finite, with an ill-conditioning warning in both', async () => {
    const { analysis, analysed } = await expectFiniteEverywhere('nearlySingular');
    expect(analysis.notes.join('\n')).toMatch(/I − A is ill-conditioned \(condition estimate 2\.00e\+12, limit 1e\+12\)/);
    expect(analysed.warnings).toMatch(/I − A is ill-conditioned \(condition estimate 2\.00e\+12/);
  });

  it('Perron root certified below 1 but within about 4e-15 of it: analysis and scenario finish, and say the rounds are not practically convergent, with the numbers', async () => {
    const { analysis, analysed } = await expectFiniteEverywhere('nearUnitRoot');
    const v = analysed.an.viability;
    // ρ(A) = 1 − 4e-15 (eigenvalues of a symmetric 2×2, 0.5 ± (0.5 − 4e-15)); the certified bounds enclose it below 1
    expect(v.perronRootBounds[1]).toBeLessThan(1);
    expect(1 - v.perronRootBounds[0]).toBeLessThan(1e-14);
    expect(v.productive).toBe(true);
    expect(v.roundsToTolerance).toBeNull();
    const series = analysed.an.series;
    expect(series.converges).toBe(false);
    if (!series.converges) {
      expect(series.kind).toBe('too-slow');
      expect(series.roundsEstimate!).toBeGreaterThan(1e15); // log(1e-6·(1 − β))/log β with 1 − β ≈ 3.6e-15
    }
    const warn = analysed.an.warnings.find((w) => w.code === 'not-practically-convergent');
    expect(warn?.message).toMatch(/not practically convergent: the rounds die out, but about 1\.\d+e\+16 rounds \(more than 1,000,000\)/);
    expect(warn?.message).toMatch(/1 − β = 3\.\d+e-15/);
    expect(analysed.warnings).toMatch(/not practically convergent/);
    expect(analysed.warnings).toMatch(/I − A is ill-conditioned/);
    expect(analysis.notes.join('\n')).toMatch(/I − A is ill-conditioned/);
    // the scenario's own rounds stop at their cap instead of reaching 99.9 %
    expect(analysis.rounds.rounds.length).toBe(200);
    expect(analysis.rounds.reach.at(-1)!.round).toBeNull();
  });

  it('household-closed model with ρ(Ā) = 1: open effects only, with a note; the analysis leaves Type II undefined', async () => {
    const { analysis, analysed } = await expectFiniteEverywhere('closedSingular');
    expect(analysis.result.closure).toBe('none');
    expect(analysis.result.effects.output.induced).toBeNull();
    expect(analysis.result.notes.join('\n')).toMatch(/No induced effects: the household-closed model is on the edge of productivity/);
    expect(analysed.json.viability).toMatchObject({ productive: true, closedProductive: false });
  });

  it('household consumption the only final demand (ρ(Ā) = 1 exactly, s of rounding size): scenario and analysis agree there is no Type II model; no induced effect anywhere', async () => {
    // a scenario on a freshly prepared table (no analysis run on it first) decides the same way as the analysis
    const pm = prepareModel(importTable(EDGE_TABLES.householdsOnly, { fileName: 'householdsOnly.csv' }));
    const fresh = runScenario(pm, shockA);
    expect(fresh.closure).toBe('none');
    expect(fresh.effects.output.induced).toBeNull();
    expect(fresh.notes.join('\n')).toMatch(/No induced effects: the household-closed model is on the edge of productivity \(Perron root bounds 0\.9{10,}\d*–1\.0{10,}\d*; Schur complement s = \S+, rounding bound \S+e-1\d\)/);
    const { analysis, analysed, json } = await expectFiniteEverywhere('householdsOnly');
    expect(analysis.result.closure).toBe('none');
    expect(analysed.an.viability).toMatchObject({ productive: true, closedProductive: false, closedModel: { usable: false, status: 'within-rounding' } });
    expect(analysed.an.multipliers.output.typeII.every((m) => m === null)).toBe(true);
    expect(analysed.warnings).toMatch(/household-closed model is on the edge of productivity/);
    const cm = analysed.an.viability.closedModel;
    expect(Math.abs(cm.schur!)).toBeLessThanOrEqual(cm.schurRoundingBound!);
    // the CLI: no induced effect, and nothing near the size a division by a rounding-size s gives (10^17 before)
    const totals = json.totals as Record<string, { induced: number | null; total: number }>;
    expect(totals.output!.induced).toBeNull();
    for (const v of Object.values(totals)) if (v) expect(Math.abs(v.total)).toBeLessThan(1e4);
    expect(json.closure).toBe('none');
  });

  it('periodic (period 2) and reducible matrices: results finite, spending rounds converge', async () => {
    for (const name of ['periodic', 'reducible'] as const) {
      const { analysis } = await expectFiniteEverywhere(name);
      expect(analysis.rounds.reach.every((r) => r.round !== null), name).toBe(true);
    }
  });

  it('a sector with zero output and no inputs is dropped with a note; a shock to it is refused by name', async () => {
    const { table } = await expectFiniteEverywhere('zeroSector');
    expect(table.sectors).toEqual(['A', 'B']);
    expect(table.warnings.find((w) => w.code === 'sector-dropped')?.message).toBe("dropped 1 sector with zero output and no purchases or sales: 'C'");
    writeFileSync(join(dir, 'shock-c.csv'), 'sector,amount\r\nC,10\r\n');
    const r = await runCli(['scenario', join(dir, 'zeroSector.csv'), '--shock', join(dir, 'shock-c.csv')]);
    expectCliRefusal(r, 'scenario');
    expect(r.err).toContain("unknown sector 'C' (the table has: A, B)");
  });

  it('money from 1e-300 to 1e300: finite results, and the multipliers do not depend on the unit', async () => {
    const base = await expectFiniteEverywhere('periodic');
    for (const name of ['tiny', 'huge'] as const) {
      const r = await expectFiniteEverywhere(name);
      const m = (j: Record<string, unknown>) => (j.multipliers as { output: { typeI: { value: number } } }).output.typeI.value;
      expect(Math.abs(m(r.json) - m(base.json))).toBeLessThan(1e-12 * m(base.json));
    }
  });

  it('an all-zero table is refused: there is nothing to model', async () => {
    const r = await scenarioCli('allZero');
    expectCliRefusal(r, 'scenario');
    expect(r.err).toContain('every sector has zero output and no flows: there is nothing to model');
  });
});
