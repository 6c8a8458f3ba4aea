// What the one output writer of the CLI guarantees: a run never writes over one of its own input files (same file on
// disk, compared by device and inode, so links and other spellings of the path count too) and refuses before writing
// anything; reports an earlier run left in the --out folder are listed, not deleted; every report's provenance hash
// is SHA-256 of the source file's bytes (FIPS 180-4; reference: the engine's own pure-JS sha256Hex, an independent
// implementation of node:crypto's); labels cannot act on the terminal (control and bidi characters escaped).
import { describe, it, expect, beforeEach, afterEach } from 'vitest';
import { copyFileSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createHash } from 'node:crypto';
import { runCli } from '../../support/cli.ts';
import { sha256Hex } from '../../../src/project/index.ts';

let dir: string;
beforeEach(() => { dir = mkdtempSync(join(tmpdir(), 'rw-outputs-')); });
afterEach(() => rmSync(dir, { recursive: true, force: true }));

const run = (...args: string[]) => runCli(args);

/** Names and contents of every file in `d`, to show a refused run changed nothing. */
function snapshot(d: string): Record<string, string> {
  return Object.fromEntries(readdirSync(d).sort().map((f) => [f, readFileSync(join(d, f), 'latin1')]));
}

const SAMPLE = 'sample-data/fernhollow-county.csv';
// A shock of one phase (the file handling is the point here, not phases): reports are named NAME-impact.csv etc.
const SHOCK = 'test/fixtures/scenario/one-phase/fernhollow-food-plant.csv';

describe('an output never replaces an input file', () => {
  it('analyze dir/multipliers.csv --out dir: refused (exit 2) naming both files, nothing written', async () => {
    const table = join(dir, 'multipliers.csv');
    copyFileSync(SAMPLE, table);
    const before = snapshot(dir);
    const r = await run('analyze', table, '--out', dir);
    expect(r.code).toBe(2);
    expect(r.err).toBe(`roundwise analyze: ${table}: is the input file ${table}; nothing was written (choose another output folder or name)\n`);
    expect(snapshot(dir)).toEqual(before);
  });

  it('a table file named like a report of the run (plant-impact.csv for a shock plant.csv) in the --out folder: refused before the first report is written', async () => {
    const table = join(dir, 'plant-impact.csv');
    copyFileSync(SAMPLE, table);
    const shock = join(dir, 'plant.csv');
    copyFileSync(SHOCK, shock);
    const before = snapshot(dir);
    const r = await run('scenario', table, '--shock', shock, '--out', dir);
    expect(r.code).toBe(2);
    expect(r.err).toContain(`is the input file ${table}`);
    // multipliers.csv and the other reports come before plant-impact.csv in no particular order: none exists.
    expect(snapshot(dir)).toEqual(before);
  });

  it('regionalize X/regional-table.csv … --out X: the national table survives', async () => {
    const national = join(dir, 'regional-table.csv');
    copyFileSync('sample-data/national-table.csv', national);
    const before = snapshot(dir);
    const r = await run('regionalize', national, '--employment', 'sample-data/fernhollow-employment.csv', '--method', 'flq', '--out', dir);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/regional-table\.csv: is the input file .*regional-table\.csv; nothing was written/);
    expect(snapshot(dir)).toEqual(before);
  });

  it('the same file under another name counts: a link in the --out folder, a path with ./, --project onto the role map', async () => {
    const table = join(dir, 'county.csv');
    copyFileSync(SAMPLE, table);
    const out = join(dir, 'out');
    mkdirSync(out);
    symlinkSync(table, join(out, 'multipliers.csv'));
    expect((await run('analyze', table, '--out', out)).code).toBe(2);
    expect(readFileSync(table, 'utf8')).toBe(readFileSync(SAMPLE, 'utf8'));
    expect((await run('analyze', join(dir, '.', 'county.csv'), '--out', dir.replace(/$/, '/./'))).code).toBe(0); // no clash: reports have other names
    const map = join(dir, 'map.json');
    writeFileSync(map, '{"rows": {}}');
    const p = await run('scenario', table, '--shock', SHOCK, '--map', map, '--project', map);
    expect(p.code).toBe(2);
    expect(readFileSync(map, 'utf8')).toBe('{"rows": {}}');
  });
});

