// --delimiter and --decimal-mark force the reading of a table whose first lines or numbers do not show it; without
// them the importer's guess is used and its warning reaches stderr, naming the option that forces the other reading.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runCli } from '../../support/cli.ts';

let dir: string;
beforeAll(() => { dir = mkdtempSync(join(tmpdir(), 'rw-dialect-')); });
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const run = (...args: string[]) => runCli(args);

/** An invented semicolon table in which every number reads both ways ('1.000' is 1000 or 1). */
const AMBIGUOUS = [
  'dollars;A;B;Households;Exports;Total output',
  'A;1.000;2.000;1.000;1.000;5.000',
  'B;1.000;1.000;2.000;1.000;5.000',
  'Wages;2.000;1.000;;;',
  'Other value added;1.000;1.000;;;',
  'Employment;3;4;;;',
].join('\n') + '\n';

describe('table dialect options', () => {
  it('a guessed decimal mark is warned about on stderr with the option that reads it the other way', async () => {
    const file = join(dir, 'amb.csv');
    writeFileSync(file, AMBIGUOUS);
    const guessed = await run('analyze', file, '--json');
    expect(guessed.code, guessed.err).toBe(0);
    expect(guessed.err).toContain("'1.000' is 1000); if '1.000' means 1, import again with the decimal mark '.' (command line: --decimal-mark point)");
    // Money scaled by 1000 leaves the money multipliers alone, but jobs per unit of output (integers) move by 1000.
    const jobs = (out: string): number[] => JSON.parse(out).multipliers.employment.simple;
    const forced = await run('analyze', file, '--json', '--decimal-mark', 'point');
    expect(forced.code, forced.err).toBe(0);
    expect(forced.err).not.toContain('decimal mark');
    expect(jobs(forced.out)[0]! / jobs(guessed.out)[0]!).toBeCloseTo(1000, 9);
    expect(JSON.parse(forced.out).multipliers.output.typeI).toEqual(JSON.parse(guessed.out).multipliers.output.typeI);
  });

  it('--delimiter reads a file whose guess would split it wrongly; a bad value is a usage error', async () => {
    const file = join(dir, 'tab.csv');
    writeFileSync(file, AMBIGUOUS.replace(/;/g, '\t').replace('dollars', 'dollars;  per year'));
    const r = await run('analyze', file, '--json', '--delimiter', 'tab', '--decimal-mark', 'comma');
    expect(r.code, r.err).toBe(0);
    expect(JSON.parse(r.out).sectors).toEqual(['A', 'B']);
    const bad = await run('analyze', file, '--delimiter', 'pipe');
    expect(bad.code).toBe(1);
    expect(bad.err).toContain('--delimiter must be comma, semicolon or tab');
    const balance = await run('balance', 'test/fixtures/regional/flows.csv', '--rows', 'test/fixtures/regional/flow-rows.csv', '--columns', 'test/fixtures/regional/flow-columns.csv', '--delimiter', 'comma');
    expect(balance.code).toBe(1);
    expect(balance.err).toContain('--delimiter and --decimal-mark apply to --table only');
  });
});
