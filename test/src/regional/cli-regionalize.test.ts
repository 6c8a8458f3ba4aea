// `roundwise regionalize` and `roundwise aggregate` in-process, through the real table importer and writer:
// the documented JSON keys (README, regionalize --json), the hand-computed figures of regionalize.test.ts, files that read back, refusals.
import { describe, it, expect, beforeAll } from 'vitest';
import { mkdtempSync, readFileSync, readdirSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { importTable } from '../../../src/table/index.ts';
import { coefficients } from '../../../src/model/index.ts';
import { estimateCountyTable } from '../../../src/study/index.ts';
import { expectClose } from './build-table.ts';
import { runCli } from '../../support/cli.ts';

const FIX = join(import.meta.dirname, '../../fixtures/regional');
const SAMPLE = join(import.meta.dirname, '../../../sample-data');
const f = (name: string) => join(FIX, name);

const cli = (...argv: string[]) => runCli(argv);

let dir = '';
beforeAll(() => { dir = mkdtempSync(join(tmpdir(), 'rw-regional-')); });

describe('roundwise regionalize', () => {
  it('--json carries sectors, slq, lambda, coefficients (rows over all sectors) and absent', async () => {
    const r = await cli('regionalize', f('three-nation.csv'), '--employment', f('three-employment-absent.csv'), '--method', 'flq', '--json');
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.sectors).toEqual(['Farming', 'Making', 'Services']);
    // county jobs 20, 0, 70 (total 90) against 100, 200, 700 (1000): SLQ = (20/90)/(0.1), 0, (70/90)/(0.7) — by hand
    expectClose(j.slq, [20 / 9, 0, 10 / 9]);
    expect(j.lambda).toBeCloseTo(Math.pow(Math.log2(1 + 90 / 1000), 0.3), 14); // Flegg & Webber 1997
    expect(j.coefficients).toHaveLength(3);
    expect(j.coefficients[1]).toEqual([0, 0, 0]);
    expect(j.absent).toEqual(['Making']);
    expect(j.cautions.length).toBeGreaterThan(3);
  });

  it('slq: lambda is null and the coefficients are those computed by hand in regionalize.test.ts', async () => {
    const j = JSON.parse((await cli('regionalize', f('three-nation.csv'), '--employment', f('three-employment.csv'), '--method', 'slq', '--json')).out);
    expect(j.lambda).toBeNull();
    expectClose(j.coefficients.flat(), [0.05, 20 / 300, 0.075, 0.1, 5 / 300, 0.025, 0.1, 0.1, 0.1]);
    expectClose(j.importLeakageValue, [4, 0.25, 1]);
  });

  it('--out writes a regional table that the importer reads back to the same flows, output and coefficients', async () => {
    const out = join(dir, 'cilq');
    const r = await cli('regionalize', f('three-nation.csv'), '--employment', f('three-employment.csv'), '--method', 'cilq', '--out', out, '--json');
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(readdirSync(out).sort()).toEqual([
      'location-quotients.about.txt', 'location-quotients.csv', 'regional-coefficients.about.txt', 'regional-coefficients.csv', 'regional-table.about.txt', 'regional-table.csv',
    ]);
    const back = importTable(readFileSync(join(out, 'regional-table.csv'), 'utf8'), { fileName: 'regional-table.csv' });
    expect(back.warnings).toEqual([]);
    expectClose(back.x, j.output);
    expectClose(coefficients(back).A, j.coefficients.flat(), 1e-12);
    expect(back.imports.map((v) => v.label)).toEqual(['Imports', 'Imports from outside the county']);
    expectClose(back.imports[1]!.values, j.importLeakageValue, 1e-12);
    expectClose(back.employment!, [20, 10, 70]);
    expect(readFileSync(join(out, 'location-quotients.about.txt'), 'utf8')).toMatch(/CILQ[\s\S]*Cautions/);
  });

  it('the table\'s sidecar is the study layer\'s estimate about (the app exports the same), naming FLQ δ', async () => {
    const out = join(dir, 'flq-about');
    const r = await cli('regionalize', f('three-nation.csv'), '--employment', f('three-employment.csv'), '--method', 'flq', '--delta', '0.27', '--out', out);
    expect(r.code, r.err).toBe(0);
    const written = readFileSync(join(out, 'regional-table.about.txt'), 'utf8');
    const date = /^Produced: (.*)$/m.exec(written)![1]!;
    const study = estimateCountyTable({
      national: { bytes: readFileSync(f('three-nation.csv')), fileName: 'three-nation.csv' },
      employment: { bytes: readFileSync(f('three-employment.csv')), fileName: f('three-employment.csv') },
      method: 'flq',
      delta: 0.27,
    }, date);
    expect(written).toBe(study.about);
    expect(written).toMatch(/^Model: .*FLQ location quotients, δ = 0\.27\)\r$/m);
    expect(written).toMatch(/^Source file: three-nation\.csv\r$/m);
    // The reports beside it carry the same model line.
    expect(readFileSync(join(out, 'location-quotients.about.txt'), 'utf8')).toContain(`Model: ${study.model}\r\n`);
  });

  it('a table with an absent sector still reads back; the importer drops the empty sector with a note', async () => {
    const out = join(dir, 'absent');
    expect((await cli('regionalize', f('three-nation.csv'), '--employment', f('three-employment-absent.csv'), '--method', 'slq', '--out', out)).code).toBe(0);
    const back = importTable(readFileSync(join(out, 'regional-table.csv'), 'utf8'), { fileName: 'regional-table.csv' });
    expect(back.sectors).toEqual(['Farming', 'Services']);
    expect(back.warnings.map((w) => w.location?.rowLabel)).toEqual(['Making']);
  });

  it('the sample national table and Fernhollow employment regionalize with every method', async () => {
    for (const method of ['slq', 'cilq', 'flq']) {
      const r = await cli('regionalize', join(SAMPLE, 'national-table.csv'), '--employment', join(SAMPLE, 'fernhollow-employment.csv'), '--method', method, '--json');
      expect(r.code).toBe(0);
      const j = JSON.parse(r.out);
      expect(j.sectors).toHaveLength(16);
      expect(j.absent).toEqual([]);
    }
  });

  it('refuses with the employment file line and the sector label', async () => {
    const bad = await cli('regionalize', f('three-nation.csv'), '--employment', f('three-employment-bad-label.csv'), '--method', 'slq');
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/three-employment-bad-label\.csv:3:1 \(row 'Makeing'\): sector 'Makeing' is not a sector of the national table/);
    const nn = await cli('regionalize', f('three-nation.csv'), '--employment', f('three-employment-not-numeric.csv'), '--method', 'slq');
    expect(nn.err).toMatch(/three-employment-not-numeric\.csv:4:2 \(row 'Services'\): county jobs '7O' are not a number/);
    expect(nn.err.trim().split('\n')).toHaveLength(1);
  });

  it('refuses δ outside [0, 1], an unknown method, δ with slq as usage mistakes (exit 1, usage on its own line), and writes nothing', async () => {
    const out = join(dir, 'refused');
    const d = await cli('regionalize', f('three-nation.csv'), '--employment', f('three-employment.csv'), '--method', 'flq', '--delta', '1.2', '--out', out);
    expect(d.code).toBe(1);
    expect(d.err).toMatch(/--delta must lie between 0 and 1 \(got '1\.2'\)/);
    expect(existsSync(out)).toBe(false);
    const others = [
      [await cli('regionalize', f('three-nation.csv'), '--employment', f('three-employment.csv'), '--method', 'lq'), /--method must be slq, cilq or flq \(got 'lq'\)/],
      [await cli('regionalize', f('three-nation.csv'), '--employment', f('three-employment.csv'), '--method', 'slq', '--delta', '0.3'), /--delta applies to --method flq only/],
      [await cli('regionalize', f('three-nation.csv'), '--method', 'slq'), /--employment EMP\.csv is required/],
    ] as const;
    for (const [r, message] of others) {
      expect(r.code).toBe(1);
      expect(r.err).toMatch(message);
      // The usage line is a line of its own, not an escaped "\n  usage:" inside the message.
      expect(r.err.split('\n')[1]).toMatch(/^usage: roundwise regionalize NATIONAL\.csv --employment EMP\.csv --method slq\|cilq\|flq /);
      expect(r.err).not.toContain('\\n');
    }
  });

  it('--map goes through the table importer\'s role-map check', async () => {
    const r = await cli('regionalize', f('three-nation.csv'), '--employment', f('three-employment.csv'), '--method', 'slq', '--map', f('bad-role-map.json'));
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/bad-role-map\.json:1:\d+: unknown row role for 'Employment \(jobs\)'/);
  });

  it('--help describes every option', async () => {
    const r = await cli('regionalize', '--help');
    for (const o of ['--employment', '--method', '--delta', '--map', '--json', '--out', 'Flegg & Tohmo']) expect(r.out).toContain(o);
  });
});

