/**
 * Screens as a planner reads them, in real Chromium: the Multipliers table shows every row of a 16-sector table
 * without scrolling, keeps the Sector heading over its pinned column when scrolled sideways, and shows jobs per
 * million dollars (or per the table's unit) with the unit named; Structure above 400 sectors says plainly why there
 * is no eigenvalue chart and what stands in for it; a large table's rows are drawn a paint after its heading (two short
 * main-thread tasks, not one long one) and filtered; importing another table ends the opened project's name.
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
    // The filter keeps the rows whose sector name holds the text typed (the rows follow the key a frame later).
    const sectors = importTable(SAMPLE_CSV, { fileName: SAMPLE_FILE_NAME }).sectors;
    const want = sectors.filter((name) => name.toLowerCase().includes('ing'));
    expect(want.length).toBeGreaterThan(1);
    expect(want.length).toBeLessThan(16);
    const filter = table.locator('input[type="search"]');
    await filter.pressSequentially('ing');
    await poll(() => table.locator('tbody tr:not(.pad) th').allTextContents()).toEqual(want);
    expect(await table.textContent()).toContain(`${want.length} of 16 rows`);
    await filter.fill('');
    await poll(() => table.locator('tbody tr:not(.pad)').count()).toBe(16);
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

  it('draws a chart given new results as a new chart of those results draws it, pixel for pixel', async () => {
    // The chart on screen takes new results in place (ChartPanel); a chart made afresh (the screen left and opened
    // again) is the reference. The closure switch changes every multiplier chart's numbers.
    await go('multipliers');
    const chart = page.locator('.chart-box canvas').first();
    const pixels = () => chart.evaluate((c) => (c as HTMLCanvasElement).toDataURL());
    await chart.waitFor();
    await poll(pixels).not.toMatch(/^data:,$/);
    const before = await pixels();
    const closure = page.getByRole('checkbox', { name: /Households closed/ });
    await closure.click();
    await poll(pixels).not.toBe(before);
    await page.waitForTimeout(300); // no later redraw
    const updated = await pixels();
    await go('overview');
    await go('multipliers');
    await poll(pixels).toBe(updated);
    await closure.click();
    await poll(pixels).toBe(before);
  });

  it('fits a scenario\'s lines at 1280×800, Remove included; with the extra line options Remove stays pinned in view', async () => {
    await go('scenarios');
    await page.getByTestId('add-line').click();
    const wrap = page.locator('.lines-wrap');
    await wrap.waitFor();
    const fits = () => wrap.evaluate((el) => el.scrollWidth <= el.clientWidth + 1);
    expect(await fits()).toBe(true);
    await shot('scenario-lines-fit');
    await page.getByTestId('more-line-options').check();
    const [box, remove] = await Promise.all([wrap.boundingBox(), page.getByRole('button', { name: 'Remove line 1' }).boundingBox()]);
    expect(remove!.x + remove!.width).toBeLessThanOrEqual(box!.x + box!.width + 1);
    expect(remove!.x).toBeGreaterThanOrEqual(box!.x);
    await shot('scenario-lines-more-options');
    await page.getByTestId('more-line-options').uncheck();
    await page.getByRole('button', { name: 'Remove line 2' }).click();
  });

  it('shows the table with final demand, value added, totals and jobs around the flows, and the inverse with its column sums', async () => {
    const table = importTable(SAMPLE_CSV, { fileName: SAMPLE_FILE_NAME });
    const ref = analyzeTable(table);
    await go('table');
    const matrix = page.locator('.matrix');
    await matrix.locator('.m-cell').first().waitFor();
    const num = (t: string | null) => Number((t ?? '').replace(/,/g, ''));
    /** Cells of the row labelled `label` now rendered, as [column index, number]. */
    const rowCells = async (label: string) => {
      const row = matrix.locator('.m-row').filter({ has: page.locator('.m-label', { hasText: label }) });
      const cells = await row.locator('.m-cell').evaluateAll((els) => els.map((e) => [Number(e.getAttribute('aria-colindex')) - 2, e.textContent ?? ''] as const));
      return cells.filter(([, t]) => t !== '').map(([c, t]) => [c, num(t)] as const);
    };
    // Right end: the final-demand columns and total output; first row is the first sector.
    await matrix.evaluate((el) => { el.scrollLeft = el.scrollWidth; });
    await poll(() => matrix.locator('.m-head').last().textContent()).toMatch(/Total output/);
    const heads = await matrix.locator('.m-head').allTextContents();
    for (const f of [...table.householdConsumption, ...table.otherFinalDemand]) expect(heads.join('|')).toContain(f.label);
    const firstRow = matrix.locator('.m-row').nth(1).locator('.m-cell').last();
    expect(num(await firstRow.textContent())).toBeCloseTo(table.x[0]!, 1);
    await shot('table-flows-final-demand');
    // Bottom left: value added, imports, total output and jobs below the sector columns.
    await matrix.evaluate((el) => { el.scrollLeft = 0; el.scrollTop = el.scrollHeight; });
    await poll(() => matrix.locator('.m-label', { hasText: 'Jobs' }).count()).toBe(1);
    for (const [j, v] of await rowCells('Total output')) expect(v, `total output of column ${j}`).toBeCloseTo(table.x[j]!, 1);
    for (const [j, v] of await rowCells('Jobs')) expect(v, `jobs of column ${j}`).toBeCloseTo(table.employment![j]!, 1);
    for (const r of [...table.labourIncome, ...table.otherValueAdded, ...table.imports]) expect(await matrix.locator('.m-label', { hasText: r.label }).count(), r.label).toBe(1);
    await shot('table-flows-value-added');
    // The Leontief inverse's column sums are the engine's Type I output multipliers.
    await page.click('[data-matrix="L"]');
    await poll(() => page.locator('[data-matrix="L"]').getAttribute('aria-pressed')).toBe('true');
    await matrix.evaluate((el) => { el.scrollLeft = 0; el.scrollTop = el.scrollHeight; });
    await poll(() => matrix.locator('.m-label', { hasText: 'Column sum (Type I output multiplier)' }).count()).toBe(1);
    const sums = await rowCells('Column sum (Type I output multiplier)');
    expect(sums.length).toBeGreaterThan(4);
    for (const [j, v] of sums) expect(v, `column sum ${j}`).toBeCloseTo(ref.multipliers.output.typeI[j]!, 4);
    await shot('table-leontief-column-sums');
    await page.click('[data-matrix="Z"]');
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
    // What the Perron root says: the long-run ratio of successive rounds, not how the first rounds shrink (power method:
    // Golub & Van Loan 2013, §7.3, recalled from memory).
    expect(await note.textContent()).toMatch(/In the long run each round of\s+spending is about that share of the round before.*first\s+rounds can shrink faster or slower/s);
    expect(await page.locator('text=unit circle |λ| = 1').count()).toBe(0);
    expect(await page.locator('body').innerText()).not.toMatch(/full spectrum skipped/);
    await shot('structure-450-sectors');
  });

  it('draws a large table\'s heading first and its rows a paint later, then every row the filter finds', async () => {
    // Needs the 450-sector table of the test above. At the end of the task that mounts the Multipliers screen (seen by
    // a MutationObserver, whose callback runs before the next task) the table has its heading and no rows.
    await page.evaluate(() => {
      const w = window as unknown as { __rowsAtMount?: number };
      const mo = new MutationObserver(() => {
        const t = document.querySelector('[data-testid="multiplier-table"]');
        if (!t) return;
        w.__rowsAtMount = t.querySelectorAll('tbody tr:not(.pad)').length;
        mo.disconnect();
      });
      mo.observe(document.body, { childList: true, subtree: true });
    });
    await go('multipliers');
    const table = page.getByTestId('multiplier-table');
    await poll(() => table.locator('tbody tr:not(.pad)').count()).toBeGreaterThan(10);
    expect(await page.evaluate(() => (window as unknown as { __rowsAtMount?: number }).__rowsAtMount)).toBe(0);
    expect(await table.locator('thead th').first().textContent()).toMatch(/Sector/);
    await table.getByRole('searchbox').fill('Sector 449');
    await poll(() => table.locator('tbody th').allTextContents()).toEqual(['Sector 449']);
  });

  it('shows no console errors', () => {
    expect(s.errors).toEqual([]);
  });
});
