/**
 * The "How sure?" panel in real Chromium against the built renderer: bands of the multipliers and of a scenario's
 * totals, computed in the engine worker a range of draws at a time, are compared with the study layer called here in
 * the test process with the same seed (the CLI's --draws calls the same function); the sensitivity's order and Cancel
 * are checked; no console error may appear. Screenshots: test-output/screenshots/how-sure-*.png (1280×800).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { money, openApp, shot, skipBrowser, type Session } from './harness.ts';
import { onePhase } from '../support/scenario.ts';
import {
  SAMPLE_CSV, SAMPLE_FILE_NAME, defaultUncertaintySettings, prepareStudy, studyBands, studyFromTableFile, studySensitivity, utf8Bytes, type Scenario,
} from '../../src/study/index.ts';

let s: Session;
let page: Page;

const ps = prepareStudy(studyFromTableFile(utf8Bytes(SAMPLE_CSV), SAMPLE_FILE_NAME));
/** ChartPanel's table alternative: up to four decimals. */
const cell = (v: number) => v.toLocaleString('en-US', { maximumFractionDigits: 4 });

async function compute(draws: number, seed: number, cv: number): Promise<void> {
  const panel = page.getByTestId('how-sure');
  await panel.getByTestId('band-draws').fill(String(draws));
  await panel.getByTestId('band-seed').fill(String(seed));
  await panel.getByTestId('band-cv').fill(String(cv));
  await panel.getByTestId('band-compute').click();
  await panel.getByTestId('band-summary').waitFor({ timeout: 60_000 }).catch(async (e) => {
    await shot(page, 'how-sure-debug');
    throw new Error(`${(e as Error).message}\npanel: ${await panel.innerText()}\nerrors: ${s.errors.join('; ')}`);
  });
}

describe.skipIf(skipBrowser)('How sure? in the browser', () => {
  beforeAll(async () => {
    s = await openApp();
    page = s.page;
  });

  afterAll(async () => {
    await s?.close();
  });

  it('shows the multipliers\' bands the study gives for the same seed', async () => {
    await page.click('[data-screen="multipliers"]');
    await compute(200, 7, 0.1);
    const ref = studyBands(ps, { settings: defaultUncertaintySettings({ draws: 200, seed: 7, cv: 0.1 }), multipliers: true, scenarios: [] })!;
    const panel = page.getByTestId('how-sure');
    expect(await panel.getByTestId('band-summary').textContent()).toMatch(new RegExp(`200 draws, seed 7, CV 0.1:\\s+${ref.accepted} kept, ${ref.rejected} left out`));
    await panel.getByTestId('band-summary').scrollIntoViewIfNeeded();
    await shot(page, 'how-sure-01-multipliers');
    await panel.getByRole('button', { name: 'Show as table' }).click();
    const first = panel.locator('.chart-table tbody tr').first();
    const texts = (await first.locator('td').allTextContents()).map((t) => t.trim());
    const typeI = ref.multipliers!.find((m) => m.key === 'output.typeI')!.values;
    const j = ref.sectors.indexOf(texts[0]!);
    expect(j).toBeGreaterThanOrEqual(0);
    const b = typeI[j]!;
    expect(texts.slice(1, 6)).toEqual([b.point, b.p5, b.p50, b.p95, b.mean].map(cell));
    // Largest point estimate first, as the screen's own chart.
    expect(Math.max(...typeI.map((x) => x?.point ?? -Infinity))).toBe(b.point);
  });

  it('shows a scenario\'s totals with the bands the study gives, and its sensitivity sorted by swing', async () => {
    await page.click('[data-screen="scenarios"]');
    await page.getByTestId('how-sure').waitFor({ timeout: 30_000 });
    await compute(200, 3, 0.1);
    const food = ps.study.table.sectors.find((x) => /food/i.test(x))!;
    const scenario: Scenario = onePhase('New food plant', [{ sector: food, amount: 1000, kind: 'final-demand', localShare: 1 }]);
    const ref = studyBands(ps, { settings: defaultUncertaintySettings({ draws: 200, seed: 3, cv: 0.1 }), multipliers: false, scenarios: [scenario] })!;
    const out = ref.scenarios[0]!.totals.output!;
    const row = page.getByTestId('band-totals').locator('tr[data-variable="output"] td');
    expect((await row.allTextContents()).slice(0, 5).map((t) => t.trim())).toEqual([out.point, out.p5, out.p50, out.p95, out.mean].map(money));
    await page.getByTestId('band-totals').scrollIntoViewIfNeeded();
    await shot(page, 'how-sure-02-scenario');

    await page.getByTestId('sens-compute').click();
    await page.getByTestId('sens-table').waitFor();
    const sens = studySensitivity(ps, scenario, 0.1)[0]!; // the panel shows the first phase's
    const names = (await page.getByTestId('sens-table').locator('tbody th').allTextContents()).map((t) => t.trim());
    expect(names).toEqual(sens.items.map((i) => i.assumption));
    await page.getByTestId('sens-table').scrollIntoViewIfNeeded();
    await shot(page, 'how-sure-03-sensitivity');
  });

  it('stops on Cancel without a result or an error, and the app carries on', async () => {
    const panel = page.getByTestId('how-sure');
    await panel.getByTestId('band-draws').fill('100000');
    await panel.getByTestId('band-compute').click();
    await panel.getByTestId('band-progress').waitFor();
    await panel.getByTestId('band-cancel').click();
    await expect.poll(() => panel.getByTestId('band-progress').count(), { timeout: 10_000 }).toBe(0);
    expect(await panel.getByTestId('band-summary').count()).toBe(0);
    expect(await panel.locator('.message.error').count()).toBe(0);
    await panel.getByTestId('band-draws').fill('50');
    await panel.getByTestId('band-compute').click();
    await panel.getByTestId('band-summary').waitFor({ timeout: 30_000 });
    expect(s.errors).toEqual([]);
  });
});
