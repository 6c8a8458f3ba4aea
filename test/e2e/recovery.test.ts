/**
 * Crash recovery in real Chromium (browser mode: one IndexedDB entry per page, Web Locks for "is its page still
 * open"). Unsaved scenario edits are copied a moment after the change; a page that dies without saving (closed with
 * no unload handlers run) leaves its copy, and the next page offers it with its date and table; recovering restores
 * the scenarios and keeps them unsaved; discarding deletes that copy only; a copy that cannot be written is said on
 * screen. (recovery-tabs.test.ts: a stale table, two tabs, a 6 MB copy.)
 * Expected scenario lists and table names are what the first page showed, not invented values.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { shot, skipBrowser, startSession, type Session } from './harness.ts';
import { addScenario, clearCopies, copies, kill, openPage, scenarioNames, tableName } from './recovery-support.ts';

let s: Session;

describe.skipIf(skipBrowser)('crash recovery, in the browser', () => {
  beforeAll(async () => {
    s = await startSession();
  }, 200_000);
  afterAll(async () => { await s?.close(); });

  let before: string[] = [];
  let sampleName = '';

  it('keeps a copy of unsaved scenario edits', async () => {
    const page = await openPage(s);
    await clearCopies(page);
    sampleName = await tableName(page);
    await addScenario(page);
    await page.getByTestId('new-scenario').click();
    before = await scenarioNames(page);
    expect(before.length).toBeGreaterThanOrEqual(3);
    await expect.poll(async () => (await copies(page))[0]?.scenarios, { timeout: 20_000 }).toBe(before.length);
    await kill(page);
  });

  it('offers the copy at the next start, with its date and table, and restores the same scenarios, still unsaved', async () => {
    const page = await openPage(s);
    const offer = page.getByTestId('recovery');
    await offer.waitFor({ timeout: 30_000 });
    const summary = await page.getByTestId('recovery-summary').textContent();
    expect(summary).toContain(`“${sampleName}”`);
    expect(summary).toContain(`${before.length} scenarios`);
    const day = (d: Date) => new Intl.DateTimeFormat('en-US', { dateStyle: 'medium' }).format(d);
    expect([day(new Date()), day(new Date(Date.now() - 3_600_000))].some((d) => summary?.includes(d))).toBe(true); // written within the hour
    await shot(page, '14-recovery-offer');
    await offer.getByRole('button', { name: 'Recover it' }).click();
    await offer.waitFor({ state: 'detached' });
    await page.locator('[data-screen="scenarios"]').click();
    await expect.poll(() => scenarioNames(page), { timeout: 30_000 }).toEqual(before);
    expect(await page.getByLabel('unsaved changes').count()).toBe(1);
    // The recovered work is now this page's own copy; the one it came from is gone.
    await expect.poll(async () => (await copies(page)).map((c) => c.scenarios), { timeout: 20_000 }).toEqual([before.length]);
    await kill(page);
  });

  it('discarding deletes the copy, and the start after that offers nothing', async () => {
    let page = await openPage(s);
    const offer = page.getByTestId('recovery');
    await offer.waitFor({ timeout: 30_000 });
    await offer.getByRole('button', { name: 'Discard' }).click();
    await expect.poll(async () => (await copies(page)).length, { timeout: 20_000 }).toBe(0);
    await kill(page);
    page = await openPage(s);
    await page.waitForTimeout(2_000);
    expect(await page.getByTestId('recovery').count()).toBe(0);
    await kill(page);
  });

  it('says so on screen when the copy cannot be written', async () => {
    // The browser's storage refuses every write, as when its quota is used up.
    const page = await openPage(s, () => {
      IDBObjectStore.prototype.put = () => { throw new DOMException('quota', 'QuotaExceededError'); };
    });
    await addScenario(page);
    const problem = page.getByTestId('recovery-problem');
    await problem.waitFor({ timeout: 20_000 });
    expect(await problem.textContent()).toMatch(/No crash-recovery copy .* could be kept: the browser's storage for this page is full/);
    await shot(page, '15-recovery-problem');
    await kill(page);
  });

  it('logged no console errors', () => {
    expect(s.errors).toEqual([]);
  });
});
