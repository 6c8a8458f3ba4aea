/**
 * What a planner types into a scenario, in real Chromium on the sample county: a misspelt sector or a local share of
 * 150 % stops the results from updating and says why (no stale numbers, no silent clipping), a new scenario's blank
 * line asks for its sector instead of claiming there are no lines, lines spread by a spending mix show short amounts,
 * and the sector picker is a combobox that shows whole names and answers the keyboard.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { join } from 'node:path';
import { REPO, shot as photograph, skipBrowser, type Session, openApp } from './harness.ts';

let s: Session;
let page: Page;

function poll<T>(fn: () => T | Promise<T>) {
  return expect.poll(fn, { interval: 100, timeout: 30_000 });
}
async function shot(name: string): Promise<void> {
  expect(await page.locator('body').innerText(), name).not.toMatch(/\bNaN\b|Infinity|∞/);
  await photograph(page, name);
}
const total = () => page.getByTestId('total-effect');

describe.skipIf(skipBrowser)('scenario input', () => {
  beforeAll(async () => {
    s = await openApp();
    page = s.page;
    await page.click('[data-screen="scenarios"]');
  });
  afterAll(async () => { await s?.close(); });

  it('asks for the sector of a new scenario\'s blank line', async () => {
    await page.getByTestId('new-scenario').click();
    await poll(() => page.getByTestId('scenario-waiting').textContent()).toMatch(/Choose the sector of the line above/);
    expect(await page.locator('body').innerText()).not.toMatch(/has no lines/);
  });

  it('finds sectors as the planner types and shows whole names', async () => {
    const picker = page.getByRole('combobox', { name: 'Sector of line 1' });
    await picker.fill('serv');
    const list = page.getByRole('listbox', { name: 'Matching sectors' });
    await poll(() => list.getByRole('option').allTextContents()).toEqual(['Professional services', 'Accommodation and food service']);
    // Whole names: the list is not clipped by the table around the field.
    const box = await list.getByRole('option').last().evaluate((el) => ({ s: el.scrollWidth, c: el.clientWidth }));
    expect(box.s).toBeLessThanOrEqual(box.c);
    await shot('scenario-picker-open');
    await picker.press('ArrowDown');
    await picker.press('ArrowDown');
    expect(await picker.getAttribute('aria-activedescendant')).toMatch(/-opt-1$/);
    await picker.press('Enter');
    await poll(() => picker.inputValue()).toBe('Accommodation and food service');
    await page.locator('[data-line-amount="0"]').fill('1000');
    await page.locator('[data-line-amount="0"]').press('Tab');
    // Results of 1,000 (not of the blank line's 0) before the next test takes them as its reference.
    await poll(() => total().textContent()).toMatch(/^[1-9][\d,]*\.\d$/);
  });

  it('holds results back while a sector is misspelt, and says which line', async () => {
    const before = await total().textContent();
    const picker = page.getByRole('combobox', { name: 'Sector of line 1' });
    await picker.fill('Transprot');
    await picker.press('Tab');
    await poll(() => page.getByTestId('scenario-error').textContent()).toMatch(/Transprot/);
    expect(await total().count()).toBe(0);
    expect(await picker.getAttribute('aria-invalid')).toBe('true');
    await shot('scenario-misspelt-sector');
    await picker.fill('Accommodation and food service');
    await picker.press('Tab');
    await poll(() => total().textContent()).toBe(before);
  });

  it('refuses a local share of 150 % instead of clipping it', async () => {
    const share = page.getByLabel('Local share of line 1, percent');
    await share.fill('150');
    await share.press('Tab');
    await poll(() => page.getByTestId('scenario-problems').textContent()).toMatch(/line 1: the local share must be a percentage from 0 to 100 \(it reads 150 %\)/);
    expect(await total().count()).toBe(0);
    // The field keeps what was typed, marked, rather than a silently clipped 100.
    expect(await share.inputValue()).toBe('150');
    expect(await share.getAttribute('aria-invalid')).toBe('true');
    await shot('scenario-share-150');
    await share.fill('60');
    await share.press('Tab');
    await poll(() => total().count()).toBe(1);
    expect(await page.getByTestId('scenario-problems').count()).toBe(0);
  });

  it('shows lines spread by a spending mix with short amounts', async () => {
    // The scenario editor's own "Spread an amount by a spending mix" (the study inputs have details of their own).
    const spread = page.getByTestId('scenario-editor').locator('details:has(select)');
    await spread.locator('summary').click();
    const mix = spread.locator('select').first();
    await mix.selectOption({ index: 1 });
    await spread.locator('input[type="number"]').first().fill('1000');
    await spread.locator('button').click();
    await poll(() => page.locator('[data-line-amount]').count()).toBeGreaterThan(2);
    const amounts = await page.locator('[data-line-amount]').evaluateAll((els) => els.map((e) => (e as HTMLInputElement).value));
    // At most two decimals on screen (the field's title keeps every digit).
    expect(amounts.every((a) => /^-?\d+(\.\d{1,2})?$/.test(a))).toBe(true);
    await shot('scenario-spread-lines');
  });

  it('offers to map or drop the sectors of scenarios kept from the previous table', async () => {
    // A household-income line (no sector: never flagged) and an activity line whose activity buys from Farming.
    await page.getByTestId('study-input-activity-file').setInputFiles({
      name: 'station.csv', mimeType: 'text/csv', buffer: Buffer.from('activity,item,sector,amount\nResearch station,output,,500\nResearch station,purchase,Farming,100\n'),
    });
    await poll(() => page.getByTestId('study-input-activity').textContent()).toMatch(/Research station/);
    const rows = page.getByTestId('scenario-lines').locator('tbody tr');
    await page.getByTestId('add-line').click();
    const income = await rows.count();
    await page.getByLabel(`Kind of line ${income}`).selectOption('labour-income');
    await page.getByTestId('add-line').click();
    const activity = await rows.count();
    await page.getByLabel(`Kind of line ${activity}`).selectOption('activity');
    await page.getByLabel(`Activity of line ${activity}`).selectOption('Research station');
    await page.click('[data-screen="import"]');
    await page.getByTestId('file-input').setInputFiles(join(REPO, 'test', 'fixtures', 'e2e', 'ridgeline-test.csv'));
    await page.getByTestId('accept-import').click();
    await poll(() => page.getByTestId('table-name').textContent()).toMatch(/ridgeline-test/);
    await page.click('[data-screen="scenarios"]');
    const panel = page.getByTestId('stale-sectors');
    await panel.waitFor();
    expect(await panel.textContent()).toMatch(/Farming/);
    expect(await page.getByTestId('stale-inputs').textContent()).toMatch(/activity “Research station” \(1 line\) buys from ‘Farming’/);
    await shot('scenario-stale-sectors');
    // Lines refused for their sector still fit the screen (the note under the sector wraps).
    await page.getByTestId('scenario-lines').scrollIntoViewIfNeeded();
    expect(await page.locator('.lines-wrap').evaluate((el) => el.scrollWidth <= el.clientWidth + 1)).toBe(true);
    await shot('scenario-stale-lines');
    const k = (await panel.locator('tbody th').allTextContents()).indexOf('Farming');
    const picker = page.getByRole('combobox', { name: 'Sector of this table for Farming' });
    await picker.fill('Orch');
    await picker.press('Enter');
    await page.getByTestId('apply-mapping').click();
    await poll(() => panel.locator('tbody th').allTextContents()).not.toContain('Farming');
    expect(k).toBeGreaterThanOrEqual(0);
    const sectors = await page.getByRole('combobox', { name: /^Sector of line/ }).evaluateAll((els) => els.map((e) => (e as HTMLInputElement).value));
    expect(sectors).toContain('Orchards');
    expect(sectors).not.toContain('Farming');
    // The activity's purchases come from its file: listed until its lines are dropped, not mapped here.
    expect(await page.getByTestId('stale-inputs').count()).toBe(1);
    await page.getByTestId('drop-stale').click();
    await poll(() => panel.count()).toBe(0);
    const kinds = await page.getByRole('combobox', { name: /^Kind of line/ }).evaluateAll((els) => els.map((e) => (e as HTMLSelectElement).value));
    expect(kinds).toContain('labour-income');
    expect(kinds).not.toContain('activity');
    await poll(() => page.getByRole('combobox', { name: /^Sector of line/ }).count()).toBe(1);
    // Undo brings the dropped lines back, as any scenario edit.
    await page.keyboard.press('Control+z');
    await poll(() => panel.count()).toBe(1);
  });

  it('shows no console errors', () => {
    expect(s.errors).toEqual([]);
  });
});
