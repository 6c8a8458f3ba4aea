/**
 * `npm run screenshots:dpr2`: every screen of the app on the sample county at device pixel ratio 2 (2560×1600 pixels
 * for a 1280×800 window), written to test-output/screenshots/dpr2-*.png to be looked at by hand after a change to a
 * screen's layout. Not part of `npm test`: rasterising ten screens at four times the pixels was the costliest single
 * test for a check no assertion can make (sharp text and lines); the test suite keeps every screen's checks at 1280×800.
 * Fails (exit 1) when a screen shows NaN or Infinity or the page logs an error.
 */
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { chromium } from 'playwright-core';
import { serveBuiltRenderer } from './built-renderer.ts';
import { CHROMIUM, CHROMIUM_ARGS, SCREENSHOTS, goTo } from './harness.ts';

const SCREENS = ['overview', 'import', 'table', 'structure', 'multipliers', 'scenarios', 'export', 'regional', 'supply-use', 'guide'];

const app = await serveBuiltRenderer();
await app.ready;
const browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS, headless: true });
const problems: string[] = [];
try {
  mkdirSync(SCREENSHOTS, { recursive: true });
  const context = await browser.newContext({ viewport: { width: 1280, height: 800 }, deviceScaleFactor: 2, locale: 'en-US' });
  const page = await context.newPage();
  page.setDefaultTimeout(60_000);
  page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
  await page.goto(app.url);
  await page.getByTestId('verdict').waitFor({ timeout: 150_000 });
  if (await page.evaluate(() => window.devicePixelRatio) !== 2) problems.push('the page does not report device pixel ratio 2');
  for (const screen of SCREENS) {
    await goTo(page, screen);
    await page.waitForTimeout(500); // charts and virtual rows settle
    if (/\bNaN\b|Infinity|∞/.test(await page.locator('body').innerText())) problems.push(`${screen}: NaN or Infinity on screen`);
    const path = join(SCREENSHOTS, `dpr2-${screen}.png`);
    await page.screenshot({ path });
    console.log(`wrote ${path}`);
  }
} finally {
  await browser.close().catch(() => {});
  await app.close();
}
for (const p of problems) console.error(p);
process.exitCode = problems.length ? 1 : 0;
