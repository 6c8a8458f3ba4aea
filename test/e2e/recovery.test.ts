/**
 * Crash recovery in real Chromium (browser mode: one IndexedDB entry per page, Web Locks for "is its page still
 * open"). Unsaved scenario edits are copied a moment after the change; a page that dies without saving (closed with
 * no unload handlers run) leaves its copy, and the next page offers it with its date and table; recovering restores
 * the scenarios and keeps them unsaved; discarding deletes that copy only. Work a save would refuse (a scenario line
 * the new table lacks) is still copied; a 6 MB project (over the localStorage quota) is copied; a copy that cannot
 * be written is said on screen; two open tabs never offer or delete each other's copies.
 * Expected scenario lists and table names are what the first page showed, not invented values.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { REPO, shot, skipBrowser, startSession, type Session } from './harness.ts';
import { sparseTableCsv } from '../support/random-tables.ts';

const TEST_CSV = join(REPO, 'test', 'fixtures', 'e2e', 'ridgeline-test.csv');
let s: Session;

async function openApp(init?: () => void): Promise<Page> {
  const page = await s.context.newPage();
  page.on('console', (m) => { if (m.type() === 'error') s.errors.push(`console: ${m.text()}`); });
  page.on('pageerror', (e) => s.errors.push(`page: ${e.message}`));
  if (init) await page.addInitScript(init);
  await page.goto(s.url);
  await page.getByTestId('verdict').waitFor({ timeout: 150_000 });
  return page;
}

/** The page dies: no save, no unload prompt (its Web Locks are released, as when a tab crashes). */
async function kill(page: Page): Promise<void> {
  await page.close({ runBeforeUnload: false });
}

async function scenarioNames(page: Page): Promise<string[]> {
  return (await page.getByTestId('scenario-list').locator('li button.pick').allTextContents()).map((t) => t.trim());
}

async function tableName(page: Page): Promise<string> {
  return (await page.getByTestId('table-name').textContent() ?? '').split(' · ')[0]!.trim();
}

interface StoredCopy { id: string; chars: number; tableName: string | null; scenarios: number | null }

/** The recovery copies in the browser's IndexedDB, read the way any page of the origin can. */
async function copies(page: Page): Promise<StoredCopy[]> {
  return page.evaluate(() => new Promise<StoredCopy[]>((resolve, reject) => {
    const req = indexedDB.open('roundwise-recovery');
    req.onupgradeneeded = () => req.result.createObjectStore('copies');
    req.onerror = () => reject(req.error);
    req.onsuccess = () => {
      const db = req.result;
      const out: StoredCopy[] = [];
      const cursor = db.transaction('copies', 'readonly').objectStore('copies').openCursor();
      cursor.onerror = () => reject(cursor.error);
      cursor.onsuccess = () => {
        const c = cursor.result;
        if (!c) { db.close(); resolve(out); return; }
        const v = c.value as { text: string };
        let doc: { tableName?: string; scenarios?: unknown[] } = {};
        try { doc = JSON.parse(v.text) as typeof doc; } catch { /* reported as nulls */ }
        out.push({ id: String(c.key), chars: v.text.length, tableName: doc.tableName ?? null, scenarios: doc.scenarios?.length ?? null });
        c.continue();
      };
    };
  }));
}

async function clearCopies(page: Page): Promise<void> {
  await page.evaluate(() => new Promise<void>((resolve, reject) => {
    const req = indexedDB.open('roundwise-recovery');
    req.onupgradeneeded = () => req.result.createObjectStore('copies');
    req.onerror = () => reject(req.error);
    req.onsuccess = () => {
      const tx = req.result.transaction('copies', 'readwrite');
      tx.objectStore('copies').clear();
      tx.oncomplete = () => { req.result.close(); resolve(); };
    };
  }));
}

async function addScenario(page: Page): Promise<void> {
  await page.locator('[data-screen="scenarios"]').click();
  await page.getByTestId('new-scenario').click();
}

async function importTable(page: Page, file: string): Promise<void> {
  await page.locator('[data-screen="import"]').click();
  await page.getByTestId('file-input').setInputFiles(file);
  await page.getByTestId('accept-import').click({ timeout: 60_000 });
}

