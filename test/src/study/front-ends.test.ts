/**
 * One study, one set of numbers: random tables and scenarios (final-demand lines with local shares, fixed-output and
 * fixed-jobs lines, households closed or not, a chosen path destination) computed through the study layer, the CLI's
 * --json and --out reports, the app worker's screen views and its exported reports. All must carry the same numbers
 * (to 1e-12 relative), and the structural paths to the chosen sector must add up to that sector's total in the effects
 * table (Defourny & Thorbecke 1984: over all elementary paths, contributions sum to the destination's change).
 * The tables are random and invented; the reference is the study layer itself plus the path identity.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import Papa from 'papaparse';
import {
  csvFileText, prepareStudy, runStudyScenario, studyFromTableFile, utf8Bytes, VARIABLES, writeTableCsv, type Scenario, type ScenarioLine,
} from '../../../src/study/index.ts';
import { api } from '../../../renderer/worker/compute.ts';
import { tableFromParts } from '../../support/io-table.ts';
import { runCli } from '../../support/cli.ts';
import { relBetween } from '../../support/compare.ts';
import { linesOf, onePhase } from '../../support/scenario.ts';

const dir = mkdtempSync(join(tmpdir(), 'roundwise-front-ends-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function same(a: ArrayLike<number | null>, b: ArrayLike<number | null>, what: string): void {
  expect(a.length, what).toBe(b.length);
  for (let i = 0; i < a.length; i++) {
    const x = a[i]!, y = b[i]!;
    if (x === null || y === null) expect(x, `${what}[${i}]`).toBe(y);
    else if (x !== y) expect(relBetween(x, y), `${what}[${i}]: ${x} vs ${y}`).toBeLessThanOrEqual(1e-12);
  }
}

/** A random productive table with households, jobs, imports and exports, written as a CSV file (bytes). */
const tableArb = fc.integer({ min: 2, max: 6 }).chain((n) => fc.record({
  n: fc.constant(n),
  flows: fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: n * n, maxLength: n * n }),
  x: fc.array(fc.integer({ min: 200, max: 9000 }), { minLength: n, maxLength: n }),
  hh: fc.array(fc.double({ min: 0.05, max: 0.4, noNaN: true }), { minLength: n, maxLength: n }),
  taxesAndFte: fc.boolean(),
}));

/** The table as CSV; with `taxesAndFte`, a tenth of other value added is a taxes row and FTE are 80 % of jobs. */
function tableCsv(t: { n: number; flows: number[]; x: number[]; hh: number[]; taxesAndFte: boolean }): string {
  const { n, x } = t;
  const Z = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => Math.round((0.5 / n) * t.flows[i * n + j]! * x[j]! * 100) / 100));
  const inputs = x.map((_, j) => Z.reduce((s, r) => s + r[j]!, 0));
  const labour = x.map((v, j) => Math.round((v - inputs[j]!) * 0.5 * 100) / 100);
  const imports = x.map((v, j) => Math.round((v - inputs[j]!) * 0.2 * 100) / 100);
  const otherVA = x.map((v, j) => Math.round((v - inputs[j]! - labour[j]! - imports[j]!) * 100) / 100);
  const sales = x.map((_, i) => Z[i]!.reduce((s, z) => s + z, 0));
  const households = x.map((v, i) => Math.round((v - sales[i]!) * t.hh[i]! * 100) / 100);
  const otherFD = x.map((v, i) => Math.round((v - sales[i]! - households[i]!) * 100) / 100);
  const table = tableFromParts({ sectors: Array.from({ length: n }, (_, i) => `Sector ${i + 1}`), Z, x, labour, otherVA, imports, employment: x.map((v) => Math.round(v / 40)), households, otherFD }, {
    name: 'random county (invented)', labourLabel: 'Compensation of employees', otherFDLabel: 'Exports', moneyUnit: 'thousand dollars',
  });
  if (t.taxesAndFte) {
    const taxes = otherVA.map((v) => Math.round(v * 10) / 100);
    table.otherValueAdded = [{ label: 'Other value added', values: Float64Array.from(otherVA, (v, j) => Math.round((v - taxes[j]!) * 100) / 100) }];
    table.taxes = [{ label: 'Taxes on production', values: Float64Array.from(taxes) }];
    table.fte = Float64Array.from(table.employment!, (e) => Math.round(e * 0.8));
  }
  return writeTableCsv(table);
}

