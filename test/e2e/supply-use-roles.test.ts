/**
 * The roles of a supply and use pair in real Chromium: a supply table with a column that is neither an industry of
 * the use table nor named by its words is refused, the roles panel shows that label without a role, and giving it
 * one on screen derives the table src/sut derives with the same role map (the CLI's --map); a role map file does the
 * same. Screenshots: test-output/screenshots/supply-use-roles-*.png.
 * A refused role map file is said in the roles panel, apart from the pair's refusal.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { createHash } from 'node:crypto';
import { goTo, money, openApp, type Session, shot, skipBrowser } from './harness.ts';
import { deriveSymmetric, readSupplyUse, SUPPLY_SAMPLE_CSV, USE_SAMPLE_CSV, USE_SAMPLE_FILE_NAME } from '../../src/sut/index.ts';

let s: Session;
let page: Page;

// The invented sample supply table with a column of zeros the use table lacks, whose words name no role.
const lines = SUPPLY_SAMPLE_CSV.trimEnd().split('\n');
const ODD = `${lines.map((l, k) => `${l},${k === 0 ? 'Statistical discrepancy' : '0'}`).join('\n')}\n`;
const csv = (name: string, text: string, mimeType = 'text/csv') => ({ name, mimeType, buffer: Buffer.from(text, 'utf8') });
const poll = <T>(fn: () => T | Promise<T>) => expect.poll(fn, { interval: 100, timeout: 30_000 });
/** A cell of the first row of the derived table, or the refusal shown instead (so a failure says why). */
async function firstRowCell(col: number): Promise<string> {
  const err = page.getByTestId('sut-error');
  if (await err.count()) return `refused: ${await err.textContent()}`;
  const td = page.getByTestId('sut-rows').locator('tbody tr').first().locator('td').nth(col);
  return ((await td.textContent({ timeout: 2_000 }).catch(() => '')) ?? '').trim();
}

describe.skipIf(skipBrowser)('roles of a supply and use pair, in the browser', () => {
  beforeAll(async () => {
    s = await openApp();
    page = s.page;
    await goTo(page, 'supply-use');
    await page.getByTestId('sut-rows').waitFor({ timeout: 30_000 });
  });
  afterAll(async () => { await s?.close(); });

  it('shows the label without a role while the pair is refused, and derives the table once it has one', async () => {
    await page.getByTestId('supply-input').setInputFiles(csv('supply-odd.csv', ODD));
    await poll(() => page.getByTestId('sut-error').textContent()).toMatch(/supply-odd\.csv:1:18 \(column 'Statistical discrepancy'\): supply column 'Statistical discrepancy' matches no column of the use table/);
    await poll(() => page.getByTestId('sut-roles-missing').textContent()).toBe('1 label without a role');
    expect(await page.getByTestId('sut-roles').getAttribute('open')).not.toBeNull();
    await shot(page, 'supply-use-roles-missing');
    await page.selectOption('[data-role-supply="Statistical discrepancy"]', 'ignore');
    await page.getByTestId('sut-rows').waitFor();
    const want = deriveSymmetric(readSupplyUse({ text: ODD, fileName: 'supply-odd.csv' }, { text: USE_SAMPLE_CSV, fileName: USE_SAMPLE_FILE_NAME }, { map: { supply: { 'Statistical discrepancy': 'ignore' } } }), { assumption: 'product-sales' }).table;
    await poll(() => firstRowCell(0)).toBe(money(want.x[0]!));
    expect(await page.getByTestId('sut-roles').locator('summary').textContent()).toMatch(/1 role set by you/);
    expect(await page.getByTestId('sut-accept').isEnabled()).toBe(true);
    // Both files of the pair with their SHA-256 (Node's crypto here), as the sidecars and the project file keep them.
    const sources = (await page.getByTestId('sut-sources').textContent()) ?? '';
    expect(sources).toContain(`Supply table: supply-odd.csv, SHA-256 ${createHash('sha256').update(ODD).digest('hex')}`);
    expect(sources).toContain(`Use table: ${USE_SAMPLE_FILE_NAME}, SHA-256 ${createHash('sha256').update(USE_SAMPLE_CSV).digest('hex')}`);
    await page.getByTestId('sut-roles').scrollIntoViewIfNeeded();
    await shot(page, 'supply-use-roles-set');
  });

  it('changes a use-table row\'s role on screen, and reads a role map file', async () => {
    await page.selectOption('[data-role-row="Other value added"]', 'taxes');
    const want = deriveSymmetric(readSupplyUse({ text: ODD, fileName: 'supply-odd.csv' }, { text: USE_SAMPLE_CSV, fileName: USE_SAMPLE_FILE_NAME }, { map: { supply: { 'Statistical discrepancy': 'ignore' }, rows: { 'Other value added': 'taxes' } } }), { assumption: 'product-sales' }).table;
    // Value added (column 3 of the by-industry table) is now labour income alone: the other row became taxes.
    expect(want.otherValueAdded).toEqual([]);
    const va = want.labourIncome.reduce((a, r) => a + r.values[0]!, 0);
    await poll(() => firstRowCell(2)).toBe(money(va));
    // A role map file replaces the roles set on screen.
    await page.getByTestId('sut-map-file').setInputFiles(csv('roles.json', '{"supply": {"Statistical discrepancy": "ignore"}}', 'application/json'));
    await poll(() => page.getByTestId('sut-roles').locator('summary').textContent()).toMatch(/1 role set by you \(from roles\.json\)/);
    // A bad one is refused at its key, and the roles stay, with the preview they give. The refusal stays on screen
    // after a derivation started by the earlier file ends (the screen derives 150 ms after a change of roles).
    await page.getByTestId('sut-map-file').setInputFiles(csv('bad.json', '{\n "supply": {"Statistical discrepancy": "exports"}\n}', 'application/json'));
    await poll(() => page.getByTestId('sut-map-error').textContent()).toMatch(/bad\.json:2:\d+: unknown supply-table role for 'Statistical discrepancy'/);
    await page.waitForTimeout(400);
    expect(await page.getByTestId('sut-map-error').textContent()).toMatch(/bad\.json:2:\d+/);
    expect(await page.getByTestId('sut-error').count()).toBe(0);
    expect(await page.getByTestId('sut-roles').locator('summary').textContent()).toMatch(/1 role set by you \(from roles\.json\)/);
    expect(await firstRowCell(0)).not.toMatch(/refused/);
    await page.getByTestId('sut-map-error').scrollIntoViewIfNeeded();
    await shot(page, 'supply-use-roles-map-refused');
    expect(await page.locator('body').innerText()).not.toMatch(/\bNaN\b|Infinity/);
    expect(s.errors).toEqual([]);
  });
});
