// Implausible shocks: non-finite results are refused at the shock-file line and sector; a shock larger than its
// sector, an output pushed below zero and a negative implied final demand at a fixed sector are warned, with numbers.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { inv } from 'mathjs';
import { formatLocated } from '../../../src/diagnostics/index.ts';
import { prepareModel } from '../../../src/model/index.ts';
import { parseShockCsv } from '../../../src/scenario/index.ts';
import { runScenario } from '../../support/scenario.ts';
import { importTable } from '../../../src/table/index.ts';
import { expectCliRefusal, nonFiniteText } from '../../support/fuzz-tables.ts';
import { runCli } from '../../support/cli.ts';
import { refusal } from '../../support/refusal.ts';

// An invented three-sector table (x = 100 everywhere) whose sector A has 1e-300 jobs per unit of output.
const TABLE = [
  'thousand dollars,A,B,C,Households,Exports,Total output',
  'A,10,20,5,30,35,100', 'B,15,10,20,25,30,100', 'C,5,10,10,40,35,100',
  'Labor income,40,30,35,,,', 'Other value added,30,30,30,,,', 'Employment (jobs),1e-298,4,5,,,',
].join('\r\n') + '\r\n';

const pm = prepareModel(importTable(TABLE, { fileName: 'county.csv' }));
const run = (shock: string) => runScenario(pm, parseShockCsv(shock, 'shock.csv'));
const checks = (notes: string[]) => notes.filter((n) => n.startsWith('Check the shock: '));