describe('RAS that does not converge within the cap', () => {
  // One refusal policy: ras() throws RasConvergenceError (src/regional/ras.ts) and the command adds none of its own.
  // The start matrix is far from the totals, so one iteration cannot meet a 1e-10 gap.
  it('balance --max-iterations 1: refused (exit 2) in one line naming the matrix file, nothing written', async () => {
    const matrix = 'test/fixtures/regional/flows.csv';
    const r = await run('balance', matrix, '--rows', 'test/fixtures/regional/flow-rows.csv', '--columns', 'test/fixtures/regional/flow-columns.csv', '--max-iterations', '1', '--out', dir);
    expect(r.code, r.err).toBe(2);
    expect(r.err).toMatch(new RegExp(`^roundwise balance: ${matrix.replace(/[./]/g, '\\$&')}: RAS did not converge within 1 iterations \\(largest relative gap [0-9.e+-]+ > 1e-10\\); [^\\n]+\\n$`));
    expect(r.out).toBe('');
    expect(readdirSync(dir)).toEqual([]);
  });
});

describe('reports left by an earlier run', () => {
  it('are listed (stderr and JSON staleFiles), not deleted; files that are not Roundwise reports are left out', async () => {
    const out = join(dir, 'reports');
    const first = await run('scenario', SAMPLE, '--shock', SHOCK, '--paths', 'Farming', '--out', out);
    expect(first.code).toBe(0);
    expect(readdirSync(out)).toContain('fernhollow-food-plant-paths.csv');
    writeFileSync(join(out, 'my-notes.csv'), 'not,ours\r\n');
    writeFileSync(join(out, 'my-notes.about.txt'), 'my own notes\r\n');
    const second = await run('scenario', SAMPLE, '--shock', SHOCK, '--out', out, '--json');
    expect(second.code).toBe(0);
    const j = JSON.parse(second.out);
    expect(j.staleFiles).toEqual([join(out, 'fernhollow-food-plant-paths.csv'), join(out, 'fernhollow-food-plant-paths.about.txt')]);
    expect(j.files).toContain(join(out, 'fernhollow-food-plant-impact.csv'));
    expect(j.files).not.toContain(join(out, 'fernhollow-food-plant-paths.csv'));
    expect(second.err).toMatch(/warning: 2 Roundwise report files in .* are from an earlier run and were not rewritten: .*fernhollow-food-plant-paths\.csv/);
    expect(readdirSync(out)).toEqual(expect.arrayContaining(['fernhollow-food-plant-paths.csv', 'my-notes.csv']));
  });

  it('the text summary lists every file written', async () => {
    const out = join(dir, 'a');
    const r = await run('aggregate', SAMPLE, '--groups', 'sample-data/fernhollow-groups.csv', '--out', out);
    expect(r.code).toBe(0);
    const listed = r.out.slice(r.out.indexOf('Wrote 4 files:')).split('\n').slice(1).filter(Boolean).map((l) => l.trim());
    expect(listed.sort()).toEqual(readdirSync(out).map((f) => join(out, f)).sort());
  });
});

