// `roundwise scenario` end to end, in process, on the invented fixture table (test/fixtures/scenario). Reference values
// come from a direct solve of the partitioned mixed model with mathjs, not from the engine.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import * as math from 'mathjs';
import Papa from 'papaparse';
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { prepareStudy, runStudyScenario, studyFromProjectFile } from '../../../src/study/index.ts';
import { runCli } from '../../support/cli.ts';
import { sampleWithTaxesAndFte } from '../../support/deliverables.ts';

const fx = (name: string) => fileURLToPath(new URL(`../../fixtures/scenario/${name}`, import.meta.url));

const cli = (...args: string[]) => runCli(['scenario', ...args]);

// Fixture table: Z, x, labour, employment, household consumption as in table.csv.
const Z = [[50, 120, 10], [30, 80, 40], [20, 60, 30]];
const x = [400, 900, 500];
const labour = [100, 300, 200];
const jobs = [12, 20, 25];
const hh = [60, 150, 250];

/** Mixed model: Mills fixed at 25 jobs / (20/900 jobs per unit); Shops final demand 40 × 0.6. */
function reference(closed: boolean): number[] {
  const n = 3;
  const xh = labour.reduce((a, b) => a + b, 0);
  const m = closed ? n + 1 : n;
  const A = (i: number, j: number) => (i < n && j < n ? Z[i]![j]! / x[j]! : i < n ? hh[i]! / xh : j < n ? labour[j]! / x[j]! : 0);
  const fixedOut = 25 / (jobs[1]! / x[1]!);
  const endo = [...Array(m).keys()].filter((i) => i !== 1);
  const f = [0, 0, 24, 0];
  const M = endo.map((i) => endo.map((j) => (i === j ? 1 : 0) - A(i, j)));
  const rhs = endo.map((i) => f[i]! + A(i, 1) * fixedOut);
  const xe = (math.lusolve(M, rhs) as number[][]).map((r) => r[0]!);
  const out = [xe[0]!, fixedOut, xe[1]!];
  return closed ? [...out, xe[2]!] : out;
}

