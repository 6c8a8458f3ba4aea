/**
 * The Scenarios screen's classification bridge, run in Node through the worker's adapter: a shock file and a mix file
 * by codes give the same numbers in the app as the CLI's `scenario --bridge` on the same files, and bad bridges and
 * codes are refused with the CLI's located messages.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { api } from '../../renderer/worker/compute.ts';
import { runCli } from '../support/cli.ts';
import { formatLocated, type InputError } from '../../src/study/index.ts';
import type { StudyChoices } from '../../renderer/worker/protocol.ts';

const ON: StudyChoices = { closure: 'households', destination: null };
const BRIDGE = { text: readFileSync('sample-data/fernhollow-bridge.csv', 'utf8'), fileName: 'sample-data/fernhollow-bridge.csv' };
// Invented codes of the sample bridge: FH-05 Construction, FH-06 Food processing, FH-12 split 0.4 Real estate / 0.6 Professional services.
const SHOCK = 'sector,amount,kind,local_share,phase,timing\nFH-05,12000,final-demand,0.8,Build,once\nFH-12,500,final-demand,1,Build,once\nFH-06,300,jobs,1,Run,annual\n';
const MIX = 'mix,sector,share\nVisitor day,FH-14,0.5\nVisitor day,FH-12,0.2\nVisitor day,FH-09,0.3\n';
const MIX_SHOCK = 'sector,amount,kind\nVisitor day,1000,mix\n';

let dir = '';
const p = (f: string) => join(dir, f);
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'rw-app-bridge-'));
  writeFileSync(p('shock-codes.csv'), SHOCK);
  writeFileSync(p('mix-codes.csv'), MIX);
  writeFileSync(p('shock-mix.csv'), MIX_SHOCK);
  api.loadSample({});
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const json = async (argv: string[]) => {
  const r = await runCli(argv);
  expect(r.code, r.err).toBe(0);
  return JSON.parse(r.out) as { phases: { name: string; totals: Record<string, unknown> }[]; totals: Record<string, unknown> };
};

describe('the app\'s classification bridge', () => {
  it('says what the sample bridge covers of the sample county', () => {
    // fernhollow-bridge.csv: 16 codes (FH-01 … FH-14, FH-90, FH-91), FH-12 split in two, FH-90 and FH-91 both to one sector: all 16 sectors reached.
    expect(api.checkBridge({ bridge: BRIDGE })).toEqual({ fileName: BRIDGE.fileName, codes: 16, splitCodes: 1, sectorsReached: 16, sectors: 16 });
  });

  it('a shock file by codes becomes the scenario whose effects the CLI gives with --bridge', async () => {
    const s = api.readShockFile({ text: SHOCK, fileName: 'shock-codes.csv', bridge: BRIDGE });
    expect(s.name).toBe('shock-codes');
    expect(s.phases.map((ph) => [ph.name, ph.lines.map((l) => [l.sector, l.amount, l.kind])])).toEqual([
      ['Build', [['Construction', 12000, 'final-demand'], ['Real estate', 200, 'final-demand'], ['Professional services', 300, 'final-demand']]],
      ['Run', [['Food processing', 300, 'jobs']]],
    ]);
    const view = api.runScenario({ scenario: s, choices: ON });
    const cli = await json(['scenario', 'sample-data/fernhollow-county.csv', '--shock', p('shock-codes.csv'), '--bridge', BRIDGE.fileName, '--json']);
    expect(cli.phases.map((ph) => ph.name)).toEqual(['Build', 'Run']);
    view.phases.forEach((ph, k) => {
      expect(ph.effects.output!.totals.total).toBeCloseTo((cli.phases[k]!.totals.output as { total: number }).total, 6);
      expect(ph.effects.employment!.totals.total).toBeCloseTo((cli.phases[k]!.totals.employment as { total: number }).total, 9);
    });
  });

  it('a spending-mix file by codes joins the study\'s mixes and gives the CLI\'s effects', async () => {
    const r = api.setStudyInput({ kind: 'mix', text: MIX, fileName: 'mix-codes.csv', bridge: BRIDGE });
    expect(r.inputs.mix).toBe('1 mix: Visitor day');
    const s = api.readShockFile({ text: MIX_SHOCK, fileName: 'shock-mix.csv', bridge: null });
    const view = api.runScenario({ scenario: s, choices: ON }).phases[0]!;
    const cli = await json(['scenario', 'sample-data/fernhollow-county.csv', '--shock', p('shock-mix.csv'), '--mix', p('mix-codes.csv'), '--bridge', BRIDGE.fileName, '--json']);
    expect(view.effects.output!.totals.total).toBeCloseTo((cli.totals.output as { total: number }).total, 6);
    api.setStudyInput({ kind: 'mix', text: null, fileName: '' });
  });

  it('refuses what the CLI refuses, with the same located message', async () => {
    const refusal = (f: () => unknown) => { try { f(); } catch (e) { return (e as Error).message; } throw new Error('not refused'); };
    // A code the bridge lacks: the shock file's line.
    const unknown = SHOCK.replace('FH-12', 'FH-77');
    expect(refusal(() => api.readShockFile({ text: unknown, fileName: 'shock.csv', bridge: BRIDGE }))).toMatch(/^code 'FH-77' is not in the bridge sample-data\/fernhollow-bridge\.csv/);
    writeFileSync(p('shock-unknown.csv'), unknown);
    const cli = await runCli(['scenario', 'sample-data/fernhollow-county.csv', '--shock', p('shock-unknown.csv'), '--bridge', BRIDGE.fileName]);
    expect(cli.code).toBe(2);
    expect(cli.err).toContain("code 'FH-77' is not in the bridge");
    // Shares not summing to 1; a code mapped twice without shares: the bridge's line.
    const bad = (text: string) => refusal(() => api.checkBridge({ bridge: { text, fileName: 'b.csv' } }));
    expect(bad('code,sector,share\nX,Farming,0.5\nX,Utilities,0.4\n')).toMatch(/shares of code 'X' sum to 0\.9, not 1/);
    expect(bad('code,sector\nX,Farming\nX,Utilities\n')).toMatch(/code 'X' is mapped twice \(also on line 2\) without shares/);
    expect(bad('code,sector\nX,Mining\n')).toMatch(/sector 'Mining' is not a sector of the table/);
    expect(refusal(() => api.setStudyInput({ kind: 'mix', text: MIX.replace('FH-14', 'ZZ'), fileName: 'mix.csv', bridge: BRIDGE }))).toMatch(/code 'ZZ' is not in the bridge/);
  });

  it('county employment by codes (the "Larger table" screen\'s bridge) is refused with the CLI\'s located messages', async () => {
    const national = { text: readFileSync('sample-data/national-table.csv', 'utf8'), fileName: 'sample-data/national-table.csv' };
    const jobs = readFileSync('sample-data/fernhollow-employment-by-code.csv', 'utf8');
    // As the worker posts a refusal to the screen (engine.worker.ts): formatLocated, file line and column first.
    const refusal = (f: () => unknown) => { try { f(); } catch (e) { return formatLocated(e as InputError); } throw new Error('not refused'); };
    const cases: [string, string, string][] = [
      // a code the bridge lacks: the employment file's line; shares not summing to 1 and a code twice without shares: the bridge's line
      ['unknown code', jobs.replace('FH-05,', 'FH-55,'), BRIDGE.text],
      ['shares', jobs, BRIDGE.text.replace('FH-12,Real estate,0.4', 'FH-12,Real estate,0.3')],
      ['twice', jobs, BRIDGE.text.replace('FH-01,Farming,', 'FH-01,Farming,\nFH-01,Utilities,')],
    ];
    for (const [what, emp, bridgeText] of cases) {
      writeFileSync(p('jobs.csv'), emp);
      writeFileSync(p('bridge.csv'), bridgeText);
      const app = refusal(() => api.buildRegional({ national, employment: { text: emp, fileName: p('jobs.csv') }, bridge: { text: bridgeText, fileName: p('bridge.csv') }, method: 'slq', delta: 0.3 }));
      const cli = await runCli(['regionalize', national.fileName, '--employment', p('jobs.csv'), '--bridge', p('bridge.csv'), '--method', 'slq']);
      expect(cli.code, what).toBe(2);
      expect(`roundwise regionalize: ${app}\n`, what).toBe(cli.err);
    }
  });
});
