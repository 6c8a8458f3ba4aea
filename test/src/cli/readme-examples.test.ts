// The README's command-line examples, run in-process exactly as written there (the README is the user's contract).
// Checks are properties of the published methods, not invented reference numbers:
// - mixed exogenous/endogenous model (Miller & Blair 2009, §13.1, recalled from memory): a `jobs` line fixes the
//   sector's jobs, so its direct employment equals the amount exactly;
// - total = direct + indirect + induced (the effect definitions of README's methods table, Miller & Blair 2009 ch. 6).
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { mkdtempSync, readFileSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runCli } from '../../support/cli.ts';

const README = readFileSync(new URL('../../../README.md', import.meta.url), 'utf8');
let dir: string;

/** Split a README command line into argv, honouring double quotes. */
function argv(line: string): string[] {
  return [...line.matchAll(/"([^"]*)"|(\S+)/g)].map((m) => m[1] ?? m[2]!);
}

const run = runCli;

beforeAll(() => { dir = mkdtempSync(join(tmpdir(), 'rw-readme-')); });
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('README command-line examples', () => {
  const lines = README.split('\n').filter((l) => l.startsWith('npx roundwise ') && !l.includes('MATRIX.csv'));

  it('lists the examples', () => {
    expect(lines.length).toBeGreaterThanOrEqual(6);
  });

  it('each runs with exit 0 (outputs redirected into a temporary folder)', async () => {
    for (const line of lines) {
      const args = argv(line.replace(/\s*>.*$/, '')).slice(2) // drop "npx roundwise" and any shell redirection
        // Every file the example writes goes into the temporary folder, never into the checkout.
        .map((a) => (/^(reports|county|grouped|derived)\/.*/.test(a) || /^[\w.-]+\.(pdf|xlsx|json)$/.test(a) ? join(dir, a) : a));
      const r = await run(args);
      expect(r.err.split('\n').filter((l) => !l.includes('warning')).join(''), line).toBe('');
      expect(r.code, line).toBe(0);
    }
    expect(readdirSync(join(dir, 'reports'))).toEqual(expect.arrayContaining([
      'fernhollow-food-plant-inputs.csv', 'fernhollow-food-plant-phases.csv', 'fernhollow-food-plant-building-the-plant-impact.csv',
      'fernhollow-food-plant-operating-the-plant-impact.csv', 'multipliers.csv',
    ]));
    // The deliverables of the examples, written where the redirection put them.
    expect(readdirSync(dir)).toEqual(expect.arrayContaining(['brief.pdf', 'study.xlsx', 'table.xlsx']));
  });

  it('the food-plant study: building once, operating yearly; operating fixes Food processing at exactly 300 direct jobs, and effects add up', async () => {
    const r = await run(['scenario', 'sample-data/fernhollow-county.csv', '--shock', 'sample-data/fernhollow-food-plant.csv', '--discount-rate', '0.035', '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.phases.map((p: { name: string; timing: string; years: number | null }) => [p.name, p.timing, p.years])).toEqual([['Building the plant', 'once', null], ['Operating the plant', 'annual', 20]]);
    // Two phases of different timings: no top-level effects, never a one-time plus annual total.
    expect(j.effects).toBeUndefined();
    const food = j.sectors.indexOf('Food processing');
    expect(food).toBeGreaterThanOrEqual(0);
    const operating = j.phases[1];
    expect(operating.effects.employment.direct[food]).toBeCloseTo(300, 9);
    for (const v of ['output', 'valueAdded', 'income', 'employment']) {
      const e = operating.effects[v];
      for (let i = 0; i < j.sectors.length; i++) {
        const sum = e.direct[i] + e.indirect[i] + e.induced[i];
        expect(Math.abs(sum - e.total[i])).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(e.total[i])));
      }
    }
  });
});
