/**
 * Screens as a planner reads them, in real Chromium: the Multipliers table shows every row of a 16-sector table
 * without scrolling, keeps the Sector heading over its pinned column when scrolled sideways, and shows jobs per
 * million dollars (or per the table's unit) with the unit named; Structure above 400 sectors says plainly why there
 * is no eigenvalue chart and what stands in for it; importing another table ends the opened project's name.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { REPO, shot as photograph, skipBrowser, type Session, openApp, goTo } from './harness.ts';
import { sparseTableCsv } from '../support/random-tables.ts';
import { SAMPLE_CSV, SAMPLE_FILE_NAME, importTable } from '../../src/table/index.ts';
import { analyzeTable } from '../../src/model/index.ts';

let s: Session;
let page: Page;

function poll<T>(fn: () => T | Promise<T>, timeout = 30_000) {
  return expect.poll(fn, { interval: 100, timeout });
}
async function shot(name: string): Promise<void> {
  expect(await page.locator('body').innerText(), name).not.toMatch(/\bNaN\b|Infinity|∞/);
  await photograph(page, name);
}
function go(screen: string): Promise<void> {
  return goTo(page, screen);
}

describe.skipIf(skipBrowser)('screens', () => {
  beforeAll(async () => {
    s = await openApp();
    page = s.page;
  });
  afterAll(async () => { await s?.close(); });

  it('shows all 16 multiplier rows at once, with the Sector heading pinned over its column', async () => {
    await go('multipliers');
    const table = page.getByTestId('multiplier-table');
    await table.waitFor();
    const scroller = table.locator('.table-scroll');
    expect(await table.locator('tbody tr:not(.pad)').count()).toBe(16);
    const fits = await scroller.evaluate((el) => el.scrollHeight <= el.clientHeight + 1);
    expect(fits).toBe(true);
    await scroller.evaluate((el) => { el.scrollLeft = el.scrollWidth; });
    await page.waitForTimeout(100);
    const [head, body, box] = await Promise.all([
      table.locator('thead th').first().boundingBox(), table.locator('tbody tr:not(.pad) th').first().boundingBox(), scroller.boundingBox(),
    ]);
    expect(Math.abs(head!.x - box!.x)).toBeLessThan(3);
    expect(Math.abs(head!.x - body!.x)).toBeLessThan(1);
    await shot('multipliers-scrolled-sideways');
    await scroller.evaluate((el) => { el.scrollLeft = 0; });
  });

  it('shows jobs per million dollars by default, per thousand on request, and names the unit', async () => {
    const ref = analyzeTable(importTable(SAMPLE_CSV, { fileName: SAMPLE_FILE_NAME }));
    const table = page.getByTestId('multiplier-table');
    const sectors = ref.sectors;
    const farming = sectors.indexOf('Farming');
    const jobsCol = async () => {
      const heads = await table.locator('thead th').allTextContents();
      const k = heads.findIndex((h) => /Employment simple/.test(h));
      const row = table.locator('tbody tr:not(.pad)').filter({ has: page.locator('th', { hasText: /^Farming$/ }) });
      return { head: heads[k]!, value: Number((await row.locator('th, td').nth(k).textContent())!.replace(/,/g, '')) };
    };
    await page.getByTestId('closure').uncheck();
    const perMillion = await jobsCol();
    expect(perMillion.head).toMatch(/jobs per million dollars of final demand/);
    // The engine's value is per thousand dollars (the table's unit); four significant digits on screen.
    expect(perMillion.value).toBeCloseTo(ref.multipliers.employment.simple[farming]! * 1000, 1);
    await page.getByTestId('jobs-unit').selectOption('thousand dollars');
    const perThousand = await jobsCol();
    expect(perThousand.head).toMatch(/jobs per thousand dollars of final demand/);
    expect(perThousand.value).toBeCloseTo(ref.multipliers.employment.simple[farming]!, 4);
    await page.getByTestId('jobs-unit').selectOption('million dollars');
    await page.getByTestId('closure').check();
    await shot('multipliers-jobs-per-million');
  });

  it('says plainly why a table above 400 sectors has no eigenvalue chart, and shows the Perron root bounds instead', async () => {
    const file = join(REPO, 'test-output', 'e2e-450-sectors.csv');
    writeFileSync(file, sparseTableCsv(450));
    await go('import');
    await page.getByTestId('file-input').setInputFiles(file);
    await page.getByTestId('accept-import').click();
    await poll(() => page.getByTestId('table-name').textContent(), 90_000).toMatch(/450 sectors/);
    await go('structure');
    const note = page.getByTestId('spectrum-skipped');
    await note.waitFor();
    expect(await note.textContent()).toMatch(/not drawn for 450 sectors.*Perron root: [\d.]+,\s+certified between [\d.]+ and [\d.]+/s);
    expect(await page.locator('text=unit circle |λ| = 1').count()).toBe(0);
    expect(await page.locator('body').innerText()).not.toMatch(/full spectrum skipped/);
    await shot('structure-450-sectors');
  });

  it('shows no console errors', () => {
    expect(s.errors).toEqual([]);
  });
});
