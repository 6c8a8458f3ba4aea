// `roundwise analyze` in-process: JSON keys, reports, refusals. The two-sector table is Miller & Blair, Input–Output
// Analysis, 2nd ed. 2009, ch. 2 (§2.3), figures recalled from memory (see test/src/model/textbook.test.ts).
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { mkdtempSync, writeFileSync, readFileSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Papa from 'papaparse';
import { importTable } from '../../../src/table/index.ts';
import { analyzeTable } from '../../../src/model/index.ts';
import { CAUTIONS } from '../../../src/report/index.ts';
import { runCli } from '../../support/cli.ts';
import { api } from '../../../renderer/worker/compute.ts';

const SAMPLE = 'sample-data/fernhollow-county.csv';
let dir: string;

const cli = (...args: string[]) => runCli(['analyze', ...args]);

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'rw-analyze-'));
  writeFileSync(join(dir, 'two.csv'), [
    'dollars,Sector 1,Sector 2,Exports,Total output',
    'Sector 1,150,500,350,1000',
    'Sector 2,200,100,1700,2000',
    'Other value added,650,1400,,',
    'Total input,1000,2000,,',
  ].join('\n'));
  writeFileSync(join(dir, 'ragged.csv'), 'x,A,B,Total output\nA,1,2,10\nB,3\nTotal input,10,10\n');
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('roundwise analyze --json', () => {
  it('prints one JSON object with the documented keys (README, analyze --json), matching the engine', async () => {
    const r = await cli(SAMPLE, '--json');
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(Object.keys(j)).toEqual(expect.arrayContaining(['sectors', 'viability', 'multipliers', 'linkages', 'warnings']));
    expect(Object.keys(j.viability)).toEqual(expect.arrayContaining(['perronRoot', 'perronRootBounds', 'hawkinsSimon', 'irreducible', 'productive', 'perronRootClosed', 'roundsToTolerance']));
    expect(Object.keys(j.multipliers).sort()).toEqual(['employment', 'income', 'output', 'valueAdded']);
    expect(Object.keys(j.multipliers.output).sort()).toEqual(['typeI', 'typeII']);
    expect(Object.keys(j.multipliers.income).sort()).toEqual(['simple', 'total', 'typeI', 'typeII']);
    expect(Object.keys(j.multipliers.employment).sort()).toEqual(['simple', 'total', 'typeI', 'typeII']);
    expect(Object.keys(j.multipliers.valueAdded).sort()).toEqual(['simple', 'total']);
    expect(Object.keys(j.linkages)).toEqual(expect.arrayContaining(['backward', 'forward']));
    const an = analyzeTable(importTable(readFileSync(SAMPLE, 'utf8'), { fileName: 'fernhollow-county.csv' }));
    expect(j.sectors).toEqual(an.sectors);
    expect(j.multipliers.employment.typeII).toEqual(an.multipliers.employment.typeII);
    expect(j.linkages.backward).toEqual(an.linkages.backward);
    expect(j.viability.perronRootBounds).toEqual(an.viability.perronRootBounds);
    expect(j.viability.productive).toBe(true);
    expect(r.out).not.toMatch(/NaN|Infinity/);
  });

  it('reproduces the textbook output multipliers end to end (1.518, 1.452; recalled from memory)', async () => {
    const r = await cli(join(dir, 'two.csv'), '--json');
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.multipliers.output.typeI.map((v: number) => Number(v.toFixed(3)))).toEqual([1.518, 1.452]);
    // no labour income row: Type II and income multipliers are null, each with a reason
    expect(j.multipliers.output.typeII).toEqual([null, null]);
    expect(j.nullReasons.some((n: { measure: string }) => n.measure === 'output.typeII')).toBe(true);
    expect(j.multipliers.employment.simple).toEqual([null, null]);
  });

  it('--map overrides a role (households as other final demand: no closure)', async () => {
    writeFileSync(join(dir, 'map.json'), JSON.stringify({ columns: { Households: 'otherFinalDemand' } }));
    const r = await cli(SAMPLE, '--json', '--map', join(dir, 'map.json'));
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.viability.perronRootClosed).toBeNull();
    expect(j.multipliers.output.typeII.every((v: unknown) => v === null)).toBe(true);
    expect(j.multipliers.output.typeI.every((v: unknown) => typeof v === 'number')).toBe(true);
  });
});