describe('one source-hash rule: SHA-256 of the file bytes', () => {
  it('a Latin-1 byte in the table: every command\'s sidecar hashes the bytes, not the decoded text', async () => {
    // The corner cell holds "d\xf3lares" in Latin-1: not valid UTF-8, so decoding and re-encoding would change the bytes.
    const bytes = Buffer.concat([Buffer.from('d'), Buffer.from([0xf3]), Buffer.from(readFileSync('test/fixtures/regional/three-nation.csv', 'utf8').replace(/^million dollars/, 'lares'))]);
    const table = join(dir, 'latin1.csv');
    writeFileSync(table, bytes);
    const expected = sha256Hex(new Uint8Array(bytes));
    expect(createHash('sha256').update(bytes.toString('utf8')).digest('hex')).not.toBe(expected);
    const runs: [string, string[], string][] = [
      ['regionalize', ['--employment', 'test/fixtures/regional/three-employment.csv', '--method', 'slq'], 'regional-table.about.txt'],
      ['aggregate', ['--groups', 'test/fixtures/regional/three-groups.csv'], 'aggregation-bias.about.txt'],
      ['balance', ['--table', '--rows', 'test/fixtures/regional/three-sales.csv', '--columns', 'test/fixtures/regional/three-purchases.csv'], 'balanced-table.about.txt'],
      ['analyze', [], 'multipliers.about.txt'],
    ];
    for (const [command, args, sidecar] of runs) {
      const out = join(dir, command);
      const r = await run(command, table, ...args, '--out', out);
      expect(r.code, `${command}: ${r.err}`).toBe(0);
      expect(readFileSync(join(out, sidecar), 'utf8'), command).toContain(`Source SHA-256: ${expected}`);
      expect(readFileSync(join(out, sidecar), 'utf8'), command).toContain('Source file: latin1.csv');
    }
  });
});

describe('labels cannot act on the terminal', () => {
  // One escape sequence and one right-to-left override in a sector label (the importer accepts a few control
  // characters in a file; many make it binary). The importer keeps labels without control and format characters
  // (src/table/labels.ts), so the sector is 'Farm[31ming': nothing of it can act, and --paths finds it by either
  // spelling.
  const LABEL = 'Farm\u001b[31ming\u202e';
  const SHOWN = 'Farm[31ming';
  const withLabel = (src: string, name: string) => {
    const p = join(dir, name);
    writeFileSync(p, readFileSync(src, 'utf8').replaceAll('Farming', LABEL));
    return p;
  };
  const acting = /[\u0000-\u0009\u000b-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069]/;

  it('summaries of analyze, scenario, regionalize and aggregate show them escaped', async () => {
    const county = withLabel(SAMPLE, 'county.csv');
    const runs = [
      ['analyze', county],
      ['scenario', county, '--shock', SHOCK, '--paths', LABEL],
      ['regionalize', withLabel('sample-data/national-table.csv', 'national.csv'), '--employment', withLabel('sample-data/fernhollow-employment.csv', 'emp.csv'), '--method', 'slq'],
      ['aggregate', county, '--groups', withLabel('sample-data/fernhollow-groups.csv', 'groups.csv')],
    ];
    // A group named with the same characters, so the aggregate summary (groups only) shows them too.
    writeFileSync(join(dir, 'groups.csv'), readFileSync(join(dir, 'groups.csv'), 'utf8').replaceAll('Primary industries', `${LABEL} group`));
    for (const args of runs) {
      const r = await run(...args);
      expect(r.code, r.err).toBe(0);
      expect(r.out, args[0]).not.toMatch(acting);
      expect(r.err, args[0]).not.toMatch(acting);
      if (args[0] !== 'scenario') expect(r.out, args[0]).toContain(SHOWN);
    }
  });

  it('JSON carries the label as imported, with no acting character in the printed text', async () => {
    const r = await run('analyze', withLabel(SAMPLE, 'county.csv'), '--json');
    expect(r.code, r.err).toBe(0);
    expect(r.out).not.toMatch(acting);
    expect(JSON.parse(r.out).sectors).toContain(SHOWN);
  });
});

describe('atomic writes keep what the user set', () => {
  it('a report file of mode 0600 keeps its mode when a run rewrites it', async () => {
    const out = join(dir, 'private');
    await run('analyze', SAMPLE, '--out', out);
    const f = join(out, 'multipliers.csv');
    const { chmodSync } = await import('node:fs');
    chmodSync(f, 0o600);
    expect((await run('analyze', SAMPLE, '--out', out)).code).toBe(0);
    expect(statSync(f).mode & 0o777).toBe(0o600);
  });
});
