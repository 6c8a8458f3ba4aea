/**
 * Profiling aid for a screen's first render at a large table (not part of `npm run bench`, which measures; this says
 * where the time goes): on an unminified production build (MINIFY=1: minified), an invented table of n sectors chosen
 * and accepted, the screens of BEFORE visited (comma-separated, default `overview,multipliers`, as app-screens.ts
 * visits them before its first visit to the Scenarios screen), then the click on `screen` profiled and traced until
 * `ready` is on screen and SETTLE_MS (default 1000) more (page-profile.ts: every main-thread task over 25 ms by trace
 * event, each long task by function). The first visit's profile and trace are kept in bench-results/screen-SCREEN-N.cpuprofile and
 * .trace.json (both open in Chromium's DevTools).
 * REVISITS=k: then k more visits, each from the Overview; CPU=0: the trace alone (the sampling profiler adds to
 * the script's time).
 *
 * Run alone: `npx tsx test/bench/profile-screen.ts [n] [screen] [ready selector]`, e.g.
 * `npx tsx test/bench/profile-screen.ts 2000 scenarios '[data-testid="total-effect"]'`.
 */
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { appOnInventedTable } from './browser.ts';
import { profilePage } from './page-profile.ts';

const n = Number(process.argv[2] ?? 2000);
const screen = process.argv[3] ?? 'scenarios';
const ready = process.argv[4] ?? '[data-testid="total-effect"]';
const before = (process.env.BEFORE ?? 'overview,multipliers').split(',').filter(Boolean);
const { app, page, dir } = await appOnInventedTable(n);
try {
  for (const s of before) {
    await page.click(`[data-screen="${s}"]`);
    await page.waitForTimeout(1000);
  }
  const cpu = process.env.CPU !== '0';
  for (let visit = 0; visit <= Number(process.env.REVISITS ?? 0); visit++) {
    if (visit > 0) {
      await page.click('[data-screen="overview"]');
      await page.waitForTimeout(1000);
    }
    const r = await profilePage(app.browser, page, async () => {
      await page.click(`[data-screen="${screen}"]`);
      await page.locator(ready).first().waitFor();
      await page.waitForTimeout(Number(process.env.SETTLE_MS ?? 1000));
    }, { cpu });
    if (visit === 0) {
      if (cpu) writeFileSync(join(dir, `screen-${screen}-${n}.cpuprofile`), JSON.stringify(r.profile));
      writeFileSync(join(dir, `screen-${screen}-${n}.trace.json`), JSON.stringify({ traceEvents: r.trace }));
    }
    console.log(`${screen} screen at n=${n}, ${visit ? `revisit ${visit}` : 'first visit'}: ${r.report.join('\n')}`);
  }
} finally {
  await app.close();
}