const lineArb = (n: number) => fc.record({
  sector: fc.integer({ min: 1, max: n }).map((k) => `Sector ${k}`),
  amount: fc.double({ min: -300, max: 800, noNaN: true }).map((v) => Math.round(v * 1000) / 1000),
  kind: fc.constantFrom('final-demand', 'final-demand', 'output', 'jobs'),
  localShare: fc.double({ min: 0, max: 1, noNaN: true }).map((v) => Math.round(v * 1000) / 1000),
});

/** One kind per sector (a sector both fixed and shocked in final demand is refused), share 1 on fixed lines. */
function consistent(lines: ScenarioLine[]): ScenarioLine[] {
  const kindOf = new Map<string, boolean>();
  return lines.filter((l) => {
    const fixed = l.kind !== 'final-demand';
    const k = kindOf.get(l.sector);
    if (k !== undefined && k !== fixed) return false;
    kindOf.set(l.sector, fixed);
    return true;
  }).map((l) => (l.kind === 'final-demand' ? l : { ...l, localShare: 1 }));
}

const shockCsv = (s: Scenario) => ['sector,amount,kind,local_share', ...linesOf(s).map((l) => `${l.sector},${l.amount},${l.kind},${l.localShare}`)].join('\n') + '\n';
const csvRows = (text: string) => Papa.parse<(string | number | null)[]>(text.trim(), { dynamicTyping: true, skipEmptyLines: true }).data;
const column = (rows: (string | number | null)[][], header: string) => {
  const k = rows[0]!.indexOf(header);
  expect(k, header).toBeGreaterThan(0);
  return rows.slice(1, -1).map((r) => r[k] as number | null);
};

