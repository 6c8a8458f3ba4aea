// `roundwise balance` in-process: totals met, zeros kept, files written atomically and read back, refusals located.
import { describe, it, expect, beforeAll } from 'vitest';
import { mkdtempSync, readFileSync, existsSync, readdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parseLabelledMatrix } from '../../../src/regional/index.ts';
import { runCli } from '../../support/cli.ts';

const FIX = join(import.meta.dirname, '../../fixtures/regional');
const f = (name: string) => join(FIX, name);

const cli = (...argv: string[]) => runCli(argv);

describe('roundwise balance', () => {
  let dir = '';
  beforeAll(() => { dir = mkdtempSync(join(tmpdir(), 'rw-balance-')); });

  it('--json: the balanced matrix meets the row and column totals and keeps the zero cell', async () => {
    const r = await cli('balance', f('flows.csv'), '--rows', f('flow-rows.csv'), '--columns', f('flow-columns.csv'), '--json');
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.converged).toBe(true);
    const m: number[][] = j.matrix;
    const rows = m.map((row) => row.reduce((a, b) => a + b, 0));
    const cols = m[0]!.map((_, k) => m.reduce((a, row) => a + row[k]!, 0));
    [66, 77, 57].forEach((t, i) => expect(Math.abs(rows[i]! - t) / t).toBeLessThanOrEqual(1e-10));
    [77, 66, 57].forEach((t, k) => expect(Math.abs(cols[k]! - t) / t).toBeLessThanOrEqual(1e-10));
    expect(m[2]![2]).toBe(0);
    expect(j.cautions.length).toBeGreaterThan(0);
  });

  it('--out writes balanced.csv and its about file; balancing that file again needs no iteration', async () => {
    const out = join(dir, 'one');
    const r = await cli('balance', f('flows.csv'), '--rows', f('flow-rows.csv'), '--columns', f('flow-columns.csv'), '--out', out);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/converged after \d+ iterations/);
    expect(readdirSync(out).sort()).toEqual(['balanced.about.txt', 'balanced.csv']);
    expect(readFileSync(join(out, 'balanced.about.txt'), 'utf8')).toMatch(/Cautions/);
    const back = parseLabelledMatrix(readFileSync(join(out, 'balanced.csv'), 'utf8'), 'balanced.csv');
    expect(back.rowLabels).toEqual(['Farming', 'Making', 'Services']);
    const again = await cli('balance', join(out, 'balanced.csv'), '--rows', f('flow-rows.csv'), '--columns', f('flow-columns.csv'), '--json', '--tolerance', '1e-9');
    expect(JSON.parse(again.out).iterations).toBe(0);
  });

  it('refuses totals that disagree, naming the file', async () => {
    const r = await cli('balance', f('flows.csv'), '--rows', f('flow-rows.csv'), '--columns', f('flow-columns-disagree.csv'));
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/flows\.csv: the row totals sum to 200 but the column totals sum to 201/);
    expect(r.err).not.toMatch(/\bat \w+ \(/); // no stack trace
  });

  it('refuses when the cap is reached, and writes nothing', async () => {
    const out = join(dir, 'capped');
    const r = await cli('balance', f('flows.csv'), '--rows', f('flow-rows.csv'), '--columns', f('flow-columns.csv'), '--max-iterations', '1', '--out', out);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/did not converge within 1 iterations/);
    expect(existsSync(out)).toBe(false);
  });

  it('refuses usage mistakes (exit 1) and unreadable files (exit 2) with one short message', async () => {
    const usage = [
      [await cli('balance', f('flows.csv'), '--rows', f('flow-rows.csv')), /--columns COLS\.csv is required/],
      [await cli('balance', f('flows.csv'), '--rows', f('flow-rows.csv'), '--columns', f('flow-columns.csv'), '--tolerance', 'tiny'), /--tolerance must be a number \(got 'tiny'\)/],
      [await cli('balance', f('flows.csv'), '--rows', f('flow-rows.csv'), '--columns', f('flow-columns.csv'), '--max-iterations', '2.5'), /--max-iterations must be a positive whole number/],
      [await cli('balance', f('flows.csv'), '--bogus'), /unknown option '--bogus'/],
    ] as const;
    for (const [r, message] of usage) {
      expect(r.code).toBe(1);
      expect(r.err).toMatch(message);
      expect(r.err).toMatch(/\nusage: roundwise balance MATRIX\.csv --rows ROWS\.csv --columns COLS\.csv /);
    }
    const missing = await cli('balance', f('nope.csv'), '--rows', f('flow-rows.csv'), '--columns', f('flow-columns.csv'));
    expect(missing.code).toBe(2);
    expect(missing.err).toMatch(/nope\.csv: no such file/);
  });

  it('refuses a totals label that is not in the matrix, with its line', async () => {
    const r = await cli('balance', f('flows.csv'), '--rows', f('flow-columns.csv'), '--columns', f('groups-bad-label.csv'));
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/groups-bad-label\.csv:3:1 \(row 'Makeing'\): 'Makeing' is not a column label of the matrix/);
  });

  it('--help describes every option', async () => {
    const r = await cli('balance', '--help');
    for (const o of ['--rows', '--columns', '--tolerance', '--max-iterations', '--json', '--out']) expect(r.out).toContain(o);
  });
});
