// --bridge on the commands that read files by sector: the same results as the files written by sector, and refusals
// that name the data file's line.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runCli } from '../../support/cli.ts';

let dir: string;
const p = (name: string) => join(dir, name);
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'rw-bridge-'));
  writeFileSync(p('bridge.csv'), 'code,sector,share\nC10,Food processing,\nF41,Construction,0.5\nF41,Real estate,0.5\n');
  writeFileSync(p('shock-codes.csv'), 'sector,amount,kind\nC10,1000,final-demand\nF41,400,final-demand\n');
  // By hand: F41's 400 split 0.5 / 0.5.
  writeFileSync(p('shock-sectors.csv'), 'sector,amount,kind\nFood processing,1000,final-demand\nConstruction,200,final-demand\nReal estate,200,final-demand\n');
  writeFileSync(p('shock-unknown.csv'), 'sector,amount\nC10,1\nX99,2\n');
  // A spending mix by code; by hand, F41's 0.6 splits 0.3 / 0.3.
  writeFileSync(p('mix-codes.csv'), 'mix,sector,share\nVisitors,C10,0.4\nVisitors,F41,0.6\n');
  writeFileSync(p('mix-sectors.csv'), 'mix,sector,share\nVisitors,Food processing,0.4\nVisitors,Construction,0.3\nVisitors,Real estate,0.3\n');
  writeFileSync(p('shock-mix.csv'), 'sector,amount,kind\nVisitors,1000,mix\n');
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('--bridge', () => {
  it('regionalize: jobs by the sample codes give the estimate of the same jobs by sector', async () => {
    const a = await runCli(['regionalize', 'sample-data/national-table.csv', '--employment', 'sample-data/fernhollow-employment-by-code.csv', '--bridge', 'sample-data/fernhollow-bridge.csv', '--method', 'slq', '--json']);
    expect(a.code, a.err).toBe(0);
    const j = JSON.parse(a.out);
    // fernhollow-employment-by-code.csv: FH-12's 3500 jobs split 0.4 / 0.6 by fernhollow-bridge.csv.
    expect(j.regionalJobs[j.sectors.indexOf('Real estate')]).toBeCloseTo(1400, 9);
    expect(j.regionalJobs[j.sectors.indexOf('Professional services')]).toBeCloseTo(2100, 9);
    expect(j.regionalJobs[j.sectors.indexOf('Public administration and education')]).toBe(6657);
  });

  it('scenario: shock lines by code give the effects of the same lines by sector', async () => {
    const a = await runCli(['scenario', 'sample-data/fernhollow-county.csv', '--shock', p('shock-codes.csv'), '--bridge', p('bridge.csv'), '--json']);
    const b = await runCli(['scenario', 'sample-data/fernhollow-county.csv', '--shock', p('shock-sectors.csv'), '--json']);
    expect(a.code, a.err).toBe(0);
    const ja = JSON.parse(a.out);
    const jb = JSON.parse(b.out);
    expect(ja.effects).toBeDefined();
    expect(ja.effects).toEqual(jb.effects);
    expect(ja.totals).toEqual(jb.totals);
  });

  it('scenario: a spending mix by code gives the effects of the same mix by sector', async () => {
    const a = await runCli(['scenario', 'sample-data/fernhollow-county.csv', '--shock', p('shock-mix.csv'), '--mix', p('mix-codes.csv'), '--bridge', p('bridge.csv'), '--json']);
    const b = await runCli(['scenario', 'sample-data/fernhollow-county.csv', '--shock', p('shock-mix.csv'), '--mix', p('mix-sectors.csv'), '--json']);
    expect(a.code, a.err).toBe(0);
    expect(b.code, b.err).toBe(0);
    const ja = JSON.parse(a.out);
    const jb = JSON.parse(b.out);
    expect(ja.effects).toBeDefined();
    expect(ja.effects).toEqual(jb.effects);
  });

  it('a code the bridge lacks exits 2 at the shock file\'s line', async () => {
    const r = await runCli(['scenario', 'sample-data/fernhollow-county.csv', '--shock', p('shock-unknown.csv'), '--bridge', p('bridge.csv')]);
    expect(r.code).toBe(2);
    expect(r.err).toBe(`roundwise scenario: ${p('shock-unknown.csv')}:3 (row 'X99'): code 'X99' is not in the bridge ${p('bridge.csv')} (every code of the file needs a row code,sector[,share] there)\n`);
  });
});
