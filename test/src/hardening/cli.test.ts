/**
 * The CLI on bad input, in process (`main(argv, io)` with captured streams): random mutations of valid tables and every
 * file of the hardening corpus either succeed with finite numbers or exit 2 with a short located message and no stack
 * trace; a refused or foreign file at the --project path is left byte for byte as it was.
 */
import fc from 'fast-check';
import { mkdtempSync, readFileSync, rmSync, writeFileSync, readdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { ACCEPTED, BASE } from '../../fixtures/hardening/make-corpus.ts';
import { encoding, expectCliRefusal, gridTable, nonFiniteText, toText } from '../../support/fuzz-tables.ts';
import { runCli } from '../../support/cli.ts';
import { FORMULA_LABELS, formulaTableCsv, unsafeCells } from './csv-safety.ts';

const CORPUS = fileURLToPath(new URL('../../fixtures/hardening/corpus/', import.meta.url));
const dir = mkdtempSync(join(tmpdir(), 'roundwise-cli-hardening-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const write = (name: string, content: string | Buffer) => {
  const p = join(dir, name);
  writeFileSync(p, content);
  return p;
};

describe('roundwise scenario on bad input', () => {
  it('random mutations of valid tables: exit 0 with finite JSON, or exit 2 with a short message', async () => {
    const ch = fc.oneof(fc.constantFrom('"', ',', ';', '\n', '\u0000', 'x', '-', '', '1e999', 'NaN'), fc.string({ maxLength: 2 }));
    let refused = 0;
    let accepted = 0;
    await fc.assert(
      fc.asyncProperty(gridTable, encoding, fc.array(fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), ch), { minLength: 0, maxLength: 3 }), async (g, enc, edits) => {
        let text = toText(g.grid, enc);
        for (const [at, s] of edits) {
          const k = Math.floor(at * text.length);
          text = text.slice(0, k) + s + text.slice(k + 1);
        }
        const table = write('t.csv', text);
        const shock = write('s.csv', `sector,amount\r\n${g.sectors[0]},100\r\n`);
        const r = await runCli(['scenario', table, '--shock', shock, '--json']);
        if (r.code === 0) {
          accepted++;
          expect(r.err).toBe('');
          expect(nonFiniteText(r.out)).toEqual([]);
          const j = JSON.parse(r.out) as { effects: Record<string, Record<string, (number | null)[] | null> | null> };
          // NaN would have become null in JSON: no array of effects may hold a null.
          for (const split of Object.values(j.effects)) for (const v of Object.values(split ?? {})) if (v) expect(v.every((x) => typeof x === 'number')).toBe(true);
        } else {
          refused++;
          expectCliRefusal(r, 'scenario');
        }
      }),
      { numRuns: 80, seed: 8201 },
    );
    expect(refused).toBeGreaterThan(0);
    expect(accepted).toBeGreaterThan(0);
  });

  it('every shock file of the corpus is refused with its message, prefixed by the command', async () => {
    const table = join(CORPUS, 'base.csv');
    for (const f of readdirSync(CORPUS).filter((n) => n.startsWith('shock-') && !ACCEPTED.includes(n))) {
      const t = f.includes('no-employment') ? join(CORPUS, 'base-no-jobs.csv') : table;
      const r = await runCli(['scenario', t, '--shock', join(CORPUS, f)]);
      expectCliRefusal(r, 'scenario');
      expect(r.err).toContain(`${join(CORPUS, f)}`);
    }
  });

  it('every refused table of the corpus is refused by the CLI too', async () => {
    const shock = write('ok-shock.csv', 'sector,amount\r\nCanning,100\r\n');
    const tables = readdirSync(CORPUS).filter((n) => n.startsWith('table-') && !ACCEPTED.includes(n));
    expect(tables.length).toBeGreaterThan(10);
    for (const f of tables) expectCliRefusal(await runCli(['scenario', join(CORPUS, f), '--shock', shock]), 'scenario');
  });

  it('missing files, a directory given as a file, and bad options are refused in one or two lines', async () => {
    const shock = write('ok2.csv', 'sector,amount\r\nCanning,100\r\n');
    const table = write('base.csv', BASE);
    expectCliRefusal(await runCli(['scenario', join(dir, 'nope.csv'), '--shock', shock]), 'scenario');
    expectCliRefusal(await runCli(['scenario', dir, '--shock', shock]), 'scenario');
    // Usage mistakes exit 1 (README "Command line"), refused input 2.
    expectCliRefusal(await runCli(['scenario', table]), 'scenario', 1);
    expectCliRefusal(await runCli(['scenario', table, '--shock']), 'scenario', 1);
    expectCliRefusal(await runCli(['scenario', table, '--shock', shock, '--colour']), 'scenario', 1);
  });

  it('an output that cannot be written (a file where the folder should be) is a short refusal, for scenario and analyze', async () => {
    const table = write('base.csv', BASE);
    const shock = write('ok4.csv', 'sector,amount\r\nCanning,100\r\n');
    const blocker = write('not-a-folder', 'x');
    const runs = [
      ['scenario', table, '--shock', shock, '--out', blocker],
      ['scenario', table, '--shock', shock, '--project', join(blocker, 'study.json')],
      ['analyze', table, '--out', blocker],
    ];
    for (const argv of runs) {
      const r = await runCli(argv);
      expectCliRefusal(r, argv[0]!);
      expect(r.err).toMatch(/cannot write: a part of the path is not a folder/);
    }
    expect(readFileSync(blocker, 'utf8')).toBe('x');
  });

  it('a refused or foreign file at the --project path is not overwritten, byte for byte', async () => {
    const table = write('base.csv', BASE);
    const shock = write('ok3.csv', 'sector,amount\r\nCanning,100\r\n');
    for (const f of readdirSync(CORPUS).filter((n) => n.startsWith('project-') && n !== 'project-valid.json')) {
      const target = write(`keep-${f}`, readFileSync(join(CORPUS, f)));
      const before = readFileSync(target);
      const r = await runCli(['scenario', table, '--shock', shock, '--project', target]);
      expectCliRefusal(r, 'scenario');
      expect(r.err).toContain('will not overwrite');
      expect(readFileSync(target).equals(before), f).toBe(true);
    }
    // A valid project there is replaced, and nothing else is left in the folder.
    const target = write('keep-valid.json', readFileSync(join(CORPUS, 'project-valid.json')));
    const ok = await runCli(['scenario', table, '--shock', shock, '--project', target]);
    expect(ok.code, ok.err).toBe(0);
    expect(readdirSync(dir).filter((n) => n.endsWith('.tmp'))).toEqual([]);
  });

  it('--out reports from a table with formula labels: every CSV cell safe, no NaN or Infinity written', async () => {
    const table = write('formulas.csv', formulaTableCsv());
    const shock = write('formula-shock.csv', `sector,amount,kind\r\n"${FORMULA_LABELS[0]!.replace(/"/g, '""')}",300,\r\n+SUM(A1),20,jobs\r\n`);
    const out = join(dir, 'out-formulas');
    const r = await runCli(['scenario', table, '--shock', shock, '--out', out, '--paths', FORMULA_LABELS[2]!]);
    expect(r.code, r.err).toBe(0);
    const csvs = readdirSync(out).filter((f) => f.endsWith('.csv'));
    expect(csvs.length).toBeGreaterThanOrEqual(3);
    for (const f of csvs) {
      const text = readFileSync(join(out, f), 'utf8');
      expect(unsafeCells(text), f).toEqual([]);
      expect(nonFiniteText(text), f).toEqual([]);
    }
  });
});

