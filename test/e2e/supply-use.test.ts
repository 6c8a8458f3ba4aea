/**
 * "Start from supply and use tables" in real Chromium against the built renderer: the bundled (invented) pair is
 * derived with the default fixed product sales structure and the numbers on screen are compared with src/sut called
 * here in the test process; the product technology's negatives are listed and block use until the zero-and-RAS
 * remedy is chosen; a pair whose products disagree is refused with the worst product while the table in use stays;
 * the derived table becomes the larger table of a county estimate, then the table in use. No console error may appear;
 * every step is photographed at 1280×800 (test-output/screenshots/supply-use-*.png).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { money, openApp, rowCell, shot, skipBrowser, type Session } from './harness.ts';
import { deriveSymmetric, readSupplyUse, SUPPLY_SAMPLE_CSV, SUPPLY_SAMPLE_FILE_NAME, USE_SAMPLE_CSV, USE_SAMPLE_FILE_NAME } from '../../src/sut/index.ts';
import { prepareStudy, studyOfTable } from '../../src/study/index.ts';

let s: Session;
let page: Page;

const pair = readSupplyUse({ text: SUPPLY_SAMPLE_CSV, fileName: SUPPLY_SAMPLE_FILE_NAME }, { text: USE_SAMPLE_CSV, fileName: USE_SAMPLE_FILE_NAME });
const modelD = deriveSymmetric(pair, { assumption: 'product-sales' });
const modelA = deriveSymmetric(pair, { assumption: 'product' });


const cell = (sector: string, col: number) => rowCell(page, 'sut-rows', sector, col);

describe.skipIf(skipBrowser)('Start from supply and use tables, in the browser', () => {
  beforeAll(async () => {
    s = await openApp();
    page = s.page;
  });
  afterAll(async () => {
    await s?.close();
  });

  it('opens from the Import screen with the bundled pair and shows the fixed product sales structure\'s table as the engine computes it', async () => {
    await page.click('[data-screen="import"]');
    await page.getByTestId('start-sut').click();
    await page.getByRole('heading', { name: 'Start from supply and use tables' }).waitFor();
    expect(await page.getByTestId('supply-name').textContent()).toContain(SUPPLY_SAMPLE_FILE_NAME);
    expect(await page.getByTestId('use-name').textContent()).toContain(USE_SAMPLE_FILE_NAME);
    await page.getByTestId('sut-rows').waitFor({ timeout: 30_000 });
    const t = modelD.table;
    const fd = (j: number) => [...t.householdConsumption, ...t.otherFinalDemand].reduce((a, c) => a + c.values[j]!, 0);
    for (const j of [0, 8, 15]) {
      expect(await cell(t.sectors[j]!, 1)).toBe(money(t.x[j]!));
      expect(await cell(t.sectors[j]!, 5)).toBe(money(fd(j)));
    }
    expect(await page.getByTestId('sut-negatives').textContent()).toMatch(/Negative flows\s*0\s*none/);
    // The Perron root's card words the verdict as the study does (one wording for every screen and file).
    expect(await page.getByTestId('sut-perron').locator('.sub').textContent()).toBe(prepareStudy(studyOfTable(t), { spectrum: false }).verdict.say);
    expect(await page.getByTestId('sut-notes').textContent()).toMatch(/Manual of Supply, Use and Input-Output Tables, 2008/);
    expect(await page.getByTestId('sut-accept').isEnabled()).toBe(true);
    await shot(page, 'supply-use-default');
  });

  it('lists the product technology\'s negatives, blocks their use, and the zero-and-RAS remedy clears them', async () => {
    await page.click('[data-by="product"]');
    await page.click('[data-assumption="product"]');
    await expect.poll(async () => (await page.getByTestId('sut-negatives').textContent()) ?? '', { timeout: 30_000 }).toContain(String(modelA.negatives.flows));
    const worst = modelA.negatives.largest[0]!;
    expect(await page.getByTestId('sut-negatives-list').textContent()).toContain(`from ${worst.row} to ${worst.column}`);
    expect(await page.getByTestId('sut-accept').isDisabled()).toBe(true);
    await shot(page, 'supply-use-negatives');
    await page.getByTestId('negatives').selectOption('zero-ras');
    await expect.poll(async () => page.getByTestId('sut-accept').isEnabled(), { timeout: 30_000 }).toBe(true);
    expect(await page.getByTestId('sut-negatives').textContent()).toMatch(/rebalanced/);
  });

  it('refuses a use table whose products disagree with supply, naming the worst product, and keeps the table in use', async () => {
    const bad = USE_SAMPLE_CSV.replace(/^Farming,(\d+)/m, (_, v: string) => `Farming,${Number(v) + 50000}`);
    await page.getByTestId('use-input').setInputFiles({ name: 'bad-use.csv', mimeType: 'text/csv', buffer: Buffer.from(bad) });
    const err = page.getByTestId('sut-error');
    await err.waitFor({ timeout: 30_000 });
    expect(await err.textContent()).toMatch(/bad-use\.csv \(row 'Farming'\): supply and use disagree .*'Farming' \+/);
    expect(await err.textContent()).toMatch(/Nothing changed: the table in use is still/);
    await shot(page, 'supply-use-refused');
    // Farming's gap is about 22 %: a 25 % tolerance accepts the pair.
    await page.getByTestId('sut-tolerance').fill('25');
    await page.getByTestId('sut-rows').waitFor({ timeout: 30_000 });
    expect(await page.getByTestId('sut-error').count()).toBe(0);
    await page.getByTestId('sut-tolerance').fill('0.1');
    await page.getByRole('button', { name: 'Use the bundled sample' }).click();
    await page.getByTestId('sut-rows').waitFor({ timeout: 30_000 });
  });

  it('hands the derived table to the county estimate, and then uses it as the table', async () => {
    await page.click('[data-by="industry"]');
    // Wait for the industry-by-industry table itself, not the previous view's buttons.
    await expect.poll(async () => (await page.getByTestId('sut-rows').locator('thead th').first().textContent())?.trim(), { timeout: 30_000 }).toBe('Industry');
    await expect.poll(async () => page.getByTestId('sut-larger').isEnabled(), { timeout: 30_000 }).toBe(true);
    await page.getByTestId('sut-larger').click();
    await page.getByRole('heading', { name: 'Start from a larger table' }).waitFor();
    expect(await page.getByTestId('national-name').textContent()).toContain('symmetric-table.csv');
    await page.getByTestId('regional-sectors').waitFor({ timeout: 30_000 });
    // County jobs by the invented codes through the bundled bridge: the estimate of the derived table still comes out.
    await page.locator('details.optional summary').click();
    await page.getByTestId('use-bridge').check();
    await expect.poll(async () => page.getByTestId('employment-name').textContent(), { timeout: 30_000 }).toContain('fernhollow-employment-by-code.csv');
    expect(await page.getByTestId('bridge-name').textContent()).toContain('fernhollow-bridge.csv');
    await expect.poll(async () => page.getByTestId('regional-notes').textContent(), { timeout: 30_000 }).toMatch(/through the bridge fernhollow-bridge\.csv/);
    expect(await page.getByTestId('regional-error').count()).toBe(0);
    await shot(page, 'supply-use-county-by-code');
    await page.getByTestId('use-bridge').uncheck();
    await page.click('[data-screen="supply-use"]');
    await page.getByTestId('sut-accept').click();
    await page.getByTestId('verdict').waitFor({ timeout: 30_000 });
    expect(await page.locator('body').textContent()).toContain('symmetric-table.csv');
    await shot(page, 'supply-use-accepted');
  });

  it('shows no console errors during the whole flow', () => {
    expect(s.errors).toEqual([]);
  });
});
