/**
 * Keyboard and assistive technology, in real Chromium: axe-core (the open accessibility rules engine, run inside the
 * page) finds no violation of serious or critical impact on any screen; navigation buttons are named by their
 * screen alone; result tabs answer the arrow keys and point at their panel; dialogs take the focus; charts carry a
 * one-sentence summary.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createRequire } from 'node:module';
import { readFileSync } from 'node:fs';
import type { Page } from 'playwright-core';
import { join } from 'node:path';
import { REPO, shot as photograph, skipBrowser, type Session, openApp, goTo } from './harness.ts';

const AXE_SOURCE = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');
let s: Session;
let page: Page;

function poll<T>(fn: () => T | Promise<T>) {
  return expect.poll(fn, { interval: 100, timeout: 30_000 });
}

interface AxeViolation { id: string; impact: string | null; help: string; nodes: { target: string[] }[] }

/** The serious and critical violations axe finds on the page as it stands, one line each. */
async function axeProblems(): Promise<string[]> {
  // Evaluated through the debugging protocol: the page's CSP rightly refuses inline scripts.
  if (!(await page.evaluate(() => 'axe' in window))) await page.evaluate(AXE_SOURCE);
  const violations = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (ctx: Document, opts: object) => Promise<{ violations: AxeViolation[] }> } }).axe;
    const r = await axe.run(document, { resultTypes: ['violations'] });
    return r.violations.map((v) => ({ id: v.id, impact: v.impact, help: v.help, nodes: v.nodes.map((n) => ({ target: n.target })) }));
  });
  return violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.impact} ${v.id}: ${v.help} — ${v.nodes.slice(0, 3).map((n) => n.target.join(' ')).join(', ')}`);
}

function go(screen: string): Promise<void> {
  return goTo(page, screen);
}

describe.skipIf(skipBrowser)('accessibility', () => {
  beforeAll(async () => {
    s = await openApp();
    page = s.page;
  });
  afterAll(async () => { await s?.close(); });

  it('names each screen button by its screen alone, the shortcut kept as a key hint', async () => {
    const nav = page.getByRole('navigation', { name: 'Screens' });
    await nav.getByRole('button', { name: 'Overview', exact: true }).waitFor();
    expect(await nav.getByRole('button', { name: /Alt/ }).count()).toBe(0);
    expect(await nav.getByRole('button', { name: 'Scenarios', exact: true }).getAttribute('aria-keyshortcuts')).toBe('Alt+6');
  });

  const SCREENS: [string, string][] = [
    ['overview', 'verdict'], ['import', 'file-input'], ['table', ''], ['structure', ''], ['multipliers', 'multiplier-table'],
    ['scenarios', 'scenario-editor'], ['export', ''], ['regional', ''], ['supply-use', ''], ['guide', 'guide-terms'],
  ];
  for (const [screen, marker] of SCREENS) {
    it(`finds no serious or critical problem on the ${screen} screen`, async () => {
      await go(screen);
      if (marker) await page.getByTestId(marker).first().waitFor({ state: 'attached' });
      await page.waitForTimeout(300); // charts and virtual rows settle
      const problems = await axeProblems();
      if (problems.length) console.log(problems.join('\n'));
      expect(problems).toEqual([]);
    });
  }

  it('finds no serious or critical problem in the import preview and the shaded grid', async () => {
    await go('import');
    await page.getByTestId('file-input').setInputFiles(join(REPO, 'test', 'fixtures', 'e2e', 'ridgeline-test.csv'));
    await page.getByTestId('as-read').waitFor();
    expect(await axeProblems()).toEqual([]);
    await page.getByRole('button', { name: 'Discard' }).click();
    await go('table');
    await page.getByTestId('grid-view').click();
    await page.locator('canvas.shaded').waitFor();
    expect(await axeProblems()).toEqual([]);
  });

  it('moves between result tabs with the arrow keys, each tab pointing at its panel', async () => {
    await go('scenarios');
    const tabs = page.getByRole('tablist', { name: 'Variable' }).getByRole('tab');
    await tabs.first().waitFor();
    const n = await tabs.count();
    expect(n).toBeGreaterThan(1);
    await tabs.first().focus();
    await page.keyboard.press('ArrowRight');
    await poll(() => tabs.nth(1).getAttribute('aria-selected')).toBe('true');
    expect(await page.evaluate(() => document.activeElement?.getAttribute('role'))).toBe('tab');
    const controls = await tabs.nth(1).getAttribute('aria-controls');
    expect(controls).toBeTruthy();
    expect(await page.locator(`#${controls}`).getAttribute('role')).toBe('tabpanel');
    await page.keyboard.press('End');
    await poll(() => tabs.nth(n - 1).getAttribute('aria-selected')).toBe('true');
    await page.keyboard.press('Home');
    await poll(() => tabs.first().getAttribute('aria-selected')).toBe('true');
  });

  it('moves between phase tabs with the arrow keys; "Add phase" stands outside the tab list', async () => {
    await go('scenarios');
    const list = page.getByRole('tablist', { name: 'Phases' });
    const before = await list.getByRole('tab').count();
    await page.getByTestId('add-phase').click();
    await poll(() => list.getByRole('tab').count()).toBe(before + 1);
    expect(await list.getByTestId('add-phase').count()).toBe(0);
    await list.getByRole('tab').first().click();
    await list.getByRole('tab').first().focus();
    await page.keyboard.press('End');
    await poll(() => list.getByRole('tab').last().getAttribute('aria-selected')).toBe('true');
    expect(await page.evaluate(() => document.activeElement?.id)).toBe(`phase-tab-${before}`);
    expect(await page.locator('#phase-panel').getAttribute('role')).toBe('tabpanel');
    expect(await axeProblems()).toEqual([]);
    await page.keyboard.press('Home');
    await poll(() => list.getByRole('tab').first().getAttribute('aria-selected')).toBe('true');
    await page.keyboard.press('Control+z'); // the added phase undone, so later tests see the scenario as it was
    await poll(() => list.getByRole('tab').count()).toBe(before);
  });

  it('puts the focus into the About dialog and gives it back on close', async () => {
    await page.getByRole('button', { name: 'Help' }).click();
    await page.getByRole('menuitem', { name: /About/ }).click();
    const dialog = page.getByRole('dialog');
    await dialog.waitFor();
    await poll(() => page.evaluate(() => Boolean(document.activeElement?.closest('[role="dialog"]')))).toBe(true);
    await photograph(page, 'about-dialog');
    await page.keyboard.press('Escape');
    expect(await dialog.count()).toBe(0);
  });

  it('opens the guide from the Help menu', async () => {
    await page.getByRole('button', { name: 'Help' }).click();
    await page.getByRole('menuitem', { name: /Guide/ }).click();
    await page.getByTestId('guide-terms').waitFor();
    const terms = (await page.getByTestId('guide-terms').textContent()) ?? '';
    for (const t of ['Leontief inverse', 'Type I multiplier', 'Type II multiplier', 'Direct, indirect, induced', 'Perron root', 'Location quotient']) expect(terms).toContain(t);
    expect(await page.getByTestId('guide-cautions').textContent()).toMatch(/qualified/);
    await photograph(page, 'guide');
  });

  it('describes every chart in a sentence, not only by its title', async () => {
    await go('overview');
    const canvases = page.locator('figure canvas');
    await canvases.first().waitFor();
    const labels = await canvases.evaluateAll((els) => els.map((e) => e.getAttribute('aria-label') ?? ''));
    expect(labels.length).toBeGreaterThan(0);
    for (const l of labels) expect(l).toMatch(/\. .*(largest|highest|from|rounds|reached|\d)/);
  });

  it('shows no console errors', () => {
    expect(s.errors).toEqual([]);
  });
});
