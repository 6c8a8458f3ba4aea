/**
 * "Start from a larger table" in real Chromium against the built renderer: the bundled (invented) national table and
 * county employment are regionalized with FLQ δ = 0.3; the SLQ and λ* on screen are compared with src/regional called
 * here in the test process; bad inputs are refused with their location while the table in use stays; the estimate
 * is exported as CSV and accepted, and the Overview, Multipliers and Scenarios then show the engine's numbers for the
 * regional table. No console error may appear; every step is photographed (test-output/screenshots/regional-*.png).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Download, Page } from 'playwright-core';
import { DOWNLOADS, money, openApp, rowCell, shot, skipBrowser, type Session } from './harness.ts';
import { importTable } from '../../src/table/index.ts';
import { writeTableCsv } from '../../src/table/index.ts';
import { analyzeTable } from '../../src/model/index.ts';
import { prepareModel } from '../../src/model/index.ts';
import { runScenario } from '../support/scenario.ts';
import { prepareStudy, studyOfTable } from '../../src/study/index.ts';
import { aggregateTable, balanceTable, flqLambda, parseEmploymentCsv, parseGroupMapping, regionalize } from '../../src/regional/index.ts';
import { EMPLOYMENT_SAMPLE_CSV, EMPLOYMENT_SAMPLE_FILE_NAME, GROUPS_SAMPLE_CSV, GROUPS_SAMPLE_FILE_NAME, NATIONAL_SAMPLE_CSV, NATIONAL_SAMPLE_FILE_NAME } from '../../src/regional/index.ts';

let s: Session;
let page: Page;

/** The engine's estimate for the bundled inputs, FLQ δ = 0.3, computed here (not in the browser). */
const national = importTable(NATIONAL_SAMPLE_CSV, { fileName: NATIONAL_SAMPLE_FILE_NAME });
const expected = regionalize(national, parseEmploymentCsv(EMPLOYMENT_SAMPLE_CSV, EMPLOYMENT_SAMPLE_FILE_NAME), { method: 'flq', delta: 0.3 });

/** Ratios on screen: four decimals in the user's locale (en-US here). */
function ratio(v: number, digits = 4): string {
  return v.toLocaleString('en-US', { minimumFractionDigits: digits, maximumFractionDigits: digits });
}

async function downloadsOf(click: () => Promise<void>, count: number): Promise<{ name: string; text: string }[]> {
  const got: Download[] = [];
  const onDl = (d: Download) => { got.push(d); };
  page.on('download', onDl);
  await click();
  await expect.poll(() => got.length, { timeout: 15_000 }).toBe(count);
  page.off('download', onDl);
  const out = [];
  for (const d of got) {
    const path = join(DOWNLOADS, `regional-${d.suggestedFilename()}`);
    await d.saveAs(path);
    out.push({ name: d.suggestedFilename(), text: readFileSync(path, 'utf8') });
  }
  return out;
}

/** The text of one cell of the sector table: row by sector label, column by position (0 = sector). */
const sectorCell = (sector: string, col: number) => rowCell(page, 'regional-sectors', sector, col);