describe('roundwise scenario', () => {
  let dir = '';
  beforeAll(() => { dir = mkdtempSync(join(tmpdir(), 'roundwise-scenario-')); });
  afterAll(() => { rmSync(dir, { recursive: true, force: true }); });

  it('--json prints effects in sector order, totals and rounds matching the partitioned solve', async () => {
    const { code, out, err } = await cli(fx('table.csv'), '--shock', fx('shock.csv'), '--map', fx('map.json'), '--json');
    expect(err).toBe('');
    expect(code).toBe(0);
    const j = JSON.parse(out);
    expect(j.sectors).toEqual(['Farms', 'Mills', 'Shops']);
    const open = reference(false);
    const closed = reference(true);
    const openTotal = j.effects.output.direct.map((d: number, i: number) => d + j.effects.output.indirect[i]);
    for (let i = 0; i < 3; i++) {
      expect(openTotal[i]).toBeCloseTo(open[i]!, 9);
      expect(j.effects.output.total[i]).toBeCloseTo(closed[i]!, 9);
      expect(j.effects.income.total[i]).toBeCloseTo((labour[i]! / x[i]!) * closed[i]!, 9);
    }
    expect(j.effects.employment.direct[1]).toBeCloseTo(25, 9);
    expect(j.effects.output.direct).toEqual([0, open[1], 24]);
    for (const v of ['output', 'valueAdded', 'income', 'employment']) {
      for (const p of ['direct', 'indirect', 'induced', 'total']) expect(j.effects[v][p]).toHaveLength(3);
      expect(Object.keys(j.totals[v])).toEqual(['direct', 'indirect', 'induced', 'total']);
    }
    expect(j.totals.output.total).toBeCloseTo(closed.slice(0, 3).reduce((a, b) => a + b, 0), 9);
    expect(j.rounds.reach.map((r: { target: number }) => r.target)).toEqual([0.9, 0.99, 0.999]);
    // The rounds stop once 99.9 % of the open-model total is reached.
    const openSum = open.reduce((a, b) => a + b, 0);
    expect(Math.abs(j.rounds.output.reduce((a: number, b: number) => a + b, 0) - openSum) / openSum).toBeLessThanOrEqual(1e-3);
    expect(j.cautions.length).toBeGreaterThan(5);
    // ρ(A) of the fixture from ml-matrix's eigenvalues, beside the rounds whose ratios tend to it.
    const eig = new EigenvalueDecomposition(new Matrix(Z.map((row) => row.map((z, c) => z / x[c]!))));
    const rho = Math.max(...eig.realEigenvalues.map((v, k) => Math.hypot(v, eig.imaginaryEigenvalues[k]!)));
    expect(j.rounds.perronRoot).toBeCloseTo(rho, 10);
    expect(Math.abs(j.rounds.ratio.at(-1) - rho) / rho).toBeLessThan(0.05);
  });
  it('--out writes impact, rounds and multiplier reports with sidecars, readable back as numbers', async () => {
    const out = join(dir, 'reports');
    const { code } = await cli(fx('table.csv'), '--shock', fx('shock.csv'), '--map', fx('map.json'), '--out', out, '--paths', 'Farms');
    expect(code).toBe(0);
    const names = readdirSync(out).sort();
    // The scenario is named after the shock file (shock.csv): its reports start with 'shock-'.
    expect(names).toEqual([
      'multipliers.about.txt', 'multipliers.csv', 'shock-impact.about.txt', 'shock-impact.csv', 'shock-implied-multipliers.about.txt', 'shock-implied-multipliers.csv',
      'shock-inputs.about.txt', 'shock-inputs.csv', 'shock-paths.about.txt', 'shock-paths.csv', 'shock-phases.about.txt', 'shock-phases.csv',
      'shock-rounds-by-sector.about.txt', 'shock-rounds-by-sector.csv',
      'shock-rounds.about.txt', 'shock-rounds.csv',
    ]);
    const impact = Papa.parse<unknown[]>(readFileSync(join(out, 'shock-impact.csv'), 'utf8'), { dynamicTyping: true, skipEmptyLines: true }).data;
    expect(impact).toHaveLength(5);
    expect(impact[1]![0]).toBe('Farms');
    expect(impact[1]![4]).toBeCloseTo(reference(true)[0]!, 9);
    const about = readFileSync(join(out, 'shock-impact.about.txt'), 'utf8');
    expect(about).toMatch(/Source SHA-256: [0-9a-f]{64}/);
    expect(about).toContain('Source file: table.csv');
    expect(about).toMatch(/Produced: \d{4}-\d\d-\d\dT/);
  });
  it('--project writes a project file whose recomputed results equal the run', async () => {
    const path = join(dir, 'study.json');
    const a = await cli(fx('table.csv'), '--shock', fx('shock.csv'), '--map', fx('map.json'), '--project', path, '--json');
    expect(a.code).toBe(0);
    const p = studyFromProjectFile(readFileSync(path, 'utf8'), path);
    const r = runStudyScenario(prepareStudy(p), p.scenarios[0]!).phases[0]!.result;
    expect(Array.from(r.effects.output.total)).toEqual(JSON.parse(a.out).effects.output.total);
    expect(p.source!.fileName).toBe('table.csv');
    // The file's own bytes are saved (the run keeps them only because --project asks for them).
    expect(p.source!.content).toEqual(new Uint8Array(readFileSync(fx('table.csv'))));
    // The closure the command line ran with is in the study: the app opens it with households closed too.
    expect(p.settings.closure).toBe('households');
    expect(r.closure).toBe('household');
    // Saving again over a valid project is fine; over anything else it is refused and the file is left as it was.
    expect((await cli(fx('table.csv'), '--shock', fx('shock.csv'), '--map', fx('map.json'), '--project', path)).code).toBe(0);
    const foreign = join(dir, 'notes.json');
    writeFileSync(foreign, '{"my": "notes"}');
    const refused = await cli(fx('table.csv'), '--shock', fx('shock.csv'), '--map', fx('map.json'), '--project', foreign);
    expect(refused.code).toBe(2);
    expect(refused.err).toMatch(/will not overwrite it: this is not a Roundwise project file/);
    expect(readFileSync(foreign, 'utf8')).toBe('{"my": "notes"}');
  });
  it('prints a plain summary without --json', async () => {
    const { code, out } = await cli(fx('table.csv'), '--shock', fx('shock.csv'), '--map', fx('map.json'));
    expect(code).toBe(0);
    expect(out).toMatch(/labour income/);
    expect(out).toMatch(/Cautions:/);
  });
  it('refuses with a located message and exit code 2, no stack trace', async () => {
    const unknown = await cli(fx('table.csv'), '--shock', fx('shock-unknown.csv'), '--map', fx('map.json'));
    expect(unknown.code).toBe(2);
    expect(unknown.err).toMatch(/shock-unknown\.csv:3:1 \(row 'Quarries', column 'sector'\): unknown sector 'Quarries'/);
    expect(unknown.err).not.toMatch(/at .*\.ts:\d+/);
    // A missing option is a usage mistake: exit 1, the usage line below the message.
    const noShock = await cli(fx('table.csv'));
    expect(noShock.code).toBe(1);
    expect(noShock.err).toMatch(/^roundwise scenario: --shock SHOCK\.csv is required\nusage: roundwise scenario TABLE\.csv --shock SHOCK\.csv /);
    const missing = await cli(join(dir, 'nope.csv'), '--shock', fx('shock.csv'));
    expect(missing.code).toBe(2);
    expect(missing.err).toMatch(/nope\.csv: no such file/);
    const badMap = await cli(fx('table.csv'), '--shock', fx('shock.csv'), '--map', fx('shock.csv'));
    expect(badMap.code).toBe(2);
    expect(badMap.err).toMatch(/shock\.csv(:\d+:\d+)?: the role map is not valid JSON/);
  });
  it('--closure none leaves out induced effects and says why; the default uses the closure the table allows', async () => {
    const none = await cli(fx('table.csv'), '--shock', fx('shock.csv'), '--map', fx('map.json'), '--closure', 'none', '--json');
    expect(none.code, none.err).toBe(0);
    const j = JSON.parse(none.out);
    expect(j.closure).toBe('none');
    expect(j.totals.output.induced).toBeNull();
    expect(j.model).toMatch(/no induced effects \(the household closure is switched off/);
    for (let i = 0; i < 3; i++) expect(j.effects.output.total[i]).toBeCloseTo(reference(false)[i]!, 9);
    const bad = await cli(fx('table.csv'), '--shock', fx('shock.csv'), '--closure', 'maybe');
    expect(bad.err).toMatch(/--closure must be households or none/);
  });
  it('--paths prints the path table in the summary, adding up in the model of the effects', async () => {
    const { code, out } = await cli(fx('table.csv'), '--shock', fx('shock.csv'), '--map', fx('map.json'), '--paths', 'Farms');
    expect(code).toBe(0);
    expect(out).toMatch(/Structural paths to 'Farms' \(closed model\): output change there /);
    expect(out).toMatch(/carries +share +path/);
    expect(out).toMatch(/Mills > Farms/);
  });
});

describe('roundwise scenario: an annual phase over years on a table with taxes and full-time equivalents', () => {
  it('states every variable\'s cumulative effect in its own unit, and the present value of every money variable', async () => {
    const own = mkdtempSync(join(tmpdir(), 'roundwise-taxes-fte-'));
    const table = join(own, 'taxes-fte.csv');
    writeFileSync(table, sampleWithTaxesAndFte().text);
    const args = [table, '--shock', 'sample-data/fernhollow-food-plant.csv', '--discount-rate', '0.035'];
    const text = await cli(...args);
    expect(text.code, text.err).toBe(0);
    const j = JSON.parse((await cli(...args, '--json')).out);
    const annual = j.phases.find((p: { timing: string }) => p.timing === 'annual');
    const fmt = (v: number) => (Math.abs(v) >= 1000 ? v.toFixed(0) : v.toPrecision(4)); // the summary's number format
    const over = text.out.split('\n').find((l) => l.startsWith('Over 20 years'))!;
    const units: Record<string, string> = { output: 'thousand dollars', valueAdded: 'thousand dollars', income: 'thousand dollars', employment: 'job-years', taxes: 'thousand dollars', fte: 'FTE-years' };
    const names: Record<string, string> = { output: 'output', valueAdded: 'value added', income: 'labour income', employment: 'employment', taxes: 'taxes less subsidies', fte: 'full-time equivalents' };
    for (const v of Object.keys(units)) expect(over, v).toContain(`${names[v]} ${fmt(annual.cumulative[v].total)} ${units[v]}`);
    const pv = text.out.split('\n').find((l) => l.startsWith('Present value at 0.035'))!;
    for (const v of ['output', 'valueAdded', 'income', 'taxes']) expect(pv, v).toContain(`${names[v]} ${fmt(annual.presentValue[v].total)}`);
    expect(pv).not.toMatch(/employment|full-time/); // no present value of head counts
    rmSync(own, { recursive: true, force: true });
  });
});

