/**
 * The harness's promise to every e2e file: a session starts as a new browser context would, although the worker's
 * page is kept from file to file (harness.ts resetPage). Each test leaves behind what a file could, then starts the
 * next session the way the next file would.
 */
import { describe, expect, it } from 'vitest';
import { openApp, skipBrowser, type Session } from './harness.ts';

/** What the last file's listener heard after its file ended. */
const heard: string[] = [];

/** Leave behind what a file could: storage, a listener, an init script, print media, a small viewport, another page. */
async function makeAMess(s: Session): Promise<void> {
  await s.page.evaluate(() => { localStorage.setItem('left-behind', '1'); });
  s.page.on('console', (m) => heard.push(m.text()));
  await s.page.addInitScript(() => { (window as unknown as { leftBehind: number }).leftBehind = 1; });
  await s.page.emulateMedia({ media: 'print' });
  await s.page.setViewportSize({ width: 500, height: 400 });
  await s.context.newPage();
}

async function expectClean(s: Session): Promise<void> {
  expect(await s.page.evaluate(() => localStorage.getItem('left-behind'))).toBeNull();
  expect(await s.page.evaluate(() => (window as unknown as { leftBehind?: number }).leftBehind)).toBeUndefined();
  expect(await s.page.evaluate(() => matchMedia('print').matches)).toBe(false);
  expect(s.page.viewportSize()).toEqual({ width: 1280, height: 800 });
  expect(s.context.pages()).toEqual([s.page]);
  heard.length = 0;
  await s.page.evaluate(() => console.error('no listener of the last file hears this'));
  await expect.poll(() => s.errors).toEqual(['console: no listener of the last file hears this']);
  expect(heard).toEqual([]);
  s.errors.length = 0;
}

describe.skipIf(skipBrowser)('each e2e file starts from a clean page', () => {
  it('undoes what the last file left on the page, closed or not', async () => {
    const left = await openApp();
    await makeAMess(left); // and never closes its session, as a file that failed half-way
    const next = await openApp();
    expect(next.page).toBe(left.page); // the same page, reset: the point of keeping it
    await expectClean(next);
    await next.close();
  });

  it('gives a new page when the last file closed the page', async () => {
    const left = await openApp();
    await makeAMess(left);
    await left.page.close();
    const next = await openApp();
    expect(next.page.isClosed()).toBe(false);
    await expectClean(next);
    await next.close();
  });
});
