/**
 * Crash recovery in real Chromium, the harder cases: work a save would refuse (a scenario line the new table lacks)
 * is still copied; two open tabs never offer or delete each other's copies; a 6 MB project (over the localStorage
 * quota) is copied. The three tests are independent and run at once, each in a browser context of its own (its own
 * store of copies): most of their time is waiting for copies, written a moment after an edit.
 */
import { afterAll, beforeAll, describe, it } from 'vitest';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { CONTEXT_OPTIONS, REPO, skipBrowser, startSession, type Session } from './harness.ts';
import { addScenario, clearCopies, copies, importTable, kill, openPage, scenarioNames, tableName, TEST_CSV, type PageHome } from './recovery-support.ts';
import { sparseTableCsv } from '../support/random-tables.ts';

let shared: Session;

/** A browser context of the test's own (its own store of copies), with its own console errors, which it returns. */
async function ownSession(run: (s: PageHome) => Promise<void>): Promise<string[]> {
  const context = await shared.browser.newContext(CONTEXT_OPTIONS);
  const errors: string[] = [];
  try {
    await run({ context, url: shared.url, errors });
  } finally {
    await context.close();
  }
  return errors;
}

describe.skipIf(skipBrowser)('crash recovery, in the browser: stale tables, two tabs, large copies', () => {
  beforeAll(async () => {
    shared = await startSession();
  }, 200_000);
  afterAll(async () => { await shared?.close(); });

  it.concurrent('keeps the work when a scenario line no longer matches a newly imported table', async ({ expect }) => {
    const errors = await ownSession(async (s) => {
      const page = await openPage(s);
      await clearCopies(page);
      const sampleName = await tableName(page);
      await addScenario(page); // the example scenario's line names a sector of the sample, not of the new table
      await importTable(page, TEST_CSV);
      await expect.poll(() => tableName(page), { timeout: 60_000 }).not.toBe(sampleName);
      const imported = await tableName(page);
      await page.locator('[data-screen="scenarios"]').click();
      const edited = await scenarioNames(page);
      expect(edited.length).toBeGreaterThanOrEqual(2);
      await expect.poll(async () => (await copies(page))[0]?.tableName, { timeout: 20_000 }).toBe(imported);
      await kill(page);
      const next = await openPage(s);
      await next.getByTestId('recovery').waitFor({ timeout: 30_000 });
      expect(await next.getByTestId('recovery-summary').textContent()).toContain(`“${imported}”`);
      await next.getByTestId('recovery').getByRole('button', { name: 'Recover it' }).click();
      await expect.poll(() => tableName(next), { timeout: 30_000 }).toBe(imported);
      await next.locator('[data-screen="scenarios"]').click();
      await expect.poll(() => scenarioNames(next), { timeout: 30_000 }).toEqual(edited);
      await kill(next);
    });
    expect(errors).toEqual([]); // logged no console errors
  });

  it.concurrent('two open tabs keep a copy each; a third offers only the closed one, and its Discard leaves the live one', async ({ expect }) => {
    const errors = await ownSession(async (s) => {
      const a = await openPage(s);
      await clearCopies(a);
      await addScenario(a);
      await expect.poll(async () => (await copies(a)).length, { timeout: 20_000 }).toBe(1);
      const b = await openPage(s);
      await addScenario(b); // at once: an edit made while B still looks for a copy to offer is copied too
      await addScenario(b);
      await expect.poll(async () => (await copies(b)).map((c) => c.scenarios).sort(), { timeout: 20_000 }).toEqual([2, 3]);
      // B writes its copy only once its look for a copy to offer has ended, so an offer would be on screen by now:
      // A is still open, and its copy is not B's to offer.
      expect(await b.getByTestId('recovery').count()).toBe(0);
      await kill(a);
      const c = await openPage(s);
      await c.getByTestId('recovery').waitFor({ timeout: 30_000 });
      expect(await c.getByTestId('recovery-summary').textContent()).toContain('2 scenarios'); // A's, not B's
      await c.getByTestId('recovery').getByRole('button', { name: 'Discard' }).click();
      await expect.poll(async () => (await copies(c)).map((x) => x.scenarios), { timeout: 20_000 }).toEqual([3]);
      await kill(b);
      await kill(c);
    });
    expect(errors).toEqual([]); // logged no console errors
  });

  it.concurrent('keeps a copy of a project over the localStorage quota (about 6 MB)', async ({ expect }) => {
    const errors = await ownSession(async (s) => {
      // A project keeps the table file itself: 600 sectors with every zero flow written with 15 decimals are about
      // 6 MB of CSV text, over the 5 MB of localStorage.
      const file = join(REPO, 'test-output', 'e2e-recovery-600-sectors.csv');
      writeFileSync(file, sparseTableCsv(600, undefined, `0.${'0'.repeat(15)}`));
      const page = await openPage(s);
      await clearCopies(page);
      await importTable(page, file);
      await expect.poll(() => page.getByTestId('table-name').textContent(), { timeout: 120_000 }).toMatch(/600 sectors/);
      await expect.poll(async () => (await copies(page))[0]?.chars ?? 0, { timeout: 60_000 }).toBeGreaterThan(5_500_000);
      expect(await page.getByTestId('recovery-problem').count()).toBe(0);
      await clearCopies(page);
      await kill(page);
    });
    expect(errors).toEqual([]); // logged no console errors
  });
});