describe.skipIf(skipBrowser)('crash recovery, in the browser', () => {
  beforeAll(async () => {
    s = await startSession();
  }, 200_000);
  afterAll(async () => { await s?.close(); });

  let before: string[] = [];
  let sampleName = '';

  it('keeps a copy of unsaved scenario edits', async () => {
    const page = await openApp();
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
    const page = await openApp();
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
    let page = await openApp();
    const offer = page.getByTestId('recovery');
    await offer.waitFor({ timeout: 30_000 });
    await offer.getByRole('button', { name: 'Discard' }).click();
    await expect.poll(async () => (await copies(page)).length, { timeout: 20_000 }).toBe(0);
    await kill(page);
    page = await openApp();
    await page.waitForTimeout(2_000);
    expect(await page.getByTestId('recovery').count()).toBe(0);
    await kill(page);
  });

  it('keeps the work when a scenario line no longer matches a newly imported table', async () => {
    const page = await openApp();
    await clearCopies(page);
    await addScenario(page); // the example scenario's line names a sector of the sample, not of the new table
    await importTable(page, TEST_CSV);
    await expect.poll(() => tableName(page), { timeout: 60_000 }).not.toBe(sampleName);
    const imported = await tableName(page);
    await page.locator('[data-screen="scenarios"]').click();
    const edited = await scenarioNames(page);
    expect(edited.length).toBeGreaterThanOrEqual(2);
    await expect.poll(async () => (await copies(page))[0]?.tableName, { timeout: 20_000 }).toBe(imported);
    await kill(page);
    const next = await openApp();
    await next.getByTestId('recovery').waitFor({ timeout: 30_000 });
    expect(await next.getByTestId('recovery-summary').textContent()).toContain(`“${imported}”`);
    await next.getByTestId('recovery').getByRole('button', { name: 'Recover it' }).click();
    await expect.poll(() => tableName(next), { timeout: 30_000 }).toBe(imported);
    await next.locator('[data-screen="scenarios"]').click();
    await expect.poll(() => scenarioNames(next), { timeout: 30_000 }).toEqual(edited);
    await kill(next);
  });

  it('two open tabs keep a copy each; a third offers only the closed one, and its Discard leaves the live one', async () => {
    const a = await openApp();
    await clearCopies(a);
    await addScenario(a);
    await expect.poll(async () => (await copies(a)).length, { timeout: 20_000 }).toBe(1);
    const b = await openApp();
    await b.waitForTimeout(2_000);
    expect(await b.getByTestId('recovery').count()).toBe(0); // A is still open: its copy is not B's to offer
    await addScenario(b);
    await addScenario(b);
    await expect.poll(async () => (await copies(b)).map((c) => c.scenarios).sort(), { timeout: 20_000 }).toEqual([2, 3]);
    await kill(a);
    const c = await openApp();
    await c.getByTestId('recovery').waitFor({ timeout: 30_000 });
    expect(await c.getByTestId('recovery-summary').textContent()).toContain('2 scenarios'); // A's, not B's
    await c.getByTestId('recovery').getByRole('button', { name: 'Discard' }).click();
    await expect.poll(async () => (await copies(c)).map((x) => x.scenarios), { timeout: 20_000 }).toEqual([3]);
    await kill(b);
    await kill(c);
  });

  it('keeps a copy of a project over the localStorage quota (about 6 MB)', async () => {
    // A project keeps the table file itself: 1,700 sectors of CSV text are about 6 MB, over the 5 MB of localStorage.
    const file = join(REPO, 'test-output', 'e2e-recovery-1700-sectors.csv');
    writeFileSync(file, sparseTableCsv(1700));
    const page = await openApp();
    await clearCopies(page);
    await importTable(page, file);
    await expect.poll(() => page.getByTestId('table-name').textContent(), { timeout: 120_000 }).toMatch(/1,700 sectors/);
    await expect.poll(async () => (await copies(page))[0]?.chars ?? 0, { timeout: 60_000 }).toBeGreaterThan(5_500_000);
    expect(await page.getByTestId('recovery-problem').count()).toBe(0);
    await clearCopies(page);
    await kill(page);
  });

  it('says so on screen when the copy cannot be written', async () => {
    // The browser's storage refuses every write, as when its quota is used up.
    const page = await openApp(() => {
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