describe('roundwise aggregate', () => {
  it('--json: groups, members and the bias figures; --out writes a table that reads back with summed flows', async () => {
    const out = join(dir, 'agg');
    const r = await cli('aggregate', f('three-nation.csv'), '--groups', f('three-groups.csv'), '--json', '--out', out);
    expect(r.err).toBe('');
    const j = JSON.parse(r.out);
    expect(j.groups).toEqual(['Goods', 'Services']);
    expect(j.members).toEqual([['Farming', 'Making'], ['Services']]);
    expect(j.notes.join(' ')).toMatch(/Aggregation bias/);
    const back = importTable(readFileSync(join(out, 'aggregated-table.csv'), 'utf8'), { fileName: 'aggregated-table.csv' });
    // by hand from three-nation.csv: Goods×Goods = 10+20+40+10, Goods×Services = 30+20, Services×Goods = 20+30, Services×Services = 40
    expectClose(back.Z, [80, 50, 50, 40]);
    expectClose(back.x, [500, 400]);
    expect(readFileSync(join(out, 'aggregation-bias.about.txt'), 'utf8')).toMatch(/Aggregation bias/);
    expect(readFileSync(join(out, 'aggregation-bias.csv'), 'utf8').split('\r\n')[1]).toMatch(/^Goods,Farming; Making,/);
  });

  it('the sample groups merge the sample county into 6 groups', async () => {
    const j = JSON.parse((await cli('aggregate', join(SAMPLE, 'fernhollow-county.csv'), '--groups', join(SAMPLE, 'fernhollow-groups.csv'), '--json')).out);
    expect(j.groups).toHaveLength(6);
  });

  it('refuses a group file that misses a sector, with the sector named', async () => {
    const r = await cli('aggregate', f('three-nation.csv'), '--groups', f('three-groups-missing.csv'));
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/three-groups-missing\.csv \(row 'Making'\): no group is given for sector 'Making'/);
    const wrong = await cli('aggregate', f('three-nation.csv'), '--groups', f('flow-rows.csv'));
    expect(wrong.err).toMatch(/flow-rows\.csv:1:1 \(row 'sector'\): sector 'sector' is not a sector of the table/);
  });
});
