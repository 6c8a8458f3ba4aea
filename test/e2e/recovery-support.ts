/**
 * Shared by the crash-recovery e2e files: pages of one browser context that die without saving, and the recovery
 * copies in the page's IndexedDB read the way any page of the origin can.
 */
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { recordErrors, REPO, type Session } from './harness.ts';

export const TEST_CSV = join(REPO, 'test', 'fixtures', 'e2e', 'ridgeline-test.csv');

/** Where pages are opened: a browser context, the app's address, and the list its console errors go to. */
export type PageHome = Pick<Session, 'context' | 'url' | 'errors'>;

/** A new page of the context with the app loaded on the sample county. */
export async function openPage(s: PageHome, init?: () => void): Promise<Page> {
  const page = await s.context.newPage();
  recordErrors(page, s.errors);
  if (init) await page.addInitScript(init);
  await page.goto(s.url);
  await page.getByTestId('verdict').waitFor({ timeout: 150_000 });
  return page;
}

/** The page dies: no save, no unload prompt (its Web Locks are released, as when a tab crashes). */
export async function kill(page: Page): Promise<void> {
  await page.close({ runBeforeUnload: false });
}

export async function scenarioNames(page: Page): Promise<string[]> {
  return (await page.getByTestId('scenario-list').locator('li button.pick').allTextContents()).map((t) => t.trim());
}

export async function tableName(page: Page): Promise<string> {
  return (await page.getByTestId('table-name').textContent() ?? '').split(' · ')[0]!.trim();
}

export interface StoredCopy { id: string; chars: number; tableName: string | null; scenarios: number | null }

/** The recovery copies in the browser's IndexedDB, read the way any page of the origin can (text, or a Blob of it). */
export async function copies(page: Page): Promise<StoredCopy[]> {
  return page.evaluate(async () => {
    const raw = await new Promise<[string, { text?: string; blob?: Blob }][]>((resolve, reject) => {
      const req = indexedDB.open('roundwise-recovery');
      req.onupgradeneeded = () => req.result.createObjectStore('copies');
      req.onerror = () => reject(req.error);
      req.onsuccess = () => {
        const db = req.result;
        const out: [string, { text?: string; blob?: Blob }][] = [];
        const cursor = db.transaction('copies', 'readonly').objectStore('copies').openCursor();
        cursor.onerror = () => reject(cursor.error);
        cursor.onsuccess = () => {
          const c = cursor.result;
          if (!c) { db.close(); resolve(out); return; }
          out.push([String(c.key), c.value as { text?: string; blob?: Blob }]);
          c.continue();
        };
      };
    });
    const out: StoredCopy[] = [];
    for (const [id, v] of raw) {
      const text = typeof v.text === 'string' ? v.text : v.blob ? await v.blob.text() : '';
      let doc: { tableName?: string; scenarios?: unknown[] } = {};
      try { doc = JSON.parse(text) as typeof doc; } catch { /* reported as nulls */ }
      out.push({ id, chars: text.length, tableName: doc.tableName ?? null, scenarios: doc.scenarios?.length ?? null });
    }
    return out;
  });
}

export async function clearCopies(page: Page): Promise<void> {
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

export async function addScenario(page: Page): Promise<void> {
  await page.locator('[data-screen="scenarios"]').click();
  await page.getByTestId('new-scenario').click();
}

export async function importTable(page: Page, file: string): Promise<void> {
  await page.locator('[data-screen="import"]').click();
  await page.getByTestId('file-input').setInputFiles(file);
  await page.getByTestId('accept-import').click({ timeout: 60_000 });
}