describe.skipIf(skipBrowser)('Start from a larger table, in the browser', () => {
  beforeAll(async () => {
    s = await openApp();
    page = s.page;
  });

  afterAll(async () => {
    await s?.close();
  });

  it('opens from the Import screen with the bundled national table and employment, and shows FLQ δ = 0.3', async () => {
    await page.click('[data-screen="import"]');
    await page.getByTestId('start-larger').click();
    await page.getByRole('heading', { name: 'Start from a larger table' }).waitFor();
    expect(await page.getByTestId('national-name').textContent()).toContain(NATIONAL_SAMPLE_FILE_NAME);
    expect(await page.getByTestId('employment-name').textContent()).toContain(EMPLOYMENT_SAMPLE_FILE_NAME);
    expect(await page.getByTestId('regional-caution').textContent()).toMatch(/extra uncertainty/);
    await page.click('[data-method="flq"]');
    await page.getByTestId('delta').fill('0.3');
    expect(await page.locator('#delta-note').textContent()).toMatch(/Flegg & Tohmo \(2013\).*0\.25–0\.35/);
    await page.getByTestId('regional-sectors').waitFor({ timeout: 30_000 });
  });

  it('shows the engine\'s SLQ for every sector, its λ*, and its leakage', async () => {
    expect(expected.lambda).toBe(flqLambda(expected.regionalJobs.reduce((a, b) => a + b, 0), expected.nationalJobs.reduce((a, b) => a + b, 0), 0.3));
    await expect.poll(async () => (await page.getByTestId('regional-lambda').locator('.value').textContent())?.trim()).toBe(ratio(expected.lambda!));
    for (const [i, sector] of expected.sectors.entries()) {
      expect(await sectorCell(sector, 3), `SLQ of ${sector}`).toBe(ratio(expected.slq[i]!));
      expect(await sectorCell(sector, 7), `leakage of ${sector}`).toBe(money(expected.leakageValue[i]!));
    }
    expect(await page.getByTestId('regional-absent-count').locator('.value').textContent()).toBe(String(expected.absent.length));
    const perron = analyzeTable(expected.table).viability.perronRoot;
    expect((await page.getByTestId('regional-perron').locator('.value').textContent())?.trim()).toBe(ratio(perron));
    // The card words the verdict as the study does (one wording for every screen and file).
    expect(await page.getByTestId('regional-perron').locator('.sub').textContent()).toBe(prepareStudy(studyOfTable(expected.table), { spectrum: false }).verdict.say);
    await shot(page, 'regional-01-estimate');
    await page.getByTestId('regional-coefficients').scrollIntoViewIfNeeded();
    // National a and regional r side by side, on one scale.
    await expect.poll(() => page.locator('[data-testid="regional-coefficients"] canvas.shaded').count()).toBe(2);
    await shot(page, 'regional-02-coefficients');
    // Each grid names its sectors: rows by number and name, columns by number (16 sectors: every one).
    const axes = page.getByTestId('shaded-axes').first();
    expect(await axes.locator('.shaded-rows span').allTextContents()).toEqual(expected.sectors.map((x, i) => `${i + 1} ${x}`));
    expect(await axes.locator('.shaded-cols span').count()).toBe(expected.sectors.length);
    // Coefficients are ratios of money to money: no money unit on them; λ* with four significant digits in the notes.
    const coefUnit = await page.getByTestId('regional-coefficients').locator('.muted', { hasText: 'Unit:' }).textContent();
    expect(coefUnit).toMatch(/share of the buyer’s output \(a ratio/);
    expect(coefUnit).not.toMatch(/dollars/);
    const heads = await page.getByTestId('regional-sectors').locator('thead th').allTextContents();
    expect(heads.filter((h) => /National inputs|Bought locally|Import leakage/.test(h) && /dollars of output/.test(h))).toEqual([]);
    const notes = await page.getByTestId('regional-notes').textContent();
    expect(notes).toContain(`λ* = ${Number(expected.lambda!.toPrecision(4))};`);
    expect(notes).not.toContain(String(expected.lambda));
    await page.click('[data-coef="share"]');
    await page.getByTestId('regional-coef-table').click();
    const cell = page.locator('[data-testid="regional-coefficients"] .m-cell').first();
    await cell.waitFor();
    // Row 1, column 1 (Farming buying from Farming): r_11 / a_11 as a percentage.
    const share = expected.coefficients[0]! / expected.nationalCoefficients[0]!;
    expect((await cell.textContent())?.trim()).toBe(share.toLocaleString('en-US', { style: 'percent', minimumFractionDigits: 1, maximumFractionDigits: 1 }));
    await shot(page, 'regional-03-local-share-table');
  });

  it('optionally balances to county totals by RAS and merges sectors by the bundled grouping', async () => {
    await page.locator('summary', { hasText: 'balance to known county totals (RAS)' }).click();
    await page.getByTestId('use-groups').check();
    const groups = page.getByTestId('regional-groups');
    await groups.waitFor();
    const merged = aggregateTable(expected.table, parseGroupMapping(GROUPS_SAMPLE_CSV, GROUPS_SAMPLE_FILE_NAME));
    expect(await groups.locator('h3').textContent()).toBe(`Sectors merged into ${merged.groups.length} groups`);
    await groups.scrollIntoViewIfNeeded();
    await shot(page, 'regional-04-grouped');
    await page.getByTestId('use-groups').uncheck();
    await expect.poll(() => groups.count()).toBe(0);

    // Consistent county totals: 90 % of the estimate's own intermediate sales and purchases.
    const n = expected.sectors.length, Z = expected.table.Z;
    const sales = new Float64Array(n), purchases = new Float64Array(n);
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) { sales[i]! += 0.9 * Z[i * n + j]!; purchases[j]! += 0.9 * Z[i * n + j]!; }
    const file = (name: string, v: Float64Array) => ({ name, mimeType: 'text/csv', buffer: Buffer.from(['sector,total', ...expected.sectors.map((x, i) => `${x},${v[i]}`)].join('\n')) });
    await page.getByTestId('use-balance').check();
    await page.getByTestId('rows-input').setInputFiles(file('county-sales.csv', sales));
    await page.getByTestId('columns-input').setInputFiles(file('county-purchases.csv', purchases));
    const bal = page.getByTestId('regional-balance');
    await bal.waitFor();
    const b = balanceTable(expected.table, { sales, purchases });
    expect(await bal.textContent()).toContain(`Converged after ${b.ras.iterations} iterations`);
    expect((await page.getByTestId('regional-perron').locator('.value').textContent())?.trim()).toBe(ratio(analyzeTable(b.table).viability.perronRoot));
    await page.getByTestId('use-balance').uncheck();
    await expect.poll(() => bal.count()).toBe(0);
    await page.locator('summary', { hasText: 'balance to known county totals (RAS)' }).click();
  });

  it('refuses δ outside [0, 1] and bad employment files with the location, keeping the table in use', async () => {
    await page.getByTestId('delta').fill('1.5');
    const err = page.getByTestId('regional-error');
    await expect.poll(() => err.textContent()).toMatch(/δ must lie between 0 and 1/);
    expect(await page.getByTestId('regional-accept').count()).toBe(0);
    await page.getByTestId('delta').fill('0.3');
    await expect.poll(() => err.count()).toBe(0);

    const bad = (text: string) => ({ name: 'county-jobs.csv', mimeType: 'text/csv', buffer: Buffer.from(text) });
    const lines = EMPLOYMENT_SAMPLE_CSV.split('\r\n').join('\n').trimEnd().split('\n');
    const unknown = [...lines.slice(0, 3), 'Space tourism,12,400', ...lines.slice(3)].join('\n');
    await page.getByTestId('employment-input').setInputFiles(bad(unknown));
    await expect.poll(() => err.textContent()).toMatch(/county-jobs\.csv:4:1.*'Space tourism' is not a sector/);
    expect(await err.textContent()).toMatch(/Nothing changed: the table in use is still Fernhollow County/);
    await err.scrollIntoViewIfNeeded();
    await shot(page, 'regional-05-refused');

    const row = (k: number, f: (c: string[]) => string[]) => lines.map((l, i) => (i === k ? f(l.split(',')).join(',') : l)).join('\n');
    await page.getByTestId('employment-input').setInputFiles(bad(row(2, (c) => [c[0]!, '-5', c[2]!])));
    await expect.poll(() => err.textContent()).toMatch(/county-jobs\.csv:3:2.*must not be negative/);
    await page.getByTestId('employment-input').setInputFiles(bad(row(2, (c) => [c[0]!, String(Number(c[2]) + 1), c[2]!])));
    await expect.poll(() => err.textContent()).toMatch(/county-jobs\.csv:3:2.*exceed national jobs/);
    await page.getByTestId('employment-input').setInputFiles(bad(lines.map((l, i) => (i === 0 ? l : l.replace(/,\d+,/, ',0,'))).join('\n')));
    await expect.poll(() => err.textContent()).toMatch(/county-jobs\.csv.*zero in every sector/);
    expect(await page.getByTestId('table-name').textContent()).toMatch(/Fernhollow County/);

    await page.getByRole('button', { name: 'Use the bundled sample' }).click();
    await expect.poll(() => err.count()).toBe(0);
    await expect.poll(async () => (await page.getByTestId('regional-lambda').locator('.value').textContent())?.trim()).toBe(ratio(expected.lambda!));
  });

  it('exports the estimate as the CSV writeTableCsv writes, with its notes and cautions', async () => {
    const files = await downloadsOf(() => page.getByTestId('regional-export').click(), 2);
    const csv = files.find((f) => f.name.endsWith('.csv'))!;
    const about = files.find((f) => f.name.endsWith('.about.txt'))!;
    // Saved with the UTF-8 byte-order mark, as every CSV the app and the CLI write (the importer skips it).
    expect(csv.text).toBe(`\ufeff${writeTableCsv(expected.table)}`);
    expect(about.text).toMatch(/FLQ with δ = 0\.3/);
    expect(about.text).toMatch(/Cautions/);
  });

  it('"Use this table" makes the estimate the table in use: Overview, Multipliers and Scenarios show the engine\'s numbers', async () => {
    await page.getByTestId('regional-accept').click();
    await expect.poll(() => page.getByTestId('table-name').textContent(), { timeout: 30_000 }).toMatch(/fernhollow-flq-estimate · 16 sectors · million dollars/);
    await page.getByTestId('verdict').waitFor();
    // What the app analyses is the CSV read back; it must be the engine's regional table.
    const used = importTable(writeTableCsv(expected.table), { fileName: 'fernhollow-flq-estimate.csv' });
    const direct = analyzeTable(expected.table).viability;
    const v = analyzeTable(used).viability;
    expect(Math.abs(v.perronRoot - direct.perronRoot)).toBeLessThan(1e-9 * direct.perronRoot);
    const perron = page.getByTestId('perron');
    expect((await perron.locator('.value').textContent())?.trim()).toBe(ratio(direct.perronRoot));
    expect(await perron.textContent()).toContain(`certified between ${ratio(v.perronRootBounds[0], 6)} and ${ratio(v.perronRootBounds[1], 6)}`);
    await shot(page, 'regional-06-overview');

    await page.click('[data-screen="multipliers"]');
    const table = page.getByTestId('multiplier-table');
    await table.waitFor();
    await page.click('button[title="Sort by Output Type I"]');
    const first = Number((await table.locator('tbody tr:not(.pad) td').first().textContent())!.replace(/,/g, ''));
    const best = Math.max(...analyzeTable(used).multipliers.output.typeI.map((x) => x ?? -Infinity));
    expect(first).toBeCloseTo(best, 4);

    await page.click('[data-screen="scenarios"]');
    const starter = { name: 'New food plant', lines: [{ sector: 'Food processing', amount: 1000, kind: 'final-demand' as const, localShare: 1 }] };
    const total = runScenario(prepareModel(used), starter).totals.output.total;
    await expect.poll(() => page.getByTestId('total-effect').textContent(), { timeout: 10_000 }).toBe(money(total));
    await shot(page, 'regional-07-scenario');

    // The table is the plain FLQ estimate at δ = 0.3: the sensitivity offers δ ± 0.1 and varies it (worker test: the study's numbers).
    expect(await page.getByTestId('sens-delta-low').inputValue()).toBe('0.2');
    expect(await page.getByTestId('sens-delta-high').inputValue()).toBe('0.4');
    await page.getByTestId('sens-compute').click();
    await expect.poll(() => page.getByTestId('sens-table').locator('tbody th').allTextContents(), { timeout: 30_000 }).toContain('FLQ δ of the county estimate');
    await page.getByTestId('sens-table').scrollIntoViewIfNeeded();
    await shot(page, 'regional-08-delta-sensitivity');
  });

  it('shows no console errors during the whole flow', () => {
    expect(s.errors).toEqual([]);
  });
});
