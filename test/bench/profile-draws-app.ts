/**
 * Profiling aid for the app while it draws (not part of `npm run bench`, which measures; this says where the time
 * goes): the flow of draws-app.ts on an unminified production build (MINIFY=1: minified), profiled and traced from
 * Compute to the bands on screen (page-profile.ts: every main-thread task over 25 ms by trace event, each long task by
 * function). TYPE=1 also types into the multiplier table's filter meanwhile, as draws-app.ts does; SCREEN=scenarios
 * draws a scenario instead. The profile and the trace are kept in bench-results/draws-app-N.cpuprofile and
 * .trace.json (both open in Chromium's DevTools).
 *
 * Run alone: `npx tsx test/bench/profile-draws-app.ts [n] [draws]`.
 */
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { appOnInventedTable } from './browser.ts';
import { profilePage } from './page-profile.ts';

const n = Number(process.argv[2] ?? 500);
const draws = Number(process.argv[3] ?? 200);
const { app, page, dir } = await appOnInventedTable(n);
try {
  await page.click(`[data-screen="${process.env.SCREEN ?? 'multipliers'}"]`);
  const panel = page.getByTestId('how-sure');
  await panel.getByTestId('band-draws').fill(String(draws));
  await panel.getByTestId('band-seed').fill('1');
  await panel.getByTestId('band-cv').fill('0.1');
  await page.waitForTimeout(1000);
  const r = await profilePage(app.browser, page, async () => {
    await panel.getByTestId('band-compute').click();
    if (process.env.TYPE === '1') {
      const filter = page.locator('[data-testid="multiplier-table"] input[type="search"]').first();
      await filter.click();
      await filter.pressSequentially('Invented sector 12', { delay: 150 });
    }
    await panel.getByTestId('band-summary').waitFor();
    await page.waitForTimeout(500);
  });
  writeFileSync(join(dir, `draws-app-${n}.cpuprofile`), JSON.stringify(r.profile));
  writeFileSync(join(dir, `draws-app-${n}.trace.json`), JSON.stringify({ traceEvents: r.trace }));
  console.log(`${draws} draws at n=${n}: ${r.report.join('\n')}`);
} finally {
  await app.close();
}
