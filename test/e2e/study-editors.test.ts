/**
 * The study's own inputs by hand, in real Chromium on the sample county: a spending mix, an activity not in the table
 * and trade margins typed into the Scenarios screen's editors are refused with the same message as the same content
 * read from a file, used by scenario lines once accepted, undone one edit at a time (button and Ctrl+Z), and the mixes
 * export as a mix file that reads back. A refusal of a line in a scenario of several phases names the phase. The
 * bundled two-phase example is offered on the sample and reported phase by phase.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Download, Page } from 'playwright-core';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { join } from 'node:path';
import { DOWNLOADS, goTo, openApp, shot as photograph, skipBrowser, type Session } from './harness.ts';
import { parseMixCsv } from '../../src/study/index.ts';

let s: Session;
let page: Page;
const AXE_SOURCE = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');

/** Serious and critical axe-core findings inside the study inputs panel, with every editor open. */
async function axeProblems(): Promise<string[]> {
  // Evaluated through the debugging protocol: the page's CSP rightly refuses inline scripts.
  if (!(await page.evaluate(() => 'axe' in window))) await page.evaluate(AXE_SOURCE);
  return page.evaluate(async () => {
    type Found = { id: string; impact: string | null; nodes: { target: string[] }[] };
    const axe = (window as unknown as { axe: { run: (ctx: Element, opts: object) => Promise<{ violations: Found[] }> } }).axe;
    const r = await axe.run(document.querySelector('[data-testid="study-inputs"]')!, { resultTypes: ['violations'] });
    return r.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => `${v.impact} ${v.id}: ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
  });
}

function poll<T>(fn: () => T | Promise<T>) {
  return expect.poll(fn, { interval: 100, timeout: 30_000 });
}
async function shot(name: string): Promise<void> {
  expect(await page.locator('body').innerText(), name).not.toMatch(/\bNaN\b|Infinity|∞/);
  await photograph(page, name);
}
const total = () => page.getByTestId('total-effect').first();
const mixSaid = () => page.getByTestId('study-input-mix').textContent();

/** Type a sector into a picker by a part of its name that only it has, and leave the field. */
async function pick(label: string, part: string): Promise<void> {
  const box = page.getByRole('combobox', { name: label, exact: true });
  await box.fill(part);
  await box.press('Tab');
}

async function download(click: () => Promise<void>): Promise<{ name: string; text: string }> {
  const got = page.waitForEvent('download');
  await click();
  const d: Download = await got;
  const path = join(DOWNLOADS, `editors-${d.suggestedFilename()}`);
  await d.saveAs(path);
  return { name: d.suggestedFilename(), text: readFileSync(path, 'utf8') };
}

describe.skipIf(skipBrowser)('study input editors', () => {
  beforeAll(async () => {
    s = await openApp();
    page = s.page;
    await goTo(page, 'scenarios');
    await page.getByTestId('study-inputs').locator('summary').first().click();
  });
  afterAll(async () => { await s?.close(); });

  it('refuses a mix whose shares do not add up to 1 with the mix file\'s message, and keeps it once they do', async () => {
    const editor = page.getByTestId('mix-editor');
    await editor.locator('summary').click();
    await page.getByTestId('mix-name').fill('Visitor day');
    await pick('Sector of row 1', 'accommodation');
    await editor.getByLabel('Share of row 1').fill('0.6');
    await page.getByTestId('mix-add-row').click();
    // The new row's sector field has the focus: the keyboard goes on from there.
    expect(await page.evaluate(() => document.activeElement?.getAttribute('aria-label'))).toBe('Sector of row 2');
    await pick('Sector of row 2', 'retail');
    await editor.getByLabel('Share of row 2').fill('0.3');
    await poll(() => page.getByTestId('mix-sum').textContent()).toBe('0.9');
    await page.getByTestId('mix-save').click();
    const said = await page.getByTestId('mix-error').textContent();
    // The same mix as a file: the same rule and words, located at the file's line there.
    await page.getByTestId('study-input-mix-file').setInputFiles({
      name: 'visitors.csv', mimeType: 'text/csv',
      buffer: Buffer.from('mix,sector,share\nVisitor day,Accommodation and food service,0.6\nVisitor day,Wholesale and retail trade,0.3\n'),
    });
    await poll(() => page.getByTestId('study-inputs-error').textContent()).toMatch(/^visitors\.csv:2/);
    const fromFile = await page.getByTestId('study-inputs-error').textContent();
    const message = (t: string | null) => t!.slice(t!.indexOf('): ') + 3);
    expect(message(said)).toBe(message(fromFile));
    expect(message(said)).toBe("spending mix 'Visitor day': shares sum to 0.9, not 1");
    expect(await mixSaid()).toBe('none');
    await shot('study-editors-mix-refused');
    await editor.getByLabel('Share of row 2').fill('0.4');
    await page.getByTestId('mix-save').click();
    await poll(() => mixSaid()).toBe('1 mix: Visitor day');
    expect(await page.getByTestId('mix-error').count()).toBe(0);
    // The editor goes on showing the mix just saved (now the study's own).
    expect(await page.getByTestId('mix-choose').inputValue()).toBe('Visitor day');
    expect(await page.getByTestId('mix-save').textContent()).toBe('Save mix');
  });

  it('uses the new mix in a scenario line, and undoes edits one at a time', async () => {
    const before = await total().textContent();
    await page.getByTestId('add-line').click();
    await page.getByLabel('Kind of line 2').selectOption('mix');
    await page.getByLabel('Spending mix of line 2').selectOption('Visitor day');
    await page.locator('[data-line-amount="1"]').fill('500');
    await page.locator('[data-line-amount="1"]').press('Tab');
    await poll(() => total().textContent()).not.toBe(before);
    const withMix = await total().textContent();
    // Ctrl+Z (focus outside a text field) and the Undo button: the amount, the mix chosen, the kind, the line, then
    // the mix itself (a study-input edit, not a scenario edit).
    await page.evaluate(() => (document.activeElement as HTMLElement | null)?.blur());
    await page.keyboard.press('Control+z');
    await poll(() => page.locator('[data-line-amount="1"]').inputValue()).toBe('0');
    for (let k = 0; k < 3; k++) await page.getByRole('button', { name: /^Undo/ }).click();
    await poll(() => page.locator('[data-line-amount]').count()).toBe(1);
    await poll(() => total().textContent()).toBe(before);
    await page.getByRole('button', { name: /^Undo/ }).click();
    await poll(() => mixSaid()).toBe('none');
    // Redo brings the mix and the line back, with the same results.
    for (let k = 0; k < 5; k++) await page.getByRole('button', { name: /^Redo/ }).click();
    await poll(() => mixSaid()).toBe('1 mix: Visitor day');
    await poll(() => total().textContent()).toBe(withMix);
  });

  it('exports the study\'s mixes as a mix file that reads back', async () => {
    const f = await download(() => page.getByTestId('mix-export').click());
    expect(f.name).toMatch(/\.csv$/);
    const back = parseMixCsv(f.text, f.name);
    expect(back.map((m) => ({ name: m.name, shares: m.shares.map((x) => [x.sector, x.share]) }))).toEqual([
      { name: 'Visitor day', shares: [['Accommodation and food service', 0.6], ['Wholesale and retail trade', 0.4]] },
    ]);
  });

  it('refuses an activity buying more than its output, as the activity file does, and keeps it once it does not', async () => {
    const editor = page.getByTestId('activity-editor');
    await editor.locator('summary').click();
    await page.getByTestId('activity-name').fill('Research station');
    await page.getByTestId('activity-output').fill('500');
    await page.getByTestId('activity-jobs').fill('12');
    await page.getByTestId('activity-labourIncome').fill('240');
    await pick('Sector of purchase 1', 'professional');
    await editor.getByLabel('Amount of purchase 1').fill('600');
    await page.getByTestId('activity-save').click();
    await poll(() => page.getByTestId('activity-error').textContent()).toMatch(/activity 'Research station': its purchases add up to 600 by this line, more than its output 500/);
    await shot('study-editors-activity-refused');
    await editor.getByLabel('Amount of purchase 1').fill('100');
    await editor.getByLabel('Local share of purchase 1').fill('0.5');
    await page.getByTestId('activity-save').click();
    await poll(() => page.getByTestId('study-input-activity').textContent()).toBe('1 activity: Research station');
  });

  it('refuses margins above the whole purchaser price, and keeps them once they are not', async () => {
    const editor = page.getByTestId('margins-editor');
    await editor.locator('summary').click();
    await pick('Sector earning the retail margin (empty: none)', 'retail trade');
    await pick('Sector earning the transport margin (empty: none)', 'transport');
    await pick('Sector of margins row 1', 'food processing');
    await editor.getByLabel('Retail share of row 1').fill('0.7');
    await editor.getByLabel('Transport share of row 1').fill('0.4');
    await page.getByTestId('margins-save').click();
    await poll(() => page.getByTestId('margins-error').textContent()).toBe("(row 'Food processing', column 'transport'): the margin shares of 'Food processing' add up to 1.1, more than the whole purchaser price (at most 1)");
    await editor.getByLabel('Retail share of row 1').fill('0.3');
    await editor.getByLabel('Transport share of row 1').fill('0.05');
    await page.getByTestId('margins-save').click();
    await poll(() => page.getByTestId('study-input-margins').textContent()).toMatch(/^1 sector with margins; retail earned by Wholesale and retail trade/);
    await shot('study-editors-filled');
    expect(await axeProblems()).toEqual([]);
  });

  it('names the phase of a line the engine refuses', async () => {
    await page.getByTestId('add-phase').click();
    await pick('Sector of line 1', 'construction');
    await page.locator('[data-line-amount="0"]').fill('100');
    await page.locator('[data-line-amount="0"]').press('Tab');
    await page.getByTestId('more-line-options').check();
    await page.getByLabel('Price year of line 1').fill('1999');
    await page.getByLabel('Price year of line 1').press('Tab');
    await poll(() => page.getByTestId('scenario-error').textContent()).toMatch(/line 1 \(phase 'Phase 2', row 'Construction', column 'price_year'\): the line is in 1999 money, but there is no price index/);
    await page.getByTestId('scenario-error').scrollIntoViewIfNeeded();
    await shot('study-editors-phase-refusal');
  });

  it('adds the bundled two-phase example, whose phases are reported apart', async () => {
    await page.getByTestId('add-example').click();
    await poll(() => page.getByTestId('scenario-name').inputValue()).toBe('Food plant, built then operated');
    const tabs = page.getByTestId('phase-tabs').getByRole('tab');
    expect(await tabs.allTextContents()).toEqual(['Building the plant (one-time)', 'Operating the plant (annual)']);
    await poll(() => page.getByTestId('phase-timing-note').textContent()).toMatch(/— Building the plant: one-time \(2026\)\.$/);
    const once = await total().textContent();
    await tabs.nth(1).click();
    await poll(() => page.getByTestId('phase-timing-note').textContent()).toMatch(/— Operating the plant: annual — one year's effects, from 2027, for 20 years\.$/);
    await poll(() => page.getByTestId('over-time').textContent()).toMatch(/^Over 20 years: /);
    expect(await total().textContent()).not.toBe(once);
    // Two phases of different timings: no total across them.
    expect(await page.getByTestId('timing-totals').count()).toBe(0);
    await page.getByTestId('phase-tabs').scrollIntoViewIfNeeded();
    await shot('study-editors-two-phase-example');
    expect(s.errors).toEqual([]);
  });
});