describe('roundwise analyze on bad input', () => {
  it('random mutations of valid tables: exit 0 with finite JSON, or exit 2 with a short message', async () => {
    const ch = fc.oneof(fc.constantFrom('"', ',', ';', '\n', '\u0000', 'x', '-', '', '1e999', 'NaN', '1e300'), fc.string({ maxLength: 2 }));
    let refused = 0;
    let accepted = 0;
    await fc.assert(
      fc.asyncProperty(gridTable, encoding, fc.array(fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), ch), { minLength: 0, maxLength: 3 }), async (g, enc, edits) => {
        let text = toText(g.grid, enc);
        for (const [at, s] of edits) {
          const k = Math.floor(at * text.length);
          text = text.slice(0, k) + s + text.slice(k + 1);
        }
        const r = await runCli(['analyze', write('a.csv', text), '--json']);
        if (r.code === 0) {
          accepted++;
          expect(nonFiniteText(r.out)).toEqual([]);
          const j = JSON.parse(r.out) as { sectors: string[]; viability: { perronRoot: number | null } };
          expect(j.sectors.length).toBeGreaterThan(0);
          expect(typeof j.viability.perronRoot).toBe('number');
          // Warnings go to stderr, one line each.
          for (const line of r.err.split('\n').filter(Boolean)) expect(line.startsWith('roundwise analyze: warning: ')).toBe(true);
        } else {
          refused++;
          expectCliRefusal(r, 'analyze');
        }
      }),
      { numRuns: 60, seed: 8202 },
    );
    expect(refused).toBeGreaterThan(0);
    expect(accepted).toBeGreaterThan(0);
  });

  it('every refused table of the corpus is refused by analyze with the importer\'s message', async () => {
    const tables = readdirSync(CORPUS).filter((n) => n.startsWith('table-') && !ACCEPTED.includes(n));
    for (const f of tables) {
      const r = await runCli(['analyze', join(CORPUS, f)]);
      expectCliRefusal(r, 'analyze');
      expect(r.err).toContain(f);
    }
  });

  it('--out reports from a table with formula labels: every CSV cell safe, no NaN or Infinity written', async () => {
    const out = join(dir, 'analysis-formulas');
    const r = await runCli(['analyze', write('formulas-a.csv', formulaTableCsv()), '--out', out]);
    expect(r.code, r.err).toBe(0);
    const csvs = readdirSync(out).filter((f) => f.endsWith('.csv'));
    expect(csvs.length).toBeGreaterThanOrEqual(3);
    let seen = 0;
    for (const f of csvs) {
      const text = readFileSync(join(out, f), 'utf8');
      expect(unsafeCells(text), f).toEqual([]);
      expect(nonFiniteText(text), f).toEqual([]);
      if (text.includes("'+SUM(A1)")) seen++;
    }
    expect(seen).toBeGreaterThan(0);
  });
});
