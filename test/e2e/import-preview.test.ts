/**
 * The import preview in real Chromium: the grid shows each cell exactly as the file was split (decimal commas stay
 * inside their cell, values under their own headings, a bad cell under the column the message names), the balance
 * report says which side (sales or inputs) is off, and labels read with the same role are said to be added together.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { shot as photograph, skipBrowser, type Session, openApp } from './harness.ts';

let s: Session;
let page: Page;

function poll<T>(fn: () => T | Promise<T>) {
  return expect.poll(fn, { interval: 100, timeout: 30_000 });
}
async function shot(name: string): Promise<void> {
  expect(await page.locator('body').innerText(), name).not.toMatch(/\bNaN\b|Infinity|∞/);
  await photograph(page, name);
}

/** A five-sector table written the continental way: semicolons between cells, decimal commas inside them. */
const SEMICOLON = [
  'thousand dollars;Farming;Mill;Trade;Transport;Care;Households;Exports;Total output',
  'Farming;100,25;450,50;5,00;10,00;5,00;150,00;1279,25;2000,00',
  'Mill;20,00;140,00;10,00;90,00;60,00;980,00;1700,00;3000,00',
  'Trade;15,00;30,00;220,00;40,00;25,00;120,00;1550,00;2000,00',
  'Transport;90,00;260,00;150,00;210,00;300,00;1990,00;1000,00;4000,00',
  'Care;30,00;90,00;60,00;200,00;280,00;2760,00;580,00;4000,00',
  'Compensation of employees;600,00;820,00;700,00;1600,00;2200,00;;;',
  'Other value added;739,75;589,50;480,00;1150,00;640,00;;;',
  'Imports;405,00;620,00;375,00;700,00;490,00;;;',
].join('\n');

async function preview(name: string, text: string): Promise<void> {
  await page.click('[data-screen="import"]');
  await page.getByTestId('file-input').setInputFiles({ name, mimeType: 'text/csv', buffer: Buffer.from(text, 'utf8') });
  await page.getByTestId('as-read').waitFor();
}

/** The as-read grid as text cells, row by row. */
async function grid(): Promise<string[][]> {
  return page.getByTestId('as-read').locator('tr').evaluateAll((rows) => rows.map((r) => [...r.children].map((c) => (c.textContent ?? '').trim())));
}

describe.skipIf(skipBrowser)('import preview', () => {
  beforeAll(async () => {
    s = await openApp();
    page = s.page;
  });
  afterAll(async () => { await s?.close(); });

  it('shows a semicolon file with decimal commas cell by cell, under the right headings', async () => {
    await preview('continental.csv', SEMICOLON);
    const g = await grid();
    expect(g[0]!.slice(0, 4)).toEqual(['thousand dollars', 'Farming', 'Mill', 'Trade']);
    // "100,25" is one cell under 'Farming', not "100" and "25" in two columns.
    expect(g[1]!.slice(0, 4)).toEqual(['Farming', '100,25', '450,50', '5,00']);
    expect(g.every((r) => r.length === g[0]!.length)).toBe(true);
    expect(await page.getByTestId('dialect').textContent()).toMatch(/semicolon/i);
    expect(await page.getByTestId('dialect').textContent()).toMatch(/comma/i);
    await shot('import-semicolon-preview');
  });

  it('shows a bad cell under the column its message names', async () => {
    await preview('bad-cell.csv', SEMICOLON.replace('Transport;90,00;260,00', 'Transport;90,00;18O'));
    const msg = (await page.getByTestId('import-error').textContent()) ?? '';
    expect(msg).toContain('18O');
    const g = await grid();
    const row = g.findIndex((r) => r.includes('18O'));
    expect(row).toBeGreaterThan(0);
    const col = g[row]!.indexOf('18O');
    // The message names the column the grid shows the cell under.
    expect(msg).toContain(`'${g[0]![col]}'`);
    expect(g[0]![col]).toBe('Mill');
    await shot('import-bad-cell');
  });

  it('says which side does not balance when a role is ignored', async () => {
    await preview('continental.csv', SEMICOLON);
    await page.getByTestId('balance-summary').waitFor();
    expect(await page.getByTestId('balance-summary').textContent()).toMatch(/add up to its output/);
    // Ignoring the export column leaves every sector's sales short of its output: the sales side is off.
    await page.selectOption('[data-column-role="Exports"]', 'ignore');
    await poll(() => page.getByTestId('balance-summary').textContent()).toMatch(/do not balance/);
    const sides = await page.getByTestId('balance').locator('tbody td:nth-child(2)').allTextContents();
    expect(sides.length).toBeGreaterThan(0);
    expect(sides.every((t) => /Sales/.test(t))).toBe(true);
    await shot('import-balance-sales');
    await page.selectOption('[data-column-role="Exports"]', 'otherFinalDemand');
    // Ignoring a value-added row leaves the inputs (column sums) short instead.
    await page.selectOption('[data-row-role="Other value added"]', 'ignore');
    await poll(async () => (await page.getByTestId('balance').locator('tbody td:nth-child(2)').allTextContents()).join('|')).toMatch(/^Inputs/);
  });

  it('says how two labour-income rows combine', async () => {
    await preview('continental.csv', SEMICOLON);
    expect(await page.getByTestId('combined').count()).toBe(0);
    await page.selectOption('[data-row-role="Other value added"]', 'labourIncome');
    await poll(() => page.getByTestId('combined').textContent()).toMatch(/2 rows .*'Compensation of employees'.*'Other value added'.*added together/);
    await page.getByRole('button', { name: 'Discard' }).click();
  });

  it('shows no console errors', () => {
    expect(s.errors).toEqual([]);
  });
});
