/**
 * The regional CLI commands (regionalize, balance, aggregate) on randomly damaged inputs, in process: each run either
 * succeeds with finite JSON or exits non-zero with a one-to-three-line message and no stack trace. The inputs start
 * from the invented fixtures of test/fixtures/regional.
 */
import fc from 'fast-check';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { nonFiniteText } from '../../support/fuzz-tables.ts';
import { runCli } from '../../support/cli.ts';

const FIX = fileURLToPath(new URL('../../fixtures/regional/', import.meta.url));
const dir = mkdtempSync(join(tmpdir(), 'roundwise-regional-hardening-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Each command with its inputs; `{k}` marks the input that gets damaged. */
const RUNS: { name: string; args: string[] }[] = [
  { name: 'regionalize', args: ['regionalize', 'three-nation.csv', '--employment', 'three-employment.csv', '--method', 'flq', '--json'] },
  { name: 'balance', args: ['balance', 'flows.csv', '--rows', 'flow-rows.csv', '--columns', 'flow-columns.csv', '--json'] },
  { name: 'aggregate', args: ['aggregate', 'three-nation.csv', '--groups', 'three-groups.csv', '--json'] },
];

const edit = fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.oneof(fc.constantFrom('"', ',', ';', '\n', '\u0000', 'x', '-', '', '1e999', 'NaN', '-5'), fc.string({ maxLength: 2 })));

describe('regional commands on damaged inputs', () => {
  for (const { name, args } of RUNS) {
    it(`${name}: finite JSON or a short refusal, never a stack trace`, async () => {
      const inputs = args.filter((a) => a.endsWith('.csv'));
      const ok = await runCli(args.map((a) => (a.endsWith('.csv') ? join(FIX, a) : a)));
      expect(ok.code, ok.err).toBe(0);
      let refused = 0;
      await fc.assert(
        fc.asyncProperty(fc.constantFrom(...inputs), fc.array(edit, { minLength: 1, maxLength: 3 }), async (target, edits) => {
          let text = readFileSync(join(FIX, target), 'utf8');
          for (const [at, s] of edits) {
            const k = Math.floor(at * text.length);
            text = text.slice(0, k) + s + text.slice(k + 1);
          }
          const damaged = join(dir, `damaged-${target}`);
          writeFileSync(damaged, text);
          const argv = args.map((a) => (a === target ? damaged : a.endsWith('.csv') ? join(FIX, a) : a));
          const r = await runCli(argv);
          if (r.code === 0) {
            expect(nonFiniteText(r.out)).toEqual([]);
            JSON.parse(r.out);
          } else {
            refused++;
            expect(r.out).toBe('');
            expect(r.err.startsWith(`roundwise ${name}: `), r.err).toBe(true);
            expect(r.err.trimEnd().split('\n').length, r.err).toBeLessThanOrEqual(3);
            expect(r.err).not.toMatch(/^\s+at\s|internal error|TypeError|RangeError/m);
          }
        }),
        { numRuns: 60, seed: 8301 },
      );
      expect(refused).toBeGreaterThan(0);
    });
  }
});