describe('the study layer, the CLI and the app worker give the same numbers', () => {
  it('effects, totals, rounds and paths agree across every front end, and paths add up to the effects table', async () => {
    let runs = 0;
    await fc.assert(fc.asyncProperty(
      tableArb.chain((t) => fc.record({
        t: fc.constant(t),
        lines: fc.array(lineArb(t.n), { minLength: 1, maxLength: 5 }),
        closure: fc.constantFrom('households', 'none'),
        dest: fc.integer({ min: 1, max: t.n }).map((k) => `Sector ${k}`),
      })),
      async ({ t, lines, closure, dest }) => {
        const scenario: Scenario = onePhase('plant', consistent(lines as ScenarioLine[]));
        const csv = tableCsv(t);
        const run = `r${runs++}`;
        const tableFile = join(dir, `${run}-county.csv`);
        const shockFile = join(dir, 'plant.csv');
        writeFileSync(tableFile, csv);
        writeFileSync(shockFile, shockCsv(scenario));

        // The study layer.
        const study = studyFromTableFile(utf8Bytes(csv), `${run}-county.csv`);
        study.settings.closure = closure;
        study.settings.paths.destination = dest;
        const ps = prepareStudy(study, { spectrum: false });
        const o = runStudyScenario(ps, scenario, { paths: dest }).phases[0]!;
        const r = o.result;
        const j = r.sectors.indexOf(dest);
        // The path identity: every elementary path to the destination adds up to its total in the effects shown.
        expect(o.paths!.model).toBe(r.closure === 'household' ? 'closed' : 'open');
        expect(relBetween(o.paths!.destinationTotal, r.effects.output.total[j]!)).toBeLessThanOrEqual(1e-12);

        // The CLI: --json and --out.
        const out = join(dir, `${run}-out`);
        const cli = await runCli(['scenario', tableFile, '--shock', shockFile, '--closure', closure, '--paths', dest, '--json', '--out', out]);
        expect(cli.code, cli.err).toBe(0);
        const json = JSON.parse(cli.out);
        expect(json.closure).toBe(r.closure);
        // Every variable the table has (taxes and FTE with their rows), every part.
        const vars = VARIABLES.filter((v) => r.effects[v] !== null);
        expect(vars.includes('taxes') && vars.includes('fte')).toBe(t.taxesAndFte);
        for (const v of vars) {
          for (const p of ['direct', 'indirect', 'induced', 'total'] as const) {
            const mine = r.effects[v]![p];
            if (mine === null) expect(json.effects[v][p]).toBeNull();
            else same(json.effects[v][p], mine, `cli json ${v}.${p}`);
          }
        }
        same(json.rounds.output, o.rounds.roundTotals, 'cli json rounds');
        expect(relBetween(json.paths.destinationTotal, o.paths!.destinationTotal)).toBeLessThanOrEqual(1e-12);
        const impact = csvRows(readFileSync(join(out, 'plant-impact.csv'), 'utf8'));
        same(column(impact, 'output total (thousand dollars)'), Array.from(r.effects.output.total), 'cli --out impact total');
        same(column(impact, 'employment direct (jobs)'), Array.from(r.effects.employment!.direct), 'cli --out jobs direct');
        const cliPaths = csvRows(readFileSync(join(out, 'plant-paths.csv'), 'utf8'));
        same(cliPaths.slice(1, -1).map((x) => x[9] as number), o.paths!.paths.map((p) => p.contribution), 'cli --out paths');

        // The app's worker: screen views and exports.
        api.loadTable({ text: csv, fileName: `${run}-county.csv` });
        const choices = { closure, destination: dest };
        const view = api.runScenario({ scenario, choices }).phases[0]!;
        expect(view.closure).toBe(r.closure);
        expect(VARIABLES.filter((v) => view.effects[v] !== null)).toEqual(vars);
        for (const v of vars) {
          const e = r.effects[v]!, shown = view.effects[v]!;
          for (const p of ['direct', 'indirect', 'total'] as const) same(shown[p], Array.from(e[p]), `worker view ${v}.${p}`);
          if (e.induced === null) expect(shown.induced, `worker view ${v}.induced`).toBeNull();
          else same(shown.induced!, Array.from(e.induced), `worker view ${v}.induced`);
          same([shown.totals.direct, shown.totals.indirect, shown.totals.induced, shown.totals.total],
            [r.totals[v]!.direct, r.totals[v]!.indirect, r.totals[v]!.induced, r.totals[v]!.total], `worker view ${v} totals`);
        }
        same(view.rounds.map((x) => x.output), o.rounds.roundTotals.slice(0, view.rounds.length), 'worker view rounds');
        const pv = api.paths({ scenario, choices });
        expect(pv.destination).toBe(dest);
        expect(relBetween(pv.total, view.effects.output!.total[j]!)).toBeLessThanOrEqual(1e-12);
        expect(pv.paths.map((p) => p.labels)).toEqual(o.paths!.paths.map((p) => p.labels));
        same(pv.paths.map((p) => p.contribution), o.paths!.paths.map((p) => p.contribution), 'worker paths');
        const exported = api.report({ kind: 'scenario-impact', scenario, scenarios: [scenario], choices });
        same(column(csvRows(exported[0]!.content), 'output total (thousand dollars)'), Array.from(r.effects.output.total), 'worker export impact');
        // The CLI writes the byte-order mark the app's export adds when it saves (csvFileText).
        expect(csvFileText(exported[0]!.content)).toBe(readFileSync(join(out, 'plant-impact.csv'), 'utf8'));
        const exportedPaths = api.report({ kind: 'scenario-paths', scenario, scenarios: [scenario], choices });
        expect(csvFileText(exportedPaths[0]!.content)).toBe(readFileSync(join(out, 'plant-paths.csv'), 'utf8'));
      },
    ), { numRuns: 25, seed: 1702 });
  });
});
