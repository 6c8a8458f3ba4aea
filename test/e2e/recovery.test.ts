/**
 * Crash recovery in real Chromium: unsaved scenario edits are copied (browser mode: localStorage) a moment after
 * the change; a window that dies without saving (closed with no unload handlers run) leaves the copy, and the next
 * start offers it back; recovering restores the scenarios and keeps them marked unsaved; discarding clears the copy.
 * The expected scenario list is what the first window showed, not an invented number.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { shot, skipBrowser, startSession, type Session } from './harness.ts';

const COPY_KEY = 'roundwise:autosave';
let s: Session;

async function openApp(): Promise<Page> {
  const page = await s.context.newPage();
  page.on('console', (m) => { if (m.type() === 'error') s.errors.push(`console: ${m.text()}`); });
  page.on('pageerror', (e) => s.errors.push(`page: ${e.message}`));
  await page.goto(s.url);
  await page.getByTestId('verdict').waitFor({ timeout: 150_000 });
  return page;
}

async function scenarioNames(page: Page): Promise<string[]> {
  return (await page.getByTestId('scenario-list').locator('li button.pick').allTextContents()).map((t) => t.trim());
}

async function copyStored(page: Page): Promise<boolean> {
  return page.evaluate((k) => window.localStorage.getItem(k) !== null, COPY_KEY);
}

describe.skipIf(skipBrowser)('crash recovery, in the browser', () => {
  beforeAll(async () => {
    s = await startSession();
    await s.page.close();
  }, 200_000);
  afterAll(async () => { await s?.close(); });

  let before: string[] = [];

  it('keeps a copy of unsaved scenario edits', async () => {
    const page = await openApp();
    expect(await copyStored(page)).toBe(false);
    await page.locator('[data-screen="scenarios"]').click();
    await page.getByTestId('new-scenario').click();
    await page.getByTestId('new-scenario').click();
    before = await scenarioNames(page);
    expect(before.length).toBeGreaterThanOrEqual(3);
    await expect.poll(() => copyStored(page), { timeout: 20_000 }).toBe(true);
    await page.close({ runBeforeUnload: false }); // the window dies: no save, no unload prompt
  });

  it('offers the copy at the next start and restores the same scenarios, still unsaved', async () => {
    const page = await openApp();
    const offer = page.getByTestId('recovery');
    await offer.waitFor({ timeout: 30_000 });
    await shot(page, '14-recovery-offer');
    await offer.getByRole('button', { name: 'Recover it' }).click();
    await offer.waitFor({ state: 'detached' });
    await page.locator('[data-screen="scenarios"]').click();
    await expect.poll(() => scenarioNames(page), { timeout: 30_000 }).toEqual(before);
    expect(await page.getByLabel('unsaved changes').count()).toBe(1);
    await page.close({ runBeforeUnload: false });
  });

  it('discarding clears the copy, and the start after that offers nothing', async () => {
    let page = await openApp();
    const offer = page.getByTestId('recovery');
    await offer.waitFor({ timeout: 30_000 });
    await offer.getByRole('button', { name: 'Discard' }).click();
    await expect.poll(() => copyStored(page), { timeout: 20_000 }).toBe(false);
    await page.close({ runBeforeUnload: false });
    page = await openApp();
    await page.waitForTimeout(2_000);
    expect(await page.getByTestId('recovery').count()).toBe(0);
    await page.close({ runBeforeUnload: false });
  });

  it('logged no console errors', () => {
    expect(s.errors).toEqual([]);
  });
});