const dir = mkdtempSync(join(tmpdir(), 'roundwise-shock-checks-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('implausible shocks', () => {
  it('effects beyond the range of a double are refused at the line of the largest shock, not shown as null', () => {
    const e = refusal(() => run('sector,amount\r\nB,5\r\nA,1e308\r\n'));
    expect(e.code).toBe('effects-not-finite');
    expect(e.location).toMatchObject({ file: 'shock.csv', line: 3, rowLabel: 'A' });
    expect(formatLocated(e)).toMatch(/^shock\.csv:3 \(row 'A'\): the effects of scenario 'shock' are too large to compute .*largest shock is 1e\+308 thousand dollars on 'A'/);
  });

  it('lines on one sector that add up beyond a double, and a jobs line whose output overflows, are refused at their line', () => {
    const sum = refusal(() => run('sector,amount\r\nA,1e308\r\nA,1e308\r\n'));
    expect(sum.code).toBe('shock-not-finite');
    expect(sum.location).toMatchObject({ line: 3, rowLabel: 'A' });
    const jobs = refusal(() => run('sector,amount,kind\r\nA,1e20,jobs\r\n'));
    expect(jobs.code).toBe('shock-not-finite');
    expect(jobs.location).toMatchObject({ line: 2, rowLabel: 'A' });
    expect(jobs.message).toBe("1e+20 jobs at 1e-300 jobs per unit of output would be an output change of Infinity thousand dollars, beyond what can be computed; check the jobs line and the sector's employment");
  });

  it('a jobs line on a sector with 1e-300 jobs per unit: computed, and warned as larger than the whole sector, with the numbers', () => {
    const r = run('sector,amount,kind\r\nA,45,jobs\r\n');
    expect(r.totals.output.direct).toBeCloseTo(4.5e301, -288); // 45 jobs ÷ 1e-300 jobs per unit (1e-298 jobs / 100)
    const [w, ...rest] = checks(r.notes);
    expect(w).toBe("Check the shock: shock.csv:2 (row 'A'): the shock on 'A' (4.5e+301 thousand dollars, from 45 jobs at 1e-300 jobs per unit of output) is larger than the sector's whole base-year output (100 thousand dollars, 4.5e+299 times); input–output effects assume changes small enough to leave production recipes and prices as they are");
    expect(rest).toEqual([]);
  });

  it('a fixed output of −100,000 on a sector of 100: warned as larger than the sector, and every output pushed below zero is named', () => {
    const r = run('sector,amount,kind\r\nB,-100000,output\r\n');
    const notes = checks(r.notes);
    expect(notes[0]).toMatch(/^Check the shock: shock\.csv:2 \(row 'B'\): the shock on 'B' \(-100000 thousand dollars\) is larger than the sector's whole base-year output \(100 thousand dollars, 1000 times\)/);
    expect(notes).toContain("Check the shock: shock.csv:2 (row 'B'): the output of 'B' (fixed from outside) would fall below zero: base-year 100 thousand dollars, change -100000 thousand dollars, so -99900 — a cut cannot exceed the sector");
    // the other sectors' changes follow from the purchases of B (and household spending): each below −100 here
    for (const s of ['A', 'C']) {
      const i = r.sectors.indexOf(s);
      expect(r.effects.output.total[i]!).toBeLessThan(-100);
      expect(notes.some((n) => n.startsWith(`Check the shock: (row '${s}'): the output of '${s}' would fall below zero`))).toBe(true);
    }
  });

  it('a fixed output smaller than what the other lines need of it: the negative implied final demand is named, and equals the mixed-model value from mathjs', () => {
    const r = run('sector,amount,kind\r\nA,1,output\r\nB,50\r\n');
    // Independent value: with L = (I − A)⁻¹ (mathjs) and f = 50 at B, the demand μ at A that makes x_A = 1 solves
    // L_AA·μ = 1 − (L f)_A (Miller & Blair 2009, §13.1, mixed models; recalled from memory).
    const A = pm.coef.A;
    const L = inv([0, 1, 2].map((i) => [0, 1, 2].map((j) => (i === j ? 1 : 0) - A[i * 3 + j]!)));
    const mu = (1 - L[0]![1]! * 50) / L[0]![0]!;
    expect(mu).toBeLessThan(0);
    expect(Math.abs(r.effectiveDemand[0]! - mu)).toBeLessThan(1e-9 * Math.abs(mu));
    const w = checks(r.notes).find((n) => n.includes('is fixed at a change of'));
    expect(w).toMatch(/^Check the shock: shock\.csv:2 \(row 'A'\): 'A' is fixed at a change of 1 thousand dollars, but in the open model the rest of the scenario needs \S+ thousand dollars of it; the model meets that with a final-demand change of (-[\d.]+) thousand dollars at 'A'/);
    expect(Number(/final-demand change of (-[\d.]+)/.exec(w!)![1])).toBeCloseTo(mu, 3);
  });

  it('an ordinary shock gets none of these warnings', () => {
    expect(checks(run('sector,amount\r\nA,10\r\nB,-5\r\n').notes)).toEqual([]);
    expect(checks(run('sector,amount,kind\r\nB,20,output\r\nC,1,jobs\r\n').notes)).toEqual([]);
  });

  it('through the CLI: the refusal is one located line (exit 2), the warnings reach the summary and the JSON', async () => {
    const table = join(dir, 'county.csv');
    writeFileSync(table, TABLE);
    const huge = join(dir, 'huge.csv');
    writeFileSync(huge, 'sector,amount\r\nA,1e308\r\n');
    const refused = await runCli(['scenario', table, '--shock', huge]);
    expectCliRefusal(refused, 'scenario');
    expect(refused.err).toMatch(/huge\.csv:2 \(row 'A'\): the effects of scenario '[^']*' are too large to compute/);
    const jobs = join(dir, 'jobs.csv');
    writeFileSync(jobs, 'sector,amount,kind\r\nA,45,jobs\r\n');
    const summary = await runCli(['scenario', table, '--shock', jobs]);
    expect(summary.code, summary.err).toBe(0);
    expect(summary.out).toMatch(/Check the shock: .*jobs\.csv:2 \(row 'A'\): the shock on 'A' \(4\.5e\+301 thousand dollars/);
    const json = await runCli(['scenario', table, '--shock', jobs, '--json']);
    expect(json.code, json.err).toBe(0);
    expect(nonFiniteText(json.out)).toEqual([]);
    expect((JSON.parse(json.out) as { notes: string[] }).notes.some((n) => n.includes('larger than the sector\'s whole base-year output'))).toBe(true);
  });
});