describe('roundwise analyze --json says what the app\'s Overview says', () => {
  it('the verdict in words, Rasmussen classes and the round by which 99 % is reached equal the app worker\'s views', async () => {
    const r = await cli(SAMPLE, '--json');
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    const view = api.loadTable({ text: readFileSync(SAMPLE, 'utf8'), fileName: 'fernhollow-county.csv' }).analysis;
    expect(j.verdict).toEqual(view.verdict);
    expect(j.linkages.classes).toEqual(view.multipliers.map((m) => (m.linkage === 'undefined' ? null : m.linkage)));
    expect(j.unitDemandRounds.reach.find((x: { target: number }) => x.target === 0.99).round).toBe(view.reach99.value);
    j.unitDemandRounds.coverage.slice(0, view.rounds.length).forEach((c: number, k: number) => expect(c).toBe(view.rounds[k]!.reached));
    // Rasmussen: a key sector has both indices above 1 (Rasmussen 1956).
    j.linkages.classes.forEach((c: string, k: number) => expect(c === 'key').toBe(j.linkages.backward[k] > 1 && j.linkages.forward[k] > 1));
  });
});

describe('roundwise analyze --out', () => {
  it('writes rectangular CSV reports with sidecars, atomically', async () => {
    const out = join(dir, 'reports');
    const r = await cli(SAMPLE, '--out', out);
    expect(r.code).toBe(0);
    const names = readdirSync(out).sort();
    for (const base of ['multipliers', 'coefficients', 'leontief-inverse', 'viability']) {
      expect(names).toContain(`${base}.csv`);
      expect(names).toContain(`${base}.about.txt`);
      const parsed = Papa.parse<string[]>(readFileSync(join(out, `${base}.csv`), 'utf8'), { skipEmptyLines: true });
      expect(parsed.errors).toEqual([]);
      const widths = new Set(parsed.data.map((row) => row.length));
      expect(widths.size).toBe(1);
      const about = readFileSync(join(out, `${base}.about.txt`), 'utf8');
      for (const c of CAUTIONS) expect(about).toContain(c);
      expect(about).toMatch(/Source SHA-256: [0-9a-f]{64}/);
    }
    expect(names.some((f) => f.endsWith('.tmp'))).toBe(false);
    // the Leontief inverse's total row is the Type I output multipliers
    const L = Papa.parse<string[]>(readFileSync(join(out, 'leontief-inverse.csv'), 'utf8'), { skipEmptyLines: true }).data;
    const M = Papa.parse<string[]>(readFileSync(join(out, 'multipliers.csv'), 'utf8'), { skipEmptyLines: true }).data;
    const totals = L[L.length - 1]!.slice(1).map(Number);
    M.slice(1).forEach((row, j) => expect(Math.abs(Number(row[1]) - totals[j]!)).toBeLessThan(1e-12 * totals[j]!));
  });
});

describe('roundwise analyze refusals', () => {
  it('a missing file: exit 2, one short line naming the file', async () => {
    const r = await cli(join(dir, 'nope.csv'));
    expect(r.code).toBe(2);
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).toMatch(/nope\.csv: no such file/);
  });
  it('a ragged row: exit 2 with the line of the file, no stack trace', async () => {
    const r = await cli(join(dir, 'ragged.csv'));
    expect(r.code).toBe(2);
    const lines = r.err.trim().split('\n');
    expect(lines.length).toBeGreaterThanOrEqual(1);
    expect(lines.length).toBeLessThanOrEqual(3);
    expect(r.err).toMatch(/ragged\.csv:3/);
    expect(r.err).not.toMatch(/\bat \w+ \(|\.ts:\d+:\d+\)/);
  });
  it('a bad role map: exit 2 naming the map file', async () => {
    writeFileSync(join(dir, 'bad-map.json'), '{"rows": {"Imports": "exports"}}');
    const r = await cli(SAMPLE, '--map', join(dir, 'bad-map.json'));
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/bad-map\.json/);
  });
  it('usage errors: exit 1 with the usage line', async () => {
    for (const args of [[], ['a.csv', 'b.csv'], [SAMPLE, '--bogus'], [SAMPLE, '--tolerance', '2']]) {
      const r = await cli(...args);
      expect(r.code).toBe(1);
      expect(r.err.trim().split('\n').length).toBeLessThanOrEqual(3);
    }
  });
  it('an unproductive table is analysed, not refused: exit 0, verdict false, warning on stderr', async () => {
    writeFileSync(join(dir, 'unproductive.csv'), [
      'dollars,A,B,Exports,Total output',
      'A,60,70,10,100',
      'B,70,60,10,100',
      'Other value added,10,10,,',
    ].join('\n'));
    const r = await cli(join(dir, 'unproductive.csv'), '--json');
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.viability.productive).toBe(false);
    expect(j.viability.hawkinsSimon).toBe(false);
    expect(j.multipliers.output.typeI).toEqual([null, null]);
    expect(r.err).toMatch(/not productive/);
  });
});
