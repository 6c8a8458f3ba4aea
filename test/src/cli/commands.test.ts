// The declarative CLI: every command is one spec behind one parser, so help texts, usage errors and exit codes are
// the same for all six. Exit codes as README "Command line" states them: 0 done, 1 usage error, 2 refused input.
// (The rules are the project's own: common practice, no source.)
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { COMMANDS } from '../../../src/cli/main.ts';
import { usageLine } from '../../../src/cli/parse.ts';
import { runCli } from '../../support/cli.ts';

let dir: string;
beforeAll(() => { dir = mkdtempSync(join(tmpdir(), 'rw-commands-')); });
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const run = (...args: string[]) => runCli(args);

/** Valid arguments for each command (on the invented sample data), so one change at a time can be tested. */
const VALID: Record<string, string[]> = {
  analyze: ['sample-data/fernhollow-county.csv'],
  scenario: ['sample-data/fernhollow-county.csv', '--shock', 'sample-data/fernhollow-food-plant.csv'],
  regionalize: ['sample-data/national-table.csv', '--employment', 'sample-data/fernhollow-employment.csv', '--method', 'slq'],
  balance: ['test/fixtures/regional/flows.csv', '--rows', 'test/fixtures/regional/flow-rows.csv', '--columns', 'test/fixtures/regional/flow-columns.csv'],
  aggregate: ['sample-data/fernhollow-county.csv', '--groups', 'sample-data/fernhollow-groups.csv'],
  sut: ['sample-data/national-supply.csv', 'sample-data/national-use.csv'],
};

describe('command specs', () => {
  it('there are the six commands, each with valid sample arguments here', () => {
    expect(COMMANDS.map((c) => c.name)).toEqual(['analyze', 'scenario', 'regionalize', 'balance', 'aggregate', 'sut']);
    expect(Object.keys(VALID)).toEqual(COMMANDS.map((c) => c.name));
  });

  it('--help lists every option of the command, one line each, and exits 0', async () => {
    for (const spec of COMMANDS) {
      const r = await run(spec.name, '--help');
      expect(r.code).toBe(0);
      const lines = r.out.split('\n');
      for (const name of [...Object.keys(spec.options), 'json', 'out', 'help']) {
        const line = lines.filter((l) => new RegExp(`^  (-h, )?--${name}(?![\\w-])`).test(l));
        expect(line, `${spec.name} --${name}`).toHaveLength(1);
        expect(line[0]!.replace(/^\s*\S+( \S+)?\s+/, '').length, `${spec.name} --${name} has help text`).toBeGreaterThan(8);
      }
      expect(lines[0]).toBe(`usage: ${usageLine(spec)}`);
      // `roundwise help <command>` and `-h` give the same text.
      expect((await run('help', spec.name)).out).toBe(r.out);
      expect((await run(spec.name, '-h')).out).toBe(r.out);
    }
  });

  it('the main help lists every command with all its options', async () => {
    const r = await run('--help');
    expect(r.code).toBe(0);
    for (const spec of COMMANDS) {
      expect(r.out).toContain(`  ${usageLine(spec)}\n`);
      for (const name of Object.keys(spec.options)) expect(usageLine(spec)).toContain(`--${name}`);
    }
    expect(r.out).toMatch(/0 done, 1 usage error, 2 refused input/);
  });

  it('usage mistakes exit 1 for every command, with the message and the usage line on its own line', async () => {
    for (const spec of COMMANDS) {
      const valid = VALID[spec.name]!;
      const cases: [string[], RegExp][] = [
        [valid.slice(spec.second ? 2 : 1), new RegExp(`^no ${spec.positional.name.replace('.', '\\.')} given$`)],
        [[...valid, 'extra.csv'], spec.second ? /^two files expected \(\S+ \S+\), got 3: / : new RegExp(`^one ${spec.positional.name.replace('.', '\\.')} expected, got 2: `)],
        ...(spec.second ? [[[valid[0]!], new RegExp(`^no ${spec.second.name.replace('.', '\\.')} given after `)] as [string[], RegExp]] : []),
        [[...valid, '--colour'], /^unknown option '--colour'$/],
        [[...valid, '--json=yes'], /^--json takes no value$/],
        [[...valid, '--out'], /^--out needs a value \(DIR\)$/],
      ];
      const required = Object.entries(spec.options).filter(([, o]) => o.type === 'string' && o.required);
      for (const [name] of required) {
        const k = valid.indexOf(`--${name}`);
        cases.push([[...valid.slice(0, k), ...valid.slice(k + 2)], new RegExp(`^--${name} \\S+ is required$`)]);
      }
      for (const [args, message] of cases) {
        const r = await run(spec.name, ...args);
        const lines = r.err.trimEnd().split('\n');
        expect(r.code, `${spec.name} ${args.join(' ')}: ${r.err}`).toBe(1);
        expect(r.out).toBe('');
        expect(lines).toHaveLength(2);
        expect(lines[0]!.startsWith(`roundwise ${spec.name}: `)).toBe(true);
        expect(lines[0]!.slice(`roundwise ${spec.name}: `.length), args.join(' ')).toMatch(message);
        expect(lines[1]).toBe(`usage: ${usageLine(spec)}`);
      }
    }
  });

  it('refused input exits 2 for every command (a missing input file), with one located line', async () => {
    for (const spec of COMMANDS) {
      const args = [join(dir, 'absent.csv'), ...VALID[spec.name]!.slice(1)];
      const r = await run(spec.name, ...args);
      expect(r.code, r.err).toBe(2);
      expect(r.err).toBe(`roundwise ${spec.name}: ${join(dir, 'absent.csv')}: no such file (it or its folder does not exist)\n`);
    }
  });

  it('unknown and missing commands say the same thing and exit 1', async () => {
    const unknown = await run('analyse');
    const none = await run();
    expect(unknown.code).toBe(1);
    expect(none.code).toBe(1);
    expect(unknown.err.split('\n')[0]).toBe("roundwise: unknown command 'analyse'");
    expect(none.err.split('\n')[0]).toBe('roundwise: no command given');
    expect(unknown.err.split('\n')[1]).toBe(none.err.split('\n')[1]);
    expect(none.err).toContain('analyze, scenario, regionalize, balance, aggregate, sut');
  });

  it('a value may start with a dash (a sector label, a negative number) and is then checked as a value', async () => {
    const r = await run('scenario', ...VALID.scenario!, '--paths', '-Not a sector');
    expect(r.code, r.err).toBe(2);
    expect(r.err).toMatch(/--paths: unknown sector '-Not a sector'/);
    const d = await run('regionalize', ...VALID.regionalize!.slice(0, -1), 'flq', '--delta', '-0.5');
    expect(d.code).toBe(1);
    expect(d.err).toMatch(/--delta must lie between 0 and 1 \(got '-0\.5'\)/);
  });

  it('every command runs on its sample arguments: exit 0, a summary on stdout, nothing written without --out', async () => {
    for (const spec of COMMANDS) {
      const r = await run(spec.name, ...VALID[spec.name]!);
      expect(r.code, r.err).toBe(0);
      expect(r.out.length).toBeGreaterThan(20);
      expect(r.out).not.toMatch(/Wrote/);
    }
  });
});
